/**
 * Values of a scenario that are still a template's placeholders. A scenario
 * started from its technology's example (or from blank defaults) carries the
 * template's figures for the site's and the project's own inputs; the editor
 * marks each one "example value" until the user changes it or says it stands
 * ("Keep these values"). Marks are document paths written as the API writes
 * issue paths (`capex.lines[0].amount`); a table, grid or list of shares the
 * editor shows as one block is one mark (`resource.bins`).
 *
 * Never marked: physical constants and method settings (seawater density,
 * gravity, hours in a year, bin width, Te/Tp, the exceedance levels
 * reported), names and notes, the shape choices the user sees at a glance
 * (resource and device kind, line bases), and values the editor does not
 * show as the document stands (a declining-balance factor under straight
 * line), since a mark must point at a field the user can see. A new
 * scenario marks the figures its template states (placeholderPathsOf the
 * template, accepted against the validated document), not the schema's
 * defaults filled in around them. Safe to import in the browser.
 */
import { pathKey } from './field-issues';
import { keyPath } from './field-words';
import { valueAt, type FieldPath } from './schema-fields';
import { stableJson } from './stable-json';

/** The editor's sections, in page order, by the ids of their headings' sections. */
export const editorSectionIds = ['site-and-resource', 'device-and-array', 'losses', 'capex', 'opex', 'revenue', 'financing', 'tax'] as const;
export type EditorSectionId = (typeof editorSectionIds)[number];

/** Parts of the document that hold the site's and the project's own inputs, walked in this order. */
const walkedParts = ['site', 'resource', 'device', 'array', 'uncertainty', 'timeline', 'capex', 'opex', 'decommissioning', 'revenue', 'finance'];

/** Lists the editor shows as one block (a table, a grid, a list of shares): one mark each. */
const blocks = [
	/^resource\.(bins|states)$/,
	/^device\.(points|powerKW)$/,
	/^uncertainty\.components$/,
	/^capex(\.lines\[\d+\])?\.phasing$/,
	/^finance\.depreciation(\.assetClasses\[\d+\])?\.schedule$/
];

/** Values the editor shows with a block and that change with it: the power matrix's axes go with its cells. */
const blockParts: Record<string, string[]> = { 'device.powerKW': ['device.hsM', 'device.periodS'] };

/** Physical constants, method settings and reporting choices: no facts of the site or project. */
const neverMarked = /^(site\.(name|waterDensityKgPerM3|gravityMPerS2)|resource\.(binWidthMPerS|teOverTp|assessedBy)|device\.(teOverTp|hsM|periodS)|uncertainty\.exceedanceLevels|finance\.debt\.downsideCases\[\d+\]\.horizonYears)$/;

/** The choices that are terms of the project (how its debt and tax work), marked like numbers. */
const markedChoices = new Set(['revenue.indexationMethod', 'finance.debt.sizing', 'finance.debt.repayment', 'finance.debt.fundingOrder', 'finance.depreciation.method']);

function get(document: unknown, key: string): unknown {
	return valueAt(document, keyPath(key));
}

/** Whether the editor shows the field at `key` as the document stands (the forms' own conditions). */
function shownInEditor(key: string, document: unknown): boolean {
	if (key === 'site.waterDepthM') return get(document, 'technology') === 'wave';
	if (/^finance\.(reserves\.debtService|covenants)\./.test(key)) return get(document, 'finance.debt.sizing') !== 'none';
	if (key === 'finance.taxLossCarryForwardCap') return get(document, 'finance.taxLossCarryForward') !== false;
	const rule = /^(finance\.depreciation(?:\.assetClasses\[\d+\])?)\.(method|lifeYears|decliningBalanceFactor|schedule)$/.exec(key);
	if (rule) {
		const [, rulePath, field] = rule;
		// With asset classes, each class has its rule and the top-level one is not shown.
		const classes = get(document, 'finance.depreciation.assetClasses');
		if (rulePath === 'finance.depreciation' && Array.isArray(classes) && classes.length > 0) return false;
		const method = get(document, `${rulePath}.method`) ?? 'straight-line';
		if (field === 'lifeYears') return method !== 'schedule';
		if (field === 'decliningBalanceFactor') return method === 'declining-balance';
		if (field === 'schedule') return method === 'schedule';
	}
	return true;
}

/** The section of the editor that shows the field at `key` (`capex.lines[0].amount` -> capex). */
export function editorSectionOf(key: string): EditorSectionId | null {
	const [top, next] = keyPath(key);
	switch (top) {
		case 'hoursPerYear':
		case 'site':
		case 'resource':
			return 'site-and-resource';
		case 'device':
			return 'device-and-array';
		case 'array':
			return next === 'deviceCount' ? 'device-and-array' : 'losses';
		case 'uncertainty':
			return 'losses';
		case 'capex':
			return 'capex';
		case 'opex':
		case 'decommissioning':
			return 'opex';
		case 'revenue':
			return 'revenue';
		case 'timeline':
			return 'financing';
		case 'finance':
			return /^(taxRate|taxLossCarryForward|taxLossCarryForwardCap|depreciation)$/.test(String(next)) ? 'tax' : 'financing';
		default:
			return null;
	}
}

/**
 * Every value of `document` that a template's placeholder would be: the
 * paths to mark on a scenario started from it, in the editor's page order.
 */
export function placeholderPathsOf(document: unknown): string[] {
	const found: string[] = [];
	const visit = (value: unknown, path: FieldPath) => {
		const key = pathKey(path);
		if (neverMarked.test(key)) return;
		if (blocks.some((block) => block.test(key))) {
			if (Array.isArray(value) && value.length > 0 && shownInEditor(key, document)) found.push(key);
			return;
		}
		if (typeof value === 'number') {
			if (Number.isFinite(value) && shownInEditor(key, document)) found.push(key);
		} else if (typeof value === 'string') {
			if (markedChoices.has(key) && shownInEditor(key, document)) found.push(key);
		} else if (Array.isArray(value)) {
			value.forEach((item, i) => visit(item, [...path, i]));
		} else if (value !== null && typeof value === 'object') {
			for (const [name, item] of Object.entries(value)) visit(item, [...path, name]);
		}
	};
	for (const part of walkedParts) visit(get(document, part), [part]);
	const order = (key: string) => editorSectionIds.indexOf(editorSectionOf(key) ?? 'tax');
	return found.map((key, i) => ({ key, i })).sort((a, b) => order(a.key) - order(b.key) || a.i - b.i).map(({ key }) => key);
}

/** What a mark stands for, comparable across documents: its value, and the values shown with it. */
function markedValue(document: unknown, key: string): string {
	return stableJson([get(document, key) ?? null, ...(blockParts[key] ?? []).map((part) => get(document, part) ?? null)]);
}

/** The marks whose values read the same in `after` as in `before`: an edit (even by an upload or an undo elsewhere) takes a mark away. */
export function unchangedPlaceholders(paths: readonly string[], before: unknown, after: unknown): string[] {
	return paths.filter((key) => markedValue(before, key) === markedValue(after, key));
}

/** The marks of one section of the editor. */
export function placeholdersInSection(paths: readonly string[], section: EditorSectionId): string[] {
	return paths.filter((key) => editorSectionOf(key) === section);
}

/** The marks a new scenario may carry: those asked for that name a placeholder value of its document, in page order. */
export function acceptedPlaceholderPaths(document: unknown, requested: readonly string[]): string[] {
	const asked = new Set(requested);
	return placeholderPathsOf(document).filter((key) => asked.has(key));
}

/**
 * The marks after a save. `requested` is the list the editor sends (the
 * marks the user has not edited nor kept); without it every current mark is
 * a candidate. A save never adds a mark: of the candidates, those still
 * marked now stay, less any whose value the save changed, less all of a
 * part (`resource`, `device`) an upload replaced.
 */
export function placeholdersAfterSave(
	current: readonly string[],
	before: unknown,
	after: unknown,
	options: { requested?: readonly string[]; replacedPart?: string } = {}
): string[] {
	const asked = options.requested === undefined ? null : new Set(options.requested);
	const replaced = options.replacedPart;
	const kept = current.filter((key) => (asked === null || asked.has(key)) && !(replaced && keyPath(key)[0] === replaced));
	return unchangedPlaceholders(kept, before, after);
}

/** Two lists of marks hold the same paths in the same order. */
export function samePlaceholders(a: readonly string[], b: readonly string[]): boolean {
	return a.length === b.length && a.every((key, i) => key === b[i]);
}
