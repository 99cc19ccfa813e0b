import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { CAUTIONS } from '../../cautions';
import { METRICS } from '../../metrics/catalogue';
import { portfolioCsv, portfolioCsvTable } from './portfolio-csv';
import { portfolioRow } from './testing/portfolio-rows';

const rows = [
	portfolioRow({ projectName: 'Quenmoor Sound', workspaceName: 'Corvane Advisory' }, [
		['installedCapacityMW', '24'],
		['capexRealTotal', '160000000.4'],
		['lcoeReal', '180.505'],
		['equityIrr', '0.0915207133'],
		['npv', '-6441516.97']
	]),
	portfolioRow({ projectName: '=HYPERLINK("x")', status: 'archived', technology: 'wave', missing: 'no-base-case', reason: 'no base case yet' })
];

describe('portfolioCsvTable', () => {
	it('has units in the headers, the currency beside money and figures rounded as the page shows them', () => {
		const table = portfolioCsvTable(rows, { withWorkspace: true });
		expect(table.headers.slice(0, 6)).toEqual(['Project', 'Workspace', 'Technology', 'Status', 'Base case', 'Currency']);
		expect(table.headers).toContain('Installed capacity (MW; devices × rated power)');
		expect(table.headers).toContain(`${METRICS.lcoeReal.label} (EUR/MWh; real, COD-year money)`);
		expect(table.headers).toContain(`${METRICS.equityIrr.label} (%/yr; nominal)`);
		expect(table.headers.at(-1)).toBe('Why no figures');
		const [first, second] = table.rows;
		const cell = (row: typeof first, header: string) => row[table.headers.indexOf(header)];
		expect(cell(first, 'Currency')).toBe('EUR');
		expect(cell(first, 'Installed capacity (MW; devices × rated power)')).toBe('24.00');
		// Half to even at the catalogue precision: 180.505 -> 180.50; 0.0915207133 -> 9.15 %.
		expect(cell(first, `${METRICS.lcoeReal.label} (EUR/MWh; real, COD-year money)`)).toBe('180.50');
		expect(cell(first, `${METRICS.equityIrr.label} (%/yr; nominal)`)).toBe('9.15');
		expect(cell(second, 'Why no figures')).toBe('no base case yet');
		expect(cell(second, 'Currency')).toBeNull();
		expect(cell(second, 'Status')).toBe('archived');
	});

	it('leaves the workspace column out for one workspace', () => {
		expect(portfolioCsvTable(rows, { withWorkspace: false }).headers).not.toContain('Workspace');
	});
});

describe('portfolioCsv', () => {
	it('writes the rows in the order given, defuses formula-leading text and ends with the cautions', () => {
		const csv = portfolioCsv(rows, { withWorkspace: false });
		expect(csv.startsWith('\uFEFF')).toBe(true);
		const [table, cautions] = csv.slice(1).split('\r\n\r\n');
		const parsed = Papa.parse<string[]>(table, { skipEmptyLines: true }).data;
		expect(parsed).toHaveLength(3);
		expect(parsed[1][0]).toBe('Quenmoor Sound');
		expect(parsed[2][0]).toBe('\'=HYPERLINK("x")');
		// A negative number stays a number.
		expect(parsed[1]).toContain('-6441517');
		expect(Papa.parse<string[]>(cautions, { skipEmptyLines: true }).data.map((r) => r[0])).toEqual(CAUTIONS.map((c) => `Caution: ${c}`));
	});
});
