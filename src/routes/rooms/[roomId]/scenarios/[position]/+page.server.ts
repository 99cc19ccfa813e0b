import { error } from '@sveltejs/kit';
import { guestRoom } from '$lib/server/rooms/guest-access';
import { recordRoomEvent } from '$lib/server/db/rooms';
import { snapshotScenarioView } from '$lib/server/rooms/views';
import type { PageServerLoad } from './$types';

/** One published scenario as frozen in the latest version: results, charts, table, assumptions, method notes. */
export const load: PageServerLoad = async (event) => {
	const { guest, room, version } = await guestRoom(event, event.params.roomId);
	const position = Number(event.params.position);
	const scenario = version?.snapshot.scenarios[position - 1];
	if (!version || !Number.isInteger(position) || !scenario) error(404, 'No such scenario in this room.');
	await recordRoomEvent({ roomId: room.id, version: version.version, guestId: guest.id, kind: 'scenario-view', targetId: scenario.id, targetName: scenario.name });
	return { room: { id: room.id, name: room.name }, ...snapshotScenarioView(version, position) };
};
