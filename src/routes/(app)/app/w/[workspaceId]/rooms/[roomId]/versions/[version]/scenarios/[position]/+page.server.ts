import { error } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { getRoomVersion } from '$lib/server/db/rooms';
import { snapshotScenarioView } from '$lib/server/rooms/views';
import type { PageServerLoad } from './$types';

/** The team's view of one scenario in any version, exactly as investors were shown it. */
export const load: PageServerLoad = async (event) => {
	const { membership, room } = await authorize(event, { workspaceId: event.params.workspaceId, roomId: event.params.roomId }, 'viewer');
	const number = Number(event.params.version);
	const position = Number(event.params.position);
	const version = Number.isInteger(number) ? await getRoomVersion(event.params.roomId, number) : undefined;
	if (!version || !Number.isInteger(position) || !version.snapshot.scenarios[position - 1]) error(404, 'No such scenario in this version.');
	return { workspaceId: membership.workspaceId, room: { id: room.id, name: room.name }, ...snapshotScenarioView(version, position) };
};
