/**
 * The prorated charge for a seat change part-way through a billing period.
 *
 *   amount = unitAmount × (newQuantity − oldQuantity) × (periodEnd − at) / (periodEnd − periodStart)
 *
 * in the currency's minor unit, rounded once to a whole unit, halves away from
 * zero. Stripe prorates to the second in the same way (its docs: "Prorations",
 * time-based proportion of the period left); a negative result is a credit.
 */
import Decimal from 'decimal.js';

export interface ProrationInput {
	unitAmount: number;
	oldQuantity: number;
	newQuantity: number;
	periodStart: number;
	periodEnd: number;
	/** The moment of the change, Unix seconds. */
	at: number;
}

/** The share of the period still to run at `at`, between 0 and 1. */
export function remainingShare(periodStart: number, periodEnd: number, at: number): Decimal {
	const length = periodEnd - periodStart;
	if (length <= 0 || at >= periodEnd) return new Decimal(0);
	if (at <= periodStart) return new Decimal(1);
	return new Decimal(periodEnd - at).div(length);
}

export function prorationAmount(input: ProrationInput): number {
	const share = remainingShare(input.periodStart, input.periodEnd, input.at);
	return new Decimal(input.unitAmount)
		.times(input.newQuantity - input.oldQuantity)
		.times(share)
		.toDecimalPlaces(0, Decimal.ROUND_HALF_UP)
		.toNumber();
}
