/**
 * decimalString writes a decimal from its digits; the reference is decimal.js's
 * own rounding and formatting, x.toDecimalPlaces(10).toFixed() (decimal.js
 * API: toDecimalPlaces rounds with the constructor's rounding mode, here half
 * to even; toFixed() without places never uses exponent notation).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { Decimal } from './decimal';
import { decimalString } from './decimal-string';

function reference(x: Decimal): string {
	const rounded = x.toDecimalPlaces(10);
	return rounded.isZero() ? '0' : rounded.toFixed();
}

describe('decimalString', () => {
	it('gives decimal.js’s string rounded to 10 places on random decimals of every size', () => {
		const digits = fc.string({ unit: fc.constantFrom('0', '1', '2', '3', '4', '5', '6', '7', '8', '9'), minLength: 1, maxLength: 30 });
		fc.assert(
			fc.property(fc.boolean(), fc.integer({ min: 1, max: 9 }), digits, fc.integer({ min: -40, max: 25 }), (negative, lead, rest, exponent) => {
				const x = new Decimal(`${negative ? '-' : ''}${lead}${rest}e${exponent}`);
				expect(decimalString(x)).toBe(reference(x));
			}),
			{ numRuns: 3000, seed: 20261202 }
		);
	});

	it('rounds ties to even, carries through nines and writes zero as 0', () => {
		// Half to even at the 10th place (decimal.js ROUND_HALF_EVEN): ...05 rounds down, ...15 up, anything past 5 up.
		const cases: [string, string][] = [
			['0.00000000005', '0'],
			['0.00000000015', '0.0000000002'],
			['0.000000000050001', '0.0000000001'],
			['-0.00000000006', '-0.0000000001'],
			['-0.00000000004', '0'],
			['9.99999999995', '10'],
			['999.99999999996', '1000'],
			['1.23450000000', '1.2345'],
			['1e25', '10000000000000000000000000'],
			['-123.4500000012345678', '-123.4500000012'],
			['0', '0']
		];
		for (const [input, expected] of cases) {
			expect(decimalString(new Decimal(input))).toBe(expected);
			expect(reference(new Decimal(input))).toBe(expected);
		}
	});
});
