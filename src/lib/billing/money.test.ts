import { describe, expect, it } from 'vitest';
import { formatMinorAmount, majorUnits } from './money';

describe('majorUnits', () => {
	// ISO 4217 minor units: EUR and GBP have 2, JPY 0, BHD 3.
	it('divides by the currency’s own minor unit (ISO 4217)', () => {
		expect(majorUnits(4900, 'eur').toString()).toBe('49');
		expect(majorUnits(4900, 'jpy').toString()).toBe('4900');
		expect(majorUnits(4900, 'bhd').toString()).toBe('4.9');
	});

	it('keeps a cent exact where float division would not (0.1 + 0.2 style)', () => {
		expect(majorUnits(30, 'eur').plus(majorUnits(1, 'eur')).toString()).toBe('0.31');
	});
});

describe('formatMinorAmount', () => {
	it('writes the amount with its currency sign and two decimals', () => {
		expect(formatMinorAmount(490000, 'eur')).toBe('€4,900.00');
		expect(formatMinorAmount(-1633, 'eur')).toBe('-€16.33');
	});
});
