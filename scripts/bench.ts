/**
 * Engine benchmark on the example scenarios.
 *
 *     npm run bench
 *
 * For each example: the median wall time of one evaluation (evaluateScenario,
 * with the breakeven solve and the plain-data result), of a 12-driver tornado
 * (24 evaluations plus the base), of the breakeven solve alone, and of the same
 * case in plain float64 (engine/float-twin), with the decimal/float ratio.
 * CPU time per evaluation is printed too: on a busy machine wall time includes
 * waiting for a core, CPU time does not.
 * Goals: one evaluation < 5 ms, tornado < 100 ms, decimal within 30x of float64.
 */
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { loadavg } from 'node:os';
import { parseScenario, type Scenario } from '../src/lib/schemas/scenario';
import { evaluateScenario } from '../src/lib/server/engine/evaluate';
import { estimateEnergy } from '../src/lib/server/engine/energy/yield';
import { prepareCase } from '../src/lib/server/engine/cashflow';
import { solveBreakevenTariff } from '../src/lib/server/engine/breakeven';
import { defaultDrivers, tornado } from '../src/lib/server/engine/sensitivity';
import { evaluateFloat } from '../src/lib/server/engine/float-twin';

type Timing = { medianMs: number; cpuMs: number };

/** Median wall time over `runs` calls after `warmup` calls, and mean CPU time per call. */
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
	return { medianMs: times[Math.floor(times.length / 2)], cpuMs: (cpu.user + cpu.system) / 1000 / runs };
}

const fmt = (ms: number) => (ms < 0.1 ? ms.toFixed(4) : ms < 10 ? ms.toFixed(3) : ms.toFixed(1));
const mark = (ok: boolean) => (ok ? 'ok' : 'OVER');

const dir = join(process.cwd(), 'examples');
const files = readdirSync(dir).filter((f) => f.endsWith('.json')).sort();
console.log(`Tidewright engine bench: node ${process.version}, load average ${loadavg().map((x) => x.toFixed(2)).join(' ')}`);
console.log('times in ms: median wall time (mean CPU time per call)\n');

let allOk = true;
for (const file of files) {
	const parsed = parseScenario(JSON.parse(readFileSync(join(dir, file), 'utf8')));
	if (!parsed.ok) throw new Error(`${file} is not a valid scenario`);
	const scenario: Scenario = parsed.scenario;
	const drivers = defaultDrivers(scenario);
	const prep = prepareCase(scenario, estimateEnergy(scenario));

	const one = measure(() => evaluateScenario(scenario), 200);
	const tor = measure(() => tornado(scenario, drivers, 'lcoeReal'), 15);
	const breakeven = measure(() => solveBreakevenTariff(prep), 200);
	const float = measure(() => evaluateFloat(scenario), 2000);
	const evaluations = solveBreakevenTariff(prep).evaluations;
	const ratio = one.cpuMs / float.cpuMs;
	const ok = one.medianMs < 5 && tor.medianMs < 100 && ratio <= 30;
	allOk &&= ok;

	console.log(`${file} (${scenario.timeline.operatingYears} operating years)`);
	console.log(`  one evaluation      ${fmt(one.medianMs)} (${fmt(one.cpuMs)})   goal < 5 ms: ${mark(one.medianMs < 5)}`);
	console.log(`  tornado, ${drivers.length} drivers  ${fmt(tor.medianMs)} (${fmt(tor.cpuMs)})   goal < 100 ms: ${mark(tor.medianMs < 100)}`);
	console.log(`  breakeven solve     ${fmt(breakeven.medianMs)} (${fmt(breakeven.cpuMs)})   ${evaluations} cash-flow passes`);
	console.log(`  float64 twin        ${fmt(float.medianMs)} (${fmt(float.cpuMs)})`);
	console.log(`  decimal / float64   ${ratio.toFixed(1)}x (CPU)   goal <= 30x: ${mark(ratio <= 30)}\n`);
}
console.log(allOk ? 'All goals met.' : 'Some goals were missed (see OVER above).');
