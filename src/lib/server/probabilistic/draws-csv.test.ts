import { describe, expect, it } from 'vitest';
import { csvNumber, drawsCsvText } from './draws-csv';
import type { RunDraws } from './summary';

describe('csvNumber', () => {
	it('rounds to 10 significant digits, so float noise disappears', () => {
		// 0.1 + 0.2 is 0.30000000000000004 in IEEE 754 double precision (from memory: the classic example).
		expect(csvNumber(0.1 + 0.2)).toBe('0.3');
		expect(csvNumber(1.3499999999999999)).toBe('1.35');
		expect(csvNumber(123456789012)).toBe('123456789000');
		expect(csvNumber(-2 / 3)).toBe('-0.6666666667');
	});

	it('writes plain decimals where JavaScript would switch to an exponent', () => {
		// Number#toString uses an exponent below 1e-6 and from 1e21 (ECMA-262, Number::toString).
		expect(String(1.234e-7)).toBe('1.234e-7');
		expect(csvNumber(1.234e-7)).toBe('0.0000001234');
		expect(csvNumber(-5e-9)).toBe('-0.000000005');
		expect(csvNumber(1e21)).toBe('1000000000000000000000');
		expect(csvNumber(1.5e22)).toBe('15000000000000000000000');
	});

	it('leaves a missing value empty', () => {
		expect(csvNumber(null)).toBe('');
		expect(csvNumber(undefined)).toBe('');
		expect(csvNumber(Number.NaN)).toBe('');
	});
});

describe('drawsCsvText', () => {
	const chunk = (energyFactor: number[], capex: number[], irr: (number | null)[]): RunDraws => ({
		outputs: { lcoeReal: energyFactor.map(() => 100), projectIrrPostTax: irr, equityIrr: irr, npv: energyFactor.map(() => -1), minDscr: energyFactor.map(() => 1.2) },
		drivers: { capex },
		energyFactor
	});

	it('numbers the rows by draw index, chunk by chunk, with a header and CRLF line ends (RFC 4180)', () => {
		const text = drawsCsvText([{ firstDraw: 0, draws: chunk([1, 0.9], [1.1, 1.2], [0.07, null]) }, { firstDraw: 4, draws: chunk([1.05], [0.95], [0.08]) }], ['capex']);
		expect(text).toBe(
			[
				'draw,capex,energyFactor,lcoeReal,projectIrrPostTax,equityIrr,npv,minDscr',
				'0,1.1,1,100,0.07,0.07,-1,1.2',
				'1,1.2,0.9,100,,,-1,1.2',
				'4,0.95,1.05,100,0.08,0.08,-1,1.2',
				''
			].join('\r\n')
		);
	});
});
