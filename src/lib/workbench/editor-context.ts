/**
 * What every field of the scenario editor needs to know without being told
 * by each parent: the draft (for the schema facts and units), the currency,
 * the problems the API named, and whether the page is read only.
 */
import { getContext, setContext } from 'svelte';
import type { IssueIndex } from './field-issues';

export interface EditorContext {
	readonly document: unknown;
	readonly currency: string;
	readonly issues: IssueIndex;
	readonly readOnly: boolean;
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
