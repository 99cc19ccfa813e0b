import { requireGuest } from '$lib/server/rooms/guest-access';
import { listRoomsOfGuest } from '$lib/server/db/rooms';
import type { PageServerLoad } from './$types';

/** The rooms this guest may open now. */
export const load: PageServerLoad = async (event) => {
	const { guest } = requireGuest(event);
	const rooms = await listRoomsOfGuest(guest.id);
	return { rooms: rooms.map((r) => ({ id: r.id, name: r.name, projectName: r.project_name, workspaceName: r.workspace_name, expiresAt: r.expires_at.toISOString() })) };
};
