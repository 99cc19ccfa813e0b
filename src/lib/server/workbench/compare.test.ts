import { describe, expect, it } from 'vitest';
import { tidalDocument } from '../../../../tests/fixtures/scenario-documents';
import { evaluateScenario, type EngineResult } from '../engine/evaluate';
import { compareScenarios, metricDifference } from './compare';

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

describe('compareScenarios', () => {
	const result = evaluateScenario(tidalDocument);
	const entry = (id: string, isBaseCase: boolean, stored: EngineResult) => ({ id, name: id, revision: 1, isBaseCase, result: stored });

	it('carries each scenario’s cover shortfalls, and none for a result stored before they were reported', () => {
		const short = { ...result, coverShortfalls: { negativeCfadsYears: [3, 4], dscrBelowOneYears: [6] } };
		const { coverShortfalls: _, ...earlier } = result;
		const base = entry('base', true, short);
		const comparison = compareScenarios([base, entry('earlier', false, earlier as EngineResult)], base);
		expect(comparison.scenarios[0].coverShortfalls).toEqual({ negativeCfadsYears: [3, 4], dscrBelowOneYears: [6] });
		expect(comparison.scenarios[1].coverShortfalls).toEqual({ negativeCfadsYears: [], dscrBelowOneYears: [] });
	});
});
