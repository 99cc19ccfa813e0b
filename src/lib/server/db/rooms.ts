/**
 * Investor data rooms in PostgreSQL: rooms, their published versions,
 * documents, room guests and their access, single-use links, accepted terms,
 * the access log and questions.
 */
import type { Knex } from 'knex';
import { db } from './knex';
import { normaliseEmail } from './users';
import type { RoomSnapshot } from '../rooms/snapshot-format';

export interface RoomRow {
	id: string;
	workspace_id: string;
	project_id: string;
	name: string;
	terms: string;
	terms_version: number;
	created_at: Date;
	updated_at: Date;
}

export const roomColumns = ['id', 'workspace_id', 'project_id', 'name', 'terms', 'terms_version', 'created_at', 'updated_at'] as const;

export async function createRoom(input: { workspaceId: string; projectId: string; name: string; terms: string; createdBy: string }, knex: Knex = db()): Promise<RoomRow> {
	const [row] = await knex('data_rooms')
		.insert({ workspace_id: input.workspaceId, project_id: input.projectId, name: input.name, terms: input.terms, created_by: input.createdBy })
		.returning(roomColumns);
	return row;
}

export async function getRoom(id: string, knex: Knex = db()): Promise<RoomRow | undefined> {
	return knex('data_rooms').select(roomColumns).where({ id }).first();
}

export async function listRoomsOfProject(projectId: string, knex: Knex = db()) {
	return knex('data_rooms')
		.select(...roomColumns.map((c) => `data_rooms.${c}`))
		.select(
			knex.raw('(select max(version) from data_room_versions v where v.room_id = data_rooms.id) as latest_version'),
			knex.raw('(select count(*)::int from room_guest_access a where a.room_id = data_rooms.id and a.revoked_at is null and a.expires_at > now()) as guests')
		)
		.where({ project_id: projectId })
		.orderBy('created_at', 'desc') as Promise<(RoomRow & { latest_version: number | null; guests: number })[]>;
}

/** New terms ask every guest to accept again. */
export async function updateRoomTerms(roomId: string, terms: string, knex: Knex = db()): Promise<void> {
	await knex('data_rooms').where({ id: roomId }).update({ terms, terms_version: knex.raw('terms_version + 1'), updated_at: knex.fn.now() });
}

export interface RoomVersion {
	id: string;
	roomId: string;
	version: number;
	snapshot: RoomSnapshot;
	engineVersion: string;
	publishedAt: Date;
	publishedByName: string | null;
}

/** Publishes the next version (numbers never repeat: the room row is locked while counting). */
export async function insertRoomVersion(roomId: string, snapshot: RoomSnapshot, publishedBy: string, knex: Knex = db()): Promise<number> {
	return knex.transaction(async (trx) => {
		await trx('data_rooms').where({ id: roomId }).forUpdate().first();
		const [{ max }] = await trx('data_room_versions').where({ room_id: roomId }).max<{ max: number | null }[]>({ max: 'version' });
		const version = (max ?? 0) + 1;
		await trx('data_room_versions').insert({ room_id: roomId, version, snapshot: JSON.stringify(snapshot), engine_version: snapshot.engineVersion, published_by: publishedBy });
		await trx('data_rooms').where({ id: roomId }).update({ updated_at: trx.fn.now() });
		return version;
	});
}

export async function getRoomVersion(roomId: string, version: number | 'latest', knex: Knex = db()): Promise<RoomVersion | undefined> {
	const query = knex('data_room_versions')
		.leftJoin('users', 'users.id', 'data_room_versions.published_by')
		.select('data_room_versions.*', 'users.name as published_by_name')
		.where('data_room_versions.room_id', roomId);
	if (version === 'latest') query.orderBy('version', 'desc');
	else query.where('data_room_versions.version', version);
	const row = await query.first();
	return row && { id: row.id, roomId: row.room_id, version: row.version, snapshot: row.snapshot, engineVersion: row.engine_version, publishedAt: row.published_at, publishedByName: row.published_by_name };
}

export async function listRoomVersions(roomId: string, knex: Knex = db()) {
	const rows = await knex('data_room_versions')
		.leftJoin('users', 'users.id', 'data_room_versions.published_by')
		.select('data_room_versions.version', 'data_room_versions.published_at', 'data_room_versions.engine_version', 'users.name as published_by_name')
		.select(knex.raw(`jsonb_array_length(data_room_versions.snapshot -> 'scenarios') as scenarios`))
		.where('data_room_versions.room_id', roomId)
		.orderBy('version', 'desc');
	return rows.map((r) => ({ version: r.version as number, publishedAt: r.published_at as Date, engineVersion: r.engine_version as string, publishedByName: (r.published_by_name as string | null) ?? null, scenarios: Number(r.scenarios) }));
}

export interface RoomDocument {
	id: string;
	roomId: string;
	folder: string;
	fileName: string;
	kind: string;
	contentType: string;
	byteSize: number;
	sha256: string;
	access: 'view' | 'download';
	createdAt: Date;
}

function toDocument(r: Record<string, unknown>): RoomDocument {
	return {
		id: r.id as string,
		roomId: r.room_id as string,
		folder: r.folder as string,
		fileName: r.file_name as string,
		kind: r.kind as string,
		contentType: r.content_type as string,
		byteSize: r.byte_size as number,
		sha256: r.sha256 as string,
		access: r.access as 'view' | 'download',
		createdAt: r.created_at as Date
	};
}

const documentColumns = ['id', 'room_id', 'folder', 'file_name', 'kind', 'content_type', 'byte_size', 'sha256', 'access', 'created_at'];

export async function insertRoomDocument(
	input: Omit<RoomDocument, 'id' | 'createdAt' | 'roomId'> & { roomId: string; content: Uint8Array; uploadedBy: string },
	knex: Knex = db()
): Promise<RoomDocument> {
	const [row] = await knex('data_room_documents')
		.insert({
			room_id: input.roomId,
			folder: input.folder,
			file_name: input.fileName,
			kind: input.kind,
			content_type: input.contentType,
			byte_size: input.byteSize,
			sha256: input.sha256,
			content: Buffer.from(input.content.buffer, input.content.byteOffset, input.content.byteLength),
			access: input.access,
			uploaded_by: input.uploadedBy
		})
		.returning(documentColumns);
	return toDocument(row);
}

export async function listRoomDocuments(roomId: string, knex: Knex = db()): Promise<RoomDocument[]> {
	const rows = await knex('data_room_documents').select(documentColumns).where({ room_id: roomId }).whereNull('removed_at').orderBy([{ column: 'folder' }, { column: 'file_name' }]);
	return rows.map(toDocument);
}

export async function getRoomDocument(roomId: string, documentId: string, knex: Knex = db()): Promise<(RoomDocument & { content: Buffer }) | undefined> {
	const row = await knex('data_room_documents').select([...documentColumns, 'content']).where({ room_id: roomId, id: documentId }).whereNull('removed_at').first();
	return row && { ...toDocument(row), content: row.content };
}

export async function removeRoomDocument(roomId: string, documentId: string, knex: Knex = db()): Promise<boolean> {
	return (await knex('data_room_documents').where({ room_id: roomId, id: documentId }).whereNull('removed_at').update({ removed_at: knex.fn.now() })) > 0;
}

export interface RoomGuest {
	id: string;
	email: string;
	name: string;
	hasPassword: boolean;
}

/** The guest with this address, made when new: one guest identity across the rooms they are invited to. */
export async function upsertGuest(email: string, name: string, knex: Knex = db()): Promise<RoomGuest> {
	const normalised = normaliseEmail(email);
	await knex.raw(`insert into room_guests (email, name) values (?, ?) on conflict ((lower(email))) do nothing`, [normalised, name.trim()]);
	const row = await knex('room_guests').select('id', 'email', 'name', 'password_hash').whereRaw('lower(email) = ?', [normalised]).first();
	return { id: row.id, email: row.email, name: row.name, hasPassword: row.password_hash !== null };
}

export async function getGuest(id: string, knex: Knex = db()): Promise<RoomGuest | undefined> {
	const row = await knex('room_guests').select('id', 'email', 'name', 'password_hash').where({ id }).first();
	return row && { id: row.id, email: row.email, name: row.name, hasPassword: row.password_hash !== null };
}

export async function getGuestCredentials(email: string, knex: Knex = db()) {
	return knex('room_guests').select('id', 'email', 'name', 'password_hash').whereRaw('lower(email) = ?', [normaliseEmail(email)]).first<
		{ id: string; email: string; name: string; password_hash: string | null } | undefined
	>();
}

export async function setGuestPassword(guestId: string, passwordHash: string, name: string | null, knex: Knex = db()): Promise<void> {
	await knex('room_guests').where({ id: guestId }).update({ password_hash: passwordHash, ...(name ? { name: name.trim() } : {}) });
}

/** Grants (or renews) a guest's access to a room until `expiresAt`, clearing an earlier revocation. */
export async function grantRoomAccess(roomId: string, guestId: string, expiresAt: Date, invitedBy: string, knex: Knex = db()): Promise<void> {
	await knex('room_guest_access')
		.insert({ room_id: roomId, guest_id: guestId, expires_at: expiresAt, invited_by: invitedBy })
		.onConflict(['room_id', 'guest_id'])
		.merge({ expires_at: expiresAt, revoked_at: null, invited_by: invitedBy, invited_at: knex.fn.now() });
}

/** Ends a guest's access to a room, and spends the links sent for it, so an old invitation opens nothing. */
export async function revokeRoomAccess(roomId: string, guestId: string, knex: Knex = db()): Promise<boolean> {
	return knex.transaction(async (trx) => {
		const revoked = await trx('room_guest_access').where({ room_id: roomId, guest_id: guestId }).whereNull('revoked_at').update({ revoked_at: trx.fn.now() });
		await trx('room_guest_links').where({ room_id: roomId, guest_id: guestId }).whereNull('used_at').update({ used_at: trx.fn.now() });
		return revoked > 0;
	});
}

export interface GuestAccessRow {
	roomId: string;
	expiresAt: Date;
	revokedAt: Date | null;
}

export async function getRoomAccess(roomId: string, guestId: string, knex: Knex = db()): Promise<GuestAccessRow | undefined> {
	const row = await knex('room_guest_access').select('room_id', 'expires_at', 'revoked_at').where({ room_id: roomId, guest_id: guestId }).first();
	return row && { roomId: row.room_id, expiresAt: row.expires_at, revokedAt: row.revoked_at };
}

/** The rooms a guest may open now, with their names and projects. */
export async function listRoomsOfGuest(guestId: string, knex: Knex = db()) {
	return knex('room_guest_access')
		.join('data_rooms', 'data_rooms.id', 'room_guest_access.room_id')
		.join('projects', 'projects.id', 'data_rooms.project_id')
		.join('workspaces', 'workspaces.id', 'data_rooms.workspace_id')
		.select('data_rooms.id', 'data_rooms.name', 'projects.name as project_name', 'workspaces.name as workspace_name', 'room_guest_access.expires_at')
		.where('room_guest_access.guest_id', guestId)
		.whereNull('room_guest_access.revoked_at')
		.where('room_guest_access.expires_at', '>', knex.fn.now())
		.orderBy('data_rooms.name') as Promise<{ id: string; name: string; project_name: string; workspace_name: string; expires_at: Date }[]>;
}

export async function listGuestsOfRoom(roomId: string, knex: Knex = db()) {
	const rows = await knex('room_guest_access')
		.join('room_guests', 'room_guests.id', 'room_guest_access.guest_id')
		.select('room_guests.id', 'room_guests.email', 'room_guests.name', 'room_guest_access.expires_at', 'room_guest_access.revoked_at', 'room_guest_access.invited_at')
		.select(
			knex.raw(`(select max(t.terms_version) from room_terms_acceptances t where t.room_id = room_guest_access.room_id and t.guest_id = room_guests.id) as accepted_terms_version`),
			knex.raw(`(select max(e.at) from room_access_events e where e.room_id = room_guest_access.room_id and e.guest_id = room_guests.id) as last_visit`),
			knex.raw(`(select e.version from room_access_events e where e.room_id = room_guest_access.room_id and e.guest_id = room_guests.id and e.version is not null order by e.at desc limit 1) as last_version_seen`)
		)
		.where('room_guest_access.room_id', roomId)
		.orderBy('room_guests.email');
	return rows.map((r) => ({
		guestId: r.id as string,
		email: r.email as string,
		name: r.name as string,
		expiresAt: r.expires_at as Date,
		revokedAt: r.revoked_at as Date | null,
		invitedAt: r.invited_at as Date,
		acceptedTermsVersion: (r.accepted_terms_version as number | null) ?? null,
		lastVisit: (r.last_visit as Date | null) ?? null,
		lastVersionSeen: (r.last_version_seen as number | null) ?? null
	}));
}

export async function insertGuestLink(input: { tokenHash: string; guestId: string; roomId: string; purpose: 'invitation' | 'sign-in'; expiresAt: Date }, knex: Knex = db()) {
	await knex('room_guest_links').insert({ token_hash: input.tokenHash, guest_id: input.guestId, room_id: input.roomId, purpose: input.purpose, expires_at: input.expiresAt });
}

export async function getGuestLink(tokenHash: string, knex: Knex = db()) {
	return knex('room_guest_links').select('*').where({ token_hash: tokenHash }).first<
		{ token_hash: string; guest_id: string; room_id: string; purpose: 'invitation' | 'sign-in'; expires_at: Date; used_at: Date | null } | undefined
	>();
}

/** Spends a link once: false when it was already used or has expired. */
export async function spendGuestLink(tokenHash: string, knex: Knex = db()): Promise<boolean> {
	return (await knex('room_guest_links').where({ token_hash: tokenHash }).whereNull('used_at').where('expires_at', '>', knex.fn.now()).update({ used_at: knex.fn.now() })) > 0;
}

export async function hasAcceptedTerms(roomId: string, guestId: string, termsVersion: number, knex: Knex = db()): Promise<boolean> {
	return (await knex('room_terms_acceptances').select('room_id').where({ room_id: roomId, guest_id: guestId, terms_version: termsVersion }).first()) !== undefined;
}

export async function recordTermsAcceptance(roomId: string, guestId: string, termsVersion: number, ip: string, knex: Knex = db()): Promise<void> {
	await knex('room_terms_acceptances').insert({ room_id: roomId, guest_id: guestId, terms_version: termsVersion, ip }).onConflict(['room_id', 'guest_id', 'terms_version']).ignore();
}

export type RoomEventKind = 'room-view' | 'scenario-view' | 'document-view' | 'document-download' | 'pdf-download';

export async function recordRoomEvent(
	input: { roomId: string; version: number | null; guestId?: string | null; userId?: string | null; kind: RoomEventKind; targetId?: string | null; targetName?: string },
	knex: Knex = db()
): Promise<void> {
	await knex('room_access_events').insert({
		room_id: input.roomId,
		version: input.version,
		guest_id: input.guestId ?? null,
		user_id: input.userId ?? null,
		kind: input.kind,
		target_id: input.targetId ?? null,
		target_name: input.targetName ?? ''
	});
}

export interface RoomEventFilter {
	guestId?: string;
	kind?: RoomEventKind;
	limit?: number;
}

export async function listRoomEvents(roomId: string, filter: RoomEventFilter = {}, knex: Knex = db()) {
	const query = knex('room_access_events')
		.leftJoin('room_guests', 'room_guests.id', 'room_access_events.guest_id')
		.leftJoin('users', 'users.id', 'room_access_events.user_id')
		.select('room_access_events.*', 'room_guests.email as guest_email', 'users.email as user_email')
		.where('room_access_events.room_id', roomId)
		.orderBy('room_access_events.at', 'desc')
		.orderBy('room_access_events.id', 'desc')
		.limit(filter.limit ?? 1000);
	if (filter.guestId) query.where('room_access_events.guest_id', filter.guestId);
	if (filter.kind) query.where('room_access_events.kind', filter.kind);
	const rows = await query;
	return rows.map((r) => ({
		at: r.at as Date,
		kind: r.kind as RoomEventKind,
		version: (r.version as number | null) ?? null,
		who: ((r.guest_email ?? r.user_email) as string | null) ?? 'someone no longer known',
		byTeam: r.user_id !== null,
		guestId: (r.guest_id as string | null) ?? null,
		targetName: r.target_name as string
	}));
}

/** Per investor: the last event, how many, and the distinct things opened (most recently opened first). Team members' own visits are left out. */
export interface InvestorSummary {
	guestId: string;
	who: string;
	lastVisit: Date;
	events: number;
	opened: string[];
}

/** The investor summary of a room's whole log, counted in PostgreSQL (no cap on the events read). */
export async function summariseInvestorVisits(roomId: string, knex: Knex = db()): Promise<InvestorSummary[]> {
	const [visits, opened] = await Promise.all([
		knex('room_access_events')
			.join('room_guests', 'room_guests.id', 'room_access_events.guest_id')
			.where('room_access_events.room_id', roomId)
			.groupBy('room_guests.id', 'room_guests.email')
			.select('room_guests.id as guest_id', 'room_guests.email')
			.max('room_access_events.at as last_visit')
			.count('* as events')
			.orderBy('last_visit', 'desc'),
		knex('room_access_events')
			.where('room_id', roomId)
			.whereNotNull('guest_id')
			.whereNot('kind', 'room-view')
			.whereNot('target_name', '')
			.groupBy('guest_id', 'target_name')
			.select('guest_id', 'target_name')
			.max('at as last_opened')
			.orderBy('last_opened', 'desc')
	]);
	const openedBy = new Map<string, string[]>();
	for (const row of opened) openedBy.set(row.guest_id, [...(openedBy.get(row.guest_id) ?? []), row.target_name]);
	return visits.map((v) => ({
		guestId: v.guest_id as string,
		who: v.email as string,
		lastVisit: v.last_visit as Date,
		events: Number(v.events),
		opened: openedBy.get(v.guest_id as string) ?? []
	}));
}

export interface RoomQuestion {
	id: string;
	guestId: string;
	askedBy: string;
	question: string;
	askedAt: Date;
	answer: string | null;
	visibility: 'asker' | 'all' | null;
	answeredAt: Date | null;
}

export async function insertQuestion(roomId: string, guestId: string, question: string, knex: Knex = db()): Promise<string> {
	const [row] = await knex('room_questions').insert({ room_id: roomId, guest_id: guestId, question }).returning(['id']);
	return row.id;
}

export async function listQuestions(roomId: string, knex: Knex = db()): Promise<RoomQuestion[]> {
	const rows = await knex('room_questions')
		.join('room_guests', 'room_guests.id', 'room_questions.guest_id')
		.select('room_questions.*', 'room_guests.email')
		.where('room_questions.room_id', roomId)
		.orderBy('asked_at', 'desc');
	return rows.map((r) => ({
		id: r.id,
		guestId: r.guest_id,
		askedBy: r.email,
		question: r.question,
		askedAt: r.asked_at,
		answer: r.answer,
		visibility: r.visibility,
		answeredAt: r.answered_at
	}));
}

export async function answerQuestion(roomId: string, questionId: string, answer: string, visibility: 'asker' | 'all', userId: string, knex: Knex = db()) {
	const [row] = await knex('room_questions')
		.where({ room_id: roomId, id: questionId })
		.update({ answer, visibility, answered_by: userId, answered_at: knex.fn.now() })
		.returning(['guest_id', 'question']);
	return row as { guest_id: string; question: string } | undefined;
}
