/**
 * A scenario document in another currency: every money amount (./money-fields
 * finds them by their units) multiplied by the rate the user gives, in
 * decimal arithmetic, and the document's currency set to the new code; or,
 * when the user says the figures already are in the new currency, the code
 * alone changed. No other field is touched.
 *
 *   amount_new = amount_old × rate, rate = units of the new currency per unit of the old
 *
 * Amounts are not rounded: 150 EUR/kW·yr at 1.0825 USD per EUR is 162.375 USD/kW·yr,
 * the exact product of the figures as typed (decimal.js; a JSON number is read by
 * its shortest decimal form, 0.1 as 0.1).
 */
import { Decimal } from '../engine/decimal';
import type { Scenario } from '../../schemas/scenario';
import { moneyPathsOf } from '../../workbench/money-fields';
import type { FieldPath } from '../../workbench/schema-fields';

/** Every money amount keeps its figure (`keep`) or is multiplied by `rate` (`convert`). */
export type AmountsChoice = { kind: 'keep' } | { kind: 'convert'; rate: string };

function setAt(document: unknown, path: FieldPath, value: number) {
	let parent = document as Record<string | number, unknown>;
	for (const key of path.slice(0, -1)) parent = parent[key] as Record<string | number, unknown>;
	parent[path[path.length - 1]] = value;
}

function valueAt(document: unknown, path: FieldPath): unknown {
	let current = document as Record<string | number, unknown> | undefined;
	for (const key of path) current = current?.[key] as Record<string | number, unknown> | undefined;
	return current;
}

/** A rate as typed ("1.0825", 1.0825) as a decimal; a JSON number by its shortest decimal form. */
export function rateDecimal(rate: string | number): Decimal {
	return new Decimal(typeof rate === 'number' ? String(rate) : rate.trim());
}

/** `amount × rate`, exactly as decimals, back to a JSON number. */
export function convertedAmount(amount: number, rate: string): number {
	return new Decimal(String(amount)).times(rateDecimal(rate)).toNumber();
}

/**
 * The document in `currency`: money amounts converted at the choice's rate
 * (or kept), the code changed. Answers the new document (the one given is
 * not changed) and how many money amounts it holds.
 */
export function documentInCurrency(document: Scenario, currency: string, choice: AmountsChoice): { document: Scenario; moneyAmounts: number } {
	const next = structuredClone(document);
	const paths = moneyPathsOf(document);
	if (choice.kind === 'convert') {
		for (const path of paths) setAt(next, path, convertedAmount(valueAt(document, path) as number, choice.rate));
	}
	next.currency = currency;
	return { document: next, moneyAmounts: paths.length };
}

/** The history's words for the revision a currency change writes. */
export function currencyChangeSummary(from: string, to: string, choice: AmountsChoice): string {
	return choice.kind === 'convert'
		? `Currency changed from ${from} to ${to}: every money amount converted at ${rateDecimal(choice.rate).toString()} ${to} per ${from}`
		: `Currency changed from ${from} to ${to}: money amounts kept as they were, not converted`;
}
