import { json } from '@sveltejs/kit';

export interface ApiIssue {
	path: string;
	message: string;
}

/** The JSON error shape every /api/v1 route answers with. */
export function apiError(status: number, message: string, issues: ApiIssue[] = []) {
	return json({ error: { message, issues } }, { status, headers: { 'cache-control': 'no-store' } });
}
