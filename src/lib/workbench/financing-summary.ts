/**
 * The engine's financing block in words: how the debt was sized, what the
 * construction cost to fund, and what each sizing case allows. The results
 * panel, the data-room page and the PDF summary read the same lines.
 *
 * Results stored by earlier engine versions (frozen in data rooms) lack the
 * funding need, fees, funding order and sizing cases, and their gearing was
 * a share of the construction spend: what is missing is left out, and the
 * gearing is named by what it was measured on.
 * Safe to import in the browser.
 */
import DecimalJs from 'decimal.js';
import { groupDigits, NO_VALUE } from '../metrics/format';
import type { EngineResult } from '../server/engine/evaluate';
import type { Scenario } from '../schemas/scenario';

type Financing = NonNullable<EngineResult['financing']>;
type Always = 'sizedBy' | 'gearing' | 'debtAmount' | 'debtDrawn' | 'interestDuringConstruction' | 'upfrontFee';
/** A financing block as stored: the first engine's fields always, the later ones when the engine that made it had them. */
export type StoredFinancing = Pick<Financing, Always> & Partial<Omit<Financing, Always>>;
export type SizingCase = Financing['sizingCases'][number];

export interface FinancingFact {
	label: string;
	value: string;
}

export const spendTimingLabels: Record<Scenario['timeline']['spendTiming'], string> = {
	'mid-year': 'Middle of each construction year',
	quarterly: 'Quarterly, in the middle of each quarter',
	monthly: 'Monthly, in the middle of each month',
	'year-end': 'End of each construction year'
};

export const fundingOrderLabels: Record<Financing['fundingOrder'], string> = {
	'equity-first': 'Equity first, then debt',
	'pro-rata': 'Debt and equity in step (pro rata)'
};

/** What binds a sizing case, in words. */
export const limitedByLabels: Record<SizingCase['limitedBy'], string> = {
	repayment: 'repayment years',
	grace: 'grace years (interest only)',
	cfads: 'CFADS not positive'
};

function percentText(fraction: string): string {
	return `${groupDigits(new DecimalJs(fraction).times(100), 1)} %`;
}

function moneyText(amount: string, currency: string): string {
	return `${groupDigits(amount, 0)} ${currency}`;
}

/** A DSCR as the metrics show it: two decimals and a times sign. */
export function dscrText(value: number | string | null): string {
	return value === null ? NO_VALUE : `${groupDigits(value, 2)}×`;
}

/** "P90" -> "P90 energy"; "P90 (10-year)" -> "P90 (10-year) energy". */
export function sizingCaseName(label: string): string {
	return `${label} energy`;
}

/**
 * "Sized by the P90 target DSCR 1.20", "Sized by gearing, 70.0 % of the total
 * funding need", "Sized by the gearing cap, 80.0 % of the total funding need:
 * every target DSCR allows more".
 */
export function sizedByText(financing: StoredFinancing): string {
	const base = financing.totalFundingNeed === undefined ? 'construction spend' : 'the total funding need';
	const share = `${percentText(financing.gearing)} of ${base}`;
	switch (financing.sizedBy) {
		case 'gearing':
			return `Sized by gearing, ${share}`;
		case 'gearing-cap':
			return `Sized by the gearing cap, ${share}: every target DSCR allows more`;
		case 'target-dscr': {
			const governing = financing.sizingCases?.find((c) => c.label === financing.governingCase);
			return governing ? `Sized by the ${governing.label} target DSCR ${groupDigits(governing.targetDscr, 2)}` : 'Sized by the target DSCR';
		}
	}
}

/** The financing block as labelled lines, in reading order; fields the stored result lacks are left out. */
export function financingFacts(financing: StoredFinancing, currency: string): FinancingFact[] {
	const money = (value: string | undefined) => (value === undefined ? null : moneyText(value, currency));
	const onNeed = financing.totalFundingNeed !== undefined;
	const lines: [string, string | null][] = [
		['Sized by', sizedByText(financing)],
		['Debt at COD', money(financing.debtAmount)],
		[onNeed ? 'Gearing, on the total funding need' : 'Gearing, on construction spend', percentText(financing.gearing)],
		['Total funding need', money(financing.totalFundingNeed)],
		['Equity invested during construction', money(financing.equityInvested)],
		['Debt drawn during construction', money(financing.debtDrawn)],
		['Interest during construction', money(financing.interestDuringConstruction)],
		['Commitment fees', money(financing.commitmentFees)],
		['Upfront fee', money(financing.upfrontFee)],
		['Funding order', financing.fundingOrder === undefined ? null : fundingOrderLabels[financing.fundingOrder]]
	];
	return lines.flatMap(([label, value]) => (value === null ? [] : [{ label, value }]));
}

/** The sizing cases as table rows: case, target, the debt it allows, what binds it, the minimum DSCR under its energy. */
export function sizingCaseRows(financing: StoredFinancing): { governs: boolean; cells: [string, string, string, string, string] }[] {
	return (financing.sizingCases ?? []).map((c) => ({
		governs: financing.sizedBy === 'target-dscr' && c.label === financing.governingCase,
		cells: [sizingCaseName(c.label), dscrText(c.targetDscr), groupDigits(c.debtCapacity, 0), limitedByLabels[c.limitedBy], dscrText(c.minDscr)]
	}));
}

/** The headers of sizingCaseRows, the money one in the given currency. */
export function sizingCaseHeaders(currency: string): [string, string, string, string, string] {
	return ['Case', 'Target DSCR', `Debt it allows (${currency})`, 'What binds it', 'Minimum DSCR under its energy'];
}
