import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { Decimal } from '../engine/decimal';
import { evaluateScenario } from '../engine/evaluate';
import { parseScenario, type Scenario } from '../../schemas/scenario';
import { tidalDocument } from '../../../../tests/fixtures/scenario-documents';
import { assumptionsTable } from './export-assumptions';

function example(name: string): Scenario {
	const parsed = parseScenario(JSON.parse(readFileSync(`examples/${name}.json`, 'utf8')));
	if (!parsed.ok) throw new Error(`examples/${name}.json should parse`);
	return parsed.scenario;
}

/** Every number in the document with its path: "finance.debt.interestRate", "capex.lines.0.amount". */
function numericLeaves(value: unknown, path: string[] = []): { path: string; value: number }[] {
	if (typeof value === 'number') return [{ path: path.join('.'), value }];
	if (value === null || typeof value !== 'object') return [];
	return Object.entries(value).flatMap(([key, child]) => numericLeaves(child, [...path, key]));
}

/** Numbers the document holds that are no assumption of this project, each with the reason. */
function notAnInput(document: Scenario, path: string): boolean {
	if (path === 'schemaVersion') return true; // the file format's version
	if (path === 'site.gravityMPerS2') return document.technology !== 'wave'; // used for wave power only
	// The factor of declining balance, kept by the schema's default when another method is chosen.
	return path.endsWith('decliningBalanceFactor') && document.finance.depreciation.method !== 'declining-balance';
}

describe('assumptionsTable', () => {
	const table = assumptionsTable(tidalDocument, evaluateScenario(tidalDocument));
	const row = (label: string) => table.rows.find((r) => r[1] === label);

	it('is a rectangle headed Section, Assumption, Value, Unit, every row naming its section', () => {
		expect(table.headers.slice(0, 4)).toEqual(['Section', 'Assumption', 'Value', 'Unit']);
		expect(table.rows.every((r) => r.length === table.headers.length && typeof r[0] === 'string' && r[0] !== '')).toBe(true);
		expect(table.numberFormats).toHaveLength(table.rows.length);
	});

	it('gives each input in words with its value and unit apart, shares as per cent', () => {
		// tests/fixtures/scenario-documents.ts: tariff 250 EUR/MWh, availability 0.95, interest 0.06.
		expect(row('Tariff (prices of the indexation base year)')).toEqual(['Revenue and grants', 'Tariff (prices of the indexation base year)', '250', 'EUR/MWh', ...table.headers.slice(4).map(() => null)]);
		expect(row('Availability')?.slice(2, 4)).toEqual(['95', '%']);
		expect(row('Interest rate')?.slice(2, 4)).toEqual(['6', '%/yr (nominal)']);
		expect(table.numberFormats![table.rows.indexOf(row('Availability')!)][2]).toBe('#,##0');
		expect(row('Technology')?.slice(2, 4)).toEqual(['Tidal stream', null]);
		const everything = JSON.stringify(table);
		for (const key of ['tariffPerMWh', 'revenue.', 'arrayLoss', 'per-kW-year', 'lump-sum', 'speedMPerS']) expect(everything).not.toContain(key);
	});

	it('sets a small table under its section: a bold title, a bold header with units, figures as numbers', () => {
		const title = table.rows.findIndex((r) => r[1] === 'Capex lines (real, COD-year money)');
		expect(table.headingRows?.[title]).toBe(true);
		expect(table.headingRows?.[title + 1]).toBe(true);
		expect(table.rows[title + 1].slice(1, 6)).toEqual(['Line', 'Basis', 'Amount', 'Phasing (by construction year)', 'Total with contingency (EUR, real)']);
		const turbines = table.rows[title + 2];
		expect(turbines.slice(0, 4)).toEqual(['Capital costs', 'Turbines', 'Per kW installed', '4,000 EUR/kW']);
		// 4 devices x 1,000 kW x 4,000 EUR/kW x 1.1 contingency = 17,600,000 EUR.
		expect(turbines[5]).toBe('17600000');
		expect(table.numberFormats![title + 2][5]).toBe('#,##0');
		expect(table.headingRows?.[title + 2]).toBe(false);
	});

	it('holds the resource bins the PDF only describes', () => {
		const title = table.rows.findIndex((r) => r[1] === 'Flow speed histogram');
		expect(table.rows[title + 1].slice(1, 3)).toEqual(['Flow speed (m/s)', 'Occurrence (probability)']);
		expect(table.rows.slice(title + 2, title + 7).map((r) => r.slice(1, 3))).toEqual(tidalDocument.resource.kind === 'speed-histogram' ? tidalDocument.resource.bins.map((b) => [String(b.speedMPerS), String(b.occurrence)]) : []);
	});

	it.each(['tidal-stream-kestle-narrows', 'wave-orrin-bank', 'ocean-current-mornstrand', 'lender-case-skerrow-sound', 'wave-tolvey-shelf-nearshore'])(
		'holds every number of %s, as typed or as per cent',
		(name) => {
			const document = example(name);
			const { rows } = assumptionsTable(document, evaluateScenario(document));
			// Every figure in the table: the numeric cells, and the figures inside text ("4,000 EUR/kW", "40 % / 60 %", "P90").
			const shown = new Set(rows.flat().flatMap((cell) => [...String(cell ?? '').matchAll(/\d[\d,]*(?:\.\d+)?/g)].map((m) => new Decimal(m[0].replaceAll(',', '')).toString())));
			const missing = numericLeaves(document)
				.filter(({ path }) => !notAnInput(document, path))
				.filter(({ value }) => !shown.has(new Decimal(value).toString()) && !shown.has(new Decimal(value).times(100).toString()));
			expect(missing).toEqual([]);
		}
	);
});
