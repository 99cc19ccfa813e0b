/**
 * The API names each problem by its field path (`document.capex.lines[0].amount`);
 * the editor's inputs are addressed by the same path as a key list. These
 * helpers join the two.
 */
import type { ApiIssue } from './api-client';
import type { FieldPath } from './schema-fields';

/** `['capex', 'lines', 0, 'amount']` -> `capex.lines[0].amount` (the schema's own path format). */
export function pathKey(path: FieldPath): string {
	let out = '';
	for (const key of path) out += typeof key === 'number' ? `[${key}]` : out === '' ? key : `.${key}`;
	return out;
}

/** A DOM id for the input of a field: `field-capex-lines-0-amount`. */
export function fieldId(path: FieldPath): string {
	return `field-${path.join('-')}`;
}

/** `capex.lines[0].amount` -> the DOM id of its input, so a listed problem can move focus there. */
export function fieldIdOfKey(key: string): string {
	return `field-${key.replace(/\[(\d+)\]/g, '.$1').split('.').join('-')}`;
}

export type IssueIndex = Map<string, string[]>;

const plainWords: [RegExp, string][] = [
	[/^Too big: expected number to be <=(.+)$/, 'At most $1.'],
	[/^Too big: expected number to be <(.+)$/, 'Less than $1.'],
	[/^Too small: expected number to be >=(.+)$/, 'At least $1.'],
	[/^Too small: expected number to be >(.+)$/, 'More than $1.'],
	[/^Too small: expected array to have >=(\d+) items?$/, 'Needs at least $1 entries.'],
	[/^Invalid input: expected int, received number$/, 'Enter a whole number.'],
	[/^Invalid input: expected number, received (undefined|null|NaN)$/, 'Enter a number.'],
	[/^Invalid input: expected string, received undefined$/, 'Fill this in.']
];

/** zod's own words for a bound ("Too big: expected number to be <=1") said the way the page speaks ("At most 1."). */
export function plainIssue(message: string): string {
	for (const [pattern, words] of plainWords) if (pattern.test(message)) return message.replace(pattern, words);
	return message;
}

/** Problems by field key; `document.` and `document` prefixes dropped. */
export function indexIssues(issues: readonly ApiIssue[]): IssueIndex {
	const index: IssueIndex = new Map();
	for (const issue of issues) {
		const key = issue.path === 'document' ? '(document)' : issue.path.replace(/^document\./, '');
		index.set(key, [...(index.get(key) ?? []), plainIssue(issue.message)]);
	}
	return index;
}

/** The words for one field, or null. */
export function issueFor(index: IssueIndex, path: FieldPath): string | null {
	const messages = index.get(pathKey(path));
	return messages && messages.length > 0 ? messages.join('; ') : null;
}
