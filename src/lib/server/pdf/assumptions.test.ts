import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseScenario, type Scenario } from '../../schemas/scenario';
import { evaluateScenario } from '../engine/evaluate';
import { assumptionSections, fieldText, inputFigure, plainNumber, withUnit } from './assumptions';

function example(name: string): Scenario {
	const parsed = parseScenario(JSON.parse(readFileSync(`examples/${name}.json`, 'utf8')));
	if (!parsed.ok) throw new Error(`examples/${name}.json should parse`);
	return parsed.scenario;
}

const tidal = example('tidal-stream-kestle-narrows');
const wave = example('wave-orrin-bank');

describe('plainNumber', () => {
	it('groups digits and keeps the decimals typed, without float noise', () => {
		expect(plainNumber(3200000)).toBe('3,200,000');
		expect(plainNumber(0.42)).toBe('0.42');
		expect(plainNumber(0.1 + 0.2)).toBe('0.3');
		expect(plainNumber(-1500.5)).toBe('−1,500.5');
	});
});

describe('withUnit', () => {
	it('reads fractions and shares as per cent, naming what they are a share of', () => {
		expect(withUnit(0.04, 'fraction')).toBe('4 %');
		expect(withUnit(0.065, 'fraction/yr (nominal)')).toBe('6.5 %/yr (nominal)');
		expect(withUnit(0.01, 'fraction of capex')).toBe('1 % of capex');
		expect(withUnit(1, 'share of inflation')).toBe('100 % of inflation');
		expect(withUnit(0.4, 'share')).toBe('40 %');
	});

	it('writes other units as the editor does, and leaves a symbol unit to the label', () => {
		expect(withUnit(1500, 'kW')).toBe('1,500 kW');
		expect(withUnit(1.35, '×')).toBe('1.35×');
		expect(withUnit(0.42, 'Cp, –')).toBe('0.42');
		expect(withUnit(0.9, 'ratio')).toBe('0.9');
		expect(withUnit(1, 'years')).toBe('1 year');
		expect(withUnit(2, 'years')).toBe('2 years');
		expect(withUnit(1, 'devices')).toBe('1 device');
	});
});

describe('fieldText', () => {
	it('gives the value at a path with the unit the editor shows beside that field', () => {
		expect(fieldText(tidal, ['device', 'rotorDiameterM'])).toBe('20 m');
		expect(fieldText(tidal, ['capex', 'lines', 0, 'amount'])).toBe('3,200,000 EUR/device');
		expect(fieldText(tidal, ['opex', 'lines', 0, 'amount'])).toBe('150 EUR/kW·yr');
		expect(fieldText(tidal, ['array', 'degradationPerYear'])).toBe('0.2 %/yr');
		expect(fieldText(tidal, ['device', 'sweptAreaM2'])).toBeNull();
	});
});

describe('assumptionSections', () => {
	const sections = assumptionSections(tidal, evaluateScenario(tidal));
	const section = (title: string) => sections.find((s) => s.title === title)!;
	const fact = (title: string, label: string) => section(title).facts.find((f) => f.label === label)?.value;

	it('covers resource, device, array and losses, timeline, capex, opex, revenue, finance and tax, in the editor order', () => {
		expect(sections.map((s) => s.title)).toEqual([
			'Site and resource',
			'Device',
			'Array, losses and uncertainty',
			'Timeline',
			'Capital costs',
			'Operating costs and decommissioning',
			'Revenue and grants',
			'Finance and debt',
			'Tax'
		]);
	});

	it('writes each input in words with its unit, never as a raw key', () => {
		expect(fact('Site and resource', 'Resource given as')).toBe('Flow speed histogram: 15 bins, 0.125 to 3.625 m/s');
		expect(fact('Array, losses and uncertainty', 'Availability')).toBe('93 %');
		expect(fact('Array, losses and uncertainty', 'Installed capacity')).toBe('15.00 MW');
		expect(fact('Finance and debt', 'Target DSCR')).toBe('1.35×');
		expect(fact('Finance and debt', 'Repayment')).toBe('Sculpted to CFADS');
		expect(fact('Tax', 'Depreciation life')).toBe('20 years');
		const everything = JSON.stringify(sections);
		for (const key of ['arrayLoss', 'tariffPerMWh', 'percent-of-capex', 'per-kW-year', 'target-dscr']) expect(everything).not.toContain(key);
	});

	it('lists capex lines with their basis, amount, phasing and the engine total with contingency', () => {
		const table = section('Capital costs').tables[0];
		// 10 turbines x 3.2 M x 1.1 contingency = 35.2 M (examples/tidal-stream-kestle-narrows.json).
		expect(table.rows[0]).toEqual(['Turbines', 'Per device', '3,200,000 EUR/device', 'default', '35,200,000']);
		expect(table.rows[3]).toEqual(['Export cable and grid connection', 'For the project', '12,000,000 EUR', '70 % / 30 %', '13,200,000']);
	});

	it('describes opex lines by basis, a share of revenue following revenue rather than escalating', () => {
		const rows = section('Operating costs and decommissioning').tables[0].rows;
		expect(rows.find((r) => r[0] === 'Seabed lease')).toEqual(['Seabed lease', 'Share of revenue', '2 % of revenue', 'with revenue']);
		expect(rows.find((r) => r[0] === 'Rotor and gearbox overhaul')?.[1]).toBe('Overhaul every 6 years, per device');
	});

	it('describes a wave device and sea states in their own terms', () => {
		const waveSections = assumptionSections(wave, evaluateScenario(wave));
		const resource = waveSections[0].facts.find((f) => f.label === 'Resource given as')!.value;
		expect(resource).toMatch(/^Scatter diagram: \d+ sea states, Hs /);
		expect(waveSections[1].facts.find((f) => f.label === 'Device given as')!.value).toMatch(/^Power matrix: \d+ Hs rows/);
		expect(waveSections[0].facts.some((f) => f.label === 'Gravitational acceleration')).toBe(true);
	});

	it("tabulates a measured power curve and a power matrix as the editor holds them", () => {
		const current = example('ocean-current-mornstrand');
		const curve = assumptionSections(current, evaluateScenario(current))[1].tables[0];
		expect(curve.columns.map((c) => `${c.header} (${c.unit})`)).toEqual(['Flow speed (m/s)', 'Power (kW)']);
		expect(curve.rows).toHaveLength(current.device.kind === 'power-curve' ? current.device.points.length : -1);
		const matrix = assumptionSections(wave, evaluateScenario(wave))[1].tables[0];
		if (wave.device.kind !== 'power-matrix') throw new Error('the wave example has a power matrix');
		expect(matrix.rows).toHaveLength(wave.device.hsM.length);
		expect(matrix.columns).toHaveLength(wave.device.periodS.length + 1);
		expect(matrix.rows[3][0]).toBe(plainNumber(wave.device.hsM[3]));
		expect(matrix.rows[3][5]).toBe(plainNumber(wave.device.powerKW[3][4]));
	});

	it('says when construction spend falls, defaulting a document saved before the field to the middle of the year', () => {
		expect(fact('Timeline', 'Construction spend and debt draws fall')).toBe('Middle of each construction year');
		const quarterly: Scenario = { ...tidal, timeline: { ...tidal.timeline, spendTiming: 'quarterly' } };
		const timeline = assumptionSections(quarterly, evaluateScenario(quarterly)).find((s) => s.title === 'Timeline')!;
		expect(timeline.facts.find((f) => f.label === 'Construction spend and debt draws fall')?.value).toBe('Quarterly, in the middle of each quarter');
	});

	describe('a loan also sized on downside energy', () => {
		const debt = tidal.finance.debt;
		if (debt.sizing !== 'target-dscr') throw new Error('the tidal example is sized by DSCR');
		const lender: Scenario = {
			...tidal,
			finance: {
				...tidal.finance,
				debt: {
					...debt,
					commitmentFee: 0.005,
					fundingOrder: 'pro-rata',
					downsideCases: [
						{ exceedancePercent: 90, targetDscr: 1.2, horizonYears: 1 },
						{ exceedancePercent: 99, targetDscr: 1.05, horizonYears: 10 }
					]
				}
			}
		};
		const result = evaluateScenario(lender);
		const finance = assumptionSections(lender, result).find((s) => s.title === 'Finance and debt')!;
		const value = (label: string) => finance.facts.find((f) => f.label === label)?.value;

		it('lists the commitment fee, the funding order and the energy cases with their targets', () => {
			expect(value('Commitment fee on the undrawn loan, during construction')).toBe('0.5 %/yr of undrawn debt');
			expect(value('Construction funded')).toBe('Debt and equity in step (pro rata)');
			const cases = finance.tables.find((t) => t.title.startsWith('Energy cases the debt is sized on'))!;
			expect(cases.rows).toEqual([
				['P50', 'the long-term mean', '1.35×'],
				['P90', 'one year', '1.2×'],
				['P99', 'ten years', '1.05×']
			]);
		});

		it('reports what the engine made of them: the governing case, the gearing on the funding need, and each case’s debt', () => {
			// Sculpted on several cases, each year's service is the least any case's cover allows: the cases that set some year are named.
			expect(value('Sized by')).toMatch(/^the least cover each year allows: the P(50|90|99 \(10-year\)) target DSCR \d\.\d\d in operating years? /);
			expect(value('Gearing, on the total funding need')).toMatch(/^\d+\.\d %$/);
			expect(value('Commitment fees paid')).toMatch(/ EUR$/);
			const sized = finance.tables.find((t) => t.title.startsWith('Debt each sizing case allows'))!;
			expect(sized.rows).toHaveLength(3);
			const governing = sized.rows.filter((row) => row[0].endsWith('(governs)'));
			expect(governing.length).toBeGreaterThan(0);
			// Each governing case names the years whose service it sets.
			expect(sized.columns[5].header).toBe('Sets the debt service in');
			expect(governing.every((row) => row[5].startsWith('operating year'))).toBe(true);
		});
	});

	describe('depreciation', () => {
		const taxOf = (document: Scenario) => assumptionSections(document, evaluateScenario(document)).find((s) => s.title === 'Tax')!;
		const withDepreciation = (depreciation: Scenario['finance']['depreciation'], extra: Partial<Scenario['finance']> = {}): Scenario => ({
			...tidal,
			finance: { ...tidal.finance, depreciation, ...extra }
		});
		// The 5-year column of IRS Publication 946 Table A-1 (half-year convention), as fractions.
		const macrsFiveYear = [0.2, 0.32, 0.192, 0.1152, 0.1152, 0.0576];

		it('names a schedule as a schedule, with its shares, not as declining balance', () => {
			const tax = taxOf(withDepreciation({ method: 'schedule', decliningBalanceFactor: 2, schedule: macrsFiveYear }));
			const value = (label: string) => tax.facts.find((f) => f.label === label)?.value;
			expect(value('Depreciation')).toBe('A schedule of shares per year');
			expect(value('Share written off each year, year 1 first')).toBe('20 % / 32 % / 19.2 % / 11.52 % / 11.52 % / 5.76 %');
			expect(value('Depreciation life')).toBe('6 years, by the schedule');
			expect(JSON.stringify(tax)).not.toContain('Declining balance');
		});

		it('states the first-year convention and the cap on losses brought forward', () => {
			const tax = taxOf(withDepreciation({ method: 'straight-line', decliningBalanceFactor: 2, lifeYears: 15, firstYearConvention: 'half-year' }, { taxLossCarryForwardCap: 0.6 }));
			const value = (label: string) => tax.facts.find((f) => f.label === label)?.value;
			expect(value('First year')).toBe("Half a year's charge in year 1 and in the year after the life");
			expect(value('Losses brought forward may offset at most')).toBe("60 % of a year's taxable profit");
			expect(fact('Tax', 'First year')).toBe("A whole year's charge in year 1");
			expect(fact('Tax', 'Losses brought forward may offset at most')).toBeUndefined();
		});

		it('tabulates asset classes, each with its share and its own rule', () => {
			const tax = taxOf(
				withDepreciation({
					method: 'straight-line',
					decliningBalanceFactor: 2,
					assetClasses: [
						{ name: 'Turbines', share: 0.6, method: 'declining-balance', decliningBalanceFactor: 1.5, lifeYears: 10 },
						{ name: 'Cable and grid', method: 'schedule', decliningBalanceFactor: 2, schedule: macrsFiveYear }
					]
				})
			);
			expect(tax.facts.find((f) => f.label === 'Depreciation')?.value).toMatch(/^By asset class/);
			expect(tax.tables[0].rows).toEqual([
				['Turbines', '60 %', 'Declining balance 1.5×', '10 years', "A whole year's charge in year 1", ''],
				['Cable and grid', 'the rest', 'Schedule', '6 years, by the schedule', 'as the schedule gives it', '20 % / 32 % / 19.2 % / 11.52 % / 11.52 % / 5.76 %']
			]);
		});
	});

	it('says plainly when there is no debt', () => {
		const noDebt: Scenario = { ...tidal, finance: { ...tidal.finance, debt: { sizing: 'none' } } };
		const finance = assumptionSections(noDebt, evaluateScenario(noDebt)).find((s) => s.title === 'Finance and debt')!;
		expect(finance.facts.find((f) => f.label === 'Senior debt')?.value).toBe('None: the project is funded by equity');
		expect(finance.facts.some((f) => f.label === 'Interest rate')).toBe(false);
	});
});

describe('the exceedance table', () => {
	const table = (document: Scenario) =>
		assumptionSections(document, evaluateScenario(document))
			.flatMap((s) => s.tables ?? [])
			.find((t) => t.title.startsWith('Net annual energy at each exceedance level'))!;

	it('shows the mean over ten years beside the one-year levels, from the result', () => {
		// With a year-to-year component the ten-year P90 is closer to P50 than the one-year P90
		// (sigma_10 = sqrt(sigma_LT^2 + sigma_IAV^2 / 10); exceedance.md).
		const withVariability = {
			...tidal,
			uncertainty: { ...tidal.uncertainty, components: [...tidal.uncertainty.components, { name: 'Year to year', sigma: 0.06, kind: 'inter-annual' as const }] }
		};
		const t = table(withVariability);
		expect(t.columns.map((c) => c.header)).toEqual(['Level', 'Net energy, one year', 'Share of P50', 'Mean over ten years']);
		const p90 = t.rows.find((r) => r[0] === 'P90')!;
		const figure = (text: string) => Number(text.replace(/,/g, ''));
		expect(figure(p90[3])).toBeGreaterThan(figure(p90[1]));
	});
});

describe('inputFigure', () => {
	it('gives the number as read, per cent for shares, with its unit apart and the decimals typed', () => {
		expect(inputFigure(0.04, 'fraction')).toEqual({ value: '4', places: 0, unit: '%' });
		expect(inputFigure(0.0075, 'fraction/yr of undrawn debt')).toEqual({ value: '0.75', places: 2, unit: '%/yr of undrawn debt' });
		expect(inputFigure(0.1 + 0.2, 'share')).toEqual({ value: '30', places: 0, unit: '%' });
		expect(inputFigure(3200000, 'EUR/device')).toEqual({ value: '3200000', places: 0, unit: 'EUR/device' });
		expect(inputFigure(0.42, 'Cp, –')).toEqual({ value: '0.42', places: 2, unit: '–' });
	});
});

describe('figures beside the words', () => {
	const sections = assumptionSections(tidal, evaluateScenario(tidal));
	const fact = (title: string, label: string) => sections.find((s) => s.title === title)!.facts.find((f) => f.label === label);

	it('gives inputs and derived figures their number and unit apart, and words none', () => {
		// examples/tidal-stream-kestle-narrows.json: availability 0.93.
		expect(fact('Array, losses and uncertainty', 'Availability')).toEqual({ label: 'Availability', value: '93 %', figure: { value: '93', places: 0, unit: '%' } });
		expect(fact('Array, losses and uncertainty', 'Installed capacity')?.figure).toEqual({ value: '15.00', places: 2, unit: 'MW' });
		expect(fact('Finance and debt', 'Repayment')?.figure).toBeUndefined();
	});

	it('lists the reserve accounts and covenants the document sets', () => {
		const lender = example('lender-case-skerrow-sound');
		const finance = assumptionSections(lender, evaluateScenario(lender)).find((s) => s.title === 'Finance and debt')!;
		const value = (label: string) => finance.facts.find((f) => f.label === label)?.value;
		// examples/lender-case-skerrow-sound.json: a six-month reserve funded at COD, a maintenance reserve, lock-up 1.15, default 1.05.
		expect(value("Debt service reserve, in months of the next year's debt service")).toBe('6 months');
		expect(value('Debt service reserve filled')).toBe('In full at COD, from the construction funding');
		expect(value('Maintenance reserve: each overhaul funded over')).toBe('its own interval');
		expect(value('Distributions locked up below a DSCR of')).toBe('1.15×');
		expect(value('Event of default below a DSCR of')).toBe('1.05×');
		const sweep: Scenario = { ...lender, finance: { ...lender.finance, covenants: { ...lender.finance.covenants, cashSweep: { share: 0.5, when: 'in-lock-up' } } } };
		const swept = assumptionSections(sweep, evaluateScenario(sweep)).find((s) => s.title === 'Finance and debt')!;
		expect(swept.facts.find((f) => f.label === 'Cash sweep to prepay the loan')?.value).toBe('50 % of the cash trapped in lock-up years');
	});

	it('says which uncertainties average out over the years', () => {
		const table = sections.find((s) => s.title === 'Array, losses and uncertainty')!.tables[0];
		expect(table.columns.map((c) => c.header)).toEqual(['Uncertainty', 'One standard deviation', 'Kind']);
		expect(table.rows.every((r) => ['Long-term, the same every year', 'Year to year, averaging out over years'].includes(r[2]))).toBe(true);
	});

	it('tabulates the resource at full detail only, and the device tables whatever their size', () => {
		const full = assumptionSections(wave, evaluateScenario(wave), 'full');
		const scatter = full[0].tables[0];
		if (wave.resource.kind !== 'sea-state-table') throw new Error('the wave example has a scatter diagram');
		expect(scatter.rows).toHaveLength(wave.resource.states.length);
		expect(scatter.rows[0]).toEqual([plainNumber(wave.resource.states[0].hsM), plainNumber(wave.resource.states[0].periodS), plainNumber(wave.resource.states[0].occurrence)]);
		expect(assumptionSections(wave, evaluateScenario(wave))[0].tables).toEqual([]);
		if (wave.device.kind !== 'power-matrix') throw new Error('the wave example has a power matrix');
		const wide: Scenario = { ...wave, device: { ...wave.device, periodS: Array.from({ length: 20 }, (_, i) => 4 + i), powerKW: wave.device.hsM.map(() => Array.from({ length: 20 }, () => 100)) } };
		expect(assumptionSections(wide, evaluateScenario(wide))[1].tables).toEqual([]);
		expect(assumptionSections(wide, evaluateScenario(wide), 'full')[1].tables[0].columns).toHaveLength(21);
	});
});
