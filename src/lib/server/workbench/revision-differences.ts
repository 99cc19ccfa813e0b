/**
 * What changed between two revisions of one scenario, input by input: the
 * inputs that differ in the words and units of the assumptions summary
 * (input-differences.ts, which the compare page reads too), one row each with
 * the older and the newer value, plus the scenario's name. A change the
 * summary has no words for is still named by its part of the document, so a
 * difference is never lost. Pure: no I/O.
 */
import type { Scenario } from '../../schemas/scenario';
import type { EngineResult } from '../engine/evaluate';
import { changedSections } from './document-changes';
import { inputDifferences } from './input-differences';

export interface RevisionSide {
	revision: number;
	name: string;
	document: Scenario;
	result: EngineResult;
}

export interface RevisionDifference {
	section: string;
	input: string;
	/** The value in the older revision; NOT_SET when it had no such input. */
	before: string;
	after: string;
	/** The unit both values are read in; '' when they are words or carry their own units. */
	unit: string;
}

export const NOT_SET = 'not set';

/** Parts of the document that are words about the scenario, not inputs: compared on their own. */
const aboutTheScenario = new Set(['name', 'description']);

function scenarioRows(before: RevisionSide, after: RevisionSide): RevisionDifference[] {
	const rows: RevisionDifference[] = [];
	if (before.name !== after.name) rows.push({ section: 'Scenario', input: 'Name', before: before.name, after: after.name, unit: '' });
	const was = before.document.description ?? '';
	const now = after.document.description ?? '';
	if (was !== now) rows.push({ section: 'Scenario', input: 'Description', before: was || NOT_SET, after: now || NOT_SET, unit: '' });
	return rows;
}

/** The document's top-level parts in words, for a change the summary cannot word. */
const partWords: Record<string, string> = {
	site: 'site',
	resource: 'resource',
	device: 'device',
	array: 'array and losses',
	uncertainty: 'yield uncertainty and exceedance levels',
	timeline: 'timeline',
	capex: 'capital costs',
	opex: 'operating costs',
	decommissioning: 'decommissioning',
	revenue: 'revenue and grants',
	finance: 'finance, debt and tax',
	currency: 'currency',
	hoursPerYear: 'hours in a year'
};

/**
 * Parts of the document that differ without a worded difference of their
 * own: each changed part is swapped alone into the older document and put in
 * words again (the engine's figures are left out of the comparison, so the
 * older result serves both).
 */
function unwordedChanges(before: RevisionSide, after: RevisionSide): RevisionDifference[] {
	return changedSections(before.document, after.document)
		.filter((key) => !aboutTheScenario.has(key))
		.filter((key) => {
			const swapped = { ...before.document, [key]: after.document[key as keyof Scenario] } as Scenario;
			return inputDifferences([before, { ...before, document: swapped }]).length === 0;
		})
		.map((key) => ({
			section: 'Other settings',
			input: `Settings of the ${partWords[key] ?? key} not listed in words`,
			before: `as in revision ${before.revision}`,
			after: `changed in revision ${after.revision}`,
			unit: ''
		}));
}

/**
 * Every input that reads differently in `after` than in `before`, in the
 * editor's order of sections, then any change the summary has no words for,
 * named by its part of the document.
 */
export function revisionDifferences(before: RevisionSide, after: RevisionSide): RevisionDifference[] {
	const worded = inputDifferences([before, after]).flatMap((section) =>
		section.rows.map((row) => ({ section: section.title, input: row.table ? `${row.table}: ${row.label}` : row.label, before: row.values[0] ?? NOT_SET, after: row.values[1] ?? NOT_SET, unit: row.unit }))
	);
	return [...scenarioRows(before, after), ...worded, ...unwordedChanges(before, after)];
}
