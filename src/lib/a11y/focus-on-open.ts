/**
 * A Svelte action for a form or panel that opens in place at a person's
 * request (New project, Duplicate, Rename): the keyboard's focus moves into
 * it, to its first field, so nobody has to hunt for what just appeared (the
 * button that opened it is often gone by then). A field already filled in is
 * selected, ready to type over. Without a field the panel itself takes the
 * focus (focusable from script only, not a Tab stop).
 *
 * Only for what opens on request: a page shown on load keeps the browser's
 * own starting point.
 */
import type { Action } from 'svelte/action';

const FIELD = [
	'input:not([type="hidden"]):not([disabled])',
	'select:not([disabled])',
	'textarea:not([disabled])'
].join(', ');

export const focusOnOpen: Action<HTMLElement> = (node) => {
	const field = node.querySelector<HTMLInputElement | HTMLSelectElement | HTMLTextAreaElement>(FIELD);
	if (!field) {
		if (!node.hasAttribute('tabindex')) node.tabIndex = -1;
		node.focus();
		return;
	}
	field.focus();
	if ((field instanceof HTMLInputElement || field instanceof HTMLTextAreaElement) && field.value !== '' && typeof field.select === 'function') {
		field.select();
	}
};
