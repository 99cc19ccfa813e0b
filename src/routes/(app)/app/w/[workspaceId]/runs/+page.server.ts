import { planAllows } from '$lib/billing/plans';
import { authorize } from '$lib/server/auth/access';
import { listRunsOfWorkspace } from '$lib/server/db/probabilistic-runs';
import { runListView } from '$lib/server/probabilistic/run-requests';
import type { PageServerLoad } from './$types';

/** The workspace's probabilistic runs, newest first, with their state: which are waiting, drawing, done. */
export const load: PageServerLoad = async (event) => {
	const { membership } = await authorize(event, event.params, 'viewer');
	const plan = planAllows(membership, 'probabilisticRuns', 'read');
	const runs = plan.allowed ? await listRunsOfWorkspace(membership.workspaceId) : [];
	return {
		workspace: { id: membership.workspaceId, name: membership.workspaceName },
		planMessage: plan.allowed ? null : plan.message,
		billingUrl: membership.role === 'owner' ? `/app/w/${membership.workspaceId}/billing` : null,
		runs: runs.map((r) => runListView(r))
	};
};
