/**
 * A field of the scenario document named in words, for lists that point at
 * fields (the editor's problems, a save conflict's changes): the label the
 * form gives it when the form shows it ("Amount of capex line 2"), else the
 * schema's own short name ("Capital cost lines"), else its path in words
 * ("revenue › tariff per MWh"). Keys are written as the API writes issue
 * paths: `capex.lines[0].amount`.
 */
import { fieldIdOfKey, pathKey } from './field-issues';
import { fieldFacts, type FieldPath } from './schema-fields';

/** `capex.lines[0].amount` -> `['capex', 'lines', 0, 'amount']`. */
export function keyPath(key: string): FieldPath {
	if (!key) return [];
	return key
		.replace(/\[(\d+)\]/g, '.$1')
		.split('.')
		.map((part) => (/^\d+$/.test(part) ? Number(part) : part));
}

/** `tariffPerMWh` -> "tariff per MWh": capitalised words lowered, units and abbreviations kept. */
function camelWords(name: string): string {
	return (name.match(/[MGk]Wh|KW|MW|M[23]|[A-Z]?[a-z0-9]+|[A-Z]+(?![a-z])|[A-Z]/g) ?? [name])
		.map((word) => (/^[A-Z][a-z]+$/.test(word) ? word.toLowerCase() : word))
		.join(' ');
}

/** The path in words: `revenue.tariffPerMWh` -> "revenue › tariff per MWh", a row index as "row 2". */
export function pathWords(key: string): string {
	return keyPath(key)
		.map((part) => (typeof part === 'number' ? `row ${part + 1}` : camelWords(part)))
		.join(' › ');
}

/** Short enough to stand as a name in a list. */
const MAX_NAME = 48;

/**
 * The schema's description cut to its name: "Capital cost lines",
 * "Flow speed histogram" (from "Flow speed histogram (IEC TS 62600-200 uses
 * 0.1 m/s bins)"); null when the schema has none short enough.
 */
export function schemaWords(path: FieldPath, document: unknown): string | null {
	const description = fieldFacts(path, document)?.description;
	if (!description) return null;
	const name = description.split(/ \(|; |: |, /)[0].trim();
	return name && name.length <= MAX_NAME ? name : null;
}

/** The text of the label the page gives an input, spaces tidied; null when the page shows no such field. */
export function labelInPage(id: string): string | null {
	if (typeof document === 'undefined') return null;
	const text = document.querySelector(`label[for="${CSS.escape(id)}"]`)?.textContent?.replace(/\s+/g, ' ').trim();
	return text || null;
}

export interface WordsSources {
	/** The label of the input with this id, if the page shows one. */
	labelOf?: (id: string) => string | null;
	/** A document whose schema branch names the field (the resource kind decides what `resource.bins` is). */
	document?: unknown;
}

/** The schema's name for a field, a field in a row named by its list and row: "Capital cost lines, row 2: amount". */
function schemaFieldWords(path: FieldPath, document: unknown): string | null {
	const row = path.findIndex((part) => typeof part === 'number');
	if (row < 0) return schemaWords(path, document);
	const list = path.slice(0, row);
	const listName = schemaWords(list, document) ?? pathWords(pathKey(list));
	const rest = path.slice(row + 1);
	return `${listName}, row ${Number(path[row]) + 1}${rest.length > 0 ? `: ${pathWords(pathKey(rest))}` : ''}`;
}

/** The field named as its form names it, else as the schema names it (given a document), else its path in words. */
export function fieldWords(key: string, { labelOf = labelInPage, document }: WordsSources = {}): string {
	if (!key) return 'The scenario';
	const label = labelOf(fieldIdOfKey(key));
	if (label) return label;
	const named = document === undefined ? null : schemaFieldWords(keyPath(key), document);
	return named ?? pathWords(key);
}

/** The editor's section for each part of the document, where the page does not say (a field it does not show). */
const sections: Record<string, string> = {
	name: 'Scenario',
	notes: 'Scenario',
	description: 'Scenario',
	schemaVersion: 'Scenario',
	technology: 'Scenario',
	currency: 'Site and resource',
	hoursPerYear: 'Site and resource',
	site: 'Site and resource',
	resource: 'Site and resource',
	device: 'Device and array',
	array: 'Losses and uncertainty',
	uncertainty: 'Losses and uncertainty',
	timeline: 'Timeline, rates and debt',
	capex: 'Capital costs',
	opex: 'Operating costs',
	decommissioning: 'Operating costs',
	revenue: 'Revenue',
	finance: 'Timeline, rates and debt'
};

/** The heading of the editor section holding the input with this id; null when the page shows no such input. */
export function sectionInPage(id: string): string | null {
	if (typeof document === 'undefined') return null;
	const section = document.getElementById(id)?.closest('section[aria-labelledby]');
	const heading = section ? document.getElementById(section.getAttribute('aria-labelledby') ?? '') : null;
	return heading?.textContent?.replace(/\s+/g, ' ').trim() || null;
}

/** The section a field sits in, as the page heads it, else by its part of the document: `capex.lines[0].amount` -> "Capital costs". */
export function sectionWords(key: string, sectionOf: (id: string) => string | null = sectionInPage): string {
	const shown = sectionOf(fieldIdOfKey(key));
	if (shown) return shown;
	const top = String(keyPath(key)[0] ?? '');
	return sections[top] ?? pathWords(top);
}
