import { describe, expect, it } from 'vitest';
import { summariseRun, type SummaryOptions } from '../server/probabilistic/summary';
import type { SnapshotRun } from '../server/rooms/snapshot-format';
import { handMadeDraws, handMadeInput, handMadeSummary, HAND_MADE_HURDLE, HAND_MADE_LOCK_UP } from '../../../tests/fixtures/probabilistic-run';
import {
	distributionText,
	driverValueText,
	edgeText,
	formatProbability,
	histogramOutput,
	missingNotes,
	runBasisLine,
	runFacts,
	runHistogram,
	runOutputKeys,
	runProbabilities,
	runTableRows,
	samplingNote
} from './run-report';

// The hand-made run (tests/fixtures/probabilistic-run.ts): ten values each drawn ten times, so
// P90 of a higher-is-better output is v0 + 0.9 (v1 - v0), P50 (v4 + v5) / 2, P10 v8 + 0.1 (v9 - v8)
// (Hyndman and Fan's definition 7 at h = 99 p, worked by hand); for the LCOE the other way round.
const summary = handMadeSummary();

function frozen(): SnapshotRun {
	const input = handMadeInput();
	return {
		runId: '00000000-0000-4000-8000-000000000001',
		seed: input.seed,
		draws: input.draws,
		engineVersion: '7',
		finishedAt: '2026-12-08T10:30:00.000Z',
		drivers: [
			{ driver: 'capex', label: 'Capex', unit: 'x base', distribution: input.drivers[0].distribution },
			{ driver: 'opex', label: 'Opex', unit: 'x base', distribution: input.drivers[1].distribution }
		],
		correlations: input.correlations,
		energyUncertainty: input.energyUncertainty,
		hurdleRate: input.hurdleRate,
		summary
	};
}

describe('runOutputKeys', () => {
	it("lists the run's outputs in the catalogue's order", () => {
		expect(runOutputKeys(summary)).toEqual(['lcoeReal', 'projectIrrPostTax', 'equityIrr', 'npv', 'minDscr']);
	});
});

describe('runTableRows', () => {
	const rows = Object.fromEntries(runTableRows(summary, 'EUR').map((r) => [r.key, r]));

	it('gives P90, P50 and P10 of a higher-is-better output as its 10th, 50th and 90th percentiles, in per cent at two places', () => {
		// Equity IRR 5 %, 6 %, ..., 14 %: P90 = 5 + 0.9 = 5.90, P50 = (9 + 10) / 2 = 9.50, P10 = 13 + 0.1 = 13.10; mean 9.50.
		expect(rows.equityIrr).toMatchObject({ label: 'Equity IRR', unit: '%/yr', mean: '9.50', p90: '5.90', p50: '9.50', p10: '13.10', count: 100, missing: 0 });
	});

	it('turns the percentiles round for the LCOE, where lower is better', () => {
		// LCOE 200, 210, ..., 290: P90 = 280 + 0.1 x 10 = 281, P10 = 200 + 0.9 x 10 = 209.
		expect(rows.lcoeReal).toMatchObject({ unit: 'EUR/MWh', mean: '245.00', p90: '281.00', p50: '245.00', p10: '209.00' });
	});

	it("writes money grouped, without decimals, with a real minus sign (the catalogue's NPV precision)", () => {
		// NPV −2 M to 7 M in steps of 1 M: P90 = −2 M + 0.9 M.
		expect(rows.npv).toMatchObject({ unit: 'EUR', p90: '−1,100,000', p50: '2,500,000', p10: '6,100,000' });
	});

	it('leaves draws without a value out of the figures and counts them', () => {
		// 90 present DSCRs, nine values ten times each: h = 89 p. P90 at h = 8.9 is still the first value, 0.90.
		expect(rows.minDscr).toMatchObject({ unit: '×', p90: '0.90', p50: '1.15', p10: '1.35', count: 90, missing: 10 });
	});
});

describe('missingNotes', () => {
	it('says how many draws of which output have no value, and nothing for complete outputs', () => {
		expect(missingNotes(summary)).toEqual(['Minimum DSCR: 10 of 100 draws have none (no debt service, or the draw was refused) and are left out.']);
	});
});

describe('formatProbability', () => {
	it('writes a share in per cent to one place', () => {
		expect(formatProbability(0)).toBe('0.0 %');
		expect(formatProbability(1 / 3)).toBe('33.3 %');
		expect(formatProbability(1)).toBe('100.0 %');
	});

	it('never rounds a small chance to none, or a large one to a certainty', () => {
		expect(formatProbability(0.0004)).toBe('below 0.1 %');
		expect(formatProbability(0.9996)).toBe('above 99.9 %');
		expect(formatProbability(0.001)).toBe('0.1 %');
	});
});

describe('runProbabilities', () => {
	it('names each threshold and gives the share of the draws below it', () => {
		// DSCR below 1.10: 0.90, 1.00, 1.05 of nine values = 30 of 90; below 1: 10 of 90; equity IRR below 8 %: 5, 6, 7 % = 30 of 100.
		expect(runProbabilities(summary)).toEqual([
			{ label: 'Minimum DSCR below the lock-up level (1.10×)', value: '33.3 %' },
			{ label: 'Minimum DSCR below 1.00×', value: '11.1 %' },
			{ label: 'Equity IRR below the hurdle rate (8.00 %/yr)', value: '30.0 %' }
		]);
	});

	it('says so in words when there is no lock-up level or no value to compare', () => {
		const draws = handMadeDraws();
		draws.outputs.minDscr = draws.outputs.minDscr.map(() => null);
		const noDebt = summariseRun(draws, { drivers: ['capex', 'opex'], energyUncertainty: true, lockUpDscr: null, hurdleRate: HAND_MADE_HURDLE });
		const [lockUp, belowOne] = runProbabilities(noDebt);
		expect(lockUp).toEqual({ label: 'Minimum DSCR below the lock-up level', value: 'no lock-up level in this scenario' });
		expect(belowOne.value).toBe('not defined: no draw has debt service');
		expect(HAND_MADE_LOCK_UP).toBe(summary.thresholds.lockUpDscr);
	});
});

describe('samplingNote', () => {
	it("gives the method note's figure: 0.3 percentage points at P90 with 10,000 draws", () => {
		// docs/methods/probabilistic-runs.md, "Sampling error": sqrt(0.9 x 0.1 / 10,000) = 0.003.
		expect(samplingNote(10_000)).toContain('With 10,000 draws a P90 or P10 is uncertain by about 0.3 percentage points');
		// sqrt(0.09 / 100) = 0.03: 3.0 points.
		expect(samplingNote(100)).toContain('about 3.0 percentage points');
	});
});

describe('driverValueText and distributionText', () => {
	it('writes driver values in the form units', () => {
		expect(driverValueText('x base', 0.9)).toBe('90 % of base');
		expect(driverValueText('fraction/yr', 0.055)).toBe('5.5 %/yr');
		expect(driverValueText('years', 25)).toBe('25 years');
		expect(driverValueText('fraction/yr', -0.01)).toBe('−1 %/yr');
	});

	it('writes each shape with its parameters, a range with its unit once', () => {
		expect(distributionText({ shape: 'triangular', min: 0.9, mode: 1, max: 1.35 }, 'x base')).toBe('triangular, 90 to 135 % of base, most likely 100 % of base');
		expect(distributionText({ shape: 'uniform', min: 20, max: 30 }, 'years')).toBe('uniform, 20 to 30 years');
		expect(distributionText({ shape: 'normal', mean: 0.03, sd: 0.005 }, 'fraction/yr')).toBe('normal, mean 3 %/yr, standard deviation 0.5 %/yr');
		expect(distributionText({ shape: 'truncated-normal', mean: 0.92, sd: 0.03, min: 0.8, max: 0.97 }, 'fraction')).toBe('normal cut to 80 to 97 %, mean 92 %, standard deviation 3 %');
		expect(distributionText({ shape: 'lognormal', mean: 1, sd: 0.1 }, 'x base')).toBe('lognormal, mean 100 % of base, standard deviation 10 % of base');
	});
});

describe('runFacts and runBasisLine', () => {
	it('lists draws, seed, each driver, the energy, the correlations, the hurdle, the engine and the day', () => {
		const facts = Object.fromEntries(runFacts(frozen()).map((f) => [f.label, f.value]));
		expect(facts).toMatchObject({
			Draws: '100',
			Seed: '4242',
			Capex: 'triangular, 90 to 135 % of base, most likely 100 % of base',
			Opex: 'lognormal, mean 100 % of base, standard deviation 10 % of base',
			'Rank correlations': 'Capex with Opex: 0.40',
			'Hurdle rate': '8.00 %/yr',
			'Engine version': '7',
			Finished: '8 December 2026'
		});
		expect(facts['Energy uncertainty']).toMatch(/^drawn/);
	});

	it('leaves the correlations out when there are none', () => {
		expect(runFacts({ ...frozen(), correlations: [] }).map((f) => f.label)).not.toContain('Rank correlations');
	});

	it('says the run in one line', () => {
		expect(runBasisLine(frozen())).toBe('100 draws, seed 4242, engine 7, finished 8 December 2026');
	});
});

describe('runHistogram', () => {
	it('shows the equity IRR in per cent: the edges times 100, every draw counted, P90, P50 and P10 marked', () => {
		const view = runHistogram(summary, 'EUR')!;
		expect(view).toMatchObject({ key: 'equityIrr', label: 'Equity IRR', unit: '%/yr', count: 100 });
		const edges = summary.outputs.equityIrr.histogram.edges;
		expect(view.bins.map((b) => b.from)).toEqual(edges.slice(0, -1).map((e) => expect.closeTo(e * 100, 9)));
		expect(view.bins.at(-1)!.to).toBeCloseTo(edges.at(-1)! * 100, 9);
		expect(view.bins.reduce((sum, b) => sum + b.count, 0)).toBe(100);
		expect(view.markers.map((m) => m.name)).toEqual(['P90', 'P50', 'P10']);
		expect(view.markers.map((m) => m.text)).toEqual(['5.90', '9.50', '13.10']);
		expect(view.markers[0].value).toBeCloseTo(5.9, 9);
	});

	it('falls back to the LCOE when no draw has an equity IRR, and to nothing when neither has a value', () => {
		const draws = handMadeDraws();
		draws.outputs.equityIrr = draws.outputs.equityIrr.map(() => null);
		const options: SummaryOptions = { drivers: ['capex', 'opex'], energyUncertainty: true, lockUpDscr: null, hurdleRate: HAND_MADE_HURDLE };
		const noEquity = summariseRun(draws, options);
		expect(histogramOutput(noEquity)).toBe('lcoeReal');
		expect(runHistogram(noEquity, 'GBP')).toMatchObject({ key: 'lcoeReal', unit: 'GBP/MWh' });
		draws.outputs.lcoeReal = draws.outputs.lcoeReal.map(() => null);
		expect(runHistogram(summariseRun(draws, options), 'GBP')).toBeNull();
	});
});

describe('edgeText', () => {
	it('rounds float noise away, groups thousands and uses a real minus sign', () => {
		expect(edgeText(7.000000000000001)).toBe('7');
		expect(edgeText(0.30000000000000004)).toBe('0.3');
		expect(edgeText(-0.5)).toBe('−0.5');
		expect(edgeText(12_500)).toBe('12,500');
	});
});
