import { describe, expect, it } from 'vitest';
import { tidalDocument } from '../../../../tests/fixtures/scenario-documents';
import { evaluateScenario, type EngineResult } from '../engine/evaluate';
import { compareScenarios, metricDifference, missingValueWords } from './compare';

describe('metricDifference', () => {
	it('subtracts the base case exactly in decimals', () => {
		// 0.3 - 0.1 is 0.2 exactly in decimal arithmetic (float64 gives 0.19999999999999998).
		expect(metricDifference('0.3', '0.1')).toEqual({ absolute: '0.2', relative: '2' });
	});

	it('gives the relative change against the size of the base value', () => {
		// LCOE 275 vs 250: +25, +10 % (hand calculation).
		expect(metricDifference('275', '250')).toEqual({ absolute: '25', relative: '0.1' });
		// NPV -50 vs base -100: +50, and +50 % of |-100| is an improvement, so the sign stays positive.
		expect(metricDifference('-50', '-100')).toEqual({ absolute: '50', relative: '0.5' });
	});

	it('has no relative change against a zero base and no difference when a value is missing', () => {
		expect(metricDifference('5', '0')).toEqual({ absolute: '5', relative: null });
		expect(metricDifference(null, '1')).toBeNull();
		expect(metricDifference('1', null)).toBeNull();
	});
});

const entry = (id: string, isBaseCase: boolean, stored: EngineResult) => ({ id, name: id, revision: 1, isBaseCase, result: stored });

describe('compareScenarios', () => {
	const result = evaluateScenario(tidalDocument);

	it('carries each scenario’s cover shortfalls, and none for a result stored before they were reported', () => {
		const short = { ...result, coverShortfalls: { negativeCfadsYears: [3, 4], dscrBelowOneYears: [6] } };
		const { coverShortfalls: _, ...earlier } = result;
		const base = entry('base', true, short);
		const comparison = compareScenarios([base, entry('earlier', false, earlier as EngineResult)], base);
		expect(comparison.scenarios[0].coverShortfalls).toEqual({ negativeCfadsYears: [3, 4], dscrBelowOneYears: [6] });
		expect(comparison.scenarios[1].coverShortfalls).toEqual({ negativeCfadsYears: [], dscrBelowOneYears: [] });
	});
});

describe('missingValueWords', () => {
	const result = evaluateScenario(tidalDocument);

	it('has no words when every metric has a value', () => {
		const full = { ...result, metrics: Object.fromEntries(Object.keys(result.metrics).map((k) => [k, '1'])) as EngineResult['metrics'] };
		expect(missingValueWords(full)).toEqual({});
	});

	it('gives the engine’s own reason after a short name of what is missing', () => {
		// An equity that only ever pays in has no IRR: the cash flows never change sign (irr.ts).
		const noIrr = {
			...result,
			metrics: { ...result.metrics, equityIrr: null },
			warnings: ['Equity IRR is not available: cash flows never change sign (only inflows or only outflows), so no rate makes the NPV zero.']
		};
		expect(missingValueWords(noIrr).equityIrr).toBe('no equity IRR: cash flows never change sign (only inflows or only outflows), so no rate makes the NPV zero');
	});

	it('borrows the reason of the metric a silent one goes missing with, and says something fixed when none was given', () => {
		const noDebt = {
			...result,
			metrics: { ...result.metrics, minDscr: null, avgDscr: null, yearsInLockUp: null, llcr: null },
			warnings: ['Minimum DSCR is not available: there is no debt service.']
		};
		const words = missingValueWords(noDebt);
		expect(words.minDscr).toBe('no minimum DSCR: there is no debt service');
		expect(words.avgDscr).toBe('no average DSCR: there is no debt service');
		expect(words.yearsInLockUp).toBe('no years in lock-up: the covenants set no lock-up DSCR');
		expect(words.llcr).toBe('no LLCR: the engine gave no value (see what it noted)');
	});

	it('reads the reasons an engine run writes: an equity-funded case has no DSCR for want of debt service', () => {
		const equity = { ...tidalDocument, finance: { ...tidalDocument.finance, debt: { sizing: 'none' as const } } };
		const words = compareScenarios([entry('equity', true, evaluateScenario(equity))], null).scenarios[0].missingValues;
		expect(words.minDscr).toBe('no minimum DSCR: there is no debt service');
		expect(words.llcr).toBe('no LLCR: there is no debt');
		expect(Object.values(words).every((w) => !w.includes('–'))).toBe(true);
	});
});
