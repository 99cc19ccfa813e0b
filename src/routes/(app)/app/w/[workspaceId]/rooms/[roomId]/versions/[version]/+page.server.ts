import { error } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { getRoomVersion, listGuestsOfRoom } from '$lib/server/db/rooms';
import type { PageServerLoad } from './$types';

/** Any published version as it was, and which investors last saw this one. */
export const load: PageServerLoad = async (event) => {
	const { membership, room } = await authorize(event, { workspaceId: event.params.workspaceId, roomId: event.params.roomId }, 'viewer');
	const number = Number(event.params.version);
	const version = Number.isInteger(number) ? await getRoomVersion(event.params.roomId, number) : undefined;
	if (!version) error(404, 'No such version of this room.');
	const guests = await listGuestsOfRoom(room.id);
	return {
		workspaceId: membership.workspaceId,
		room: { id: room.id, name: room.name },
		version: { number: version.version, publishedAt: version.publishedAt.toISOString(), publishedByName: version.publishedByName, engineVersion: version.engineVersion },
		scenarios: version.snapshot.scenarios.map((s, i) => ({ position: i + 1, name: s.name, revision: s.revision, isBaseCase: s.isBaseCase })),
		seenBy: guests.filter((g) => g.lastVersionSeen === version.version).map((g) => g.email)
	};
};
