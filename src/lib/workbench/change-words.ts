/**
 * A changed value of the scenario document in words, as its field shows it:
 * fractions as per cent, numbers grouped with their unit ("4,000 EUR/kW"),
 * lists short. And a changed list or group of fields taken apart into the
 * single fields that differ, so "Capital cost lines changed" reads as
 * "Amount of capex line 2: 6,000,000 → 6,500,000 EUR".
 */
import { unitOf } from './field-units';
import { entryUnit, formatEntry, RESTING_PLACES } from './number-entry';
import type { FieldPath } from './schema-fields';
import { stableJson } from './stable-json';

export const NOT_SET = 'not set';

/** Longer words (notes) are cut here. */
const MAX_WORDS = 80;
/** A list shows this many items, then how many there are. */
const MAX_ITEMS = 8;

function isPlainObject(value: unknown): value is Record<string, unknown> {
	return value !== null && typeof value === 'object' && !Array.isArray(value);
}

function numberWords(value: number, path: FieldPath, document: unknown, currency: string): { figure: string; unit: string } {
	const entry = entryUnit(unitOf(path, document, currency));
	return { figure: formatEntry(value, entry.scale, RESTING_PLACES), unit: entry.unit };
}

function listWords(items: readonly unknown[], path: FieldPath, document: unknown, currency: string): string {
	if (items.length === 0) return 'none';
	if (items.every((item) => typeof item === 'number')) {
		const figures = items.map((item, i) => numberWords(item as number, [...path, i], document, currency));
		const shown = figures.slice(0, MAX_ITEMS).map((f) => f.figure).join(', ');
		const more = items.length > MAX_ITEMS ? ` … (${items.length} values)` : '';
		const unit = figures[0].unit;
		return `${shown}${more}${unit ? ` ${unit}` : ''}`;
	}
	const names = items.map((item) => (isPlainObject(item) && typeof item.name === 'string' ? item.name : null));
	if (names.every((name) => name !== null)) {
		const shown = names.slice(0, MAX_ITEMS).join(', ');
		return items.length > MAX_ITEMS ? `${shown} … (${items.length} rows)` : shown;
	}
	return items.length === 1 ? '1 row' : `${items.length} rows`;
}

/** One value as its field reads it; `document` holds it (a money amount's unit follows its line's basis). */
export function valueWords(value: unknown, path: FieldPath, document: unknown, currency: string): string {
	if (value === undefined || value === null) return NOT_SET;
	if (typeof value === 'number') {
		const { figure, unit } = numberWords(value, path, document, currency);
		return unit ? `${figure} ${unit}` : figure;
	}
	if (typeof value === 'boolean') return value ? 'yes' : 'no';
	if (typeof value === 'string') {
		const text = value.replace(/\s+/g, ' ').trim();
		if (!text) return 'empty';
		return text.length > MAX_WORDS ? `${text.slice(0, MAX_WORDS - 1)}…` : text;
	}
	if (Array.isArray(value)) return listWords(value, path, document, currency);
	const count = Object.keys(value).length;
	return count === 1 ? '1 setting' : `${count} settings`;
}

export interface ValueDifference {
	path: FieldPath;
	before: unknown;
	after: unknown;
}

/** Rows of objects (capex lines, histogram bins) are taken apart; a list of plain numbers is one field, as the form types it. */
const rowsApart = (a: readonly unknown[], b: readonly unknown[]) =>
	a.length === b.length && [...a, ...b].every((item) => item !== null && typeof item === 'object');

/**
 * The single fields that differ between two values at `path`: groups of
 * fields key by key (a group present on one side only, field by field
 * against nothing), lists of rows of the same length row by row, anything
 * else whole.
 */
export function valueDifferences(before: unknown, after: unknown, path: FieldPath = []): ValueDifference[] {
	if (stableJson(before) === stableJson(after)) return [];
	const objects = (isPlainObject(before) || before === undefined) && (isPlainObject(after) || after === undefined);
	if (objects && (before !== undefined || after !== undefined)) {
		const was = (before ?? {}) as Record<string, unknown>;
		const now = (after ?? {}) as Record<string, unknown>;
		const keys = [...new Set([...Object.keys(now), ...Object.keys(was)])];
		return keys.flatMap((key) => valueDifferences(was[key], now[key], [...path, key]));
	}
	if (Array.isArray(before) && Array.isArray(after) && rowsApart(before, after)) {
		return before.flatMap((row, i) => valueDifferences(row, after[i], [...path, i]));
	}
	return [{ path, before, after }];
}
