/**
 * The assumptions as a table for the exports: every input of the scenario
 * document in the words and units the PDF summary and the room pages use
 * (assumptionSections, at full detail), one row a fact: section, assumption,
 * value, unit. A section's small tables (capex lines, the power curve, the
 * bins of the resource) follow its facts, each as a bold title row, a bold
 * header row and its rows, from the second column on. Every row names its
 * section and there are no blank rows, so a filter on the first column
 * keeps a section whole and a CSV reader can stop at the first blank line.
 */
import type { Scenario } from '../../schemas/scenario';
import type { EngineResult } from '../engine/evaluate';
import { assumptionSections, type AssumptionSection, type Fact, type FactTable } from '../pdf/assumptions';
import { figureInText, numberFormat, numberInText } from './export-numbers';
import type { ExportCell, ExportTable } from './export-tables';

interface Line {
	cells: ExportCell[];
	formats: (string | null)[];
	heading: boolean;
}

/** A fact's row; a figure the engine's financing words give as "40,498,975 EUR" is split into number and unit too. */
function factLine(section: string, fact: Fact): Line {
	const figure = fact.figure ?? figureInText(fact.value);
	if (!figure) return { cells: [section, fact.label, fact.value, null], formats: [], heading: false };
	const { value, places, unit } = figure;
	return { cells: [section, fact.label, value, unit === '' ? null : unit], formats: [null, null, numberFormat(places), null], heading: false };
}

/** A table cell: a figure in grouped text becomes a number with its decimals; words stay words. */
function tableCell(text: string): { cell: ExportCell; format: string | null } {
	const number = numberInText(text);
	return number ? { cell: number.value, format: numberFormat(number.places) } : { cell: text === '' ? null : text, format: null };
}

function tableLines(section: string, table: FactTable): Line[] {
	const header = table.columns.map((c) => (c.unit ? `${c.header} (${c.unit})` : c.header));
	const body = table.rows.map((row) => {
		const cells = row.map(tableCell);
		return { cells: [section, ...cells.map((c) => c.cell)], formats: [null, ...cells.map((c) => c.format)], heading: false };
	});
	return [{ cells: [section, table.title], formats: [], heading: true }, { cells: [section, ...header], formats: [], heading: true }, ...body];
}

function sectionLines(section: AssumptionSection): Line[] {
	return [...section.facts.map((fact) => factLine(section.title, fact)), ...section.tables.flatMap((table) => tableLines(section.title, table))];
}

const HEADERS = ['Section', 'Assumption', 'Value', 'Unit'];

/** The Assumptions sheet and CSV: every row as wide as the widest, so the file is a rectangle. */
export function assumptionsTable(document: Scenario, result: EngineResult): ExportTable {
	const lines = assumptionSections(document, result, 'full').flatMap(sectionLines);
	const width = Math.max(HEADERS.length, ...lines.map((l) => l.cells.length));
	const pad = <T>(values: T[], filler: T) => [...values, ...Array<T>(width - values.length).fill(filler)];
	return {
		title: 'Assumptions',
		headers: pad(HEADERS, ''),
		rows: lines.map((l) => pad(l.cells, null)),
		numeric: Array<boolean>(width).fill(false),
		numberFormats: lines.map((l) => pad(l.formats, null)),
		headingRows: lines.map((l) => l.heading)
	};
}
