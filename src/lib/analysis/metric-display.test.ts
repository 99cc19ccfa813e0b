import { describe, expect, it } from 'vitest';
import { METRIC_KEYS } from '../server/engine/evaluate';
import { METRIC_DISPLAY, formatDifference, formatMetric, formatRelative, groupDigits, verdictOf } from './metric-display';
import Decimal from 'decimal.js';

describe('METRIC_DISPLAY', () => {
	it('covers every engine metric', () => {
		expect(Object.keys(METRIC_DISPLAY).sort()).toEqual([...METRIC_KEYS].sort());
	});
});

describe('groupDigits', () => {
	it('groups thousands and rounds half to even at the last place', () => {
		// Hand-worked: 1234567.885 at 2 places -> .88 (8 is even), 0.125 at 2 places -> .12
		expect(groupDigits(new Decimal('1234567.885'), 2)).toBe('1,234,567.88');
		expect(groupDigits(new Decimal('0.125'), 2)).toBe('0.12');
		expect(groupDigits(new Decimal('-6441516.97'), 0)).toBe('−6,441,517');
	});
	it('writes a value that rounds to zero without a sign', () => {
		expect(groupDigits(new Decimal('-0.0001'), 2)).toBe('0.00');
	});
});

describe('formatMetric', () => {
	it('shows rates and fractions as percentages', () => {
		expect(formatMetric('equityIrr', '0.0915207133')).toBe('9.15');
		expect(formatMetric('capacityFactor', '0.3063831975')).toBe('30.6');
	});
	it('shows energy and money whole, prices to the cent, an absent value as a dash', () => {
		expect(formatMetric('netAepMWh', '40258.7521467622')).toBe('40,259');
		expect(formatMetric('lcoeReal', '252.6441263815')).toBe('252.64');
		expect(formatMetric('npv', null)).toBe('–');
	});
});

describe('formatDifference and formatRelative', () => {
	it('signs differences; rates in percentage points', () => {
		expect(formatDifference('lcoeReal', '47.4231120829')).toBe('+47.42');
		expect(formatDifference('equityIrr', '-0.0598771186')).toBe('−5.99 pp');
		expect(formatDifference('minDscr', '0.0000000001')).toBe('0.00');
		expect(formatRelative('0.1846776463')).toBe('+18.5 %');
		expect(formatRelative('-0.6542466338')).toBe('−65.4 %');
	});
});

describe('verdictOf', () => {
	it('reads a higher LCOE as worse and a higher IRR as better', () => {
		expect(verdictOf('lcoeReal', '47.42')).toBe('worse');
		expect(verdictOf('lcoeReal', '-1')).toBe('better');
		expect(verdictOf('equityIrr', '0.01')).toBe('better');
		expect(verdictOf('paybackYears', '2.6')).toBe('worse');
	});
	it('calls a change below the shown precision the same, and debt neither', () => {
		expect(verdictOf('minDscr', '0.0000000001')).toBe('same');
		expect(verdictOf('debtAmount', '-2990782.85')).toBe('neutral');
	});
});
