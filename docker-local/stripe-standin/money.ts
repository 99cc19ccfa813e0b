/**
 * Amounts as people read them. Stripe counts in the currency's minor unit
 * (pence, cents); the stand-in assumes two decimal places, which holds for the
 * currencies Tidewright prices in (GBP, EUR, USD).
 */
import Decimal from 'decimal.js';

export function formatAmount(minorUnits: number, currency: string): string {
	const negative = minorUnits < 0;
	const [whole, fraction] = new Decimal(Math.abs(minorUnits)).div(100).toFixed(2).split('.');
	const grouped = whole.replace(/\B(?=(\d{3})+(?!\d))/g, ',');
	return `${negative ? '−' : ''}${currency.toUpperCase()} ${grouped}.${fraction}`;
}

/** unit × quantity, both whole minor units, checked to stay exact. */
export function lineAmount(unitAmount: number, quantity: number): number {
	const amount = new Decimal(unitAmount).times(quantity);
	if (!amount.abs().lte(Number.MAX_SAFE_INTEGER)) throw new RangeError('amount too large');
	return amount.toNumber();
}
