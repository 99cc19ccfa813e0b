/**
 * What every field of the scenario editor needs to know without being told
 * by each parent: the draft (for the schema facts and units), the currency,
 * the problems the API named, whether the page is read only, and which
 * values are still the example's placeholders (./placeholders.ts).
 */
import { getContext, setContext } from 'svelte';
import type { IssueIndex } from './field-issues';

export interface EditorContext {
	readonly document: unknown;
	readonly currency: string;
	readonly issues: IssueIndex;
	readonly readOnly: boolean;
	/** Values still the example's placeholders, by path key (`capex.lines[0].amount`): each field shows "example value". */
	readonly placeholders: ReadonlySet<string>;
	/** The user says these values stand: their marks go, the values stay (saved with the scenario). */
	keepPlaceholders(keys: readonly string[]): void;
}

const key = Symbol('scenario-editor');

export function setEditorContext(context: EditorContext) {
	setContext(key, context);
}

export function getEditorContext(): EditorContext {
	const context = getContext<EditorContext | undefined>(key);
	if (!context) throw new Error('scenario editor fields must sit inside the scenario editor');
	return context;
}
