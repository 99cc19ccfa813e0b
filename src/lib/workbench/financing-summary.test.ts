import { describe, expect, it } from 'vitest';
import { financingFacts, sizedByText, sizingCaseTable, type StoredFinancing } from './financing-summary';

/** A financing block shaped as the engine answers it (figures invented, rounded for reading). */
const sizedOnP90: StoredFinancing = {
	sizedBy: 'target-dscr',
	governingCase: 'P90',
	gearing: '0.6164842782',
	debtAmount: '42776986.03',
	debtDrawn: '40178228.7',
	interestDuringConstruction: '2598757.33',
	commitmentFees: '226234.18',
	upfrontFee: '855539.72',
	totalFundingNeed: '69388608.18',
	equityInvested: '26611622.15',
	fundingOrder: 'pro-rata',
	sizingCases: [
		{ label: 'P50', targetDscr: 1.35, debtCapacity: '46525069.84', limitedBy: 'repayment', bindsInYears: [], minDscr: '1.3183106082', dscr: [] },
		{ label: 'P90', targetDscr: 1.2, debtCapacity: '42776986.03', limitedBy: 'grace', bindsInYears: [], minDscr: '1.2', dscr: [] },
		{ label: 'P99 (10-year)', targetDscr: 1, debtCapacity: '43000000', limitedBy: 'cfads', bindsInYears: [], minDscr: null, dscr: [] }
	]
};

/** As the first engine stored it in a data-room snapshot: no funding need, fees, order or cases. */
const storedEarlier: StoredFinancing = {
	sizedBy: 'gearing',
	gearing: '0.7',
	debtAmount: '30000000',
	debtDrawn: '28000000',
	interestDuringConstruction: '2000000',
	upfrontFee: '600000'
};

describe('sizedByText', () => {
	it('names the governing case and its target', () => {
		expect(sizedByText(sizedOnP90)).toBe('Sized by the P90 target DSCR 1.20');
		expect(sizedByText({ ...sizedOnP90, governingCase: 'P50' })).toBe('Sized by the P50 target DSCR 1.35');
	});

	it('states the gearing and what it is measured on', () => {
		expect(sizedByText({ ...sizedOnP90, sizedBy: 'gearing', gearing: '0.7' })).toBe('Sized by gearing, 70.0 % of the total funding need');
		expect(sizedByText({ ...sizedOnP90, sizedBy: 'gearing-cap', gearing: '0.8' })).toBe(
			'Sized by the gearing cap, 80.0 % of the total funding need: every target DSCR allows more'
		);
		// Before the funding need existed, gearing was a share of the construction spend.
		expect(sizedByText(storedEarlier)).toBe('Sized by gearing, 70.0 % of construction spend');
	});
});

describe('financingFacts', () => {
	it('lists the debt, the gearing on the funding need, the funding and its costs, in reading order', () => {
		const facts = financingFacts(sizedOnP90, 'EUR');
		expect(facts.map((f) => f.label)).toEqual([
			'Sized by',
			'Debt at COD',
			'Gearing, on the total funding need',
			'Total funding need',
			'Equity invested during construction',
			'Debt drawn during construction',
			'Interest during construction',
			'Commitment fees',
			'Upfront fee',
			'Funding order'
		]);
		const value = (label: string) => facts.find((f) => f.label === label)?.value;
		expect(value('Debt at COD')).toBe('42,776,986 EUR');
		expect(value('Gearing, on the total funding need')).toBe('61.6 %');
		expect(value('Commitment fees')).toBe('226,234 EUR');
		expect(value('Funding order')).toBe('Debt and equity in step (pro rata)');
		expect(value('Sized by')).toBe('the P90 target DSCR 1.20');
	});

	it('leaves out what an earlier stored result lacks, and names its gearing by construction spend', () => {
		const labels = financingFacts(storedEarlier, 'GBP').map((f) => f.label);
		expect(labels).toEqual([
			'Sized by',
			'Debt at COD',
			'Gearing, on construction spend',
			'Debt drawn during construction',
			'Interest during construction',
			'Upfront fee'
		]);
	});
});

/** Sculpted on P50 and P90 together: each year's service is the lesser either cover allows. */
const sculptedOnBoth: StoredFinancing = {
	...sizedOnP90,
	sizingCases: [
		{ ...sizedOnP90.sizingCases![0], bindsInYears: [1, 2, 3, 4, 5, 6] },
		{ ...sizedOnP90.sizingCases![1], bindsInYears: [7, 8, 9, 10, 11, 12, 13, 14, 15] },
		{ ...sizedOnP90.sizingCases![2], bindsInYears: [] }
	]
};

describe('sizedByText, sculpted on several cases', () => {
	it('names each case that sets some years, with those years', () => {
		expect(sizedByText(sculptedOnBoth)).toBe(
			'Sized by the least cover each year allows: the P50 target DSCR 1.35 in operating years 1 to 6 and the P90 target DSCR 1.20 in operating years 7 to 15'
		);
	});
});

describe('sizingCaseTable', () => {
	it('gives each case its target, the debt it allows on its own, what binds it and its minimum DSCR, marking the one that governs', () => {
		const table = sizingCaseTable(sizedOnP90, 'EUR');
		expect(table.headers).toEqual(['Case', 'Target DSCR', 'Debt it allows on its own (EUR)', 'What binds it on its own', 'Minimum DSCR under its energy']);
		expect(table.rows.map((r) => r.governs)).toEqual([false, true, false]);
		expect(table.rows[0].cells).toEqual(['P50 energy', '1.35×', '46,525,070', 'repayment years', '1.32×']);
		expect(table.rows[1].cells[3]).toBe('grace years (interest only)');
		expect(table.rows[2].cells).toEqual(['P99 (10-year) energy', '1.00×', '43,000,000', 'CFADS not positive', '–']);
	});

	it('adds the years whose debt service each case sets when the loan is sculpted on several, each such case governing', () => {
		const table = sizingCaseTable(sculptedOnBoth, 'EUR');
		expect(table.headers[5]).toBe('Sets the debt service in');
		expect(table.rows.map((r) => r.cells[5])).toEqual(['operating years 1 to 6', 'operating years 7 to 15', 'no year']);
		expect(table.rows.map((r) => r.governs)).toEqual([true, true, false]);
	});

	it('has no rows for debt sized by gearing or a result stored before the cases existed', () => {
		expect(sizingCaseTable(storedEarlier, 'EUR').rows).toEqual([]);
	});
});
