/**
 * The guests' door, the one check every /rooms route asks: a signed-in room
 * guest, invited into this room, not revoked, not expired, in a workspace
 * whose plan still opens rooms to investors, and (unless the route is the
 * terms page itself) with the room's current terms accepted.
 */
import { error, redirect, type RequestEvent } from '@sveltejs/kit';
import { isUuid } from '../auth/access';
import type { GuestPrincipal } from '../auth/principal';
import { getRoom, getRoomAccess, getRoomVersion, hasAcceptedTerms, type RoomRow, type RoomVersion } from '../db/rooms';
import { getWorkspaceStanding } from '../db/billing';
import { planAllows } from '../../billing/plans';

type GuestEvent = Pick<RequestEvent, 'locals' | 'url'>;

export const NO_ROOM = 'No such data room, or your access to it has ended.';
export const ROOM_CLOSED = 'This data room is closed for now. The team that shared it can reopen it.';

export function requireGuest(event: GuestEvent): GuestPrincipal {
	const principal = event.locals.principal;
	if (principal?.kind === 'guest') return principal;
	redirect(303, `/rooms/signin?next=${encodeURIComponent(event.url.pathname + event.url.search)}`);
}

export interface GuestRoom {
	guest: GuestPrincipal['guest'];
	room: RoomRow;
	/** The latest published version; null before the first publication. */
	version: RoomVersion | null;
}

export async function guestRoom(event: GuestEvent, roomId: string, options: { termsPage?: boolean } = {}): Promise<GuestRoom> {
	const { guest } = requireGuest(event);
	if (!isUuid(roomId)) error(404, NO_ROOM);
	const access = await getRoomAccess(roomId, guest.id);
	if (!access || access.revokedAt !== null || new Date(access.expiresAt).getTime() <= Date.now()) error(404, NO_ROOM);
	const room = await getRoom(roomId);
	if (!room) error(404, NO_ROOM);
	if (!planAllows(await getWorkspaceStanding(room.workspace_id), 'dataRooms', 'share').allowed) error(403, ROOM_CLOSED);
	if (!options.termsPage && !(await hasAcceptedTerms(room.id, guest.id, room.terms_version))) {
		redirect(303, `/rooms/${room.id}/terms?next=${encodeURIComponent(event.url.pathname)}`);
	}
	return { guest, room, version: (await getRoomVersion(room.id, 'latest')) ?? null };
}
