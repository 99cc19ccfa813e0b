import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { createHash } from 'node:crypto';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { createProject } from '../../src/lib/server/db/projects';
import { countUploadsInProject, getUploadById, getUploadContent, getUploadPlace } from '../../src/lib/server/db/uploads';
import { readProjectPage } from '../../src/lib/server/db/project-page';
import { receiveUpload } from '../../src/lib/server/workbench/receive-upload';
import type { UploadKind } from '../../src/lib/schemas/workbench';

let database: TestDatabase;
let workspaceId: string;
let projectId: string;
let userId: string;

const template = (name: string) => new Uint8Array(readFileSync(`static/templates/${name}.csv`));
const text = (s: string) => new TextEncoder().encode(s);

beforeAll(async () => {
	database = await createTestDatabase();
	const { knex } = database;
	[{ id: workspaceId }] = await knex('workspaces').insert({ name: 'Upload Test', slug: 'upload-test' }).returning('id');
	[{ id: userId }] = await knex('users').insert({ email: 'up@test.example', name: 'Una Loader', password_hash: 'x' }).returning('id');
	projectId = (await createProject({ workspaceId, name: 'Channel', technology: 'tidal-stream' }, knex)).id;
});
afterAll(() => database.drop());

function upload(kind: UploadKind, bytes: Uint8Array, fileName = `${kind}.csv`) {
	return receiveUpload({ projectId, kind, fileName, contentType: 'text/csv', bytes, userId }, database.knex);
}

describe('receiveUpload', () => {
	it.each([
		['current-speed-time-series', 'speed-histogram'],
		['speed-histogram', 'speed-histogram'],
		['power-curve', 'power-curve'],
		['sea-state-table', 'sea-state-table'],
		['power-matrix', 'power-matrix']
	] as const)('stores a good %s file byte for byte with its parsed %s', async (kind, producedKind) => {
		const bytes = template(kind);
		const result = await upload(kind, bytes);
		expect(result.ok).toBe(true);
		if (!result.ok) return;
		expect(result.upload).toMatchObject({ kind, projectId, byteSize: bytes.byteLength, uploadedBy: { id: userId, name: 'Una Loader' } });
		// The stored digest is the file's sha256, computed here independently.
		expect(result.upload.sha256).toBe(createHash('sha256').update(bytes).digest('hex'));
		expect((result.upload.parsed.data as { kind: string }).kind).toBe(producedKind);

		const stored = await getUploadContent(result.upload.id, database.knex);
		expect(Buffer.compare(stored!.content, Buffer.from(bytes))).toBe(0);
		expect((await getUploadById(result.upload.id, database.knex))!.parsed).toEqual(result.upload.parsed);
		expect(await getUploadPlace(result.upload.id, database.knex)).toEqual({ uploadId: result.upload.id, projectId, workspaceId });
	});

	it('bins a time series into hours and reports the record', async () => {
		const result = await upload(
			'current-speed-time-series',
			text('timestamp,speed_m_s\n2026-01-01T00:00:00Z,1.0\n2026-01-01T01:00:00Z,1.04\n2026-01-01T02:00:00Z,2.0\n')
		);
		expect(result.ok).toBe(true);
		if (!result.ok) return;
		const summary = result.upload.parsed.summary as { sampleCount: number; recordLengthHours: string; meanSpeedMS: string };
		// Three hourly samples over two hours; mean (1.0 + 1.04 + 2.0) / 3 = 1.3466... (hand calculation).
		expect(summary.sampleCount).toBe(3);
		expect(summary.recordLengthHours).toBe('2');
		expect(Number(summary.meanSpeedMS)).toBeCloseTo(4.04 / 3, 10);
	});

	it.each([
		['wrong columns', 'speed-histogram', 'velocity,count\n1.0,5\n', /missing column/],
		['text in a number cell', 'speed-histogram', 'speed_m_s,hours\n1.0,5\n1.1,lots\n', /Row 3, column "hours"/],
		['a negative speed', 'current-speed-time-series', 'timestamp,speed_m_s\n2026-01-01T00:00:00Z,1\n2026-01-01T00:10:00Z,-0.4\n', /Row 3, column "speed_m_s"/],
		['an empty file', 'power-curve', '', /empty/],
		['duplicate timestamps', 'current-speed-time-series', 'timestamp,speed_m_s\n2026-01-01T00:00:00Z,1\n2026-01-01T00:00:00Z,1.2\n2026-01-01T00:10:00Z,1.3\n', /same time as row 2/]
	] as const)('stores nothing for %s', async (_what, kind, body, message) => {
		const before = await countUploadsInProject(projectId, database.knex);
		const result = await upload(kind, text(body));
		expect(result.ok).toBe(false);
		if (result.ok) return;
		expect(result.errors.map((e) => e.message).join('\n')).toMatch(message);
		expect(await countUploadsInProject(projectId, database.knex)).toBe(before);
	});

	it('stores nothing for a file in the wrong encoding', async () => {
		const before = await countUploadsInProject(projectId, database.knex);
		// "é" in Latin-1 is the single byte 0xE9, which is not valid UTF-8 on its own.
		const latin1 = new Uint8Array([...text('speed_m_s,hours\n1.0,5\n'), 0xe9, ...text(',3\n')]);
		const result = await upload('speed-histogram', latin1);
		expect(result.ok).toBe(false);
		if (!result.ok) expect(result.errors[0].message).toMatch(/not valid UTF-8/);
		expect(await countUploadsInProject(projectId, database.knex)).toBe(before);
	});

	it('lists uploads newest first without their contents', async () => {
		const list = (await readProjectPage(projectId, 'any engine', database.knex))!.uploads;
		expect(list.length).toBe(await countUploadsInProject(projectId, database.knex));
		expect(list[0]).not.toHaveProperty('content');
		expect(list[0]).not.toHaveProperty('parsed');
		const times = list.map((u) => u.createdAt.getTime());
		expect([...times].sort((a, b) => b - a)).toEqual(times);
	});
});
