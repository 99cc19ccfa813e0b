/**
 * The bookkeeping of placeholder marks. The rule checked is the product's own
 * (issue 14, item 7): a scenario started from a template marks the site's and
 * the project's inputs, never physical constants; a mark goes when its value
 * is edited, when an upload replaces its part, or when the user keeps it; a
 * save never adds one; a duplicate copies them.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseScenario, type Scenario } from '../schemas/scenario';
import { blankDocument } from './document-defaults';
import {
	acceptedPlaceholderPaths,
	editorSectionIds,
	editorSectionOf,
	placeholderPathsOf,
	placeholdersAfterSave,
	placeholdersInSection,
	samePlaceholders,
	unchangedPlaceholders
} from './placeholders';

function example(name: string): Scenario {
	const parsed = parseScenario(JSON.parse(readFileSync(new URL(`../../../examples/${name}.json`, import.meta.url), 'utf8')));
	if (!parsed.ok) throw new Error(`examples/${name}.json does not parse`);
	return parsed.scenario;
}

const tidal = example('tidal-stream-kestle-narrows');
const waveMatrix = example('wave-orrin-bank');
const currentWeibull = example('ocean-current-mornstrand');

describe('placeholderPathsOf', () => {
	const marks = placeholderPathsOf(tidal);

	it("marks the site's and the project's inputs: resource, device, array, costs, revenue, financing terms, tax", () => {
		for (const key of [
			'resource.bins',
			'device.rotorDiameterM',
			'device.ratedPowerKW',
			'array.deviceCount',
			'array.availability',
			'capex.lines[0].amount',
			'capex.contingency',
			'opex.lines[0].amount',
			'opex.lines[1].fraction',
			'decommissioning.amount',
			'revenue.tariffPerMWh',
			'revenue.grants[0].amount',
			'timeline.operatingYears',
			'finance.realDiscountRate',
			'finance.debt.interestRate',
			'finance.debt.repayment',
			'finance.taxRate'
		]) {
			expect(marks, key).toContain(key);
		}
	});

	it('never marks physical constants, method settings, names or the shape choices', () => {
		for (const key of ['site.waterDensityKgPerM3', 'site.gravityMPerS2', 'site.name', 'hoursPerYear', 'uncertainty.exceedanceLevels', 'resource.kind', 'resource.occurrenceBasis', 'device.kind', 'capex.lines[0].name', 'capex.lines[0].basis', 'currency', 'name']) {
			expect(marks, key).not.toContain(key);
		}
	});

	it('marks a table, a grid or a list of shares once, not cell by cell', () => {
		expect(marks).toContain('resource.bins');
		expect(marks.some((key) => key.startsWith('resource.bins['))).toBe(false);
		expect(marks).toContain('uncertainty.components');
		expect(marks).toContain('capex.phasing');
		expect(marks).toContain('capex.lines[3].phasing');
		const matrix = placeholderPathsOf(waveMatrix);
		expect(matrix).toContain('device.powerKW');
		expect(matrix.filter((key) => key.startsWith('device.hsM') || key.startsWith('device.periodS') || key.startsWith('device.powerKW['))).toEqual([]);
	});

	it('marks only what the editor shows as the document stands', () => {
		// Straight line shows no declining-balance factor; declining balance does.
		expect(marks).not.toContain('finance.depreciation.decliningBalanceFactor');
		expect(currentWeibull.finance.depreciation.method).toBe('declining-balance');
		expect(placeholderPathsOf(currentWeibull)).toContain('finance.depreciation.decliningBalanceFactor');
		// Covenants and the debt service reserve only show with debt; the loss cap only with losses carried forward.
		const noDebt = { ...tidal, finance: { ...tidal.finance, debt: { sizing: 'none' as const }, taxLossCarryForward: false, taxLossCarryForwardCap: 0.6 } };
		const without = placeholderPathsOf(noDebt);
		expect(without.filter((key) => key.startsWith('finance.covenants') || key.startsWith('finance.reserves.debtService'))).toEqual([]);
		expect(without).not.toContain('finance.taxLossCarryForwardCap');
	});

	it("lists the marks in the editor's page order", () => {
		expect(marks[0]).toBe('resource.bins');
		const order = marks.map((key) => editorSectionIds.indexOf(editorSectionOf(key)!));
		expect(order).toEqual([...order].sort((a, b) => a - b));
		expect(order.every((i) => i >= 0)).toBe(true);
	});

	it("finds the blank defaults' figures as well as the example's", () => {
		const blank = placeholderPathsOf(blankDocument('wave', { name: 'Blank', currency: 'EUR' }));
		expect(blank).toEqual(expect.arrayContaining(['resource.states', 'device.captureWidthRatio', 'capex.lines[0].amount', 'revenue.tariffPerMWh', 'finance.taxRate']));
		expect(blank).not.toContain('site.waterDensityKgPerM3');
	});
});

describe('editorSectionOf', () => {
	it('puts each field in the section the editor shows it in', () => {
		expect(editorSectionOf('site.waterDepthM')).toBe('site-and-resource');
		expect(editorSectionOf('array.deviceCount')).toBe('device-and-array');
		expect(editorSectionOf('array.arrayLoss')).toBe('losses');
		expect(editorSectionOf('decommissioning.amount')).toBe('opex');
		expect(editorSectionOf('timeline.constructionYears')).toBe('financing');
		expect(editorSectionOf('finance.debt.tenorYears')).toBe('financing');
		expect(editorSectionOf('finance.taxRate')).toBe('tax');
		expect(editorSectionOf('finance.depreciation.assetClasses[1].share')).toBe('tax');
		expect(editorSectionOf('name')).toBeNull();
	});

	it('gives the marks of one section', () => {
		expect(placeholdersInSection(['capex.contingency', 'revenue.tariffPerMWh', 'capex.lines[0].amount'], 'capex')).toEqual(['capex.contingency', 'capex.lines[0].amount']);
	});
});

describe('unchangedPlaceholders', () => {
	const marks = placeholderPathsOf(tidal);

	it('drops the mark of an edited value and keeps every other', () => {
		const edited = structuredClone(tidal);
		edited.capex.lines[1].amount = 1_100_000;
		const left = unchangedPlaceholders(marks, tidal, edited);
		expect(left).not.toContain('capex.lines[1].amount');
		expect(left).toHaveLength(marks.length - 1);
	});

	it('drops a table’s one mark when any cell changes, and a grid’s when an axis changes', () => {
		const edited = structuredClone(tidal);
		if (edited.resource.kind !== 'speed-histogram') throw new Error('the tidal example has a histogram');
		edited.resource.bins[7].occurrence = 1000;
		expect(unchangedPlaceholders(['resource.bins', 'device.ratedPowerKW'], tidal, edited)).toEqual(['device.ratedPowerKW']);

		const axis = structuredClone(waveMatrix);
		if (axis.device.kind !== 'power-matrix') throw new Error('the Orrin Bank example has a power matrix');
		axis.device.hsM[0] += 0.25;
		expect(unchangedPlaceholders(['device.powerKW'], waveMatrix, axis)).toEqual([]);
	});

	it('does not count the order of keys as an edit (the database reorders them)', () => {
		const reordered = Object.fromEntries(Object.entries(structuredClone(tidal)).reverse());
		expect(unchangedPlaceholders(marks, tidal, reordered)).toEqual(marks);
	});
});

describe('placeholdersAfterSave', () => {
	const current = ['resource.bins', 'device.ratedPowerKW', 'capex.lines[0].amount', 'revenue.tariffPerMWh'];

	it('keeps every mark whose value the save leaves alone, when the client sends none', () => {
		expect(placeholdersAfterSave(current, tidal, structuredClone(tidal))).toEqual(current);
	});

	it('narrows to the marks the editor still shows, and never adds one', () => {
		const requested = ['device.ratedPowerKW', 'revenue.tariffPerMWh', 'finance.taxRate'];
		expect(placeholdersAfterSave(current, tidal, tidal, { requested })).toEqual(['device.ratedPowerKW', 'revenue.tariffPerMWh']);
	});

	it('drops the marks of a changed value even when the client asks to keep them', () => {
		const edited = { ...tidal, revenue: { ...tidal.revenue, tariffPerMWh: 240 } };
		expect(placeholdersAfterSave(current, tidal, edited, { requested: current })).toEqual(['resource.bins', 'device.ratedPowerKW', 'capex.lines[0].amount']);
	});

	it('drops every mark of a part an upload replaced', () => {
		expect(placeholdersAfterSave(current, tidal, tidal, { replacedPart: 'device' })).toEqual(['resource.bins', 'capex.lines[0].amount', 'revenue.tariffPerMWh']);
	});
});

describe('acceptedPlaceholderPaths', () => {
	it('keeps the requested marks that name a placeholder value of the document, in page order', () => {
		const requested = ['finance.taxRate', 'site.waterDensityKgPerM3', 'capex.lines[99].amount', 'not.a.field', 'resource.bins'];
		expect(acceptedPlaceholderPaths(tidal, requested)).toEqual(['resource.bins', 'finance.taxRate']);
	});
});

describe('samePlaceholders', () => {
	it('compares paths in order', () => {
		expect(samePlaceholders(['a', 'b'], ['a', 'b'])).toBe(true);
		expect(samePlaceholders(['a', 'b'], ['b', 'a'])).toBe(false);
		expect(samePlaceholders(['a'], ['a', 'b'])).toBe(false);
	});
});
