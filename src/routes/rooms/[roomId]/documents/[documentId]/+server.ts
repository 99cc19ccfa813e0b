import { error } from '@sveltejs/kit';
import { guestRoom } from '$lib/server/rooms/guest-access';
import { isUuid } from '$lib/server/auth/access';
import { getRoomDocument, recordRoomEvent } from '$lib/server/db/rooms';
import { dispositionOf, documentResponse } from '$lib/server/rooms/document-response';
import type { RequestHandler } from './$types';

/** A document of the room, for a guest who accepted the terms; every view and download is logged. */
export const GET: RequestHandler = async (event) => {
	const { guest, room, version } = await guestRoom(event, event.params.roomId);
	const document = isUuid(event.params.documentId) ? await getRoomDocument(room.id, event.params.documentId) : undefined;
	if (!document) error(404, 'No such document in this room.');
	const disposition = dispositionOf(document);
	await recordRoomEvent({
		roomId: room.id,
		version: version?.version ?? null,
		guestId: guest.id,
		kind: disposition === 'inline' ? 'document-view' : 'document-download',
		targetId: document.id,
		targetName: document.fileName
	});
	return documentResponse(document, disposition);
};
