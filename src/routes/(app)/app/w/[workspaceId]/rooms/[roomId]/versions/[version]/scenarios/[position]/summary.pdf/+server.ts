import { error } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { getRoomVersion } from '$lib/server/db/rooms';
import { renderSummaryPdfOnPool } from '$lib/server/compute/pool';
import { roomSummaryInput } from '$lib/server/rooms/room-pdf';
import { summaryPdfResponse } from '$lib/server/pdf/summary-input';
import type { RequestHandler } from './$types';

/** The team's copy of a published scenario's PDF, exactly as the version froze it (unstamped). */
export const GET: RequestHandler = async (event) => {
	const { room } = await authorize(event, { workspaceId: event.params.workspaceId, roomId: event.params.roomId }, 'viewer');
	const number = Number(event.params.version);
	const position = Number(event.params.position);
	const version = Number.isInteger(number) ? await getRoomVersion(event.params.roomId, number) : undefined;
	const scenario = version?.snapshot.scenarios[position - 1];
	if (!version || !Number.isInteger(position) || !scenario) error(404, 'No such scenario in this version.');
	const pdf = await renderSummaryPdfOnPool(roomSummaryInput(room.name, version, position, null));
	return summaryPdfResponse(pdf, scenario.name, scenario.revision);
};
