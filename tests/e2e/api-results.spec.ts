import { expect, test } from '@playwright/test';
import ExcelJS from 'exceljs';
import Papa from 'papaparse';
import Decimal from 'decimal.js';
import { baseURL } from '../../playwright.config';
import { tidalInput } from '../fixtures/scenario-documents';
import { CAUTIONS } from '../../src/lib/cautions';
import { demoWorkspaceId, disposeAll, expectError, issuePaths, newProject, newScenario, signInEveryone, type Clients, type ProjectJson, type ScenarioJson } from './helpers/workbench';

let clients: Clients;
let project: ProjectJson;
let base: ScenarioJson;

test.beforeAll(async ({ playwright }) => {
	clients = await signInEveryone(playwright, baseURL);
	project = await newProject(clients.analyst, await demoWorkspaceId(clients));
	base = await newScenario(clients.analyst, project.id, { name: 'Base' });
});
test.afterAll(() => disposeAll(clients));

function withCapexFactor(factor: number) {
	return { ...tidalInput, capex: { ...tidalInput.capex, lines: tidalInput.capex.lines.map((l) => ({ ...l, amount: l.amount * factor })) } };
}

async function evaluate(client: Clients[keyof Clients], scenarioId: string, body?: unknown) {
	return client.post(`/api/v1/scenarios/${scenarioId}/evaluate`, body === undefined ? {} : { data: body });
}

test.describe('evaluate', () => {
	test('answers the engine result for the saved scenario, to a viewer too', async () => {
		const response = await evaluate(clients.viewer, base.id);
		expect(response.status()).toBe(200);
		const body = await response.json();
		expect(body).toMatchObject({ scenarioId: base.id, revision: 1, source: 'saved' });
		expect(body.result.metrics).toHaveProperty('lcoeReal');
		expect(Number(body.result.metrics.netAepMWh)).toBeGreaterThan(0);
		// 2 construction years + 20 operating years, one row each.
		expect(body.result.cashFlow).toHaveLength(22);
	});

	test('evaluates an unsaved draft for an analyst: LCOE moves with capex and nothing is saved', async () => {
		const saved = (await (await evaluate(clients.analyst, base.id)).json()).result;
		const draft = await evaluate(clients.analyst, base.id, { document: withCapexFactor(1.5) });
		expect(draft.status()).toBe(200);
		const body = await draft.json();
		expect(body.source).toBe('draft');
		expect(new Decimal(body.result.metrics.lcoeReal).greaterThan(new Decimal(saved.metrics.lcoeReal))).toBe(true);
		expect(body.result.metrics.netAepMWh).toBe(saved.metrics.netAepMWh);
		const after = (await (await clients.viewer.get(`/api/v1/scenarios/${base.id}`)).json()).scenario;
		expect(after.revision).toBe(1);
	});

	test('refuses a bad draft with field paths, and a draft from a viewer', async () => {
		const bad = await expectError(
			await evaluate(clients.analyst, base.id, { document: { ...tidalInput, finance: { ...tidalInput.finance, realDiscountRate: 'seven' } } }),
			422
		);
		expect(issuePaths(bad)).toEqual(['document.finance.realDiscountRate']);
		expect(issuePaths(await expectError(await evaluate(clients.analyst, base.id, { documents: {} }), 422))).toEqual(['documents']);

		const viewerDraft = await expectError(await evaluate(clients.viewer, base.id, { document: tidalInput }), 403);
		expect(viewerDraft.error.message).toMatch(/unsaved draft needs the analyst role/);
		await expectError(await evaluate(clients.outsider, base.id), 404);
		await expectError(await evaluate(clients.anonymous, base.id), 401);
	});
});

test.describe('tornado and spider', () => {
	test('answers tornado rows sorted by swing, with the usual ranges by default', async () => {
		const response = await clients.viewer.post(`/api/v1/scenarios/${base.id}/tornado`, { data: { metric: 'lcoeReal' } });
		expect(response.status()).toBe(200);
		const { tornado, drivers } = await response.json();
		expect(drivers.find((d: { driver: string }) => d.driver === 'capex')).toEqual({ driver: 'capex', low: 0.8, high: 1.2 });
		expect(tornado.rows.length).toBe(drivers.length);
		const swings = tornado.rows.filter((r: { swing: string | null }) => r.swing !== null).map((r: { swing: string }) => Number(r.swing));
		expect([...swings].sort((a, b) => b - a)).toEqual(swings);
	});

	test('takes chosen drivers and ranges; capex low and high bracket the base LCOE', async () => {
		const response = await clients.analyst.post(`/api/v1/scenarios/${base.id}/tornado`, {
			data: { metric: 'lcoeReal', drivers: [{ driver: 'capex', low: 0.9, high: 1.1 }, { driver: 'tariff', low: 0.5, high: 1.5 }] }
		});
		const { tornado } = await response.json();
		const capex = tornado.rows.find((r: { driver: string }) => r.driver === 'capex');
		expect(Number(capex.lowOutput)).toBeLessThan(Number(tornado.baseOutput));
		expect(Number(capex.highOutput)).toBeGreaterThan(Number(tornado.baseOutput));
		// The tariff does not enter the LCOE (discounted costs over discounted energy): no swing.
		expect(Number(tornado.rows.find((r: { driver: string }) => r.driver === 'tariff').swing)).toBe(0);
	});

	test('refuses unknown metrics and drivers with paths; a viewer may not send a draft', async () => {
		const bad = await expectError(
			await clients.analyst.post(`/api/v1/scenarios/${base.id}/tornado`, {
				data: { metric: 'happiness', drivers: [{ driver: 'weather', low: 0, high: 1 }, { driver: 'capex', low: 'low', high: 1.2 }] }
			}),
			422
		);
		expect(issuePaths(bad).sort()).toEqual(['drivers[0].driver', 'drivers[1].low', 'metric']);
		await expectError(await clients.viewer.post(`/api/v1/scenarios/${base.id}/tornado`, { data: { document: tidalInput } }), 403);
		await expectError(await clients.outsider.post(`/api/v1/scenarios/${base.id}/tornado`, { data: {} }), 404);
		await expectError(await clients.anonymous.post(`/api/v1/scenarios/${base.id}/tornado`, { data: {} }), 401);
	});

	test('answers spider series, one point per step', async () => {
		const response = await clients.viewer.post(`/api/v1/scenarios/${base.id}/spider`, {
			data: { metric: 'lcoeReal', drivers: ['capex', 'opex'], changes: [-0.2, 0, 0.2] }
		});
		expect(response.status()).toBe(200);
		const { spider } = await response.json();
		expect(spider.series.map((s: { driver: string }) => s.driver)).toEqual(['capex', 'opex']);
		expect(spider.series[0].points.map((p: { change: number }) => p.change)).toEqual([-0.2, 0, 0.2]);
	});
});

test.describe('compare', () => {
	test('puts scenarios side by side with exact differences against the base case', async () => {
		const dearer = await newScenario(clients.analyst, project.id, { name: 'Dearer', document: withCapexFactor(1.2) });
		const response = await clients.viewer.get(`/api/v1/projects/${project.id}/compare?ids=${base.id},${dearer.id}`);
		expect(response.status()).toBe(200);
		const body = await response.json();
		expect(body.baseCase.id).toBe(base.id);
		expect(body.scenarios.map((s: { id: string }) => s.id)).toEqual([base.id, dearer.id]);
		const [b, d] = body.scenarios;
		expect(b.differences.lcoeReal).toEqual({ absolute: '0', relative: '0' });
		const expected = new Decimal(d.metrics.lcoeReal).minus(b.metrics.lcoeReal);
		expect(d.differences.lcoeReal.absolute).toBe(expected.toDecimalPlaces(10).toFixed());
		expect(expected.greaterThan(0)).toBe(true);
		expect(d.differences.netAepMWh.absolute).toBe('0');
		expect(body.metrics.find((m: { key: string }) => m.key === 'lcoeReal').unit).toMatch(/MWh/);
	});

	test('refuses bad and foreign ids, and outsiders', async () => {
		const bad = await expectError(await clients.viewer.get(`/api/v1/projects/${project.id}/compare?ids=${base.id},nope`), 422);
		expect(issuePaths(bad)).toEqual(['ids[1]']);
		const other = await newProject(clients.analyst, await demoWorkspaceId(clients));
		const foreign = await newScenario(clients.analyst, other.id);
		expect(issuePaths(await expectError(await clients.viewer.get(`/api/v1/projects/${project.id}/compare?ids=${foreign.id}`), 404))).toEqual(['ids[0]']);
		await expectError(await clients.outsider.get(`/api/v1/projects/${project.id}/compare?ids=${base.id}`), 404);
		await expectError(await clients.anonymous.get(`/api/v1/projects/${project.id}/compare`), 401);
	});
});

test.describe('exports', () => {
	test('CSV: the cash-flow table with units in the headers, the cautions after it', async () => {
		const response = await clients.viewer.get(`/api/v1/scenarios/${base.id}/export?format=csv`);
		expect(response.status()).toBe(200);
		expect(response.headers()['content-type']).toBe('text/csv; charset=utf-8');
		expect(response.headers()['content-disposition']).toMatch(/^attachment; filename="[a-z0-9-]+-base-\d{4}-\d{2}-\d{2}-cash-flow\.csv"$/);
		const text = (await response.text()).replace(/^\uFEFF/, '');
		const [table, cautions] = text.split('\r\n\r\n');
		const rows = Papa.parse<string[]>(table, { skipEmptyLines: true }).data;
		expect(rows[0]).toEqual(expect.arrayContaining(['Year t (0 = COD)', 'Energy delivered (MWh)', 'Revenue (EUR, nominal)', 'DSCR (ratio)']));
		expect(rows).toHaveLength(1 + 22);
		expect(rows[1][0]).toBe('-1');
		expect(cautions).toContain(CAUTIONS[1]);

		const metrics = await clients.viewer.get(`/api/v1/scenarios/${base.id}/export?format=csv&table=metrics`);
		const metricRows = Papa.parse<string[]>((await metrics.text()).replace(/^\uFEFF/, '').split('\r\n\r\n')[0], { skipEmptyLines: true }).data;
		expect(metricRows[0]).toEqual(['Metric', 'Key', 'Value', 'Value (exact)', 'Unit']);
		const lcoeRow = metricRows.find((r) => r[1] === 'lcoeReal')!;
		expect(lcoeRow[0]).toBe('LCOE, real');
		// Rounded as the editor shows it (two places), with every digit beside it.
		expect(lcoeRow[2]).toMatch(/^\d+\.\d\d$/);
		expect(Number(lcoeRow[3])).toBeCloseTo(Number(lcoeRow[2]), 2);
		expect(lcoeRow[4]).toMatch(/^EUR\/MWh/);
	});

	test('XLSX: a sheet per table, numbers as numbers, cautions on a sheet of their own', async () => {
		const response = await clients.viewer.get(`/api/v1/scenarios/${base.id}/export?format=xlsx`);
		expect(response.status()).toBe(200);
		expect(response.headers()['content-type']).toBe('application/vnd.openxmlformats-officedocument.spreadsheetml.sheet');
		const workbook = new ExcelJS.Workbook();
		await workbook.xlsx.load((await response.body()) as unknown as ArrayBuffer);
		expect(workbook.worksheets.map((s) => s.name)).toEqual(['About', 'Assumptions', 'Annual table', 'Metrics', 'Warnings', 'Cautions']);
		const cashFlow = workbook.getWorksheet('Annual table')!;
		expect(cashFlow.getRow(1).getCell(5).value).toBe('Revenue (EUR, nominal)');
		expect(cashFlow.rowCount).toBe(1 + 22);
		expect(typeof cashFlow.getRow(5).getCell(5).value).toBe('number');
		const cautions = workbook.getWorksheet('Cautions')!;
		expect(cautions.getColumn(1).values.slice(2)).toEqual([...CAUTIONS]);

		const evaluated = (await (await evaluate(clients.viewer, base.id)).json()).result;
		const metrics = workbook.getWorksheet('Metrics')!;
		const lcoeRow = metrics.getColumn(2).values.indexOf('lcoeReal');
		expect(metrics.getRow(lcoeRow).getCell(3).value).toBeCloseTo(Number(evaluated.metrics.lcoeReal), 6);
		// The exact value, shown at the catalogue's precision (two places for LCOE) by the cell's number format.
		expect(metrics.getRow(lcoeRow).getCell(3).numFmt).toBe('#,##0.00');
		expect(metrics.getRow(lcoeRow).getCell(1).value).toBe('LCOE, real');
	});

	test('refuses unknown formats and strangers', async () => {
		expect(issuePaths(await expectError(await clients.viewer.get(`/api/v1/scenarios/${base.id}/export?format=pdf`), 422))).toEqual(['format']);
		expect(issuePaths(await expectError(await clients.viewer.get(`/api/v1/scenarios/${base.id}/export?format=csv&table=x`), 422))).toEqual(['table']);
		await expectError(await clients.outsider.get(`/api/v1/scenarios/${base.id}/export?format=csv`), 404);
		await expectError(await clients.anonymous.get(`/api/v1/scenarios/${base.id}/export?format=csv`), 401);
	});
});
