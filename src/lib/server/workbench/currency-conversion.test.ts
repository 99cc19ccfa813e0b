import { readFileSync } from 'node:fs';
import DecimalJs from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { parseScenario, type Scenario } from '../../schemas/scenario';
import { moneyPathsOf } from '../../workbench/money-fields';
import { pathKey } from '../../workbench/field-issues';
import { valueAt, type FieldPath } from '../../workbench/schema-fields';
import { convertedAmount, currencyChangeSummary, documentInCurrency } from './currency-conversion';

function example(name: string): Scenario {
	const parsed = parseScenario(JSON.parse(readFileSync(new URL(`../../../../examples/${name}.json`, import.meta.url), 'utf8')));
	if (!parsed.ok) throw new Error(`examples/${name}.json does not parse`);
	return parsed.scenario;
}

const tidal = example('tidal-stream-kestle-narrows');
const wave = example('wave-orrin-bank');

/** The money amounts of examples/tidal-stream-kestle-narrows.json, read off the file by hand. */
const tidalMoney = [
	'capex.lines[0].amount', // Turbines, EUR per device
	'capex.lines[1].amount',
	'capex.lines[2].amount',
	'capex.lines[3].amount', // export cable, lump sum
	'capex.lines[4].amount',
	'capex.lines[5].amount', // project management, EUR per kW
	'opex.lines[0].amount', // O&M, EUR per kW-year
	'opex.lines[3].amount', // grid use, EUR per MWh
	'opex.lines[4].amount', // overhaul, EUR per device
	'decommissioning.amount',
	'revenue.tariffPerMWh',
	'revenue.merchantPricePerMWh',
	'revenue.grants[0].amount'
];

function setAt(document: unknown, path: FieldPath, value: unknown) {
	let parent = document as Record<string | number, unknown>;
	for (const key of path.slice(0, -1)) parent = parent[key] as Record<string | number, unknown>;
	parent[path[path.length - 1]] = value;
}

describe('moneyPathsOf', () => {
	it('finds every money amount of the tidal example and nothing else: shares of capex or revenue are not money', () => {
		expect(moneyPathsOf(tidal).map(pathKey).sort()).toEqual([...tidalMoney].sort());
	});

	it('leaves out a grant given as a share of capex', () => {
		expect(wave.revenue.grants[0].basis).toBe('percent-of-capex');
		expect(moneyPathsOf(wave).map(pathKey)).not.toContain('revenue.grants[0].fraction');
	});
});

describe('convertedAmount', () => {
	it('multiplies as decimals, not as binary floats', () => {
		// In binary floating point 3 × 1.1 is 3.3000000000000003 (IEEE 754 double); as decimals it is 3.3.
		expect(3 * 1.1).not.toBe(3.3);
		expect(convertedAmount(3, '1.1')).toBe(3.3);
	});

	it('agrees with hand computations', () => {
		// By hand: 3,200,000 × 1.0825 = 3,200,000 + 264,000; 255 × 1.0825 = 255 + 21.0375; 150 × 1.0825 = 150 + 12.375.
		expect(convertedAmount(3_200_000, '1.0825')).toBe(3_464_000);
		expect(convertedAmount(255, '1.0825')).toBe(276.0375);
		expect(convertedAmount(150, '1.0825')).toBe(162.375);
	});
});

describe('documentInCurrency', () => {
	it('converts every money amount at the rate and touches no other field', () => {
		const rate = '1.0825';
		const { document, moneyAmounts } = documentInCurrency(tidal, 'USD', { kind: 'convert', rate });
		expect(moneyAmounts).toBe(tidalMoney.length);
		expect(document.currency).toBe('USD');
		for (const key of tidalMoney) {
			const path = moneyPathsOf(tidal).find((p) => pathKey(p) === key)!;
			// The reference: decimal.js itself, on the amount as written in the file.
			const expected = new DecimalJs(String(valueAt(tidal, path))).times(rate).toNumber();
			expect(valueAt(document, path), key).toBe(expected);
		}
		// Put the old amounts and code back: what is left must be the example, field for field.
		const restored = structuredClone(document);
		for (const path of moneyPathsOf(tidal)) setAt(restored, path, valueAt(tidal, path));
		restored.currency = tidal.currency;
		expect(restored).toEqual(tidal);
	});

	it('keeps every amount when asked to, changing the code alone', () => {
		const { document } = documentInCurrency(tidal, 'GBP', { kind: 'keep' });
		expect(document).toEqual({ ...tidal, currency: 'GBP' });
	});

	it('leaves the document it is given as it was', () => {
		const before = structuredClone(tidal);
		documentInCurrency(tidal, 'USD', { kind: 'convert', rate: '2' });
		expect(tidal).toEqual(before);
	});
});

describe('currencyChangeSummary', () => {
	it('says in the history what became of the money', () => {
		expect(currencyChangeSummary('EUR', 'USD', { kind: 'convert', rate: '1.0825' })).toBe('Currency changed from EUR to USD: every money amount converted at 1.0825 USD per EUR');
		expect(currencyChangeSummary('EUR', 'USD', { kind: 'keep' })).toBe('Currency changed from EUR to USD: money amounts kept as they were, not converted');
	});
});
