import { describe, expect, it } from 'vitest';
import { financingFacts, sizedByText, sizingCaseRows, type StoredFinancing } from './financing-summary';

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
		{ label: 'P50', targetDscr: 1.35, debtCapacity: '46525069.84', limitedBy: 'repayment', minDscr: '1.3183106082', dscr: [] },
		{ label: 'P90', targetDscr: 1.2, debtCapacity: '42776986.03', limitedBy: 'grace', minDscr: '1.2', dscr: [] },
		{ label: 'P99 (10-year)', targetDscr: 1, debtCapacity: '43000000', limitedBy: 'cfads', minDscr: null, dscr: [] }
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

describe('sizingCaseRows', () => {
	it('gives each case its target, the debt it allows, what binds it and its minimum DSCR, marking the one that governs', () => {
		const rows = sizingCaseRows(sizedOnP90);
		expect(rows.map((r) => r.governs)).toEqual([false, true, false]);
		expect(rows[0].cells).toEqual(['P50 energy', '1.35×', '46,525,070', 'repayment years', '1.32×']);
		expect(rows[1].cells[3]).toBe('grace years (interest only)');
		expect(rows[2].cells).toEqual(['P99 (10-year) energy', '1.00×', '43,000,000', 'CFADS not positive', '–']);
	});

	it('has no rows for debt sized by gearing or a result stored before the cases existed', () => {
		expect(sizingCaseRows(storedEarlier)).toEqual([]);
	});
});
