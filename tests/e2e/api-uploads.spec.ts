import { expect, test } from '@playwright/test';
import { readFileSync } from 'node:fs';
import { baseURL } from '../../playwright.config';
import { waveInput } from '../fixtures/scenario-documents';
import { demoWorkspaceId, disposeAll, expectError, issuePaths, newProject, newScenario, signInEveryone, type Clients, type ProjectJson } from './helpers/workbench';

let clients: Clients;
let workspaceId: string;
let project: ProjectJson;

test.beforeAll(async ({ playwright }) => {
	clients = await signInEveryone(playwright, baseURL);
	workspaceId = await demoWorkspaceId(clients);
	project = await newProject(clients.analyst, workspaceId);
});
test.afterAll(() => disposeAll(clients));

const template = (kind: string) => readFileSync(`static/templates/${kind}.csv`);

function upload(client: Clients[keyof Clients], projectId: string, kind: string, buffer: Buffer, name = `${kind}.csv`, mimeType = 'text/csv') {
	return client.post(`/api/v1/projects/${projectId}/uploads`, { multipart: { kind, file: { name, mimeType, buffer } } });
}

async function uploadCount(projectId: string): Promise<number> {
	const response = await clients.viewer.get(`/api/v1/projects/${projectId}/uploads`);
	expect(response.status()).toBe(200);
	return (await response.json()).uploads.length;
}

test.describe('uploads API: good files', () => {
	for (const [kind, produced] of [
		['current-speed-time-series', 'speed-histogram'],
		['speed-histogram', 'speed-histogram'],
		['power-curve', 'power-curve'],
		['sea-state-table', 'sea-state-table'],
		['power-matrix', 'power-matrix']
	] as const) {
		test(`stores a good ${kind} file and answers the parsed preview`, async () => {
			const bytes = template(kind);
			const response = await upload(clients.analyst, project.id, kind, bytes);
			expect(response.status(), await response.text()).toBe(201);
			const { upload: stored } = await response.json();
			expect(stored).toMatchObject({ kind, fileName: `${kind}.csv`, byteSize: bytes.byteLength, uploadedBy: { name: 'Tomas Vell' } });
			expect(stored.data.kind).toBe(produced);
			expect(stored.summary).toBeTruthy();
			expect(Array.isArray(stored.warnings)).toBe(true);

			const again = await (await clients.viewer.get(`/api/v1/uploads/${stored.id}`)).json();
			expect(again.upload.data).toEqual(stored.data);
			const file = await clients.viewer.get(`/api/v1/uploads/${stored.id}/file`);
			expect(file.headers()['content-disposition']).toMatch(/^attachment;/);
			expect(Buffer.compare(await file.body(), bytes)).toBe(0);
		});
	}

	test('applies a binned time series to a scenario as a new revision', async () => {
		const scenario = await newScenario(clients.analyst, project.id);
		const series = template('current-speed-time-series');
		const stored = (await (await upload(clients.analyst, project.id, 'current-speed-time-series', series)).json()).upload;
		// One sample a data row: every line of the template but its header.
		const dataRows = series.toString('utf8').trim().split('\n').length - 1;
		expect(stored.summary.sampleCount).toBe(dataRows);

		const applied = await clients.analyst.post(`/api/v1/uploads/${stored.id}/apply?scenarioId=${scenario.id}`, { data: { revision: 1 } });
		expect(applied.status(), await applied.text()).toBe(200);
		const body = await applied.json();
		expect(body.section).toBe('resource');
		expect(body.scenario.revision).toBe(2);
		expect(body.scenario.document.resource).toEqual(stored.data);
		const [latest] = (await (await clients.viewer.get(`/api/v1/scenarios/${scenario.id}/revisions`)).json()).revisions;
		expect(latest).toMatchObject({ changedSections: ['resource'], summary: 'Applied current-speed time series "current-speed-time-series.csv" to resource' });

		const stale = await expectError(await clients.analyst.post(`/api/v1/uploads/${stored.id}/apply?scenarioId=${scenario.id}`, { data: { revision: 1 } }), 409);
		expect(stale.error.currentRevision).toBe(2);
	});

	test('refuses to apply a wave upload to a tidal scenario, or to another project', async () => {
		const scenario = await newScenario(clients.analyst, project.id);
		const matrix = (await (await upload(clients.analyst, project.id, 'power-matrix', template('power-matrix'))).json()).upload;
		const misfit = await expectError(await clients.analyst.post(`/api/v1/uploads/${matrix.id}/apply?scenarioId=${scenario.id}`), 422);
		expect(misfit.error.message).toMatch(/fits wave scenarios; this scenario is tidal-stream/);

		const waveProject = await newProject(clients.analyst, workspaceId, { technology: 'wave' });
		const waveScenario = await newScenario(clients.analyst, waveProject.id, { document: waveInput });
		const elsewhere = await expectError(await clients.analyst.post(`/api/v1/uploads/${matrix.id}/apply?scenarioId=${waveScenario.id}`), 404);
		expect(issuePaths(elsewhere)).toEqual(['scenarioId']);
		expect(issuePaths(await expectError(await clients.analyst.post(`/api/v1/uploads/${matrix.id}/apply`), 404))).toEqual(['scenarioId']);
	});
});

const text = (s: string) => Buffer.from(s, 'utf8');

/** Each bad file, the kind it is sent as, and the words its refusal must contain. */
const badFiles: { what: string; kind: string; file: () => Buffer; status?: number; message: RegExp; cell?: { row: number; column: string } }[] = [
	{ what: 'wrong columns', kind: 'speed-histogram', file: () => text('velocity,count\n1.0,5\n'), message: /missing column "speed_m_s"/ },
	{ what: 'text in a number cell', kind: 'speed-histogram', file: () => text('speed_m_s,hours\n1.0,5\n1.1,lots\n'), message: /"lots"/, cell: { row: 3, column: 'hours' } },
	{
		what: 'a negative speed',
		kind: 'current-speed-time-series',
		file: () => text('timestamp,speed_m_s\n2026-01-01T00:00:00Z,1\n2026-01-01T00:10:00Z,-0.4\n'),
		message: /-0\.4/,
		cell: { row: 3, column: 'speed_m_s' }
	},
	{ what: 'an empty file', kind: 'power-curve', file: () => Buffer.alloc(0), message: /empty/ },
	{ what: 'a header and no data', kind: 'power-curve', file: () => text('speed_m_s,power_kW\n'), message: /no data rows/ },
	{
		what: 'a huge file',
		kind: 'current-speed-time-series',
		file: () => Buffer.concat([text('timestamp,speed_m_s\n'), Buffer.alloc(21 * 1024 * 1024, '2026-01-01T00:00:00Z,1.0\n')]),
		status: 413,
		message: /over the 20\.0 MB limit/
	},
	{ what: 'the wrong encoding (UTF-16)', kind: 'speed-histogram', file: () => Buffer.from('\ufeffspeed_m_s,hours\n1.0,5\n', 'utf16le'), message: /UTF-16/ },
	{ what: 'the wrong encoding (Latin-1)', kind: 'speed-histogram', file: () => Buffer.from('speed_m_s,hours,note\n1.0,5,d\xe9but\n', 'latin1'), message: /not valid UTF-8/ },
	{
		what: 'duplicate timestamps',
		kind: 'current-speed-time-series',
		file: () => text('timestamp,speed_m_s\n2026-01-01T00:00:00Z,1\n2026-01-01T00:00:00Z,1.2\n2026-01-01T00:10:00Z,1.3\n'),
		message: /same time as row 2/,
		cell: { row: 3, column: 'timestamp' }
	},
	{ what: 'a workbook instead of a CSV', kind: 'power-matrix', file: () => Buffer.concat([Buffer.from([0x50, 0x4b, 0x03, 0x04]), Buffer.alloc(64, 1)]), message: /Excel workbook/ },
	{ what: 'a ragged row', kind: 'power-curve', file: () => text('speed_m_s,power_kW\n1.0,10\n1.5,20,30\n'), message: /has 3 values but the header has 2 columns/ },
	{ what: 'power curve speeds out of order', kind: 'power-curve', file: () => text('speed_m_s,power_kW\n1.0,10\n2.0,40\n1.5,20\n'), message: /Row 4/ },
	{ what: 'probabilities that do not sum to 1', kind: 'sea-state-table', file: () => text('hs_m,te_s,probability\n1,7,0.5\n2,8,0.2\n'), message: /add up to 0\.7, not 1/ },
	{ what: 'power matrix periods that do not increase', kind: 'power-matrix', file: () => text('hs_m/te_s,6,5\n1,10,20\n'), message: /periods must increase/ }
];

test.describe('uploads API: bad files store nothing', () => {
	for (const bad of badFiles) {
		test(`refuses ${bad.what} with a named error`, async () => {
			const before = await uploadCount(project.id);
			const body = await expectError(await upload(clients.analyst, project.id, bad.kind, bad.file()), bad.status ?? 422);
			const messages = body.error.issues.map((i) => i.message).join('\n');
			expect(messages).toMatch(bad.message);
			expect(body.error.message).toMatch(bad.status === 413 ? /limit/ : /The file was not saved/);
			if (bad.cell) {
				expect(body.error.issues).toEqual(expect.arrayContaining([expect.objectContaining({ path: 'file', row: bad.cell.row, column: bad.cell.column })]));
			}
			expect(await uploadCount(project.id)).toBe(before);
		});
	}

	test('refuses a request without a file, without a kind or with an unknown kind', async () => {
		const before = await uploadCount(project.id);
		const url = `/api/v1/projects/${project.id}/uploads`;
		const noFile = await expectError(await clients.analyst.post(url, { multipart: { kind: 'power-curve' } }), 422);
		expect(issuePaths(noFile)).toEqual(['file']);
		const unknown = await expectError(
			await clients.analyst.post(url, { multipart: { kind: 'bathymetry', file: { name: 'a.csv', mimeType: 'text/csv', buffer: template('power-curve') } } }),
			422
		);
		expect(issuePaths(unknown)).toEqual(['kind']);
		expect(unknown.error.issues[0].message).toMatch(/kind must be one of/);
		const notMultipart = await expectError(await clients.analyst.post(url, { data: { kind: 'power-curve' } }), 415);
		expect(notMultipart.error.message).toMatch(/multipart\/form-data/);
		expect(await uploadCount(project.id)).toBe(before);
	});
});

test.describe('uploads API: roles', () => {
	test('viewers cannot upload or apply, outsiders see nothing, anonymous callers must sign in', async () => {
		const scenario = await newScenario(clients.analyst, project.id);
		const stored = (await (await upload(clients.analyst, project.id, 'speed-histogram', template('speed-histogram'))).json()).upload;
		const before = await uploadCount(project.id);

		expect((await expectError(await upload(clients.viewer, project.id, 'speed-histogram', template('speed-histogram')), 403)).error.message).toMatch(/analyst role/);
		await expectError(await upload(clients.outsider, project.id, 'speed-histogram', template('speed-histogram')), 404);
		await expectError(await upload(clients.anonymous, project.id, 'speed-histogram', template('speed-histogram')), 401);
		expect(await uploadCount(project.id)).toBe(before);

		const apply = `/api/v1/uploads/${stored.id}/apply?scenarioId=${scenario.id}`;
		await expectError(await clients.viewer.post(apply), 403);
		await expectError(await clients.outsider.post(apply), 404);
		await expectError(await clients.anonymous.post(apply), 401);

		for (const path of [`/api/v1/projects/${project.id}/uploads`, `/api/v1/uploads/${stored.id}`, `/api/v1/uploads/${stored.id}/file`]) {
			await expectError(await clients.outsider.get(path), 404);
			await expectError(await clients.anonymous.get(path), 401);
		}
		expect((await (await clients.viewer.get(`/api/v1/scenarios/${scenario.id}`)).json()).scenario.revision).toBe(1);
	});
});
