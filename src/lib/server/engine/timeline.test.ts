import { describe, expect, it } from 'vitest';
import * as financial from 'financial';
import { buildTimeline, discountFactorsOnTimeline, powersOnTimeline, presentValue } from './timeline';
import { Decimal } from './decimal';

describe('buildTimeline', () => {
	it('puts the last construction year at t = 0 and operating year k at t = k', () => {
		// The engine's documented time convention (docs/methods/time-convention.md).
		const t = buildTimeline(3, 4);
		expect(t.constructionTimes).toEqual([-2, -1, 0]);
		expect(t.operatingTimes).toEqual([1, 2, 3, 4]);
	});
});

describe('powersOnTimeline and discount factors', () => {
	it('builds growth^t by repeated multiplication on both sides of COD', () => {
		const p = powersOnTimeline(1.02, buildTimeline(3, 3));
		expect(p.construction[0].minus(new Decimal(1.02).pow(-2)).abs().toNumber()).toBeLessThan(1e-28);
		expect(p.construction.slice(1).map(String)).toEqual([new Decimal(1).div(1.02).toString(), '1']);
		expect(p.operation.map(String)).toEqual(['1.02', '1.0404', '1.061208']);
	});
	it('gives the present value of the npm financial package (first value at t = 0)', () => {
		// npm financial npv (numpy-financial convention) of [-40000, 5000, 8000, 12000, 30000] at 8 % = 3065.22267 (CHECK-VALUES).
		const t = buildTimeline(1, 4);
		const pv = presentValue({ construction: [new Decimal(-40000)], operation: [5000, 8000, 12000, 30000].map((x) => new Decimal(x)) }, discountFactorsOnTimeline(0.08, t));
		expect(pv.toNumber()).toBeCloseTo(3065.22267, 5);
		expect(pv.toNumber()).toBeCloseTo(financial.npv(0.08, [-40000, 5000, 8000, 12000, 30000]), 8);
	});
	it('compounds construction flows before COD', () => {
		// With t = -1 the factor is (1.08)^1: -100 at t = -1 is worth -108 at COD.
		const f = discountFactorsOnTimeline(0.08, buildTimeline(2, 1));
		expect(f.construction[0].toString()).toBe('1.08');
	});
});
