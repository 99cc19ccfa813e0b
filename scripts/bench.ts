/**
 * Engine benchmark on the example scenarios.
 *
 *     npm run bench
 *
 * For each example: the median wall time of one evaluation (evaluateScenario,
 * with the breakeven solve and the plain-data result), of a 12-driver tornado
 * on equity IRR (24 evaluations plus the base, every stage; on LCOE too, which
 * skips the debt pass), and of the breakeven solve alone.
 * CPU time per evaluation is printed too: on a busy machine wall time includes
 * waiting for a core, CPU time does not.
 * Goals: one evaluation < 5 ms, tornado < 100 ms.
 *
 * Then the PDF summary of a 30-year case (the tidal example with its
 * operating life set to 30 years, its tornado and method notes given, as the
 * route gives them): the median time to draw it. Goal: under 2 s.
 */
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { availableParallelism, loadavg } from 'node:os';
import { parseScenario, type Scenario } from '../src/lib/schemas/scenario';
import { evaluateDetailed, evaluateScenario } from '../src/lib/server/engine/evaluate';
import { estimateEnergy } from '../src/lib/server/engine/energy/yield';
import { prepareCase } from '../src/lib/server/engine/cashflow';
import { solveBreakevenTariff } from '../src/lib/server/engine/breakeven';
import { defaultDrivers, tornado } from '../src/lib/server/engine/sensitivity';
import { renderScenarioSummaryPdf, type ScenarioSummaryInput } from '../src/lib/server/pdf/summary';
import { summaryNoteSlugs } from '../src/lib/server/pdf/note-choice';
import { METHOD_NOTES } from '../src/lib/methods';
import { CAUTIONS } from '../src/lib/cautions';
import { ENGINE_VERSION } from '../src/lib/server/engine/version';

type Timing = { medianMs: number; minMs: number; cpuMs: number };

/** Median and fastest wall time over `runs` calls after `warmup` calls, and mean CPU time per call. */
function measure(fn: () => unknown, runs: number, warmup = Math.max(5, Math.floor(runs / 5))): Timing {
	for (let i = 0; i < warmup; i++) fn();
	const times: number[] = [];
	const cpuStart = process.cpuUsage();
	for (let i = 0; i < runs; i++) {
		const start = performance.now();
		fn();
		times.push(performance.now() - start);
	}
	const cpu = process.cpuUsage(cpuStart);
	times.sort((a, b) => a - b);
	return { medianMs: times[Math.floor(times.length / 2)], minMs: times[0], cpuMs: (cpu.user + cpu.system) / 1000 / runs };
}

const fmt = (ms: number) => (ms < 0.1 ? ms.toFixed(4) : ms < 10 ? ms.toFixed(3) : ms.toFixed(1));
const show = (t: Timing) => `${fmt(t.medianMs)} [${fmt(t.minMs)}] (${fmt(t.cpuMs)})`;
const mark = (ok: boolean) => (ok ? 'ok' : 'OVER');

const dir = join(process.cwd(), 'examples');
const files = readdirSync(dir).filter((f) => f.endsWith('.json')).sort();
const cores = availableParallelism();
console.log(`Tidewright engine bench: node ${process.version}, ${cores} cores, load average ${loadavg().map((x) => x.toFixed(2)).join(' ')}`);
if (loadavg()[0] > cores) console.log('The machine is busy: median wall times include waiting for a core; the fastest run and CPU time do not.');
console.log('times in ms: median wall time [fastest run] (mean CPU time per call)\n');

let allOk = true;
for (const file of files) {
	const parsed = parseScenario(JSON.parse(readFileSync(join(dir, file), 'utf8')));
	if (!parsed.ok) throw new Error(`${file} is not a valid scenario`);
	const scenario: Scenario = parsed.scenario;
	const drivers = defaultDrivers(scenario);
	const prep = prepareCase(scenario, estimateEnergy(scenario));

	const one = measure(() => evaluateScenario(scenario), 200);
	// Equity IRR needs every stage (energy where a driver changes it, cash flows, debt and tax, IRR);
	// LCOE needs no debt pass, so it is the light case.
	const tor = measure(() => tornado(scenario, drivers, 'equityIrr'), 15);
	const torLcoe = measure(() => tornado(scenario, drivers, 'lcoeReal'), 15);
	// The evaluation starts the breakeven search at the real LCOE; so does this timing.
	const lcoeReal = evaluateDetailed(scenario, { breakeven: false }).metrics.lcoeReal;
	const breakeven = measure(() => solveBreakevenTariff(prep, lcoeReal), 200);
	const evaluations = solveBreakevenTariff(prep, lcoeReal).evaluations;
	const ok = one.medianMs < 5 && tor.medianMs < 100;
	allOk &&= ok;

	console.log(`${file} (${scenario.timeline.operatingYears} operating years)`);
	console.log(`  one evaluation       ${show(one)}   goal < 5 ms: ${mark(one.medianMs < 5)}`);
	console.log(`  tornado, ${drivers.length} drivers   ${show(tor)} on equity IRR   goal < 100 ms: ${mark(tor.medianMs < 100)}`);
	console.log(`                       ${show(torLcoe)} on LCOE`);
	console.log(`  breakeven solve      ${show(breakeven)}   ${evaluations} NPV passes\n`);
}
/** Median and fastest wall time of an async call over `runs` runs after `warmup`, and mean CPU time per run. */
async function measureAsync(fn: () => Promise<unknown>, runs: number, warmup = 2): Promise<Timing> {
	for (let i = 0; i < warmup; i++) await fn();
	const times: number[] = [];
	const cpuStart = process.cpuUsage();
	for (let i = 0; i < runs; i++) {
		const start = performance.now();
		await fn();
		times.push(performance.now() - start);
	}
	const cpu = process.cpuUsage(cpuStart);
	times.sort((a, b) => a - b);
	return { medianMs: times[Math.floor(times.length / 2)], minMs: times[0], cpuMs: (cpu.user + cpu.system) / 1000 / runs };
}

/** The PDF summary's input for a 30-year case: no example runs that long, so the tidal example's life is set to 30 years. */
function thirtyYearSummary(): ScenarioSummaryInput {
	const file = 'tidal-stream-kestle-narrows.json';
	const raw = JSON.parse(readFileSync(join(dir, file), 'utf8'));
	raw.timeline.operatingYears = 30;
	const parsed = parseScenario(raw);
	if (!parsed.ok) throw new Error(`${file} with 30 operating years is not a valid scenario`);
	const document = parsed.scenario;
	const titles = new Map<string, string>(METHOD_NOTES.map((n) => [n.slug, n.title]));
	return {
		project: { name: 'Kestle Narrows tidal array', technology: document.technology, siteName: document.site.name ?? '', siteDescription: '', currency: document.currency },
		scenario: { name: document.name, revision: 1, notes: '' },
		document,
		result: evaluateScenario(document),
		engineVersion: ENGINE_VERSION,
		tornado: tornado(document, defaultDrivers(document), 'lcoeReal'),
		// The app bundles the notes with Vite; a script reads them from docs/methods.
		methodNotes: summaryNoteSlugs(document.technology, true).map((slug) => ({ slug, title: titles.get(slug) ?? slug, markdown: readFileSync(join(process.cwd(), 'docs/methods', `${slug}.md`), 'utf8') })),
		cautions: CAUTIONS,
		edition: { label: 'Team copy', date: new Date() },
		stamp: { email: 'bench@tidewright.example', at: new Date() }
	};
}

const summary = thirtyYearSummary();
let pdfBytes = 0;
const pdf = await measureAsync(async () => {
	pdfBytes = (await renderScenarioSummaryPdf(summary)).length;
}, 7);
const pdfOk = pdf.medianMs < 2000;
allOk &&= pdfOk;
console.log(`PDF summary, 30-year case (tidal example, life set to 30 years; ${summary.result.cashFlow.length} cash-flow rows, tornado, ${summary.methodNotes.length} method notes)`);
console.log(`  drawn                ${show(pdf)}   ${Math.round(pdfBytes / 1024)} kB   goal under 2 s: ${pdfOk ? 'met' : 'missed'}\n`);

console.log(allOk ? 'All goals met.' : 'Some goals were missed (see OVER or missed above).');
