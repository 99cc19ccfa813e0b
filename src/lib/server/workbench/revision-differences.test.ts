import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseScenario, type Scenario } from '../../schemas/scenario';
import { evaluateScenario } from '../engine/evaluate';
import { NOT_SET, revisionDifferences, type RevisionSide } from './revision-differences';

/** Read as the app reads a saved document (an older version upgraded, defaults filled in). */
function parsed(document: unknown): Scenario {
	const outcome = parseScenario(document);
	if (!outcome.ok) throw new Error(`the document should parse: ${JSON.stringify(outcome.issues.slice(0, 2))}`);
	return outcome.scenario;
}

/** The example's values (examples/tidal-stream-kestle-narrows.json): availability 0.93, ten turbines at 3,200,000 EUR each, five opex lines. */
const tidal = parsed(JSON.parse(readFileSync('examples/tidal-stream-kestle-narrows.json', 'utf8')));

function side(revision: number, document: Scenario, name = document.name): RevisionSide {
	const read = parsed(document);
	return { revision, name, document: read, result: evaluateScenario(read) };
}

const first = side(1, tidal);

describe('revisionDifferences', () => {
	it('finds nothing between a revision and an identical one', () => {
		expect(revisionDifferences(first, side(2, structuredClone(tidal)))).toEqual([]);
	});

	it('names a renamed scenario, and nothing else when only the name changed', () => {
		expect(revisionDifferences(first, side(2, { ...tidal, name: 'Lender case' }, 'Lender case'))).toEqual([
			{ section: 'Scenario', input: 'Name', before: tidal.name, after: 'Lender case', unit: '' }
		]);
	});

	it('gives a changed share in per cent apart from its unit, and leaves out the figures the engine derived from it', () => {
		const differences = revisionDifferences(first, side(2, { ...tidal, array: { ...tidal.array, availability: 0.95 } }));
		// 0.93 and 0.95 as typed are 93 % and 95 % (the summary reads fractions as per cent).
		expect(differences).toEqual([{ section: 'Array, losses and uncertainty', input: 'Availability', before: '93', after: '95', unit: '%' }]);
	});

	it('names a changed table cell by its table, its row and its column', () => {
		const lines = tidal.capex.lines.map((line) => (line.name === 'Turbines' ? { ...line, amount: 3_500_000 } : line));
		const differences = revisionDifferences(first, side(2, { ...tidal, capex: { ...tidal.capex, lines } }));
		expect(differences).toHaveLength(1);
		expect(differences[0].section).toBe('Capital costs');
		expect(differences[0].input).toMatch(/: Turbines, Amount$/);
		expect(`${differences[0].before} ${differences[0].unit}`).toContain('3,200,000');
		expect(`${differences[0].after} ${differences[0].unit}`).toContain('3,500,000');
	});

	it('reads a removed table row as not set in the newer revision, and an added one as not set in the older', () => {
		const fewer = { ...tidal, opex: { ...tidal.opex, lines: tidal.opex.lines.filter((line) => line.name !== 'Grid use') } };
		const removed = revisionDifferences(first, side(2, fewer));
		expect(removed).toHaveLength(1);
		expect(removed[0]).toMatchObject({ section: 'Operating costs and decommissioning', after: NOT_SET });
		expect(removed[0].input).toMatch(/: Grid use$/);
		expect(removed[0].before).toContain('3');
		const added = revisionDifferences(side(2, fewer), side(3, tidal));
		expect(added[0]).toMatchObject({ before: NOT_SET });
	});

	it('keeps words on both sides when the kind of input changes', () => {
		const debt = tidal.finance.debt;
		if (debt.sizing !== 'target-dscr') throw new Error('the tidal example is sized by DSCR');
		const annuity = revisionDifferences(first, side(2, { ...tidal, finance: { ...tidal.finance, debt: { ...debt, repayment: 'annuity' } } }));
		expect(annuity).toContainEqual(expect.objectContaining({ section: 'Finance and debt', input: 'Repayment', before: 'Sculpted to CFADS', unit: '' }));
	});

	it('still names a change the summary has no words for, by its part of the document', () => {
		// The exceedance levels only shape the engine's own table of P-values, which the comparison leaves out.
		const levels = [...tidal.uncertainty.exceedanceLevels, 99.5];
		const differences = revisionDifferences(first, side(4, { ...tidal, uncertainty: { ...tidal.uncertainty, exceedanceLevels: levels } }));
		expect(differences).toEqual([
			{ section: 'Other settings', input: 'Settings of the yield uncertainty and exceedance levels not listed in words', before: 'as in revision 1', after: 'changed in revision 4', unit: '' }
		]);
	});
});
