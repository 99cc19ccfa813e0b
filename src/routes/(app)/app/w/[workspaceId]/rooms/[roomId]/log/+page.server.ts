import { authorize } from '$lib/server/auth/access';
import { listGuestsOfRoom, listRoomEvents, summariseInvestorVisits } from '$lib/server/db/rooms';
import { ROOM_EVENT_KINDS, readLogFilter, roomEventWords } from '$lib/server/rooms/access-log';
import type { PageServerLoad } from './$types';

/** Who saw what, and when: every view and download of the room, for the team. */
export const load: PageServerLoad = async (event) => {
	const { membership, room } = await authorize(event, { workspaceId: event.params.workspaceId, roomId: event.params.roomId }, 'viewer');
	const filter = readLogFilter(event.url);
	const [events, guests, summary] = await Promise.all([
		listRoomEvents(room.id, { guestId: filter.guest, kind: filter.kind }),
		listGuestsOfRoom(room.id),
		summariseInvestorVisits(room.id)
	]);
	return {
		workspaceId: membership.workspaceId,
		room: { id: room.id, name: room.name },
		filter: { guest: filter.guest ?? '', kind: filter.kind ?? '' },
		kinds: ROOM_EVENT_KINDS.map((k) => ({ key: k, label: roomEventWords[k] })),
		guests: guests.map((g) => ({ id: g.guestId, email: g.email })),
		summary: summary.map((s) => ({ ...s, lastVisit: s.lastVisit.toISOString() })),
		events: events.map((e) => ({ at: e.at.toISOString(), who: e.who, byTeam: e.byTeam, what: roomEventWords[e.kind], item: e.targetName, version: e.version }))
	};
};
