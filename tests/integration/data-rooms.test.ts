/**
 * Investor data rooms against a real PostgreSQL and the local mail sink:
 * frozen versions, the publish refusals, the plan gates, the guests' door
 * (invitation link, password, terms, expiry, revocation), documents, the
 * access log and questions. The team's steps go through `authorize` with a
 * signed-in member, as the room pages do; the guests' through `guestRoom`
 * with the principal `hooks.server.ts` would have made from their cookie.
 */
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { crc32, deflateSync } from 'node:zlib';
import ExcelJS from 'exceljs';
import { isHttpError, isRedirect, type RequestEvent } from '@sveltejs/kit';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { setAppEnv } from '../helpers/app-env';
import { startTestMailSink, tokenFromMessage, type TestMailSink } from '../helpers/mail-sink';
import { newWorkspaceOf } from '../helpers/people';
import { memberEvent } from '../helpers/route-event';
import { authorize } from '../../src/lib/server/auth/access';
import type { GuestPrincipal } from '../../src/lib/server/auth/principal';
import type { SessionUser } from '../../src/lib/server/auth/session';
import { PlanRefusal } from '../../src/lib/server/billing/gates';
import { planAllows } from '../../src/lib/billing/plans';
import { parseScenario, type Scenario } from '../../src/lib/schemas/scenario';
import { createProject, type ProjectRow } from '../../src/lib/server/db/projects';
import { archiveScenario, createScenario, saveScenario, type ScenarioRecord } from '../../src/lib/server/db/scenarios';
import { getStoredResult } from '../../src/lib/server/db/scenario-results';
import {
	getRoomDocument,
	getRoomVersion,
	grantRoomAccess,
	insertQuestion,
	listRoomEvents,
	listRoomVersions,
	recordRoomEvent,
	recordTermsAcceptance,
	summariseInvestorVisits,
	updateRoomTerms,
	upsertGuest,
	type RoomEventKind
} from '../../src/lib/server/db/rooms';
import { evaluateScenario } from '../../src/lib/server/engine/evaluate';
import { ENGINE_VERSION } from '../../src/lib/server/engine/version';
import { resultOfSavedScenario } from '../../src/lib/server/workbench/stored-results';
import { logCsv } from '../../src/lib/server/rooms/access-log';
import { NO_ROOM, ROOM_CLOSED, guestRoom } from '../../src/lib/server/rooms/guest-access';
import { validateGuestSession } from '../../src/lib/server/rooms/guest-sessions';
import { enterByLink, requestSignInLink, signInGuest, viewGuestLink } from '../../src/lib/server/rooms/guest-sign-in';
import { PublishProblem, buildSnapshot } from '../../src/lib/server/rooms/snapshot';
import { latestDoneRuns } from '../../src/lib/server/rooms/publishable-runs';
import { roomSummaryInput } from '../../src/lib/server/rooms/room-pdf';
import { snapshotScenarioView } from '../../src/lib/server/rooms/views';
import { handMadeInput, handMadeSummary } from '../fixtures/probabilistic-run';
import { RoomProblem, answerRoomQuestion, attachDocument, changeTerms, createRoomForProject, inviteGuest, publishVersion, questionsForGuest, removeDocument, revokeGuest } from '../../src/lib/server/rooms/team';

const ORIGIN = 'http://127.0.0.1:9';
const GOOD_PASSWORD = 'kelp-lantern-harbour-58';
const DAY_MS = 24 * 60 * 60 * 1000;

let database: TestDatabase;
let sink: TestMailSink;
let counter = 0;
let kestle: Scenario;

beforeAll(async () => {
	database = await createTestDatabase();
	setAppEnv({ DATABASE_URL: database.url });
	sink = await startTestMailSink();
	const parsed = parseScenario(JSON.parse(readFileSync('examples/tidal-stream-kestle-narrows.json', 'utf8')));
	if (!parsed.ok) throw new Error('the Kestle Narrows example should parse');
	kestle = parsed.scenario;
});
afterAll(async () => {
	await sink?.stop();
	await database?.drop();
});

function next(): number {
	counter += 1;
	return counter;
}

// ---------------------------------------------------------------------------
// The team's side

interface Team {
	owner: SessionUser;
	workspaceId: string;
	project: ProjectRow;
}

async function setPlan(workspaceId: string, plan: 'free' | 'team', status: 'active' | 'lapsed') {
	await database.knex('workspaces').where({ id: workspaceId }).update({ plan, plan_status: status });
}

/** A workspace with a tidal project; on the Team plan, paid up, unless told otherwise. */
async function newTeam(plan: 'free' | 'team' = 'team'): Promise<Team> {
	const { owner, workspaceId } = await newWorkspaceOf(database.knex);
	if (plan === 'team') await setPlan(workspaceId, 'team', 'active');
	const project = await createProject({ workspaceId, name: `Kestle Narrows ${next()}`, technology: 'tidal-stream', siteName: 'Kestle Narrows' }, database.knex);
	return { owner, workspaceId, project };
}

async function anotherProject(team: Team): Promise<ProjectRow> {
	return createProject({ workspaceId: team.workspaceId, name: `Orrin Sound ${next()}`, technology: 'tidal-stream' }, database.knex);
}

/**
 * Stores a saved revision's result as the save routes do (storeResultOfSave),
 * with the engine run here rather than on a worker thread.
 */
async function storeResult(scenario: ScenarioRecord) {
	return (await resultOfSavedScenario(scenario, { technology: 'tidal-stream' }, { evaluate: evaluateScenario })).result;
}

async function newScenario(project: ProjectRow, name = `Base case ${next()}`, document: Scenario = kestle): Promise<ScenarioRecord> {
	const scenario = await createScenario({ projectId: project.id, name, document, userId: null }, database.knex);
	await storeResult(scenario);
	return scenario;
}

/** What a room page's POST action gets from `authorize` (memberships read afresh, as for any action). */
function teamEvent(user: SessionUser) {
	return memberEvent(user, { method: 'POST', path: '/app/rooms', params: {} });
}

function projectAccess(team: Team, project = team.project) {
	return authorize(teamEvent(team.owner), { workspaceId: team.workspaceId, projectId: project.id }, 'analyst');
}

function roomAccess(team: Team, roomId: string) {
	return authorize(teamEvent(team.owner), { workspaceId: team.workspaceId, roomId }, 'analyst');
}

async function newRoom(team: Team, project = team.project) {
	return createRoomForProject(await projectAccess(team, project), { name: `Investor room ${next()}`, terms: '' });
}

async function count(table: string, where: Record<string, unknown> = {}): Promise<number> {
	const [{ n }] = await database.knex(table).where(where).count<{ n: string }[]>({ n: '*' });
	return Number(n);
}

async function thrown(work: () => Promise<unknown>): Promise<unknown> {
	try {
		await work();
	} catch (e) {
		return e;
	}
	throw new Error('expected a refusal, but the call went through');
}

/** Key order as PostgreSQL's jsonb keeps it is not the writer's: compare the same value written with sorted keys. */
function canonicalJson(value: unknown): string {
	return JSON.stringify(value, (_key, v: unknown) =>
		v !== null && typeof v === 'object' && !Array.isArray(v) ? Object.fromEntries(Object.entries(v as Record<string, unknown>).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))) : v
	);
}

async function storedSnapshotText(roomId: string, version: number): Promise<string> {
	const row = await database.knex('data_room_versions').select(database.knex.raw('snapshot::text as text')).where({ room_id: roomId, version }).first();
	return row.text as string;
}

// ---------------------------------------------------------------------------
// The guests' side

type GuestEvent = Pick<RequestEvent, 'locals' | 'url'>;

function guestEvent(principal: GuestPrincipal | null, path: string): GuestEvent {
	return { locals: { principal: principal ?? { kind: 'anonymous' } }, url: new URL(path, 'http://127.0.0.1') } as unknown as GuestEvent;
}

/** The principal `hooks.server.ts` makes from a guest's cookie. */
async function guestPrincipal(sessionToken: string): Promise<GuestPrincipal> {
	const validated = await validateGuestSession(sessionToken);
	if (!validated) throw new Error('the guest session should be valid');
	return { kind: 'guest', guest: { id: validated.guest.id, email: validated.guest.email, name: validated.guest.name }, session: validated.session };
}

/** What `guestRoom` answered: 'passes', an HTTP status, or a redirect's status and address. */
async function door(principal: GuestPrincipal | null, roomId: string, options: { termsPage?: boolean } = {}): Promise<'passes' | number | string> {
	try {
		await guestRoom(guestEvent(principal, `/rooms/${roomId}`), roomId, options);
		return 'passes';
	} catch (e) {
		if (isHttpError(e)) return e.status;
		if (isRedirect(e)) return `${e.status} ${e.location}`;
		throw e;
	}
}

function guestAddress(): string {
	return `investor-${next()}@fund.example`;
}

function inAMonth(): Date {
	return new Date(Date.now() + 30 * DAY_MS);
}

async function invitationToken(email: string, roomName: string): Promise<string> {
	const messages = (await sink.messagesTo(email)).filter((m) => m.subject.includes(roomName));
	expect(messages).toHaveLength(1);
	return tokenFromMessage(messages[0], `${ORIGIN}/rooms/join`);
}

/** Invites a new investor, who follows the mailed link, chooses a password and accepts the terms. */
async function investorIn(team: Team, room: { id: string; name: string }, email = guestAddress()) {
	await inviteGuest(await roomAccess(team, room.id), { email, name: 'Ilse Marrow', accessUntil: inAMonth(), origin: ORIGIN });
	const entry = await enterByLink(await invitationToken(email, room.name), { password: GOOD_PASSWORD });
	if (!entry.ok) throw new Error(entry.message);
	const principal = await guestPrincipal(entry.token);
	await acceptTerms(room.id, principal);
	return { email, principal, sessionToken: entry.token };
}

async function acceptTerms(roomId: string, principal: GuestPrincipal) {
	const { terms_version } = await database.knex('data_rooms').select('terms_version').where({ id: roomId }).first();
	await recordTermsAcceptance(roomId, principal.guest.id, terms_version, '10.9.0.1');
}

// ---------------------------------------------------------------------------
// Small real files

/** A 2x2 RGB PNG (W3C PNG specification, 5.2-5.6: signature, IHDR, IDAT, IEND, each chunk with its CRC-32). */
function smallPng(): Uint8Array {
	const chunk = (type: string, data: Buffer) => {
		const length = Buffer.alloc(4);
		length.writeUInt32BE(data.length);
		const typed = Buffer.concat([Buffer.from(type, 'latin1'), data]);
		const crc = Buffer.alloc(4);
		crc.writeUInt32BE(crc32(typed));
		return Buffer.concat([length, typed, crc]);
	};
	const header = Buffer.alloc(13);
	header.writeUInt32BE(2, 0);
	header.writeUInt32BE(2, 4);
	header.set([8, 2, 0, 0, 0], 8); // 8 bits, truecolour, deflate, no filter method variant, no interlace
	// Two scanlines, each a filter byte (0) and two RGB pixels: sea blue and sand.
	const pixels = Buffer.from([0, 20, 80, 140, 230, 210, 160, 0, 230, 210, 160, 20, 80, 140]);
	const signature = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
	return new Uint8Array(Buffer.concat([signature, chunk('IHDR', header), chunk('IDAT', deflateSync(pixels)), chunk('IEND', Buffer.alloc(0))]));
}

async function smallXlsx(): Promise<Uint8Array> {
	const workbook = new ExcelJS.Workbook();
	workbook.addWorksheet('Yield').addRows([
		['Year', 'Net energy (MWh)'],
		[1, 41250],
		[2, 41040]
	]);
	return new Uint8Array((await workbook.xlsx.writeBuffer()) as ArrayBuffer);
}

const sha256Of = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');

// ---------------------------------------------------------------------------

describe('publishVersion: frozen snapshots', () => {
	it('keeps version 1 as it was frozen after the scenario and its stored result change; version 2 has the new figures', async () => {
		const team = await newTeam();
		const scenario = await newScenario(team.project);
		const room = await newRoom(team);
		const oldLcoe = (await getStoredResult(scenario.id, 1, ENGINE_VERSION, database.knex))!.result.metrics.lcoeReal;
		expect(oldLcoe).not.toBeNull();

		const frozen = await buildSnapshot(team.project, [scenario.id]);
		expect(await publishVersion(await roomAccess(team, room.id), [scenario.id])).toBe(1);
		const textAtPublish = await storedSnapshotText(room.id, 1);
		expect(canonicalJson((await getRoomVersion(room.id, 1))!.snapshot)).toBe(canonicalJson(frozen));

		// A higher capex saved as revision 2 through the function the save route uses, and its result stored.
		const turbines = kestle.capex.lines[0];
		const document: Scenario = { ...kestle, capex: { ...kestle.capex, lines: [{ ...turbines, amount: turbines.amount * 1.5 }, ...kestle.capex.lines.slice(1)] } };
		const saved = (await saveScenario({ scenarioId: scenario.id, expectedRevision: 1, document, userId: team.owner.id }, database.knex))!;
		expect(saved.revision).toBe(2);
		const newLcoe = (await storeResult(saved)).metrics.lcoeReal!;
		expect(Number(newLcoe)).toBeGreaterThan(Number(oldLcoe));
		// And the store's result of revision 1 rewritten too (as a re-evaluation would): the room must not read it.
		await database
			.knex('scenario_results')
			.where({ scenario_id: scenario.id, revision: 1 })
			.update({ result: database.knex.raw(`jsonb_set(result, '{metrics,lcoeReal}', '"1.23"')`) });

		const first = (await getRoomVersion(room.id, 1))!;
		const [frozenScenario] = first.snapshot.scenarios;
		expect(frozenScenario.revision).toBe(1);
		expect(frozenScenario.document.capex.lines[0].amount).toBe(turbines.amount);
		expect(frozenScenario.result.metrics.lcoeReal).toBe(oldLcoe);
		expect(await storedSnapshotText(room.id, 1)).toBe(textAtPublish);
		expect(canonicalJson(first.snapshot)).toBe(canonicalJson(frozen));

		expect(await publishVersion(await roomAccess(team, room.id), [scenario.id])).toBe(2);
		const [republished] = (await getRoomVersion(room.id, 2))!.snapshot.scenarios;
		expect(republished.revision).toBe(2);
		expect(republished.document.capex.lines[0].amount).toBe(turbines.amount * 1.5);
		expect(republished.result.metrics.lcoeReal).toBe(newLcoe);
		expect((await getRoomVersion(room.id, 'latest'))!.version).toBe(2);
		expect((await listRoomVersions(room.id)).map((v) => v.version)).toEqual([2, 1]);
	});

	it('numbers five publications at once 1 to 5: distinct, consecutive, no gaps', async () => {
		const team = await newTeam();
		const scenario = await newScenario(team.project);
		const room = await newRoom(team);
		const access = await roomAccess(team, room.id);
		const numbers = await Promise.all(Array.from({ length: 5 }, () => publishVersion(access, [scenario.id])));
		expect([...numbers].sort((a, b) => a - b)).toEqual([1, 2, 3, 4, 5]);
		expect((await listRoomVersions(room.id)).map((v) => v.version)).toEqual([5, 4, 3, 2, 1]);
	});

	it('freezes several scenarios in the order chosen, each once', async () => {
		const team = await newTeam();
		const base = await newScenario(team.project, 'Base case');
		const low = await newScenario(team.project, 'Low availability', { ...kestle, array: { ...kestle.array, availability: 0.8 } });
		const room = await newRoom(team);
		await publishVersion(await roomAccess(team, room.id), [low.id, base.id, low.id]);
		const { snapshot } = (await getRoomVersion(room.id, 1))!;
		expect(snapshot.scenarios.map((s) => s.name)).toEqual(['Low availability', 'Base case']);
		expect(Number(snapshot.scenarios[0].result.metrics.netAepMWh)).toBeLessThan(Number(snapshot.scenarios[1].result.metrics.netAepMWh));
	});
});

/**
 * A probabilistic run row as a worker leaves it, written straight into the
 * table (migrations/20261208000001_probabilistic_runs.ts): done with the
 * hand-made summary and a finishing time, or still running.
 */
async function insertRunRow(team: Team, scenario: { id: string }, revision: number, state: 'done' | 'running', finishedAt: Date | null): Promise<string> {
	const input = handMadeInput();
	const done = state === 'done';
	const [row] = await database
		.knex('probabilistic_runs')
		.insert({
			workspace_id: team.workspaceId,
			project_id: team.project.id,
			scenario_id: scenario.id,
			scenario_revision: revision,
			engine_version: ENGINE_VERSION,
			input: JSON.stringify(input),
			seed: input.seed,
			draws: input.draws,
			chunk_size: 50,
			state,
			draws_done: done ? input.draws : 0,
			summary: done ? JSON.stringify(handMadeSummary()) : null,
			started_at: new Date(Date.now() - 3_600_000),
			finished_at: finishedAt
		})
		.returning('id');
	return row.id as string;
}

describe('publishVersion: a probabilistic run', () => {
	it("freezes the latest finished run of the published revision with its summary and inputs; the room page and its PDF read it back; older versions read on without one", async () => {
		const team = await newTeam();
		const scenario = await newScenario(team.project, 'Lender base case');
		const plain = await newScenario(team.project, 'No run here');
		const room = await newRoom(team);
		const access = await roomAccess(team, room.id);
		// Version 1, before any run: no run in its snapshot.
		expect(await publishVersion(access, [scenario.id])).toBe(1);

		// A run of revision 1, then revision 2 saved with two finished runs and one still running.
		const hour = 3_600_000;
		await insertRunRow(team, scenario, 1, 'done', new Date(Date.now() - hour / 4));
		const saved = (await saveScenario({ scenarioId: scenario.id, expectedRevision: 1, notes: 'After the lenders’ review.', userId: team.owner.id }, database.knex))!;
		expect(saved.revision).toBe(2);
		await storeResult(saved);
		// The latest to finish is not the latest made: "latest" goes by finishing time.
		const latest = await insertRunRow(team, scenario, 2, 'done', new Date(Date.now() - hour / 3));
		await insertRunRow(team, scenario, 2, 'done', new Date(Date.now() - hour / 2));
		await insertRunRow(team, scenario, 2, 'running', null);

		// What the publish page offers: the latest finished run of each scenario's saved revision, none for the other.
		const offered = await latestDoneRuns([{ id: scenario.id, revision: 2 }, { id: plain.id, revision: 1 }], database.knex);
		expect([...offered.keys()]).toEqual([scenario.id]);
		expect(offered.get(scenario.id)).toMatchObject({ id: latest, scenarioRevision: 2, draws: 100 });

		// A run asked for a scenario with none is refused in words, writing nothing.
		const refusal = await thrown(() => publishVersion(access, [scenario.id, plain.id], { withRunOf: [plain.id] }));
		expect(refusal).toBeInstanceOf(PublishProblem);
		expect((refusal as Error).message).toBe('No run here has no finished probabilistic run of revision 1: reload the page and choose again.');
		expect(await count('data_room_versions', { room_id: room.id })).toBe(1);

		expect(await publishVersion(access, [scenario.id, plain.id], { withRunOf: [scenario.id] })).toBe(2);
		const version = (await getRoomVersion(room.id, 2))!;
		const [withRun, without] = version.snapshot.scenarios;
		const input = handMadeInput();
		expect(withRun.revision).toBe(2);
		expect(withRun.probabilisticRun).toMatchObject({
			runId: latest,
			seed: input.seed,
			draws: input.draws,
			engineVersion: ENGINE_VERSION,
			energyUncertainty: true,
			hurdleRate: input.hurdleRate,
			correlations: input.correlations
		});
		expect(withRun.probabilisticRun!.drivers.map((d) => [d.driver, d.label, d.distribution])).toEqual([
			['capex', 'Capex', input.drivers[0].distribution],
			['opex', 'Opex', input.drivers[1].distribution]
		]);
		expect(new Date(withRun.probabilisticRun!.finishedAt).getTime()).toBe(offered.get(scenario.id)!.finishedAt.getTime());
		expect(withRun.probabilisticRun!.summary).toEqual(handMadeSummary());
		expect(without.probabilisticRun).toBeUndefined();

		// The room page's view and the room PDF's input carry it, with the method note on runs.
		expect(snapshotScenarioView(version, 1).scenario.probabilisticRun).toEqual(withRun.probabilisticRun);
		expect(snapshotScenarioView(version, 2).scenario.probabilisticRun).toBeNull();
		const pdfInput = roomSummaryInput(room.name, version, 1, null);
		expect(pdfInput.run).toEqual(withRun.probabilisticRun);
		expect(pdfInput.methodNotes.map((n) => n.slug)).toContain('probabilistic-runs');
		expect(roomSummaryInput(room.name, version, 2, null).methodNotes.map((n) => n.slug)).not.toContain('probabilistic-runs');

		// Version 1, frozen before runs could be published, reads on without one.
		const first = (await getRoomVersion(room.id, 1))!;
		expect(snapshotScenarioView(first, 1).scenario.probabilisticRun).toBeNull();
		expect(roomSummaryInput(room.name, first, 1, null).run).toBeNull();
	});
});

describe('publishVersion: refusals', () => {
	it('refuses no scenario, a scenario of another project and an archived scenario, in words, writing nothing', async () => {
		const team = await newTeam();
		const live = await newScenario(team.project);
		const elsewhere = await newScenario(await anotherProject(team));
		const archived = await newScenario(team.project, 'Withdrawn case');
		await archiveScenario(archived.id, team.owner.id, database.knex);
		const room = await newRoom(team);
		const access = await roomAccess(team, room.id);

		const none = await thrown(() => publishVersion(access, []));
		expect(none).toBeInstanceOf(PublishProblem);
		expect((none as Error).message).toBe('Choose at least one scenario to publish.');
		for (const ids of [[elsewhere.id], [live.id, elsewhere.id], [archived.id], [live.id, archived.id]]) {
			const refusal = await thrown(() => publishVersion(access, ids));
			expect(refusal).toBeInstanceOf(PublishProblem);
			expect((refusal as Error).message).toMatch(/not live scenarios of this project/);
		}
		expect(await count('data_room_versions', { room_id: room.id })).toBe(0);
		// The same room still publishes the live scenario alone.
		expect(await publishVersion(access, [live.id])).toBe(1);
	});
});

describe('plan gates', () => {
	it('refuses a room on the free plan with a 402 and the billing page, creating nothing', async () => {
		const team = await newTeam('free');
		const access = await projectAccess(team);
		const refusal = await thrown(() => createRoomForProject(access, { name: 'Investors', terms: '' }));
		expect(refusal).toBeInstanceOf(PlanRefusal);
		expect(refusal).toMatchObject({ status: 402, details: { billingUrl: `/app/w/${team.workspaceId}/billing` } });
		expect((refusal as Error).message).toMatch(/Team or Practice plan/);
		expect(await count('data_rooms', { workspace_id: team.workspaceId })).toBe(0);
	});

	it('on a lapsed plan refuses publishing and inviting, lets the team read, closes the room to investors; paying reopens it', async () => {
		const team = await newTeam();
		const scenario = await newScenario(team.project);
		const room = await newRoom(team);
		await publishVersion(await roomAccess(team, room.id), [scenario.id]);
		const investor = await investorIn(team, room);
		expect(await door(investor.principal, room.id)).toBe('passes');

		await setPlan(team.workspaceId, 'team', 'lapsed');
		const lapsed = await roomAccess(team, room.id);
		const publishRefusal = await thrown(() => publishVersion(lapsed, [scenario.id]));
		expect(publishRefusal).toBeInstanceOf(PlanRefusal);
		expect(publishRefusal).toMatchObject({ status: 402, details: { billingUrl: `/app/w/${team.workspaceId}/billing` } });
		expect((publishRefusal as Error).message).toMatch(/read-only/);
		const newcomer = guestAddress();
		const inviteRefusal = await thrown(() => inviteGuest(lapsed, { email: newcomer, name: 'Oren Dask', accessUntil: inAMonth(), origin: ORIGIN }));
		expect(inviteRefusal).toBeInstanceOf(PlanRefusal);
		expect(await count('data_room_versions', { room_id: room.id })).toBe(1);
		expect(await count('room_guests', { email: newcomer })).toBe(0);
		expect(await sink.messagesTo(newcomer)).toHaveLength(0);
		// Changing the terms or taking a document out are changes too; taking access away is not gated.
		const termsBefore = (await database.knex('data_rooms').where({ id: room.id }).first()).terms;
		expect(await thrown(() => changeTerms(lapsed, 'Changed terms that investors would have to accept again.'))).toBeInstanceOf(PlanRefusal);
		expect((await database.knex('data_rooms').where({ id: room.id }).first()).terms).toBe(termsBefore);
		expect(await thrown(() => removeDocument(lapsed, scenario.id))).toBeInstanceOf(PlanRefusal);

		expect(planAllows(lapsed.membership, 'dataRooms', 'read')).toEqual({ allowed: true });
		expect((await getRoomVersion(room.id, 1))!.snapshot.scenarios[0].id).toBe(scenario.id);
		expect(await door(investor.principal, room.id)).toBe(403);
		await expect(guestRoom(guestEvent(investor.principal, `/rooms/${room.id}`), room.id)).rejects.toMatchObject({ body: { message: ROOM_CLOSED } });

		await setPlan(team.workspaceId, 'team', 'active');
		expect(await door(investor.principal, room.id)).toBe('passes');
		expect(await publishVersion(await roomAccess(team, room.id), [scenario.id])).toBe(2);
	});
});

describe('guests: invitation, password, terms and the door', () => {
	it('mails an invitation link that asks for a password once, then signs the guest in', async () => {
		const team = await newTeam();
		const room = await newRoom(team);
		const email = guestAddress();
		await inviteGuest(await roomAccess(team, room.id), { email, name: 'Ilse Marrow', accessUntil: inAMonth(), origin: ORIGIN });
		const [message] = await sink.messagesTo(email);
		expect(message.subject).toContain(room.name);
		expect(message.text).toContain(team.project.name);
		const token = await invitationToken(email, room.name);

		const view = await viewGuestLink(token);
		expect(view).toMatchObject({ status: 'open', purpose: 'invitation', roomId: room.id, guest: { email, hasPassword: false } });

		const weak = await enterByLink(token, { password: 'tide' });
		expect(weak).toEqual({ ok: false, message: 'Use at least 12 characters.' });
		const common = await enterByLink(token, { password: 'password1234' });
		expect(common.ok).toBe(false);
		expect((await viewGuestLink(token)).status).toBe('open');
		expect(await count('guest_sessions', { guest_id: (await upsertGuest(email, '')).id })).toBe(0);

		const entered = await enterByLink(token, { password: GOOD_PASSWORD, name: 'Ilse Marrow' });
		if (!entered.ok) throw new Error(entered.message);
		expect(entered.roomId).toBe(room.id);
		expect((await validateGuestSession(entered.token))!.guest).toMatchObject({ email, hasPassword: true });
		expect((await viewGuestLink(token)).status).toBe('used');
		const again = await enterByLink(token, { password: GOOD_PASSWORD });
		expect(again.ok).toBe(false);
		expect(again.ok === false && again.message).toMatch(/used already/);

		const signedIn = await signInGuest({ email, password: GOOD_PASSWORD, ip: '10.9.1.1' });
		expect(signedIn).toMatchObject({ ok: true, roomId: room.id });
		expect(await validateGuestSession((signedIn as { token: string }).token)).not.toBeNull();
	});

	it('refuses a wrong password and an unknown address with the same words', async () => {
		const team = await newTeam();
		const room = await newRoom(team);
		const { email } = await investorIn(team, room);
		const wrong = await signInGuest({ email, password: 'not-the-right-one-77', ip: '10.9.2.1' });
		const unknown = await signInGuest({ email: `nobody-${next()}@fund.example`, password: GOOD_PASSWORD, ip: '10.9.2.1' });
		expect(wrong.ok).toBe(false);
		expect(unknown).toEqual(wrong);
		expect(wrong.ok === false && wrong.message).not.toMatch(new RegExp(email.replace('.', '\\.'), 'i'));
		// An address invited but without a password yet answers the same.
		const pending = guestAddress();
		await inviteGuest(await roomAccess(team, room.id), { email: pending, name: 'Oren Dask', accessUntil: inAMonth(), origin: ORIGIN });
		expect(await signInGuest({ email: pending, password: GOOD_PASSWORD, ip: '10.9.2.1' })).toEqual(wrong);
	});

	it('lets a guest sign in with the right password more than five times in a quarter hour (only failures count)', async () => {
		const team = await newTeam();
		const room = await newRoom(team);
		const { email } = await investorIn(team, room);
		const outcomes = [];
		for (let i = 0; i < 7; i++) outcomes.push((await signInGuest({ email, password: GOOD_PASSWORD, ip: '10.9.3.1' })).ok);
		expect(outcomes).toEqual([true, true, true, true, true, true, true]);
		// Five failures still stop the sixth attempt, the right password included.
		for (let i = 0; i < 5; i++) expect((await signInGuest({ email, password: `wrong-guess-number-${i}`, ip: '10.9.3.1' })).ok).toBe(false);
		const locked = await signInGuest({ email, password: GOOD_PASSWORD, ip: '10.9.3.1' });
		expect(locked.ok === false && locked.message).toMatch(/^Too many attempts\. Try again in /);
	});

	it('asks for the terms first, again after new terms, and opens only the rooms the guest is invited to', async () => {
		const team = await newTeam();
		const scenario = await newScenario(team.project);
		const room = await newRoom(team);
		const otherRoom = await newRoom(team, await anotherProject(team));
		await publishVersion(await roomAccess(team, room.id), [scenario.id]);
		const email = guestAddress();
		await inviteGuest(await roomAccess(team, room.id), { email, name: 'Ilse Marrow', accessUntil: inAMonth(), origin: ORIGIN });
		const entry = await enterByLink(await invitationToken(email, room.name), { password: GOOD_PASSWORD });
		if (!entry.ok) throw new Error(entry.message);
		const principal = await guestPrincipal(entry.token);

		expect(await door(null, room.id)).toBe(`303 /rooms/signin?next=${encodeURIComponent(`/rooms/${room.id}`)}`);
		expect(await door(principal, otherRoom.id)).toBe(404);
		expect(await door(principal, 'not-a-room')).toBe(404);
		await expect(guestRoom(guestEvent(principal, `/rooms/${otherRoom.id}`), otherRoom.id)).rejects.toMatchObject({ body: { message: NO_ROOM } });

		const termsFirst = `303 /rooms/${room.id}/terms?next=${encodeURIComponent(`/rooms/${room.id}`)}`;
		expect(await door(principal, room.id)).toBe(termsFirst);
		expect(await door(principal, room.id, { termsPage: true })).toBe('passes');
		await acceptTerms(room.id, principal);
		const inside = await guestRoom(guestEvent(principal, `/rooms/${room.id}`), room.id);
		expect(inside.room.id).toBe(room.id);
		expect(inside.version?.version).toBe(1);
		expect(inside.version?.snapshot.scenarios[0].id).toBe(scenario.id);

		await updateRoomTerms(room.id, 'New terms: the figures stay confidential for two years after the room closes.');
		expect(await door(principal, room.id)).toBe(termsFirst);
		await acceptTerms(room.id, principal);
		expect(await door(principal, room.id)).toBe('passes');
		// Still nothing for the room the guest was never invited to, terms or not.
		expect(await door(principal, otherRoom.id)).toBe(404);
	});

	it('closes the room once the access end date has passed', async () => {
		const team = await newTeam();
		const room = await newRoom(team);
		const { principal } = await investorIn(team, room);
		expect(await door(principal, room.id)).toBe('passes');
		await database.knex('room_guest_access').where({ room_id: room.id, guest_id: principal.guest.id }).update({ expires_at: new Date(Date.now() - 1000) });
		expect(await door(principal, room.id)).toBe(404);
	});

	it('refuses an access end date in the past, inviting nobody', async () => {
		const team = await newTeam();
		const room = await newRoom(team);
		const email = guestAddress();
		const access = await roomAccess(team, room.id);
		const refusal = await thrown(() => inviteGuest(access, { email, name: 'Oren Dask', accessUntil: new Date(Date.now() - DAY_MS), origin: ORIGIN }));
		expect(refusal).toBeInstanceOf(RoomProblem);
		expect(refusal).toMatchObject({ field: 'accessUntil' });
		expect(await sink.messagesTo(email)).toHaveLength(0);
		expect(await count('room_guests', { email })).toBe(0);
	});

	it('revokes at once; the guest keeps their session while another room is open and loses it with the last', async () => {
		const team = await newTeam();
		const roomX = await newRoom(team);
		const roomY = await newRoom(team, await anotherProject(team));
		const { email, principal, sessionToken } = await investorIn(team, roomX);
		await inviteGuest(await roomAccess(team, roomY.id), { email, name: 'Ilse Marrow', accessUntil: inAMonth(), origin: ORIGIN });
		await acceptTerms(roomY.id, principal);
		expect(await door(principal, roomX.id)).toBe('passes');
		expect(await door(principal, roomY.id)).toBe('passes');

		expect(await revokeGuest(await roomAccess(team, roomX.id), principal.guest.id)).toBe(true);
		expect(await door(principal, roomX.id)).toBe(404);
		expect(await door(principal, roomY.id)).toBe('passes');
		expect(await validateGuestSession(sessionToken)).not.toBeNull();

		expect(await revokeGuest(await roomAccess(team, roomY.id), principal.guest.id)).toBe(true);
		expect(await validateGuestSession(sessionToken)).toBeNull();
		expect(await count('guest_sessions', { guest_id: principal.guest.id })).toBe(0);
		expect(await revokeGuest(await roomAccess(team, roomY.id), principal.guest.id)).toBe(false);
	});

	it('mails a sign-in link to an invited guest only, answering everyone alike', async () => {
		const team = await newTeam();
		const room = await newRoom(team);
		const { email } = await investorIn(team, room);
		const stranger = `stranger-${next()}@fund.example`;
		const known = await requestSignInLink({ email, origin: ORIGIN });
		const unknown = await requestSignInLink({ email: stranger, origin: ORIGIN });
		expect(known.message).toBe(unknown.message.replace(stranger, email));

		let links: Awaited<ReturnType<TestMailSink['messagesTo']>> = [];
		for (let i = 0; i < 50 && links.length === 0; i++) {
			links = (await sink.messagesTo(email)).filter((m) => m.subject.includes('sign-in link'));
			if (links.length === 0) await new Promise((resolve) => setTimeout(resolve, 100));
		}
		expect(links).toHaveLength(1);
		const token = tokenFromMessage(links[0], `${ORIGIN}/rooms/join`);
		expect(await viewGuestLink(token)).toMatchObject({ status: 'open', purpose: 'sign-in', roomId: room.id, guest: { hasPassword: true } });
		const entered = await enterByLink(token, {});
		expect(entered).toMatchObject({ ok: true, roomId: room.id });
		expect(await sink.messagesTo(stranger)).toHaveLength(0);
	});
});

describe('attachDocument', () => {
	it('stores a PNG and a CSV with the sha256 node:crypto computes, byte for byte', async () => {
		const team = await newTeam();
		const room = await newRoom(team);
		const access = await roomAccess(team, room.id);
		const png = smallPng();
		const csv = new TextEncoder().encode('Year,Net energy (MWh)\r\n1,41250\r\n2,41040\r\n');

		const image = await attachDocument(access, { fileName: 'Kestle site plan.png', bytes: png, folder: 'Site', access: 'view' });
		expect(image).toMatchObject({ kind: 'png', contentType: 'image/png', byteSize: png.length, sha256: sha256Of(png), access: 'view', folder: 'Site' });
		const table = await attachDocument(access, { fileName: 'Yield by year.csv', bytes: csv, folder: 'Yield', access: 'download' });
		expect(table).toMatchObject({ kind: 'csv', byteSize: csv.length, sha256: sha256Of(csv), access: 'download' });

		const stored = (await getRoomDocument(room.id, image.id))!;
		expect(Buffer.compare(stored.content, Buffer.from(png))).toBe(0);
		expect(sha256Of(stored.content)).toBe(image.sha256);
		expect(Buffer.compare((await getRoomDocument(room.id, table.id))!.content, Buffer.from(csv))).toBe(0);
	});

	it('refuses a PNG named .pdf and an XLSX marked view only, naming the file and writing nothing', async () => {
		const team = await newTeam();
		const room = await newRoom(team);
		const access = await roomAccess(team, room.id);
		const before = await count('data_room_documents', { room_id: room.id });

		const renamed = await thrown(() => attachDocument(access, { fileName: 'Kestle site plan.pdf', bytes: smallPng(), folder: '', access: 'view' }));
		expect(renamed).toBeInstanceOf(RoomProblem);
		expect(renamed).toMatchObject({ field: 'file' });
		expect((renamed as Error).message).toContain('Kestle site plan.pdf');
		expect((renamed as Error).message).toMatch(/PNG/);

		const workbook = await smallXlsx();
		const viewOnly = await thrown(() => attachDocument(access, { fileName: 'Yield table.xlsx', bytes: workbook, folder: '', access: 'view' }));
		expect(viewOnly).toBeInstanceOf(RoomProblem);
		expect(viewOnly).toMatchObject({ field: 'access' });
		expect((viewOnly as Error).message).toContain('Yield table.xlsx');
		expect(await count('data_room_documents', { room_id: room.id })).toBe(before);

		// The same workbook as a download is accepted.
		expect(await attachDocument(access, { fileName: 'Yield table.xlsx', bytes: workbook, folder: '', access: 'download' })).toMatchObject({ kind: 'xlsx', sha256: sha256Of(workbook) });
		expect(await count('data_room_documents', { room_id: room.id })).toBe(before + 1);
	});
});

describe('the access log', () => {
	async function event(roomId: string, who: { guestId?: string; userId?: string }, kind: RoomEventKind, targetName: string, at: Date) {
		await recordRoomEvent({ roomId, version: 1, ...who, kind, targetName });
		const { id } = await database.knex('room_access_events').where({ room_id: roomId }).orderBy('id', 'desc').first('id');
		await database.knex('room_access_events').where({ id }).update({ at });
	}

	it('filters by investor and kind, summarises each investor, and writes a CSV with formulas neutralised', async () => {
		const team = await newTeam();
		const room = await newRoom(team);
		const alba = await upsertGuest(guestAddress(), 'Alba Corran');
		const bram = await upsertGuest(guestAddress(), 'Bram Osk');
		for (const guest of [alba, bram]) await grantRoomAccess(room.id, guest.id, inAMonth(), team.owner.id);
		const t = (minutes: number) => new Date(Date.UTC(2027, 2, 4, 9, minutes));
		const formula = "=HYPERLINK(\"http://evil.example\",\"Site plan\")";

		await event(room.id, { guestId: alba.id }, 'room-view', '', t(0));
		await event(room.id, { guestId: alba.id }, 'scenario-view', 'Base case', t(2));
		await event(room.id, { guestId: alba.id }, 'document-view', formula, t(4));
		await event(room.id, { guestId: bram.id }, 'room-view', '', t(10));
		await event(room.id, { guestId: bram.id }, 'document-download', 'Kestle site plan.png', t(12));
		await event(room.id, { userId: team.owner.id }, 'room-view', '', t(20));

		const all = await listRoomEvents(room.id);
		expect(all).toHaveLength(6);
		expect(all[0]).toMatchObject({ byTeam: true, who: team.owner.email, guestId: null });
		const albas = await listRoomEvents(room.id, { guestId: alba.id });
		expect(albas.map((e) => e.kind)).toEqual(['document-view', 'scenario-view', 'room-view']);
		expect(albas.every((e) => e.who === alba.email)).toBe(true);
		expect((await listRoomEvents(room.id, { kind: 'room-view' })).map((e) => e.who)).toEqual([team.owner.email, bram.email, alba.email]);
		expect(await listRoomEvents(room.id, { guestId: bram.id, kind: 'document-download' })).toEqual([expect.objectContaining({ targetName: 'Kestle site plan.png' })]);

		const summary = await summariseInvestorVisits(room.id);
		expect(summary.map((s) => s.guestId)).toEqual([bram.id, alba.id]);
		expect(summary[0]).toMatchObject({ who: bram.email, events: 2, opened: ['Kestle site plan.png'] });
		expect(summary[0].lastVisit.toISOString()).toBe(t(12).toISOString());
		expect(summary[1]).toMatchObject({ who: alba.email, events: 3, opened: [formula, 'Base case'] });
		expect(summary[1].lastVisit.toISOString()).toBe(t(4).toISOString());
		// The summary counts the whole log, past the 1,000 events the table shows.
		await database.knex('room_access_events').insert(Array.from({ length: 1000 }, () => ({ room_id: room.id, version: 1, guest_id: bram.id, kind: 'room-view', target_name: '', at: t(1) })));
		expect((await listRoomEvents(room.id)).length).toBe(1000);
		expect((await summariseInvestorVisits(room.id))[0]).toMatchObject({ guestId: bram.id, events: 1002 });

		const csv = logCsv(all);
		const lines = csv.replace(/^\uFEFF/, '').split('\r\n');
		expect(lines[0]).toBe('Time (UTC),Who,Team member,What,Item,Room version');
		expect(lines.slice(1).filter((l) => l !== '')).toHaveLength(6);
		expect(lines[lines.length - 1]).toBe('');
		const formulaLine = lines.find((l) => l.includes('HYPERLINK'))!;
		expect(formulaLine).toBe(`${t(4).toISOString()},${alba.email},no,Viewed a document,"'=HYPERLINK(""http://evil.example"",""Site plan"")",1`);
		expect(lines.some((l) => /(^|,)"?=/.test(l))).toBe(false);
		expect(lines[1]).toBe(`${t(20).toISOString()},${team.owner.email},yes,Opened the room,,1`);
	});
});

describe('questions', () => {
	it('shows an answer for the asker to the asker only, an answer for all to every guest, and mails the asker', async () => {
		const team = await newTeam();
		const room = await newRoom(team);
		const alba = await investorIn(team, room);
		const bram = await investorIn(team, room);
		const access = await roomAccess(team, room.id);

		const private_ = await insertQuestion(room.id, alba.principal.guest.id, 'What availability does the base case assume for the first two years?');
		expect((await questionsForGuest(room.id, alba.principal.guest.id)).map((q) => q.id)).toEqual([private_]);
		expect(await questionsForGuest(room.id, bram.principal.guest.id)).toEqual([]);

		await answerRoomQuestion(access, { questionId: private_, answer: 'Ninety per cent in years one and two, then ninety-five.', visibility: 'asker', origin: ORIGIN });
		const albaSees = await questionsForGuest(room.id, alba.principal.guest.id);
		expect(albaSees).toEqual([expect.objectContaining({ id: private_, answer: 'Ninety per cent in years one and two, then ninety-five.', visibility: 'asker' })]);
		expect(await questionsForGuest(room.id, bram.principal.guest.id)).toEqual([]);
		const answerMails = (await sink.messagesTo(alba.email)).filter((m) => m.subject.includes('has an answer'));
		expect(answerMails).toHaveLength(1);
		expect(answerMails[0].subject).toContain(room.name);
		expect(answerMails[0].text).toContain('Ninety per cent in years one and two, then ninety-five.');
		expect(answerMails[0].text).toContain(`${ORIGIN}/rooms/${room.id}`);
		expect((await sink.messagesTo(bram.email)).filter((m) => m.subject.includes('has an answer'))).toHaveLength(0);

		const shared = await insertQuestion(room.id, alba.principal.guest.id, 'Is the grid connection offer firm?');
		await answerRoomQuestion(access, { questionId: shared, answer: 'Yes: a firm offer for 15 MW, signed in 2026.', visibility: 'all', origin: ORIGIN });
		expect((await questionsForGuest(room.id, bram.principal.guest.id)).map((q) => q.id)).toEqual([shared]);
		expect((await questionsForGuest(room.id, alba.principal.guest.id)).map((q) => q.id).sort()).toEqual([private_, shared].sort());
		expect((await sink.messagesTo(alba.email)).filter((m) => m.subject.includes('has an answer'))).toHaveLength(2);
	});

	it('refuses to answer a question of another room', async () => {
		const team = await newTeam();
		const room = await newRoom(team);
		const otherRoom = await newRoom(team, await anotherProject(team));
		const { principal } = await investorIn(team, otherRoom);
		const question = await insertQuestion(otherRoom.id, principal.guest.id, 'Who holds the seabed lease?');
		const refusal = await thrown(async () => answerRoomQuestion(await roomAccess(team, room.id), { questionId: question, answer: 'The sponsor.', visibility: 'all', origin: ORIGIN }));
		expect(refusal).toBeInstanceOf(RoomProblem);
		expect((await questionsForGuest(otherRoom.id, principal.guest.id))[0].answer).toBeNull();
	});
});
