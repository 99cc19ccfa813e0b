import { json } from '@sveltejs/kit';
import { databaseIsReachable } from '$lib/server/db/health';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async () => {
	const dbOk = await databaseIsReachable();
	return json(
		{ status: dbOk ? 'ok' : 'degraded', db: dbOk ? 'ok' : 'down' },
		{ status: dbOk ? 200 : 503, headers: { 'cache-control': 'no-store' } }
	);
};
