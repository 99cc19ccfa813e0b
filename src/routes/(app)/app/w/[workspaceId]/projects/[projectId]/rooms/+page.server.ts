import { fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { authorize } from '$lib/server/auth/access';
import { roleAtLeast } from '$lib/server/auth/roles';
import { listRoomsOfProject } from '$lib/server/db/rooms';
import { createRoomForProject } from '$lib/server/rooms/team';
import { DEFAULT_TERMS_TEXT, roomTermsSchema } from '$lib/server/rooms/terms';
import { PlanRefusal } from '$lib/server/billing/gates';
import { readForm } from '$lib/server/forms';
import { planAllows } from '$lib/billing/plans';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const { project, membership } = await authorize(event, event.params, 'viewer');
	const rooms = await listRoomsOfProject(project.id);
	const plan = planAllows(membership, 'dataRooms', 'change');
	return {
		workspaceId: membership.workspaceId,
		project: { id: project.id, name: project.name },
		rooms: rooms.map((r) => ({ id: r.id, name: r.name, latestVersion: r.latest_version, guests: r.guests, createdAt: r.created_at.toISOString() })),
		canCreate: roleAtLeast(membership.role, 'analyst') && plan.allowed,
		planMessage: plan.allowed ? null : plan.message,
		billingUrl: membership.role === 'owner' ? `/app/w/${membership.workspaceId}/billing` : null,
		defaultTerms: DEFAULT_TERMS_TEXT
	};
};

const roomForm = z.object({
	name: z.string().trim().min(1, 'Give the room a name.').max(200, 'At most 200 characters.'),
	terms: roomTermsSchema
});

export const actions: Actions = {
	create: async (event) => {
		const access = await authorize(event, event.params, 'analyst');
		const fields = await readForm(event.request);
		const parsed = roomForm.safeParse(fields);
		if (!parsed.success) return fail(400, { name: fields.name ?? '', terms: fields.terms ?? '', field: String(parsed.error.issues[0].path[0]), message: parsed.error.issues[0].message });
		let roomId: string;
		try {
			roomId = (await createRoomForProject(access, parsed.data)).id;
		} catch (e) {
			if (e instanceof PlanRefusal) return fail(402, { name: parsed.data.name, terms: parsed.data.terms, field: null, message: e.message });
			throw e;
		}
		redirect(303, `/app/w/${access.membership.workspaceId}/rooms/${roomId}`);
	}
};
