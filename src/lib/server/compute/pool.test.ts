import { readFileSync } from 'node:fs';
import ExcelJS from 'exceljs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseScenario, type Scenario } from '../../schemas/scenario';
import { evaluateScenario } from '../engine/evaluate';
import { defaultDrivers, DRIVER_IDS, spider, tornado } from '../engine/sensitivity';
import { UPLOAD_KINDS } from '../uploads';
import { buildExport } from '../workbench/export';
import { ApiProblem } from '../workbench/api-route';
import { runEngine } from '../workbench/evaluation';
import { ComputePool, computeThreadCount } from './pool';

function example(file: string): Scenario {
	const parsed = parseScenario(JSON.parse(readFileSync(`examples/${file}.json`, 'utf8')));
	if (!parsed.ok) throw new Error(`examples/${file}.json should parse`);
	return parsed.scenario;
}

const examples = {
	current: example('ocean-current-mornstrand'),
	tidal: example('tidal-stream-kestle-narrows'),
	wave: example('wave-orrin-bank')
};

/** Every driver at 21 steps from -50 % to +50 %: about 300 metric evaluations, well over a second of engine work. */
const heavySpider = {
	document: examples.tidal,
	drivers: [...DRIVER_IDS],
	metric: 'equityIrr' as const,
	changes: Array.from({ length: 21 }, (_, i) => Number((-0.5 + i * 0.05).toFixed(2)))
};

let pool: ComputePool;
const extraPools: ComputePool[] = [];

beforeAll(async () => {
	pool = await ComputePool.start({ threads: 1 });
});
afterAll(async () => {
	await Promise.all([pool, ...extraPools].map((p) => p.close()));
});

async function anotherPool(options: Parameters<typeof ComputePool.start>[0]) {
	const started = await ComputePool.start(options);
	extraPools.push(started);
	return started;
}

/** Runs `work` while a 10 ms interval ticks on this thread; answers the work's wall time and the worst lateness of a tick. */
/**
 * Runs `work` with a 10 ms interval timer going, and counts the timer's
 * callbacks that ran before the work ended: none can while synchronous work
 * holds this thread, dozens do while the work runs on another thread. A count
 * rather than a lag in milliseconds, so a busy machine does not change the verdict.
 */
async function withTicks(work: () => Promise<unknown> | unknown): Promise<{ tookMs: number; ticksDuring: number }> {
	let ticks = 0;
	const tick = setInterval(() => ticks++, 10);
	const started = performance.now();
	try {
		await work();
		return { tookMs: performance.now() - started, ticksDuring: ticks };
	} finally {
		clearInterval(tick);
	}
}

describe('ComputePool.run', () => {
	it('evaluates the three examples exactly as the engine does on this thread', async () => {
		for (const [name, document] of Object.entries(examples)) {
			expect(await pool.run('evaluate', { document }), name).toEqual(evaluateScenario(document));
		}
	});

	it('answers tornado and spider as the engine does on this thread', async () => {
		const drivers = defaultDrivers(examples.tidal);
		expect(await pool.run('tornado', { document: examples.tidal, drivers, metric: 'lcoeReal' })).toEqual(tornado(examples.tidal, drivers, 'lcoeReal'));
		expect(await pool.run('spider', { document: examples.wave, drivers: ['capex', 'opex'], metric: 'equityIrr', changes: [-0.1, 0, 0.1] })).toEqual(
			spider(examples.wave, ['capex', 'opex'], 'equityIrr', [-0.1, 0, 0.1])
		);
	});

	it('parses the upload templates as the parsers do on this thread', async () => {
		for (const kind of ['speed-histogram', 'power-matrix'] as const) {
			const bytes = new Uint8Array(readFileSync(`static/templates/${kind}.csv`));
			const pooled = await pool.run('parseUpload', { kind, bytes });
			expect(pooled.ok, kind).toBe(true);
			expect(pooled).toEqual(UPLOAD_KINDS[kind].parse(bytes));
		}
	});

	it('builds the CSV export byte for byte as on this thread', async () => {
		const result = evaluateScenario(examples.wave);
		const context = { projectName: 'Orrin Bank', scenarioName: 'Base', revision: 3, generatedAt: new Date('2026-01-02T03:04:05Z'), document: examples.wave };
		const pooled = await pool.run('buildExport', { result, context, format: 'csv', table: 'cash-flow' });
		const direct = await buildExport(result, context, 'csv', 'cash-flow');
		expect(pooled.fileName).toBe(direct.fileName);
		expect(new TextDecoder().decode(pooled.body)).toBe(new TextDecoder().decode(direct.body));
	});

	it('builds the workbook export with the same sheets and cells as on this thread', async () => {
		const result = evaluateScenario(examples.tidal);
		const context = { projectName: 'Kestle Narrows', scenarioName: 'Base', revision: 1, generatedAt: new Date('2026-01-02T03:04:05Z'), document: examples.tidal };
		const pooled = await pool.run('buildExport', { result, context, format: 'xlsx', table: 'cash-flow' });
		const direct = await buildExport(result, context, 'xlsx');
		const sheets = async (body: Uint8Array) => {
			const book = new ExcelJS.Workbook();
			await book.xlsx.load(body as unknown as ArrayBuffer);
			return book.worksheets.map((sheet) => ({ name: sheet.name, rows: sheet.getSheetValues().map((row) => JSON.stringify(row)) }));
		};
		expect(pooled.fileName).toBe('kestle-narrows-base-2026-01-02.xlsx');
		expect(await sheets(pooled.body)).toEqual(await sheets(direct.body));
	});

	it("brings an engine refusal back as a RangeError, answered 422 in the engine's words", async () => {
		// Past the schema (which refuses grace >= tenor) straight to the engine, which refuses it too.
		const debt = examples.tidal.finance.debt;
		if (debt.sizing === 'none') throw new Error('the tidal example should carry debt');
		const broken: Scenario = { ...examples.tidal, finance: { ...examples.tidal.finance, debt: { ...debt, graceYears: 15, tenorYears: 15 } } };
		const direct = await runEngine(() => evaluateScenario(broken)).catch((e: unknown) => e);
		const pooled = await runEngine(() => pool.run('evaluate', { document: broken })).catch((e: unknown) => e);
		expect(direct).toBeInstanceOf(ApiProblem);
		expect(pooled).toBeInstanceOf(ApiProblem);
		expect((pooled as ApiProblem).status).toBe(422);
		expect((pooled as ApiProblem).message).toBe((direct as ApiProblem).message);
		expect((pooled as ApiProblem).message).toMatch(/^The engine cannot evaluate this scenario: .+\.$/);
		// The thread survives a refusal.
		expect((await pool.run('evaluate', { document: examples.wave })).metrics).toEqual(evaluateScenario(examples.wave).metrics);
	});

	it('stops a task over its time limit and answers 503 in words', async () => {
		const hasty = await anotherPool({ threads: 1, timeoutMs: 1 });
		const refusal = await hasty.run('evaluate', { document: examples.tidal }).catch((e: unknown) => e);
		expect(refusal).toBeInstanceOf(ApiProblem);
		expect((refusal as ApiProblem).status).toBe(503);
		expect((refusal as ApiProblem).message).toBe(
			'The calculation did not finish within 0.001 seconds and was stopped. The server may be busy: try again in a minute, or make the scenario smaller.'
		);
		expect((refusal as ApiProblem).headers['retry-after']).toBe('60');
	});

	it('refuses work beyond its queue as busy (503) instead of queuing it', async () => {
		const small = await anotherPool({ threads: 1, maxQueue: 1 });
		const outcomes = await Promise.allSettled(Array.from({ length: 4 }, () => small.run('evaluate', { document: examples.wave })));
		const refused = outcomes.flatMap((o) => (o.status === 'rejected' ? [o.reason as unknown] : []));
		const answered = outcomes.flatMap((o) => (o.status === 'fulfilled' ? [o.value] : []));
		// One running and one waiting; the other two are turned away at once.
		expect(answered).toHaveLength(2);
		expect(refused).toHaveLength(2);
		for (const r of refused) {
			expect(r).toBeInstanceOf(ApiProblem);
			expect((r as ApiProblem).status).toBe(503);
			expect((r as ApiProblem).message).toBe('The server is busy with other calculations: try again in a few seconds.');
		}
		expect(answered[0]).toEqual(evaluateScenario(examples.wave));
	});

	it('leaves this thread free while a heavy job runs: the timers of this thread keep firing', async () => {
		await pool.run('evaluate', { document: examples.tidal }); // the thread is up and its code loaded
		const pooled = await withTicks(() => pool.run('spider', heavySpider));
		// The same job here holds the thread for as long as it runs: the measurement can tell the difference.
		const here = await withTicks(() => spider(heavySpider.document, heavySpider.drivers, heavySpider.metric, heavySpider.changes));
		expect(here.tookMs).toBeGreaterThan(300);
		expect(here.ticksDuring).toBe(0);
		expect(pooled.tookMs).toBeGreaterThan(300);
		// About tookMs / 10 on a quiet machine; a fifth of that even when the cores are shared.
		expect(pooled.ticksDuring).toBeGreaterThan(pooled.tookMs / 50);
	});
});

describe('computeThreadCount', () => {
	it('takes min(2, cores - 1), at least 1, without a setting', () => {
		expect(computeThreadCount(undefined, 1)).toBe(1);
		expect(computeThreadCount(undefined, 2)).toBe(1);
		expect(computeThreadCount('', 3)).toBe(2);
		expect(computeThreadCount(undefined, 16)).toBe(2);
	});

	it('takes a whole number from the setting and refuses anything else in words', () => {
		expect(computeThreadCount('6', 2)).toBe(6);
		for (const bad of ['0', '-1', '1.5', 'many', '65']) {
			expect(() => computeThreadCount(bad, 4)).toThrow(`COMPUTE_THREADS must be a whole number from 1 to 64; it is "${bad}".`);
		}
	});
});
