/**
 * The room's access log for the team: events filtered by investor and kind,
 * a summary per investor (last visit, what was opened), and the CSV of the
 * filtered events.
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

export interface InvestorSummary {
	guestId: string;
	who: string;
	lastVisit: Date;
	events: number;
	opened: string[];
}

/** Per investor: the last event, how many, and the distinct things opened (newest first). Team members' own visits are left out. */
export function summariseByInvestor(events: readonly LogEvent[]): InvestorSummary[] {
	const byGuest = new Map<string, InvestorSummary>();
	for (const event of events) {
		if (!event.guestId) continue;
		const summary = byGuest.get(event.guestId) ?? { guestId: event.guestId, who: event.who, lastVisit: event.at, events: 0, opened: [] };
		summary.events += 1;
		if (event.at > summary.lastVisit) summary.lastVisit = event.at;
		if (event.kind !== 'room-view' && event.targetName && !summary.opened.includes(event.targetName)) summary.opened.push(event.targetName);
		byGuest.set(event.guestId, summary);
	}
	return [...byGuest.values()].sort((a, b) => b.lastVisit.getTime() - a.lastVisit.getTime());
}

export function logCsv(events: readonly LogEvent[]): string {
	return tableToCsv({
		title: 'Access log',
		headers: ['Time (UTC)', 'Who', 'Team member', 'What', 'Item', 'Room version'],
		rows: events.map((e) => [e.at.toISOString(), e.who, e.byTeam ? 'yes' : 'no', roomEventWords[e.kind], e.targetName, e.version]),
		numeric: [false, false, false, false, false, true]
	});
}
