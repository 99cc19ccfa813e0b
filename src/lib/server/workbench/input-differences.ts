/**
 * The inputs that differ between compared scenarios, in the words and units
 * of the assumptions summary (assumptionSections at full detail, which the
 * PDF, the rooms and the exports read too): facts matched by section and
 * label, table cells by table, row and column. Figures the engine worked out
 * (installed capacity, capex total, the debt at COD) are left out: the
 * metrics table compares results, this list compares what was typed.
 */
import type { Scenario } from '../../schemas/scenario';
import type { EngineResult } from '../engine/evaluate';
import { assumptionSections, plainNumber, type AssumptionSection, type Fact, type FactTable } from '../pdf/assumptions';
import { figureInText, numberInText } from './export-numbers';

export interface InputDifference {
	/** The table the input sits in ("Capex lines (real, COD-year money)"); null for a fact of the section. */
	table: string | null;
	/** The input: a fact's label, or a table cell's row and column ("Turbines, Amount", "row 3, Flow speed"). */
	label: string;
	/** The unit every value is read in; '' when the values are words or carry their own units. */
	unit: string;
	/** One value a compared scenario, in their order; null where a scenario has no such input. */
	values: (string | null)[];
}

export interface InputDifferenceSection {
	title: string;
	rows: InputDifference[];
}

export interface ComparedInputs {
	document: Scenario;
	result: EngineResult;
}

/** Past this many differing cells a table (a long histogram, a power matrix) is summed up in one more row. */
export const MAX_TABLE_DIFFERENCES = 12;

/** Units that say nothing beside a number (a symbol left to the label, a plain ratio). */
const SILENT_UNITS = new Set(['', '–', 'ratio']);

/** The keys in first-seen order across the lists: the first scenario's order, then what later ones add. */
function unionInOrder(lists: readonly (readonly string[])[]): string[] {
	const seen = new Set<string>();
	for (const list of lists) for (const key of list) seen.add(key);
	return [...seen];
}

/** Each item keyed by its name, repeated names told apart by their count ("Rated power", "Rated power#2"). */
function keyed<T>(items: readonly T[], nameOf: (item: T) => string): Map<string, T> {
	const counts = new Map<string, number>();
	const map = new Map<string, T>();
	for (const item of items) {
		const name = nameOf(item);
		const n = (counts.get(name) ?? 0) + 1;
		counts.set(name, n);
		map.set(n === 1 ? name : `${name}#${n}`, item);
	}
	return map;
}

const allSame = (values: readonly (string | null)[]) => values.every((v) => v === values[0]);

/** A fact's row: numbers apart from a unit they all share, else the words as the summary writes them. */
function factRow(label: string, facts: readonly (Fact | undefined)[]): InputDifference {
	const present = facts.filter((f): f is Fact => f !== undefined);
	const unit = present[0]?.figure?.unit;
	const sharedUnit = unit !== undefined && present.every((f) => f.figure?.unit === unit);
	if (sharedUnit) {
		return { table: null, label, unit: SILENT_UNITS.has(unit) ? '' : unit, values: facts.map((f) => (f?.figure ? plainNumber(f.figure.value) : null)) };
	}
	return { table: null, label, unit: '', values: facts.map((f) => f?.value ?? null) };
}

function factDifferences(sections: readonly (AssumptionSection | undefined)[]): InputDifference[] {
	const byCase = sections.map((s) => keyed((s?.facts ?? []).filter((f) => !f.derived), (f) => f.label));
	return unionInOrder(byCase.map((m) => [...m.keys()])).flatMap((key) => {
		const facts = byCase.map((m) => m.get(key));
		if (allSame(facts.map((f) => f?.value ?? null))) return [];
		return [factRow(facts.find((f) => f !== undefined)!.label, facts)];
	});
}

const isNumberText = (text: string) => numberInText(text.trim()) !== null;

/** Table cells apart from a unit they all share: the column's own, or one each cell writes after its number ("3,200,000 EUR/device"). */
function cellValues(cells: readonly (string | null)[], columnUnit: string): { unit: string; values: (string | null)[] } {
	const present = cells.filter((c): c is string => c !== null);
	if (present.every(isNumberText)) return { unit: columnUnit, values: [...cells] };
	const figures = present.map(figureInText);
	const unit = figures[0]?.unit;
	if (columnUnit === '' && unit !== undefined && figures.every((f) => f?.unit === unit)) {
		return { unit, values: cells.map((c) => (c === null ? null : c.slice(0, c.length - unit.length - 1))) };
	}
	return { unit: columnUnit, values: [...cells] };
}

/** Named rows (capex lines, grants) match by name; rows of numbers (bins, a power curve) match by position. */
function rowsByName(tables: readonly FactTable[]): boolean {
	return tables.every((t) => {
		const names = t.rows.map((r) => r[0] ?? '');
		return new Set(names).size === names.length && names.every((n) => n !== '' && !isNumberText(n));
	});
}

const columnKey = (c: FactTable['columns'][number]) => (c.unit ? `${c.header} (${c.unit})` : c.header);

function tableDifferences(tables: readonly (FactTable | undefined)[]): InputDifference[] {
	const present = tables.filter((t): t is FactTable => t !== undefined);
	const typedColumns = (t: FactTable) => t.columns.map((c, i) => ({ column: c, index: i })).filter(({ index }) => !t.derivedColumns?.includes(index));
	if (present.every((t) => typedColumns(t).length === 0)) return [];
	const title = present[0].title;
	const byName = rowsByName(present);
	const rowMaps = tables.map((t) => new Map((t?.rows ?? []).map((row, i) => [byName ? row[0] : `row ${i + 1}`, row])));
	const columns = unionInOrder(present.map((t) => typedColumns(t).filter(({ index }) => !(byName && index === 0)).map(({ column }) => columnKey(column))));
	const cellOf = (t: FactTable | undefined, row: string[] | undefined, key: string): string | null => {
		if (!t || !row) return null;
		const index = t.columns.findIndex((c) => columnKey(c) === key);
		return index < 0 ? null : (row[index] ?? null);
	};
	const rowWords = (t: FactTable | undefined, row: string[] | undefined): string | null =>
		t && row ? typedColumns(t).map(({ column, index }) => `${column.header} ${row[index] ?? ''}`.trim()).join(', ') : null;

	const differences: InputDifference[] = [];
	for (const key of unionInOrder(rowMaps.map((m) => [...m.keys()]))) {
		const rows = rowMaps.map((m) => m.get(key));
		if (rows.some((r) => r === undefined)) {
			differences.push({ table: title, label: key, unit: '', values: rows.map((r, i) => rowWords(tables[i], r)) });
			continue;
		}
		for (const column of columns) {
			const cells = rows.map((r, i) => cellOf(tables[i], r, column));
			if (allSame(cells)) continue;
			const header = present.flatMap((t) => t.columns).find((c) => columnKey(c) === column)!;
			differences.push({ table: title, label: `${key}, ${header.header}`, ...cellValues(cells, header.unit ?? '') });
		}
	}
	if (differences.length <= MAX_TABLE_DIFFERENCES) return differences;
	const more = differences.length - MAX_TABLE_DIFFERENCES;
	return [
		...differences.slice(0, MAX_TABLE_DIFFERENCES),
		{
			table: title,
			label: `${more} more value${more === 1 ? '' : 's'} differ`,
			unit: '',
			values: tables.map((t) => (t ? `${t.rows.length} row${t.rows.length === 1 ? '' : 's'} in all` : null))
		}
	];
}

/**
 * The differing inputs, section by section in the editor's order; a section
 * where all scenarios agree is left out, so two identical scenarios give [].
 * Each row has one value a scenario, in the order given.
 */
export function inputDifferences(compared: readonly ComparedInputs[]): InputDifferenceSection[] {
	if (compared.length < 2) return [];
	const sectionsByCase = compared.map((c) => new Map(assumptionSections(c.document, c.result, 'full').map((s) => [s.title, s])));
	return unionInOrder(sectionsByCase.map((m) => [...m.keys()])).flatMap((title) => {
		const sections = sectionsByCase.map((m) => m.get(title));
		const tablesByCase = sections.map((s) => new Map((s?.tables ?? []).map((t) => [t.title, t])));
		const rows = [
			...factDifferences(sections),
			...unionInOrder(tablesByCase.map((m) => [...m.keys()])).flatMap((tableTitle) => tableDifferences(tablesByCase.map((m) => m.get(tableTitle))))
		];
		return rows.length === 0 ? [] : [{ title, rows }];
	});
}
