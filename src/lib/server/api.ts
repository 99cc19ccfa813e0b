import { json } from '@sveltejs/kit';

export interface ApiIssue {
	path: string;
	message: string;
}

/** The JSON error shape every /api/v1 route answers with: `{ error: { message, issues, ...details } }`. */
export function apiError(status: number, message: string, issues: ApiIssue[] = [], details: Record<string, unknown> = {}) {
	return json({ error: { message, issues, ...details } }, { status, headers: { 'cache-control': 'no-store' } });
}
