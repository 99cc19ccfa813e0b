/**
 * The engine written once over two number types: over random documents (each
 * example with every sensitivity driver moved at random, and its energy
 * outturn drawn), the float64 run agrees with the 30-digit decimal run to
 * 1e-9 relative on every metric the two both give.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseScenario, type Scenario } from '../../schemas/scenario';
import { Decimal, numberKind, withFloat64, ZERO } from './decimal';
import { evaluateMetrics, METRIC_KEYS } from './evaluate';
import { Float64 } from './float64';
import { applyDriver, defaultDrivers } from './sensitivity';

const examplesDir = join(process.cwd(), 'examples');
const examples: Scenario[] = readdirSync(examplesDir)
	.filter((f) => f.endsWith('.json'))
	.sort()
	.map((f) => {
		const parsed = parseScenario(JSON.parse(readFileSync(join(examplesDir, f), 'utf8')));
		if (!parsed.ok) throw new Error(`${f} is not a valid scenario`);
		return parsed.scenario;
	});

/** Relative difference, against the larger magnitude (and 1 for values near zero: rates, ratios). */
function relativeDifference(a: number, b: number, scale: number): number {
	return Math.abs(a - b) / Math.max(Math.abs(a), Math.abs(b), scale);
}

describe('withFloat64', () => {
	it('binds the number type for the call only, also when the call throws', () => {
		expect(withFloat64(() => new Decimal(1).plus(2))).toBeInstanceOf(Float64);
		expect(() =>
			withFloat64(() => {
				throw new RangeError('refused');
			})
		).toThrow('refused');
		expect(numberKind()).toBe('decimal');
		expect(ZERO).not.toBeInstanceOf(Float64);
		expect(new Decimal(1).plus(2)).not.toBeInstanceOf(Float64);
	});

	it('agrees with the decimal engine to 1e-9 relative on random documents', () => {
		const outputs = METRIC_KEYS.filter((k) => k !== 'breakevenTariff');
		fc.assert(
			fc.property(
				fc.nat(examples.length - 1),
				fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 12, maxLength: 12 }),
				fc.double({ min: 0.8, max: 1.2, noNaN: true }),
				(which, positions, energyOutturn) => {
					let scenario = examples[which];
					// Each driver somewhere inside its screening range.
					defaultDrivers(scenario).forEach((range, i) => {
						scenario = applyDriver(scenario, range.driver, range.low + (range.high - range.low) * positions[i % positions.length]);
					});
					const run = () => evaluateMetrics(scenario, outputs, { breakeven: false, energyOutturn });
					const exact = run().metrics;
					const fast = withFloat64(run).metrics;
					// Money is compared on the scale of the capex, rates and ratios on 1.
					const moneyScale = scenario.capex.lines.reduce((total, line) => total + Math.abs(line.amount), 0);
					for (const key of outputs) {
						const a = exact[key];
						const b = fast[key];
						expect(b === null, `${key} given by one kind only`).toBe(a === null);
						if (a === null || b === null) continue;
						const scale = key === 'npv' || key === 'debtAmount' ? moneyScale : 1;
						expect(relativeDifference(a.toNumber(), b.toNumber(), scale), key).toBeLessThan(1e-9);
					}
				}
			),
			{ numRuns: 40, seed: 20261202 }
		);
	});
});
