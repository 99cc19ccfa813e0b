import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseScenario, type Scenario } from '../../schemas/scenario';
import { evaluateDetailed } from '../engine/evaluate';
import { evaluateDraw, scenarioForDraw } from './draw-evaluation';

function example(file: string): Scenario {
	const parsed = parseScenario(JSON.parse(readFileSync(join(process.cwd(), 'examples', file), 'utf8')));
	if (!parsed.ok) throw new Error(`${file} is not a valid scenario`);
	return parsed.scenario;
}

const tidal = example('tidal-stream-kestle-narrows.json');

describe('evaluateDraw', () => {
	it('with no driver moved and the estimate delivered, gives the deterministic figures', () => {
		const exact = evaluateDetailed(tidal, { breakeven: false }).metrics;
		const draw = evaluateDraw(tidal, { drivers: {}, energyOutturn: 1 });
		for (const key of ['lcoeReal', 'projectIrrPostTax', 'equityIrr', 'npv', 'minDscr'] as const) {
			expect(draw[key]).toBeCloseTo(exact[key]!.toNumber(), 6);
		}
	});

	it('sizes the debt on the estimate while the years deliver the energy drawn', () => {
		const base = evaluateDetailed(tidal, { breakeven: false });
		const short = evaluateDetailed(tidal, { breakeven: false, energyOutturn: 0.9 });
		// Same loan: sized at financial close on the estimate.
		expect(short.metrics.debtAmount!.toNumber()).toBeCloseTo(base.metrics.debtAmount!.toNumber(), 2);
		expect(short.metrics.netAepMWh!.toNumber()).toBeCloseTo(base.metrics.netAepMWh!.toNumber() * 0.9, 6);
		// Less energy on the same loan: every cover ratio falls, the LCOE rises (common practice).
		expect(short.metrics.minDscr!.toNumber()).toBeLessThan(base.metrics.minDscr!.toNumber());
		expect(short.metrics.lcoeReal!.toNumber()).toBeGreaterThan(base.metrics.lcoeReal!.toNumber());
		// The real LCOE is discounted cost over discounted energy; costs per MWh fall with the energy, so
		// 10 % less energy raises it by less than 1/0.9 (common practice).
		expect(short.metrics.lcoeReal!.toNumber()).toBeLessThan(base.metrics.lcoeReal!.toNumber() / 0.9);
	});

	it('applies the drawn driver values in turn', () => {
		const moved = scenarioForDraw(tidal, { capex: 1.1, availability: 0.8 });
		expect(moved.array.availability).toBe(0.8);
		expect(moved.capex.lines[0].amount).toBeCloseTo(tidal.capex.lines[0].amount * 1.1, 6);
		expect(evaluateDraw(tidal, { drivers: { capex: 1.1 }, energyOutturn: 1 }).lcoeReal!).toBeGreaterThan(evaluateDraw(tidal, { drivers: {}, energyOutturn: 1 }).lcoeReal!);
	});
});
