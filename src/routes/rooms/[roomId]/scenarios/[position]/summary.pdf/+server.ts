import { error } from '@sveltejs/kit';
import { guestRoom } from '$lib/server/rooms/guest-access';
import { recordRoomEvent } from '$lib/server/db/rooms';
import { renderSummaryPdfOnPool } from '$lib/server/compute/pool';
import { roomSummaryInput } from '$lib/server/rooms/room-pdf';
import { summaryPdfResponse } from '$lib/server/pdf/summary-input';
import type { RequestHandler } from './$types';

/** An investor's copy of a published scenario's PDF summary, stamped with their address and the time. */
export const GET: RequestHandler = async (event) => {
	const { guest, room, version } = await guestRoom(event, event.params.roomId);
	const position = Number(event.params.position);
	const scenario = version?.snapshot.scenarios[position - 1];
	if (!version || !Number.isInteger(position) || !scenario) error(404, 'No such scenario in this room.');
	const pdf = await renderSummaryPdfOnPool(roomSummaryInput(room.name, version, position, { email: guest.email, at: new Date() }));
	await recordRoomEvent({ roomId: room.id, version: version.version, guestId: guest.id, kind: 'pdf-download', targetId: scenario.id, targetName: `${scenario.name} (PDF)` });
	return summaryPdfResponse(pdf, scenario.name, scenario.revision);
};
