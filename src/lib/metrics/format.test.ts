import { describe, expect, it } from 'vitest';
import {
	chartValue,
	differenceUnit,
	exactMetric,
	formatChartValue,
	formatDifference,
	formatMetric,
	formatMetricWithUnit,
	formatRelative,
	groupDigits,
	roundedMetric,
	spreadsheetNumberFormat,
	verdictAgainst,
	verdictOf
} from './format';

describe('groupDigits', () => {
	it('groups thousands and rounds half to even at the last place', () => {
		// Hand-worked: 1234567.885 at 2 places -> .88 (8 is even), 0.125 at 2 places -> .12
		expect(groupDigits('1234567.885', 2)).toBe('1,234,567.88');
		expect(groupDigits('0.125', 2)).toBe('0.12');
		expect(groupDigits('-6441516.97', 0)).toBe('−6,441,517');
	});
	it('writes a value that rounds to zero without a sign', () => {
		expect(groupDigits('-0.0001', 2)).toBe('0.00');
	});
});

describe('formatMetric', () => {
	it('shows rates and fractions as percentages at the catalogue precision', () => {
		expect(formatMetric('equityIrr', '0.0915207133')).toBe('9.15');
		expect(formatMetric('capacityFactor', '0.3063831975')).toBe('30.6');
	});
	it('shows the case figures beside the metrics at their own precision', () => {
		expect(formatMetric('installedCapacityMW', '15.125')).toBe('15.12');
		expect(formatMetric('capexRealTotal', '86350000.5')).toBe('86,350,000');
		expect(roundedMetric('capexRealTotal', '86350001.5')).toBe('86350002');
	});
	it('shows energy and money whole, prices to the cent, ratios to two places, an absent value as a dash', () => {
		expect(formatMetric('netAepMWh', '40258.7521467622')).toBe('40,259');
		expect(formatMetric('npv', '-6441516.97')).toBe('−6,441,517');
		expect(formatMetric('lcoeReal', '252.6441263815')).toBe('252.64');
		expect(formatMetric('minDscr', '1.3549')).toBe('1.35');
		expect(formatMetric('paybackYears', '11.25')).toBe('11.2');
		expect(formatMetric('npv', null)).toBe('–');
	});
});

describe('roundedMetric', () => {
	it('gives the screen digits without grouping and with an ASCII minus, for files', () => {
		expect(roundedMetric('npv', '-6441516.97')).toBe('-6441517');
		expect(roundedMetric('equityIrr', '0.0915207133')).toBe('9.15');
		expect(roundedMetric('lcoeReal', '1252.6451263815')).toBe('1252.65');
		expect(roundedMetric('npv', '-0.2')).toBe('0');
		expect(roundedMetric('npv', null)).toBeNull();
	});
});

describe('exactMetric', () => {
	it('keeps every digit, scaled to the display unit without rounding', () => {
		expect(exactMetric('equityIrr', '0.0915207133')).toBe('9.15207133');
		expect(exactMetric('npv', '-123456789012.1234567891')).toBe('-123456789012.1234567891');
		expect(exactMetric('capacityFactor', '0.3')).toBe('30');
		expect(exactMetric('llcr', null)).toBeNull();
	});
});

describe('formatMetricWithUnit', () => {
	it('puts the unit after the figure', () => {
		expect(formatMetricWithUnit('lcoeReal', '252.6441263815', 'EUR')).toBe('252.64 EUR/MWh');
		expect(formatMetricWithUnit('equityIrr', '0.0915', 'EUR')).toBe('9.15 %/yr');
		expect(formatMetricWithUnit('equityIrr', null, 'EUR')).toBe('–');
	});
});

describe('formatDifference', () => {
	it('signs differences; per cent figures in percentage points', () => {
		expect(formatDifference('lcoeReal', '47.4231120829')).toBe('+47.42');
		expect(formatDifference('equityIrr', '-0.0598771186')).toBe('−5.99 pp');
		expect(formatDifference('minDscr', '0.0000000001')).toBe('0.00');
		expect(formatDifference('npv', '-0.4')).toBe('0');
	});
});

describe('differenceUnit', () => {
	it('is percentage points for per cent figures and the unit otherwise', () => {
		expect(differenceUnit('equityIrr', 'EUR')).toBe('pp');
		expect(differenceUnit('lcoeReal', 'EUR')).toBe('EUR/MWh');
	});
});

describe('formatRelative', () => {
	it('writes a relative change as a signed per cent to one place', () => {
		expect(formatRelative('0.1846776463')).toBe('+18.5 %');
		expect(formatRelative('-0.6542466338')).toBe('−65.4 %');
		expect(formatRelative('-0.0001')).toBe('0.0 %');
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
		// 0.00004 is 0.004 pp, below the 0.01 pp an IRR shows.
		expect(verdictOf('equityIrr', '0.00004')).toBe('same');
		expect(verdictOf('debtAmount', '-2990782.85')).toBe('neutral');
	});
});

describe('verdictAgainst', () => {
	it('compares a value with the base, neutral when either is missing', () => {
		expect(verdictAgainst('lcoeReal', '260', '250')).toBe('worse');
		expect(verdictAgainst('minDscr', '1.40', '1.30')).toBe('better');
		expect(verdictAgainst('minDscr', null, '1.30')).toBe('neutral');
	});
});

describe('chartValue and formatChartValue', () => {
	it('draws per cent figures times 100 and labels them with the unit', () => {
		expect(chartValue('equityIrr', '0.0915')).toBeCloseTo(9.15, 12);
		expect(chartValue('lcoeReal', '252.64')).toBeCloseTo(252.64, 12);
		expect(chartValue('lcoeReal', null)).toBeNull();
		expect(formatChartValue('equityIrr', 9.153, 'EUR')).toBe('9.15 %/yr');
		expect(formatChartValue('npv', -1234567.4, 'EUR')).toBe('−1,234,567 EUR');
	});
});

describe('spreadsheetNumberFormat', () => {
	it('uses percent formats for per cent figures and grouped formats at the catalogue precision otherwise', () => {
		expect(spreadsheetNumberFormat('equityIrr')).toBe('0.00%');
		expect(spreadsheetNumberFormat('capacityFactor')).toBe('0.0%');
		expect(spreadsheetNumberFormat('npv')).toBe('#,##0');
		expect(spreadsheetNumberFormat('lcoeReal')).toBe('#,##0.00');
		expect(spreadsheetNumberFormat('paybackYears')).toBe('#,##0.0');
	});
});
