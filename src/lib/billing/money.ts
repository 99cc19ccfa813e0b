/**
 * Amounts from Stripe are whole minor units (cents); shown in the currency's
 * own major units, divided with decimal.js, never with floating point.
 */
import Decimal from 'decimal.js';

function minorDigits(currency: string): number {
	return new Intl.NumberFormat('en', { style: 'currency', currency: currency.toUpperCase() }).resolvedOptions().maximumFractionDigits ?? 2;
}

export function majorUnits(minor: number, currency: string): Decimal {
	return new Decimal(minor).div(new Decimal(10).pow(minorDigits(currency)));
}

/** 490000, 'eur' -> "€4,900.00" */
export function formatMinorAmount(minor: number, currency: string, locale = 'en-GB'): string {
	const digits = minorDigits(currency);
	const amount = majorUnits(minor, currency);
	const formatted = new Intl.NumberFormat(locale, { style: 'currency', currency: currency.toUpperCase(), minimumFractionDigits: digits, maximumFractionDigits: digits }).format(
		Number(amount.toFixed(digits))
	);
	return formatted;
}
