/**
 * The database announces every committed change to what the kept reads hold
 * (projects, scenarios, stored results, uploads; people's names), whoever
 * writes it; the app's kept reads follow those announcements and the app's
 * own writes, and keep nothing while the feed is deaf.
 */
import { readFileSync } from 'node:fs';
import { randomUUID } from 'node:crypto';
import knexFactory, { type Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { setAppEnv } from '../helpers/app-env';
import { knexConfig } from '../../knexfile';
import { startChangeFeed, type Change, type ChangeFeed } from '../../src/lib/server/db/change-feed';
import { projectReads, requestFinished, startCachedReads, stopCachedReads } from '../../src/lib/server/db/cached-reads';
import { db } from '../../src/lib/server/db/knex';
import { createProject } from '../../src/lib/server/db/projects';
import { createScenario } from '../../src/lib/server/db/scenarios';
import { readProjectPageKept } from '../../src/lib/server/db/project-page';
import { receiveUpload } from '../../src/lib/server/workbench/receive-upload';
import { resultOfSavedScenario } from '../../src/lib/server/workbench/stored-results';
import { evaluateScenario } from '../../src/lib/server/engine/evaluate';
import { ENGINE_VERSION } from '../../src/lib/server/engine/version';
import { tidalDocument } from '../fixtures/scenario-documents';

let database: TestDatabase;
/** Another process's connection: its writes reach the app only through the feed. */
let elsewhere: Knex;
let workspaceId: string;
let userId: string;

beforeAll(async () => {
	database = await createTestDatabase();
	setAppEnv({ DATABASE_URL: database.url });
	elsewhere = knexFactory(knexConfig(database.url));
	[{ id: workspaceId }] = await database.knex('workspaces').insert({ name: 'Feed Test', slug: 'feed-test' }).returning('id');
	[{ id: userId }] = await database.knex('users').insert({ email: 'feed@test.example', name: 'Fenna Reed', password_hash: 'x' }).returning('id');
});
afterAll(async () => {
	await elsewhere.destroy();
	await database.drop();
});

/** A feed that records what it hears; `settle` waits for a marker sent after the writes, so every change before it has arrived. */
function recordingFeed() {
	const heard: Change[] = [];
	let losses = 0;
	const feed = startChangeFeed(database.url, { changed: (c) => heard.push(c), lost: () => losses++ }, { firstRetryMs: 50 });
	return {
		feed,
		heard,
		get losses() {
			return losses;
		},
		async settle() {
			// Notifications reach a listener in commit order: once a marker sent after the writes is in, so is everything before it.
			const marker = randomUUID();
			await elsewhere.raw(`select pg_notify('tidewright_changes', ?)`, [`project:${marker}`]);
			const isMarker = (c: Change) => c.kind === 'project' && c.projectId === marker;
			await expect.poll(() => heard.some(isMarker), { message: 'the marker', timeout: 5_000 }).toBe(true);
			const got = heard.splice(0);
			return got.slice(0, got.findIndex(isMarker));
		}
	};
}

describe('the change feed', () => {
	let recorder: ReturnType<typeof recordingFeed>;
	let feed: ChangeFeed;
	beforeAll(async () => {
		recorder = recordingFeed();
		feed = recorder.feed;
		await vi.waitFor(() => expect(feed.live, 'the feed to listen').toBe(true), { timeout: 5_000 });
	});
	afterAll(() => feed.stop());

	it('names the project of every committed change to a project, its scenarios, stored results and uploads', async () => {
		const project = await createProject({ workspaceId, name: 'Heard', technology: 'tidal-stream' }, elsewhere);
		expect(await recorder.settle()).toContainEqual({ kind: 'project', projectId: project.id });

		const scenario = await createScenario({ projectId: project.id, name: 'Case', document: tidalDocument, userId }, elsewhere);
		expect(await recorder.settle()).toEqual([{ kind: 'project', projectId: project.id }]);

		await elsewhere('scenarios').where({ id: scenario.id }).update({ name: 'Case renamed' });
		expect(await recorder.settle()).toEqual([{ kind: 'project', projectId: project.id }]);

		await resultOfSavedScenario(scenario, { technology: 'tidal-stream' }, { evaluate: evaluateScenario, knex: elsewhere });
		expect(await recorder.settle()).toContainEqual({ kind: 'project', projectId: project.id });

		const csv = new Uint8Array(readFileSync('static/templates/power-curve.csv'));
		await receiveUpload({ projectId: project.id, kind: 'power-curve', fileName: 'curve.csv', contentType: 'text/csv', bytes: csv, userId }, elsewhere);
		expect(await recorder.settle()).toContainEqual({ kind: 'project', projectId: project.id });

		await elsewhere('uploads').where({ project_id: project.id }).delete();
		expect(await recorder.settle()).toEqual([{ kind: 'project', projectId: project.id }]);
	});

	it('says nothing of a change rolled back, or of a person change that shows nowhere', async () => {
		const project = await createProject({ workspaceId, name: 'Quiet', technology: 'tidal-stream' }, elsewhere);
		await recorder.settle();
		await elsewhere
			.transaction(async (trx) => {
				await trx('projects').where({ id: project.id }).update({ name: 'Never' });
				throw new Error('roll back');
			})
			.catch(() => undefined);
		await elsewhere('users').where({ id: userId }).update({ email: 'feed.moved@test.example' });
		expect(await recorder.settle()).toEqual([]);
	});

	it('announces a change to everything when a person shown beside scenarios is renamed', async () => {
		await recorder.settle();
		await elsewhere('users').where({ id: userId }).update({ name: 'Fenna Reed-Holm' });
		expect(await recorder.settle()).toEqual([{ kind: 'all' }]);
	});

	it('says it was lost when its connection drops, listens again, and hears again', async () => {
		const lossesBefore = recorder.losses;
		await elsewhere.raw(`select pg_terminate_backend(pid) from pg_stat_activity where application_name = 'tidewright-change-feed' and datname = current_database()`);
		await expect.poll(() => recorder.losses > lossesBefore, { message: 'the loss', timeout: 5_000 }).toBe(true);
		// Lost once on the drop, once more on listening again (what changed in between is unknown).
		await expect.poll(() => feed.live && recorder.losses >= lossesBefore + 2, { message: 'listening again', timeout: 5_000 }).toBe(true);
		const project = await createProject({ workspaceId, name: 'Heard again', technology: 'tidal-stream' }, elsewhere);
		expect(await recorder.settle()).toContainEqual({ kind: 'project', projectId: project.id });
	});
});

describe('kept reads', () => {
	let projectId: string;
	// The app's own pool (db()) is the one watched for this process's writes.
	let currentRequest: object | undefined;
	let queries = 0;
	const countQuery = () => queries++;

	beforeAll(async () => {
		projectId = (await createProject({ workspaceId, name: 'Kept', technology: 'tidal-stream' }, database.knex)).id;
		await createScenario({ projectId, name: 'Kept case', document: tidalDocument, userId }, database.knex);
		startCachedReads(db(), database.url, () => currentRequest);
		db().on('query', countQuery);
		// Live once a read is kept.
		await vi.waitFor(
			async () => {
				await readProjectPageKept(projectId, ENGINE_VERSION);
				expect(projectReads.size, 'reads to be kept').toBeGreaterThan(0);
			},
			{ timeout: 5_000 }
		);
	});
	afterAll(async () => {
		db().off('query', countQuery);
		await stopCachedReads();
	});

	async function pageName() {
		return (await readProjectPageKept(projectId, ENGINE_VERSION))?.project.name;
	}

	it('serve a page seen again without a query', async () => {
		await pageName();
		const before = queries;
		expect(await pageName()).toBe('Kept');
		expect(queries).toBe(before);
	});

	it("show another process's change once it is committed", async () => {
		await elsewhere('projects').where({ id: projectId }).update({ name: 'Kept, renamed elsewhere' });
		await expect.poll(pageName, { message: 'the change to show', timeout: 5_000 }).toBe('Kept, renamed elsewhere');
	});

	it("read the database while a request of this process that wrote is under way, and show its write as soon as it ends", async () => {
		await pageName();
		const request = {};
		currentRequest = request;
		await db().transaction(async (trx) => {
			await trx('projects').where({ id: projectId }).update({ name: 'Kept, renamed here' });
			// Another page view during the write, before the commit: from the database, and not kept.
			currentRequest = undefined;
			expect(await pageName()).toBe('Kept, renamed elsewhere');
			currentRequest = request;
		});
		currentRequest = undefined;
		// Committed, and the request still running (a form action's page load): the database, not what was kept.
		const before = queries;
		expect(await pageName()).toBe('Kept, renamed here');
		expect(queries).toBeGreaterThan(before);
		requestFinished(request);
		expect(await pageName()).toBe('Kept, renamed here');
		// Kept again (once the feed's own word of the write is in, which forgets the project once more).
		await expect
			.poll(
				async () => {
					const before = queries;
					const name = await pageName();
					return name === 'Kept, renamed here' && queries === before;
				},
				{ message: 'the page to be kept again', timeout: 5_000 }
			)
			.toBe(true);
	});

	it('keep nothing once stopped', async () => {
		await stopCachedReads();
		expect(projectReads.size).toBe(0);
		const before = queries;
		await pageName();
		await pageName();
		expect(queries).toBe(before + 2);
	});
});
