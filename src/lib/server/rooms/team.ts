/**
 * What the team does with a data room: create it, publish versions, attach
 * documents, invite and revoke investors, answer questions. Every step asks
 * the plan gate first (rooms are a paid feature; a lapsed plan leaves them
 * readable by the team and closed to investors).
 */
import { requireFeature } from '../billing/gates';
import type { ProjectAccess, RoomAccess } from '../auth/access';
import {
	answerQuestion,
	createRoom,
	getGuest,
	grantRoomAccess,
	insertGuestLink,
	insertRoomDocument,
	insertRoomVersion,
	listQuestions,
	removeRoomDocument,
	revokeRoomAccess,
	updateRoomTerms,
	upsertGuest,
	type RoomDocument,
	type RoomRow
} from '../db/rooms';
import { generateRandomToken, hashToken } from '../auth/tokens';
import { sendMail } from '../mail/mailer';
import { roomAnswerMessage, roomInvitationMessage } from '../mail/templates';
import { buildSnapshot, type SnapshotChoices } from './snapshot';
import { endSessionsOfGuestWithoutRooms } from './guest-sessions';
import { checkRoomDocument } from './document-check';
import { VIEWABLE_KINDS } from './document-response';
import { DEFAULT_TERMS_TEXT } from './terms';

export const INVITATION_LINK_DAYS = 7;

export class RoomProblem extends Error {
	constructor(
		message: string,
		readonly field: string | null = null
	) {
		super(message);
		this.name = 'RoomProblem';
	}
}

export async function createRoomForProject(access: ProjectAccess, input: { name: string; terms: string }): Promise<RoomRow> {
	requireFeature(access.membership, 'dataRooms', 'change');
	return createRoom({ workspaceId: access.membership.workspaceId, projectId: access.project.id, name: input.name, terms: input.terms || DEFAULT_TERMS_TEXT, createdBy: access.user.id });
}

/** A new frozen version; a probabilistic run shown to investors needs a plan with runs, as the room itself needs one with rooms. */
export async function publishVersion(access: RoomAccess, scenarioIds: readonly string[], choices: SnapshotChoices = {}): Promise<number> {
	requireFeature(access.membership, 'dataRooms', 'change');
	const withRunOf = (choices.withRunOf ?? []).filter((id) => scenarioIds.includes(id));
	if (withRunOf.length > 0) requireFeature(access.membership, 'probabilisticRuns', 'share');
	const snapshot = await buildSnapshot(access.project, scenarioIds, { withRunOf });
	return insertRoomVersion(access.roomId, snapshot, access.user.id);
}

export async function attachDocument(access: RoomAccess, input: { fileName: string; bytes: Uint8Array; folder: string; access: 'view' | 'download' }): Promise<RoomDocument> {
	requireFeature(access.membership, 'dataRooms', 'change');
	const checked = checkRoomDocument({ fileName: input.fileName, bytes: input.bytes });
	if (!checked.ok) throw new RoomProblem(checked.reason, 'file');
	if (input.access === 'view' && !VIEWABLE_KINDS.has(checked.kind)) {
		throw new RoomProblem(`${checked.safeFileName} cannot be shown in a browser (${checked.kind.toUpperCase()}): attach it as a download, or as a PDF to keep it view only.`, 'access');
	}
	return insertRoomDocument({
		roomId: access.roomId,
		folder: input.folder,
		fileName: checked.safeFileName,
		kind: checked.kind,
		contentType: checked.contentType,
		byteSize: checked.byteSize,
		sha256: checked.sha256,
		access: input.access,
		content: input.bytes,
		uploadedBy: access.user.id
	});
}

export async function inviteGuest(access: RoomAccess, input: { email: string; name: string; accessUntil: Date; origin: string }): Promise<void> {
	requireFeature(access.membership, 'dataRooms', 'share');
	if (input.accessUntil.getTime() <= Date.now()) throw new RoomProblem('Choose an access end date in the future.', 'accessUntil');
	const { room } = access;
	const guest = await upsertGuest(input.email, input.name);
	await grantRoomAccess(room.id, guest.id, input.accessUntil, access.user.id);
	const token = generateRandomToken();
	await insertGuestLink({ tokenHash: hashToken(token), guestId: guest.id, roomId: room.id, purpose: 'invitation', expiresAt: new Date(Date.now() + INVITATION_LINK_DAYS * 86_400_000) });
	await sendMail(
		guest.email,
		roomInvitationMessage({
			inviterName: access.user.name || access.user.email,
			workspaceName: access.membership.workspaceName,
			roomName: room.name,
			projectName: access.project.name,
			url: `${input.origin}/rooms/join/${token}`,
			daysValid: INVITATION_LINK_DAYS,
			accessUntil: input.accessUntil
		})
	);
}

/** Takes a document out of the room (a change: the plan must allow it). False when it is not in this room. */
export async function removeDocument(access: RoomAccess, documentId: string): Promise<boolean> {
	requireFeature(access.membership, 'dataRooms', 'change');
	return removeRoomDocument(access.roomId, documentId);
}

/** New confidentiality terms: every investor accepts them again before the room opens. */
export async function changeTerms(access: RoomAccess, terms: string): Promise<void> {
	requireFeature(access.membership, 'dataRooms', 'change');
	await updateRoomTerms(access.roomId, terms);
}

/** Ends a guest's access at once (allowed on any plan: taking access away is never gated); a guest left with no room also loses their sessions. */
export async function revokeGuest(access: RoomAccess, guestId: string): Promise<boolean> {
	const revoked = await revokeRoomAccess(access.roomId, guestId);
	if (revoked) await endSessionsOfGuestWithoutRooms(guestId);
	return revoked;
}

export async function answerRoomQuestion(access: RoomAccess, input: { questionId: string; answer: string; visibility: 'asker' | 'all'; origin: string }): Promise<void> {
	requireFeature(access.membership, 'dataRooms', 'change');
	const answered = await answerQuestion(access.roomId, input.questionId, input.answer, input.visibility, access.user.id);
	if (!answered) throw new RoomProblem('That question is not in this room.', 'questionId');
	const asker = await getGuest(answered.guest_id);
	const { room } = access;
	if (asker) await sendMail(asker.email, roomAnswerMessage({ roomName: room.name, question: answered.question, answer: input.answer, url: `${input.origin}/rooms/${room.id}` }));
}

/** The questions a guest sees: their own, and answers the team made visible to all guests. */
export async function questionsForGuest(roomId: string, guestId: string) {
	return (await listQuestions(roomId)).filter((q) => q.guestId === guestId || (q.answer !== null && q.visibility === 'all'));
}
