import { describe, expect, it } from 'vitest';
import type { Scenario } from '../schemas/scenario';
import { tidalDocument } from '../../../tests/fixtures/scenario-documents';
import { saveConflict, type SavedRevision, type ScenarioSide } from './save-conflict';

// The page is not there in a unit test: no labels, no section headings, so the schema's words and the section table speak.
const words = { labelOf: () => null, sectionOf: () => null };

const side = (change: (doc: Scenario) => void = () => {}, beside: Partial<Omit<ScenarioSide, 'document'>> = {}): ScenarioSide => {
	const document = structuredClone(tidalDocument);
	change(document);
	return { name: document.name, notes: '', ...beside, document };
};
const saved = (revision: number, by: string, scenario: ScenarioSide | null): SavedRevision => ({
	revision,
	by,
	at: `2026-03-0${revision}T10:00:00Z`,
	side: scenario && { name: scenario.name, document: scenario.document }
});

describe('saveConflict', () => {
	const base = side();

	it('lists their change in words, with who made it, and puts my other change on top', () => {
		const latest = side((d) => (d.array.availability = 0.9));
		const mine = side((d) => (d.capex.contingency = 0.15));
		const conflict = saveConflict(base, latest, mine, [saved(2, 'Tomas Vell', latest)], new Set(), words);
		expect(conflict.theirs).toHaveLength(1);
		const [change] = conflict.theirs;
		// Availability is a fraction the form shows as per cent (number-entry.ts).
		expect(change.rows).toEqual([{ key: 'array.availability', section: 'Losses and uncertainty', field: 'Availability', before: '95 %', after: '90 %' }]);
		expect(change.revisions.map((r) => r.by)).toEqual(['Tomas Vell']);
		expect(change.sameAsMine).toBe(false);
		expect(conflict.clashes).toEqual([]);
		expect(conflict.mine).toEqual([{ key: 'capex.contingency', section: 'Capital costs', field: 'Contingency added to every capex line', before: '10 %', after: '15 %' }]);
		expect(conflict.moreOfMine).toBe(0);
		expect(conflict.merged.document.array.availability).toBe(0.9);
		expect(conflict.merged.document.capex.contingency).toBe(0.15);
	});

	it('offers a clash with both values, mine kept until theirs is chosen', () => {
		const latest = side((d) => (d.array.availability = 0.9));
		const mine = side((d) => (d.array.availability = 0.93));
		const conflict = saveConflict(base, latest, mine, [saved(2, 'Tomas Vell', latest)], new Set(), words);
		expect(conflict.clashes).toEqual([
			{
				key: 'document.array.availability',
				section: 'Losses and uncertainty',
				field: 'Availability',
				rows: [{ key: 'array.availability', field: 'Availability', theirs: '90 %', mine: '93 %' }],
				more: 0,
				theirsChosen: false
			}
		]);
		expect(conflict.merged.document.array.availability).toBe(0.93);
		const chosen = saveConflict(base, latest, mine, [saved(2, 'Tomas Vell', latest)], new Set(['document.array.availability']), words);
		expect(chosen.clashes[0].theirsChosen).toBe(true);
		expect(chosen.merged.document.array.availability).toBe(0.9);
	});

	it('takes a changed list apart into the fields that differ, each with its unit', () => {
		const latest = side((d) => (d.capex.lines[1].amount = 6_500_000));
		const conflict = saveConflict(base, latest, side(), [saved(2, 'Tomas Vell', latest)], new Set(), words);
		// The second fixture line is a lump sum in EUR (tests/fixtures/scenario-documents.ts).
		expect(conflict.theirs[0].key).toBe('document.capex.lines');
		expect(conflict.theirs[0].rows).toEqual([
			{ key: 'capex.lines[1].amount', section: 'Capital costs', field: 'Capital cost lines, row 2: amount', before: '6,000,000 EUR', after: '6,500,000 EUR' }
		]);
	});

	it('merges the name and notes beside the document, and keeps the document named as the scenario', () => {
		const latest = side(() => {}, { notes: 'Checked with the lender' });
		const mine = side((d) => (d.name = 'stale copy'), { name: 'Bank case' });
		const conflict = saveConflict(base, latest, mine, [saved(2, 'Isla Penrow', latest)], new Set(), words);
		expect(conflict.theirs.map((c) => c.rows[0])).toEqual([{ key: 'notes', section: 'Scenario', field: 'Notes', before: 'empty', after: 'Checked with the lender' }]);
		expect(conflict.merged.name).toBe('Bank case');
		expect(conflict.merged.notes).toBe('Checked with the lender');
		expect(conflict.merged.document.name).toBe(latest.document.name);
	});

	it('tells which of several revisions made each change when their documents are known, else names them all', () => {
		const second = side((d) => (d.array.availability = 0.9));
		const third = side((d) => {
			d.array.availability = 0.9;
			d.capex.contingency = 0.12;
		});
		const revisions = [saved(2, 'Tomas Vell', second), saved(3, 'Isla Penrow', third)];
		const conflict = saveConflict(base, third, side(), revisions, new Set(), words);
		const by = Object.fromEntries(conflict.theirs.map((c) => [c.key, c.revisions.map((r) => r.revision)]));
		expect(by).toEqual({ 'document.array.availability': [2], 'document.capex.contingency': [3] });

		const unknown = saveConflict(base, third, side(), [saved(2, 'Tomas Vell', null), saved(3, 'Isla Penrow', third)], new Set(), words);
		expect(unknown.theirs.map((c) => c.revisions.map((r) => r.revision))).toEqual([[2, 3], [2, 3]]);
	});

	it('marks a change both made alike, with nothing to choose', () => {
		const latest = side((d) => (d.array.deviceCount = 6));
		const mine = side((d) => (d.array.deviceCount = 6));
		const conflict = saveConflict(base, latest, mine, [saved(2, 'Tomas Vell', latest)], new Set(), words);
		expect(conflict.theirs[0].sameAsMine).toBe(true);
		expect(conflict.clashes).toEqual([]);
		expect(conflict.mine).toEqual([]);
	});
});
