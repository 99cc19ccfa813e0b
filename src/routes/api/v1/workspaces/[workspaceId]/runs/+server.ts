import { json } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { requireFeature } from '$lib/server/billing/gates';
import { listRunsOfWorkspace } from '$lib/server/db/probabilistic-runs';
import { apiRoute } from '$lib/server/workbench/api-route';
import { runListView } from '$lib/server/probabilistic/run-requests';
import type { RequestHandler } from './$types';

/** The workspace's probabilistic runs, newest first (the latest 50), with their state and progress; `?live=1` for those waiting or running. */
export const GET: RequestHandler = apiRoute(async (event) => {
	const { membership } = await authorize(event, event.params, 'viewer');
	requireFeature(membership, 'probabilisticRuns', 'read');
	const runs = await listRunsOfWorkspace(membership.workspaceId, { liveOnly: event.url.searchParams.get('live') === '1' });
	return json({ workspace: { id: membership.workspaceId, name: membership.workspaceName }, runs: runs.map((r) => runListView(r)) });
});
