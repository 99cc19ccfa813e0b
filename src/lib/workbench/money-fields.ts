/**
 * The money amounts of a scenario document: every number whose unit is in
 * the document's currency (capex, opex, decommissioning and grant amounts,
 * tariff and merchant prices), found by the same unit rules the editor
 * shows beside each field (./field-units.ts), so a new money field is found
 * the day it gets its unit. Safe to import in the browser.
 */
import { unitOf } from './field-units';
import type { FieldPath } from './schema-fields';

/** Stands for the currency while units are read: a unit that contains it is a unit of money. */
const CURRENCY_MARK = '{currency}';

/** Whether the field at `path` holds money (its unit is in the currency: EUR, EUR/kW, EUR/MWh...). */
export function isMoneyField(path: FieldPath, document: unknown): boolean {
	return unitOf(path, document, CURRENCY_MARK).includes(CURRENCY_MARK);
}

/** Every money amount in the document, as field paths, in document order. */
export function moneyPathsOf(document: unknown): FieldPath[] {
	const found: FieldPath[] = [];
	const visit = (value: unknown, path: FieldPath) => {
		if (typeof value === 'number') {
			if (isMoneyField(path, document)) found.push(path);
		} else if (Array.isArray(value)) {
			value.forEach((item, i) => visit(item, [...path, i]));
		} else if (value !== null && typeof value === 'object') {
			for (const [name, item] of Object.entries(value)) visit(item, [...path, name]);
		}
	};
	visit(document, []);
	return found;
}
