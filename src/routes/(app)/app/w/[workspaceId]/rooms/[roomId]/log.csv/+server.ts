import { authorize } from '$lib/server/auth/access';
import { listRoomEvents } from '$lib/server/db/rooms';
import { logCsv, readLogFilter } from '$lib/server/rooms/access-log';
import type { RequestHandler } from './$types';

/** The access log as CSV, with the page's filters. */
export const GET: RequestHandler = async (event) => {
	const { room } = await authorize(event, { workspaceId: event.params.workspaceId, roomId: event.params.roomId }, 'viewer');
	const filter = readLogFilter(event.url);
	const events = await listRoomEvents(room.id, { guestId: filter.guest, kind: filter.kind });
	const name = room.name.replace(/[^\w.-]+/g, '-').slice(0, 60) || 'room';
	return new Response(logCsv(events), {
		headers: { 'content-type': 'text/csv; charset=utf-8', 'content-disposition': `attachment; filename="${name}-access-log.csv"`, 'cache-control': 'no-store' }
	});
};
