import { fail, redirect } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { PlanRefusal } from '$lib/server/billing/gates';
import { startFromExample } from '$lib/server/workbench/example-project';
import { exampleProjectFacts } from '$lib/server/workbench/starter-documents';
import { technologies, type Technology } from '$lib/schemas/workbench';
import { technologyLabels } from '$lib/technology';
import type { Actions, PageServerLoad } from './$types';

/** What an empty workspace offers to start from: one example per technology (the same for every view). */
const examples = technologies.flatMap((technology) => {
	const example = exampleProjectFacts(technology);
	return example ? [{ technology, label: technologyLabels[technology], name: example.name, currency: example.currency }] : [];
});

export const load: PageServerLoad = async (event) => {
	await authorize(event, event.params, 'viewer');
	return { welcome: event.url.searchParams.has('welcome'), examples };
};

export const actions: Actions = {
	/** A new project from the example of one technology, its document saved as the base case; then its page. */
	example: async (event) => {
		const { membership, user } = await authorize(event, event.params, 'analyst');
		const technology = (await event.request.formData()).get('technology');
		if (typeof technology !== 'string' || !(technologies as readonly string[]).includes(technology)) {
			return fail(400, { exampleProblem: 'Choose one of the examples.' });
		}
		let projectId: string;
		try {
			projectId = (await startFromExample(membership.workspaceId, technology as Technology, user.id)).id;
		} catch (e) {
			if (e instanceof PlanRefusal) return fail(402, { exampleProblem: e.message });
			throw e;
		}
		redirect(303, `/app/w/${membership.workspaceId}/projects/${projectId}`);
	}
};
