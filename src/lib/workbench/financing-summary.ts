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
import { operatingYearsList } from '../metrics/cover-shortfalls';
import { groupDigits, NO_VALUE } from '../metrics/format';
import { METRICS } from '../metrics/catalogue';
import type { EngineResult } from '../server/engine/evaluate';
import type { Scenario } from '../schemas/scenario';

type Financing = NonNullable<EngineResult['financing']>;
type Always = 'sizedBy' | 'gearing' | 'debtAmount' | 'debtDrawn' | 'interestDuringConstruction' | 'upfrontFee';
export type SizingCase = Financing['sizingCases'][number];
/** A sizing case as stored: bindsInYears came later than the rest. */
export type StoredSizingCase = Omit<SizingCase, 'bindsInYears'> & Partial<Pick<SizingCase, 'bindsInYears'>>;
/** A financing block as stored: the first engine's fields always, the later ones when the engine that made it had them. */
export type StoredFinancing = Pick<Financing, Always> & Partial<Omit<Financing, Always | 'sizingCases'>> & { sizingCases?: StoredSizingCase[] };

const bindingYears = (c: StoredSizingCase) => c.bindsInYears ?? [];

export interface FinancingFact {
	label: string;
	value: string;
	/** Words rather than a figure (read left, in the text face). */
	words: boolean;
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

/** What set the debt, after the words "Sized by": "the P90 target DSCR 1.20", "gearing, 70.0 % of the total funding need". */
function sizedByWords(financing: StoredFinancing): string {
	const base = financing.totalFundingNeed === undefined ? 'construction spend' : 'the total funding need';
	const share = `${percentText(financing.gearing)} of ${base}`;
	switch (financing.sizedBy) {
		case 'gearing':
			return `gearing, ${share}`;
		case 'gearing-cap':
			return `the gearing cap, ${share}: every target DSCR allows more`;
		case 'target-dscr': {
			const setting = (financing.sizingCases ?? []).filter((c) => bindingYears(c).length > 0);
			if (setting.length > 1) {
				const each = setting.map((c) => `the ${c.label} target DSCR ${groupDigits(c.targetDscr, 2)} in ${operatingYearsList(bindingYears(c))}`);
				return `the least cover each year allows: ${each.slice(0, -1).join(', ')} and ${each[each.length - 1]}`;
			}
			const governing = financing.sizingCases?.find((c) => c.label === financing.governingCase);
			return governing ? `the ${governing.label} target DSCR ${groupDigits(governing.targetDscr, 2)}` : 'the target DSCR';
		}
	}
}

/**
 * "Sized by the P90 target DSCR 1.20", "Sized by gearing, 70.0 % of the total
 * funding need", "Sized by the gearing cap, 80.0 % of the total funding need:
 * every target DSCR allows more".
 */
export function sizedByText(financing: StoredFinancing): string {
	return `Sized by ${sizedByWords(financing)}`;
}

/** The financing block as labelled lines, in reading order; fields the stored result lacks are left out. */
export function financingFacts(financing: StoredFinancing, currency: string): FinancingFact[] {
	const money = (value: string | undefined) => (value === undefined ? null : moneyText(value, currency));
	const onNeed = financing.totalFundingNeed !== undefined;
	const lines: [string, string | null][] = [
		['Sized by', sizedByWords(financing)],
		[METRICS.debtAmount.label, money(financing.debtAmount)],
		[onNeed ? 'Gearing, on the total funding need' : 'Gearing, on construction spend', percentText(financing.gearing)],
		['Total funding need', money(financing.totalFundingNeed)],
		['Equity invested during construction', money(financing.equityInvested)],
		['Debt drawn during construction', money(financing.debtDrawn)],
		['Interest during construction', money(financing.interestDuringConstruction)],
		['Commitment fees', money(financing.commitmentFees)],
		['Upfront fee', money(financing.upfrontFee)],
		['Funding order', financing.fundingOrder === undefined ? null : fundingOrderLabels[financing.fundingOrder]]
	];
	const inWords = new Set(['Sized by', 'Funding order']);
	return lines.flatMap(([label, value]) => (value === null ? [] : [{ label, value, words: inWords.has(label) }]));
}

export interface SizingCaseTable {
	headers: string[];
	/** governs: the case set the debt, or (sculpted on several cases) the debt service of some years. */
	rows: { governs: boolean; cells: string[] }[];
}

/**
 * The sizing cases as a table: case, target, the debt its target allows on
 * its own, what binds it, the minimum DSCR under its energy with the debt as
 * sized; and, for a loan sculpted on several cases, the years whose debt
 * service each case sets.
 */
export function sizingCaseTable(financing: StoredFinancing, currency: string): SizingCaseTable {
	const cases = financing.sizingCases ?? [];
	const shared = cases.some((c) => bindingYears(c).length > 0);
	const byDscr = financing.sizedBy === 'target-dscr';
	return {
		headers: [
			'Case',
			'Target DSCR',
			`Debt it allows on its own (${currency})`,
			'What binds it on its own',
			`${METRICS.minDscr.label} under its energy`,
			...(shared ? ['Sets the debt service in'] : [])
		],
		rows: cases.map((c) => {
			const years = bindingYears(c);
			return {
				governs: byDscr && (shared ? years.length > 0 : c.label === financing.governingCase),
				cells: [
					sizingCaseName(c.label),
					dscrText(c.targetDscr),
					groupDigits(c.debtCapacity, 0),
					limitedByLabels[c.limitedBy],
					dscrText(c.minDscr),
					...(shared ? [years.length > 0 ? operatingYearsList(years) : 'no year'] : [])
				]
			};
		})
	};
}
