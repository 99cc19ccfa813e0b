/**
 * The room's access log for the team: events filtered by investor and kind,
 * and the CSV of the filtered events (the summary per investor is counted in
 * PostgreSQL: db/rooms summariseInvestorVisits).
 */
import { z } from 'zod';
import { listRoomEvents, type RoomEventKind } from '../db/rooms';
import { tableToCsv } from '../workbench/export-csv';

export const ROOM_EVENT_KINDS = ['room-view', 'scenario-view', 'document-view', 'document-download', 'pdf-download'] as const satisfies readonly RoomEventKind[];

export const roomEventWords: Record<RoomEventKind, string> = {
	'room-view': 'Opened the room',
	'scenario-view': 'Read a scenario',
	'document-view': 'Viewed a document',
	'document-download': 'Downloaded a document',
	'pdf-download': 'Downloaded a PDF summary'
};

export const logFilter = z.object({
	guest: z.uuid().optional().catch(undefined),
	kind: z.enum(ROOM_EVENT_KINDS).optional().catch(undefined)
});
export type LogFilter = z.infer<typeof logFilter>;

export function readLogFilter(url: URL): LogFilter {
	return logFilter.parse({ guest: url.searchParams.get('guest') ?? undefined, kind: url.searchParams.get('kind') ?? undefined });
}

export type LogEvent = Awaited<ReturnType<typeof listRoomEvents>>[number];

export function logCsv(events: readonly LogEvent[]): string {
	return tableToCsv({
		title: 'Access log',
		headers: ['Time (UTC)', 'Who', 'Team member', 'What', 'Item', 'Room version'],
		rows: events.map((e) => [e.at.toISOString(), e.who, e.byTeam ? 'yes' : 'no', roomEventWords[e.kind], e.targetName, e.version]),
		numeric: [false, false, false, false, false, true]
	});
}
