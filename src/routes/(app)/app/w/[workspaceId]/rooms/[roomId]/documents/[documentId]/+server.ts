import { error } from '@sveltejs/kit';
import { authorize, isUuid } from '$lib/server/auth/access';
import { getRoomDocument } from '$lib/server/db/rooms';
import { documentResponse } from '$lib/server/rooms/document-response';
import type { RequestHandler } from './$types';

/** A room document for the team: always a download, with the same safe headers investors get. */
export const GET: RequestHandler = async (event) => {
	const { roomId } = await authorize(event, { workspaceId: event.params.workspaceId, roomId: event.params.roomId }, 'viewer');
	const document = isUuid(event.params.documentId) ? await getRoomDocument(roomId, event.params.documentId) : undefined;
	if (!document) error(404, 'No such document in this room.');
	return documentResponse(document, 'attachment');
};
