/**
 * The scenario's assumptions in words, for the summary: each section of the
 * document as labelled facts and small tables, every number with the unit the
 * editor shows beside its field (src/lib/workbench/field-units.ts). Shares
 * the editor keeps as fractions read as per cent here (0.04 -> 4 %), the
 * one change of form. Figures the engine derived (installed capacity, capex
 * totals, the debt at COD) come from its result, rounded with decimal.js.
 * The PDF summary, the data-room pages and the spreadsheet export read these
 * sections: facts with a number carry it apart from its unit (`figure`) for a
 * spreadsheet's cells.
 */
import DecimalJs from 'decimal.js';
import { groupDigits } from '../../metrics/format';
import { technologyLabels } from '../../technology';
import { unitOf } from '../../workbench/field-units';
import { financingFacts, fundingOrderLabels, sizingCaseTable, spendTimingLabels } from '../../workbench/financing-summary';
import { valueAt, type FieldPath } from '../../workbench/schema-fields';
import type { Scenario } from '../../schemas/scenario';
import type { EngineResult } from '../engine/evaluate';
import type { TableColumn } from './tables';

const Decimal = DecimalJs.clone({ precision: 40, rounding: DecimalJs.ROUND_HALF_EVEN });

/** A number as it is read: in its display unit (per cent figures times 100), exact decimal text at `places` decimals. */
export interface Figure {
	value: string;
	places: number;
	/** '' for a pure number. */
	unit: string;
}

export interface Fact {
	label: string;
	value: string;
	/** The number in `value` apart from its unit; absent for a fact in words. */
	figure?: Figure;
	/** Worked out by the engine from the inputs (installed capacity, capex total, debt at COD), not typed: a comparison of inputs leaves it out. */
	derived?: true;
}

export interface FactTable {
	title: string;
	columns: TableColumn[];
	rows: string[][];
	/** Columns the engine worked out (by index); every column when the whole table is a result. */
	derivedColumns?: number[];
}

export interface AssumptionSection {
	title: string;
	facts: Fact[];
	tables: FactTable[];
}

/** The most decimals an input is shown with (inputs are as typed; this only stops float noise). */
const MAX_PLACES = 6;

/** A number as typed, grouped: 3200000 -> "3,200,000", 0.42 -> "0.42". */
export function plainNumber(value: DecimalJs.Value): string {
	const d = new Decimal(value).toDecimalPlaces(MAX_PLACES, Decimal.ROUND_HALF_EVEN);
	return groupDigits(d, d.decimalPlaces());
}

const isShare = (unit: string) => unit === 'share' || unit.startsWith('share of ') || unit.startsWith('fraction');

/** The unit a number is read in: fractions and shares as per cent, a symbol unit ("Cp, –") as a dash, anything else as the editor writes it. */
function displayUnit(unit: string): string {
	if (unit === 'share') return '%';
	if (unit.startsWith('share of ')) return `% of ${unit.slice('share of '.length)}`;
	if (unit.startsWith('fraction')) return unit.replace(/^fraction/, '%');
	return /^\S+, –$/.test(unit) ? '–' : unit;
}

/** A number typed against the editor's unit, as it is read: 0.04 'fraction' is 4 '%' (at most six decimals, no float noise). */
export function inputFigure(value: DecimalJs.Value, unit: string): Figure {
	const d = new Decimal(value).times(isShare(unit) ? 100 : 1).toDecimalPlaces(MAX_PLACES, Decimal.ROUND_HALF_EVEN);
	return { value: (d.isZero() ? d.abs() : d).toFixed(), places: d.decimalPlaces(), unit: displayUnit(unit) };
}

/**
 * A number with the editor's unit: fractions and shares as per cent
 * ("4 %", "2 %/yr", "1 % of capex", "100 % of inflation"), a symbol unit
 * ("Cp, –") left to the label, anything else as the editor writes it.
 */
export function withUnit(value: number, unit: string): string {
	const figure = inputFigure(value, unit);
	const text = plainNumber(figure.value);
	if (figure.unit === '' || figure.unit === 'ratio' || figure.unit === '–') return text;
	if (figure.unit === '×') return `${text}×`;
	if (value === 1 && (unit === 'years' || unit === 'devices')) return `1 ${unit.slice(0, -1)}`;
	return `${text} ${figure.unit}`;
}

/** An input as a fact: its value in words with its unit, and the number apart. */
function inputFact(label: string, value: number, unit: string): Fact {
	return { label, value: withUnit(value, unit), figure: inputFigure(value, unit) };
}

/** A figure the engine derived, at `places` decimals in `unit` (per cent figures already times 100): "15.00 MW". */
function derived(label: string, value: DecimalJs.Value, places: number, unit: string): Fact {
	const d = new Decimal(value).toDecimalPlaces(places, Decimal.ROUND_HALF_EVEN);
	return { label, value: `${groupDigits(d, places)} ${unit}`, figure: { value: (d.isZero() ? d.abs() : d).toFixed(places), places, unit }, derived: true };
}

/** The document's value at `path` with its editor unit; null when the field is absent. */
export function fieldText(document: Scenario, path: FieldPath): string | null {
	const value = valueAt(document, path);
	if (typeof value !== 'number') return null;
	return withUnit(value, unitOf(path, document, document.currency));
}

function range(values: readonly number[], unit: string): string {
	if (values.length === 0) return '';
	const lo = Math.min(...values);
	const hi = Math.max(...values);
	return lo === hi ? `${plainNumber(lo)} ${unit}` : `${plainNumber(lo)} to ${plainNumber(hi)} ${unit}`;
}

function shares(values: readonly number[] | undefined): string {
	return values ? values.map((v) => `${plainNumber(new Decimal(v).times(100))} %`).join(' / ') : '';
}

function facts(document: Scenario, entries: [label: string, path: FieldPath][]): Fact[] {
	return entries.flatMap(([label, path]) => {
		const value = valueAt(document, path);
		return typeof value === 'number' ? [inputFact(label, value, unitOf(path, document, document.currency))] : [];
	});
}

const yesNo = (value: boolean) => (value ? 'Yes' : 'No');

/**
 * summary: what fits a page (the PDF, the room pages): the device's own table
 * only when it is small, the resource in words. full: every table the
 * document holds, the resource's bins or sea states too (the spreadsheet).
 */
export type AssumptionDetail = 'summary' | 'full';

// ---------------------------------------------------------------- sections

function siteAndResource(document: Scenario, detail: AssumptionDetail): AssumptionSection {
	const r = document.resource;
	const list: Fact[] = [];
	if (document.site.name) list.push({ label: 'Site name', value: document.site.name });
	list.push({ label: 'Technology', value: technologyLabels[document.technology] });
	list.push(...facts(document, [['Hours in a year', ['hoursPerYear']], ['Seawater density', ['site', 'waterDensityKgPerM3']]]));
	if (document.technology === 'wave') list.push(...facts(document, [['Gravitational acceleration', ['site', 'gravityMPerS2']]]));
	const occurrences = (basis: 'hours' | 'probability') => (basis === 'hours' ? 'hours in a year' : 'probabilities');
	const periods = (type: 'energy-period' | 'peak-period') => (type === 'energy-period' ? 'energy periods Te' : 'peak periods Tp, converted with Te/Tp');
	switch (r.kind) {
		case 'speed-histogram':
			list.push({ label: 'Resource given as', value: `Flow speed histogram: ${r.bins.length} bins, ${range(r.bins.map((b) => b.speedMPerS), 'm/s')}` });
			list.push({ label: 'Occurrences given as', value: occurrences(r.occurrenceBasis) });
			break;
		case 'weibull':
			list.push({ label: 'Resource given as', value: 'Weibull distribution of flow speed' });
			list.push(...facts(document, [['Scale c', ['resource', 'scaleMPerS']], ['Shape k', ['resource', 'shape']], ['Bin width', ['resource', 'binWidthMPerS']]]));
			break;
		case 'rayleigh':
			list.push({ label: 'Resource given as', value: 'Rayleigh distribution of flow speed' });
			list.push(...facts(document, [['Mean flow speed', ['resource', 'meanSpeedMPerS']], ['Bin width', ['resource', 'binWidthMPerS']]]));
			break;
		case 'sea-state-table':
			list.push({
				label: 'Resource given as',
				value: `Scatter diagram: ${r.states.length} sea states, Hs ${range(r.states.map((s) => s.hsM), 'm')}, periods ${range(r.states.map((s) => s.periodS), 's')}`
			});
			list.push({ label: 'Periods given as', value: periods(r.periodType) });
			if (r.periodType === 'peak-period') list.push(...facts(document, [['Te/Tp', ['resource', 'teOverTp']]]));
			list.push({ label: 'Occurrences given as', value: occurrences(r.occurrenceBasis) });
			break;
		case 'sea-state':
			list.push({ label: 'Resource given as', value: 'One characteristic sea state all year' });
			list.push(...facts(document, [['Significant wave height Hs', ['resource', 'hsM']], ['Wave period', ['resource', 'periodS']]]));
			list.push({ label: 'Period given as', value: periods(r.periodType) });
			if (r.periodType === 'peak-period') list.push(...facts(document, [['Te/Tp', ['resource', 'teOverTp']]]));
			break;
		case 'assessed-energy':
			list.push({ label: 'Resource given as', value: 'Net annual energy from an independent yield assessment, taken as given (the device is used for its rated power only)' });
			if (r.assessedBy) list.push({ label: 'Assessed by', value: r.assessedBy });
			list.push(
				...facts(document, [
					['Assessed net energy, P50', ['resource', 'p50MWh']],
					['Assessed net energy, P90 (one year)', ['resource', 'p90MWh']],
					['Total uncertainty (sigma)', ['resource', 'sigma']],
					['Year-to-year variability (sigma)', ['resource', 'interAnnualSigma']],
					['Long-term uncertainty (sigma)', ['resource', 'longTermSigma']]
				])
			);
			break;
	}
	return { title: 'Site and resource', facts: list, tables: detail === 'full' ? resourceTables(r) : [] };
}

/** The flow speed histogram or the scatter diagram as the editor holds them. */
function resourceTables(r: Scenario['resource']): FactTable[] {
	const occurrence = (basis: 'hours' | 'probability'): TableColumn => ({ header: 'Occurrence', unit: basis === 'hours' ? 'h/yr' : 'probability', align: 'right' });
	if (r.kind === 'speed-histogram') {
		return [
			{
				title: 'Flow speed histogram',
				columns: [{ header: 'Flow speed', unit: 'm/s', align: 'right' }, occurrence(r.occurrenceBasis)],
				rows: r.bins.map((b) => [plainNumber(b.speedMPerS), plainNumber(b.occurrence)])
			}
		];
	}
	if (r.kind === 'sea-state-table') {
		return [
			{
				title: 'Scatter diagram (sea states)',
				columns: [
					{ header: 'Hs', unit: 'm', align: 'right' },
					{ header: r.periodType === 'energy-period' ? 'Te' : 'Tp', unit: 's', align: 'right' },
					occurrence(r.occurrenceBasis)
				],
				rows: r.states.map((st) => [plainNumber(st.hsM), plainNumber(st.periodS), plainNumber(st.occurrence)])
			}
		];
	}
	return [];
}

function device(document: Scenario, result: EngineResult, detail: AssumptionDetail): AssumptionSection {
	const d = document.device;
	const list: Fact[] = [];
	switch (d.kind) {
		case 'rotor':
			list.push({ label: 'Device given as', value: 'Parametric rotor: P = ½ × density × swept area × Cp × efficiency × v³, capped at rated power' });
			list.push(
				...facts(document, [
					['Rotor diameter', ['device', 'rotorDiameterM']],
					['Swept area', ['device', 'sweptAreaM2']],
					['Power coefficient Cp', ['device', 'powerCoefficient']],
					['Drive-train efficiency', ['device', 'driveTrainEfficiency']],
					['Cut-in speed', ['device', 'cutInSpeedMPerS']],
					['Rated power', ['device', 'ratedPowerKW']],
					['Cut-out speed', ['device', 'cutOutSpeedMPerS']]
				])
			);
			break;
		case 'power-curve':
			list.push({ label: 'Device given as', value: `Measured power curve: ${d.points.length} points, ${range(d.points.map((p) => p.speedMPerS), 'm/s')}` });
			list.push(...facts(document, [['Rated power', ['device', 'ratedPowerKW']]]));
			break;
		case 'power-matrix':
			list.push({
				label: 'Device given as',
				value: `Power matrix: ${d.hsM.length} Hs rows (${range(d.hsM, 'm')}) by ${d.periodS.length} period columns (${range(d.periodS, 's')})`
			});
			list.push({ label: 'Periods given as', value: d.periodType === 'energy-period' ? 'energy periods Te' : 'peak periods Tp, converted with Te/Tp' });
			if (d.periodType === 'peak-period') list.push(...facts(document, [['Te/Tp', ['device', 'teOverTp']]]));
			list.push({ label: 'Between cells', value: d.lookup === 'bilinear' ? 'interpolated between the four surrounding cells' : 'the nearest cell' });
			list.push(...facts(document, [['Rated power', ['device', 'ratedPowerKW']]]));
			break;
		case 'capture-width':
			list.push({ label: 'Device given as', value: 'Capture width: P = CWR × width × J, capped at rated power' });
			list.push(
				...facts(document, [
					['Capture width ratio', ['device', 'captureWidthRatio']],
					['Characteristic width', ['device', 'characteristicWidthM']],
					['Rated power', ['device', 'ratedPowerKW']]
				])
			);
			break;
	}
	list.push(derived('Rated power per device (as used)', result.energy.ratedPowerPerDeviceKW, 0, 'kW'));
	list.push(derived('Mean power per device, before losses', result.energy.meanDevicePowerKW, 1, 'kW'));
	return { title: 'Device', facts: list, tables: deviceTables(d, detail) };
}

/** Past these sizes the device's own table would not fit a page; the words above still describe it. */
const MAX_CURVE_POINTS = 60;
const MAX_MATRIX_COLUMNS = 14;

/** The measured power curve or the power matrix as the editor holds them. */
function deviceTables(d: Scenario['device'], detail: AssumptionDetail): FactTable[] {
	const full = detail === 'full';
	if (d.kind === 'power-curve' && (full || d.points.length <= MAX_CURVE_POINTS)) {
		return [
			{
				title: 'Power curve (electrical power per device)',
				columns: [
					{ header: 'Flow speed', unit: 'm/s', align: 'right' },
					{ header: 'Power', unit: 'kW', align: 'right' }
				],
				rows: d.points.map((p) => [plainNumber(p.speedMPerS), plainNumber(p.powerKW)])
			}
		];
	}
	if (d.kind === 'power-matrix' && (full || d.periodS.length <= MAX_MATRIX_COLUMNS)) {
		const period = d.periodType === 'energy-period' ? 'Te' : 'Tp';
		return [
			{
				title: `Power matrix (mean electrical power per device, kW): Hs down, ${period} across`,
				columns: [{ header: 'Hs', unit: 'm', align: 'left' }, ...d.periodS.map((p) => ({ header: `${plainNumber(p)} s`, unit: period, align: 'right' as const }))],
				rows: d.hsM.map((hs, i) => [plainNumber(hs), ...d.powerKW[i].map((kw) => plainNumber(kw))])
			}
		];
	}
	return [];
}

const uncertaintyKindWords: Record<Scenario['uncertainty']['components'][number]['kind'], string> = {
	'long-term': 'Long-term, the same every year',
	'inter-annual': 'Year to year, averaging out over years'
};

function arrayAndLosses(document: Scenario, result: EngineResult): AssumptionSection {
	const e = result.energy;
	const list: Fact[] = [
		...facts(document, [['Devices in the array', ['array', 'deviceCount']]]),
		derived('Installed capacity', new Decimal(e.installedCapacityKW).dividedBy(1000), 2, 'MW'),
		...facts(document, [
			['Array (wake and blockage) loss', ['array', 'arrayLoss']],
			['Availability', ['array', 'availability']],
			['Electrical loss', ['array', 'electricalLoss']],
			['Other losses', ['array', 'otherLoss']],
			['Degradation per year', ['array', 'degradationPerYear']]
		]),
		derived('Gross annual energy, before losses', e.grossAepMWh, 0, 'MWh/yr'),
		derived('Share of gross energy delivered', new Decimal(e.lossFactor).times(100), 1, '%'),
		derived('Combined yield uncertainty', new Decimal(e.combinedSigma).times(100), 1, '% of P50')
	];
	const tables: FactTable[] = [];
	const components = document.uncertainty.components;
	if (components.length > 0) {
		tables.push({
			title: 'Yield uncertainties (independent, combined as the root sum of squares)',
			columns: [{ header: 'Uncertainty', wrap: true }, { header: 'One standard deviation', unit: '% of P50', align: 'right' }, { header: 'Kind' }],
			// A document saved before the field existed counted every component as long-term.
			rows: components.map((c) => [c.name, plainNumber(new Decimal(c.sigma).times(100)), uncertaintyKindWords[c.kind ?? 'long-term']])
		});
	}
	// Results stored before the horizons existed have the one-year levels only.
	const tenYear = e.exceedancesByHorizon?.find((h) => h.horizonYears === 10);
	const tenYearOf = (label: string) => tenYear?.levels.find((l) => l.label === label);
	const exceedanceColumns: TableColumn[] = [
		{ header: 'Level' },
		{ header: 'Net energy, one year', unit: 'MWh/yr', align: 'right' },
		{ header: 'Share of P50', unit: '%', align: 'right' },
		...(tenYear ? [{ header: 'Mean over ten years', unit: 'MWh/yr', align: 'right' as const }] : [])
	];
	tables.push({
		title: 'Net annual energy at each exceedance level (first operating year)',
		columns: exceedanceColumns,
		derivedColumns: exceedanceColumns.map((_, i) => i),
		rows: [
			['P50', groupDigits(e.netAepMWh, 0), '100.0', ...(tenYear ? [groupDigits(e.netAepMWh, 0)] : [])],
			...e.exceedances.map((x) => {
				const ten = tenYearOf(x.label);
				return [x.label, groupDigits(x.aepMWh, 0), groupDigits(new Decimal(x.shareOfP50).times(100), 1), ...(tenYear ? [ten ? groupDigits(ten.aepMWh, 0) : '-'] : [])];
			})
		]
	});
	return { title: 'Array, losses and uncertainty', facts: list, tables };
}

function timeline(document: Scenario): AssumptionSection {
	return {
		title: 'Timeline',
		facts: [
			...facts(document, [
				['Construction', ['timeline', 'constructionYears']],
				['Operating life', ['timeline', 'operatingYears']]
			]),
			// A document saved before the field existed was evaluated with the schema's default.
			{ label: 'Construction spend and debt draws fall', value: spendTimingLabels[document.timeline.spendTiming ?? 'mid-year'] },
			{ label: 'Time convention', value: 't = 0 is the commercial operation date (COD); operating year k ends at t = k' }
		],
		tables: []
	};
}

const capexBasisWords: Record<Scenario['capex']['lines'][number]['basis'], string> = {
	'lump-sum': 'For the project',
	'per-kW': 'Per kW installed',
	'per-device': 'Per device'
};

function capitalCosts(document: Scenario, result: EngineResult): AssumptionSection {
	const currency = document.currency;
	const years = document.timeline.constructionYears;
	const defaultPhasing = document.capex.phasing ? shares(document.capex.phasing) : `even over ${years} year${years === 1 ? '' : 's'}`;
	const rows = document.capex.lines.map((line, i) => [
		line.name,
		capexBasisWords[line.basis],
		fieldText(document, ['capex', 'lines', i, 'amount']) ?? '',
		line.phasing ? shares(line.phasing) : 'default',
		groupDigits(result.costs.capexLines[i]?.realTotal ?? '0', 0)
	]);
	return {
		title: 'Capital costs',
		facts: [
			...facts(document, [['Contingency', ['capex', 'contingency']]]),
			{ label: 'Default phasing over the construction years', value: defaultPhasing },
			derived('Capex total, with contingency, before grants', result.costs.capexRealTotal, 0, `${currency} (real, COD-year money)`)
		],
		tables: [
			{
				title: 'Capex lines (real, COD-year money)',
				columns: [
					{ header: 'Line', wrap: true },
					{ header: 'Basis' },
					{ header: 'Amount', align: 'right' },
					{ header: 'Phasing', unit: 'by construction year' },
					{ header: 'Total with contingency', unit: `${currency}, real`, align: 'right' }
				],
				rows,
				derivedColumns: [4]
			}
		]
	};
}

function opexBasis(line: Scenario['opex']['lines'][number]): string {
	switch (line.basis) {
		case 'fixed-per-year':
			return 'Fixed per year';
		case 'per-kW-year':
			return 'Per kW installed per year';
		case 'per-MWh':
			return 'Per MWh delivered';
		case 'percent-of-capex':
			return 'Share of capex per year';
		case 'percent-of-revenue':
			return 'Share of revenue';
		case 'periodic-overhaul':
			return `Overhaul every ${line.intervalYears} year${line.intervalYears === 1 ? '' : 's'}${line.perDevice ? ', per device' : ''}`;
	}
}

function decommissioningText(document: Scenario): string {
	const d = document.decommissioning;
	const value = fieldText(document, ['decommissioning', d.basis === 'percent-of-capex' ? 'fraction' : 'amount']) ?? '';
	return d.basis === 'lump-sum' ? `${value} for the project` : value;
}

function operatingCosts(document: Scenario, result: EngineResult): AssumptionSection {
	const rows = document.opex.lines.map((line, i) => [
		line.name,
		opexBasis(line),
		fieldText(document, ['opex', 'lines', i, 'amount' in line ? 'amount' : 'fraction']) ?? '',
		'escalation' in line ? (fieldText(document, ['opex', 'lines', i, 'escalation']) ?? '') : 'with revenue'
	]);
	return {
		title: 'Operating costs and decommissioning',
		facts: [
			{ label: 'Decommissioning, at the end of the final operating year', value: decommissioningText(document) },
			derived('Decommissioning as paid', result.costs.decommissioningNominal, 0, `${document.currency} (nominal)`)
		],
		tables:
			rows.length === 0
				? []
				: [
						{
							title: 'Opex lines (real, COD-year money, escalated with inflation plus their own escalation)',
							columns: [{ header: 'Line', wrap: true }, { header: 'Basis', wrap: true }, { header: 'Amount', align: 'right' }, { header: 'Real escalation', align: 'right' }],
							rows
						}
					]
	};
}

const indexationMethodLabels: Record<Scenario['revenue']['indexationMethod'], string> = {
	'indexed-share': 'A share of the price indexed, the rest fixed in money',
	'scaled-inflation': 'The whole price indexed to a share of inflation'
};

function revenue(document: Scenario, result: EngineResult): AssumptionSection {
	const grants = document.revenue.grants;
	return {
		title: 'Revenue and grants',
		facts: [
			...facts(document, [
				['Tariff (prices of the indexation base year)', ['revenue', 'tariffPerMWh']],
				['Support period', ['revenue', 'supportYears']]
			]),
			// A document frozen before the field existed was evaluated by the scaled-inflation reading.
			{ label: 'Tariff indexation', value: indexationMethodLabels[document.revenue.indexationMethod ?? 'scaled-inflation'] },
			...facts(document, [
				['Indexed', ['revenue', 'tariffIndexation']],
				['Indexation base year before COD', ['revenue', 'indexationBaseYearsBeforeCod']],
				['Tariff and merchant price inflation', ['revenue', 'tariffInflation']],
				['Merchant price after support (real, COD-year prices)', ['revenue', 'merchantPricePerMWh']],
				['Merchant price escalation', ['revenue', 'merchantEscalation']],
				['Curtailment (unpaid)', ['revenue', 'curtailment']]
			]),
			...(grants.length > 0 ? [derived('Grants in total (real)', result.costs.grantsRealTotal, 0, document.currency)] : [])
		],
		tables:
			grants.length === 0
				? []
				: [
						{
							title: 'Capital grants (received with capex spend, not taxed)',
							columns: [{ header: 'Grant', wrap: true }, { header: 'Basis' }, { header: 'Amount', align: 'right' }],
							rows: grants.map((g, i) => [
								g.name,
								g.basis === 'lump-sum' ? 'Amount' : 'Share of capex',
								fieldText(document, ['revenue', 'grants', i, g.basis === 'lump-sum' ? 'amount' : 'fraction']) ?? ''
							])
						}
					]
	};
}

const repaymentWords = { annuity: 'Annuity (level payments)', 'straight-line': 'Straight line (level principal)', sculpted: 'Sculpted to CFADS' } as const;
/** The engine's financing lines whose label would repeat an input's: said as amounts paid, or left out (null) where the input says it already. */
const computedLabels: Record<string, string | null> = {
	'Interest during construction': 'Interest during construction, amount',
	'Upfront fee': 'Upfront fee paid',
	'Commitment fees': 'Commitment fees paid',
	'Funding order': null
};

const reserveFundingWords: Record<'from-funding' | 'from-cash-flow', string> = {
	'from-funding': 'In full at COD, from the construction funding',
	'from-cash-flow': 'From the cash left after debt service, before distributions'
};
const sweepWords: Record<'always' | 'in-lock-up', string> = {
	always: 'of the cash otherwise distributable, every year',
	'in-lock-up': 'of the cash trapped in lock-up years'
};

/** The reserve accounts and covenants the document sets (none when it leaves them out). */
function reservesAndCovenants(document: Scenario): Fact[] {
	const { reserves, covenants } = document.finance;
	const list: Fact[] = [];
	const r = (...keys: string[]): FieldPath => ['finance', 'reserves', ...keys];
	if (reserves?.debtService) {
		list.push(...facts(document, [["Debt service reserve, in months of the next year's debt service", r('debtService', 'months')]]));
		list.push({ label: 'Debt service reserve filled', value: reserveFundingWords[reserves.debtService.funding ?? 'from-funding'] });
	}
	if (reserves?.maintenance) {
		const years = reserves.maintenance.fundingYears;
		const label = 'Maintenance reserve: each overhaul funded over';
		list.push(years === undefined ? { label, value: 'its own interval' } : inputFact(label, years, 'years'));
	}
	if (reserves?.decommissioning) list.push(...facts(document, [['Decommissioning reserve funded over the last', r('decommissioning', 'fundingYears')]]));
	if (covenants) {
		const c = (key: string): FieldPath => ['finance', 'covenants', key];
		list.push(...facts(document, [['Distributions locked up below a DSCR of', c('lockUpDscr')], ['Event of default below a DSCR of', c('defaultDscr')]]));
		const sweep = covenants.cashSweep;
		if (sweep) {
			const words = sweepWords[sweep.when ?? 'always'];
			const figure = inputFigure(sweep.share, 'share');
			list.push({ label: 'Cash sweep to prepay the loan', value: `${withUnit(sweep.share, 'share')} ${words}`, figure: { ...figure, unit: `% ${words}` } });
		}
	}
	return list;
}

function financeAndDebt(document: Scenario, result: EngineResult): AssumptionSection {
	const debt = document.finance.debt;
	const list: Fact[] = [
		...facts(document, [
			['Inflation', ['finance', 'inflation']],
			['Real discount rate', ['finance', 'realDiscountRate']]
		]),
		derived('Nominal discount rate (Fisher)', new Decimal(result.rates.nominalDiscountRate).times(100), 2, '%/yr')
	];
	if (debt.sizing === 'none') {
		list.push({ label: 'Senior debt', value: 'None: the project is funded by equity' });
		return { title: 'Finance and debt', facts: list, tables: [] };
	}
	list.push({ label: 'Senior debt', value: debt.sizing === 'gearing' ? 'Sized by gearing' : 'Sized by a target DSCR, within a gearing cap' });
	const p = (key: string): FieldPath => ['finance', 'debt', key];
	list.push(
		...facts(
			document,
			debt.sizing === 'gearing'
				? [['Gearing', p('gearing')]]
				: [
						['Target DSCR', p('targetDscr')],
						['Gearing cap', p('maxGearing')]
					]
		),
		...facts(document, [
			['Interest rate', p('interestRate')],
			['Tenor from COD', p('tenorYears')],
			['Grace (interest only)', p('graceYears')],
			['Upfront fee', p('upfrontFee')],
			['Commitment fee on the undrawn loan, during construction', p('commitmentFee')]
		]),
		// Documents saved before these fields existed were evaluated with the schema's defaults.
		{ label: 'Construction funded', value: fundingOrderLabels[debt.fundingOrder ?? 'equity-first'] },
		{ label: 'Repayment', value: repaymentWords[debt.repayment] },
		{ label: 'Interest during construction', value: debt.capitalizeInterestDuringConstruction ? 'Rolled into the loan' : 'Paid by equity' },
		...reservesAndCovenants(document)
	);
	const tables: FactTable[] = [];
	const downside = debt.sizing === 'target-dscr' ? (debt.downsideCases ?? []) : [];
	if (debt.sizing === 'target-dscr' && downside.length > 0) {
		tables.push({
			title: 'Energy cases the debt is sized on (the least debt governs)',
			columns: [{ header: 'Energy' }, { header: 'Exceeded over' }, { header: 'Target DSCR', align: 'right' }],
			rows: [
				['P50', 'the long-term mean', withUnit(debt.targetDscr, '×')],
				...downside.map((c) => [`P${plainNumber(c.exceedancePercent)}`, (c.horizonYears ?? 1) === 1 ? 'one year' : 'ten years', withUnit(c.targetDscr, '×')])
			]
		});
	}
	const f = result.financing;
	if (f) {
		for (const fact of financingFacts(f, document.currency)) {
			const label = fact.label in computedLabels ? computedLabels[fact.label] : fact.label;
			if (label) list.push({ label, value: fact.value, derived: true });
		}
		const sized = sizingCaseTable(f, document.currency);
		if (sized.rows.length > 0) {
			const text = (i: number) => i === 0 || i === 3 || i === 5;
			tables.push({
				title: 'Debt each sizing case allows, with the DSCR under its energy',
				columns: sized.headers.map((header, i) => ({ header, align: text(i) ? 'left' : 'right', wrap: text(i) })),
				derivedColumns: sized.headers.map((_, i) => i),
				rows: sized.rows.map((c) => (c.governs ? [`${c.cells[0]} (governs)`, ...c.cells.slice(1)] : c.cells))
			});
		}
	}
	return { title: 'Finance and debt', facts: list, tables };
}

type DepreciationRule = Pick<Scenario['finance']['depreciation'], 'method' | 'lifeYears' | 'decliningBalanceFactor' | 'firstYearConvention' | 'schedule'>;

const depreciationMethodWords: Record<DepreciationRule['method'], string> = {
	'straight-line': 'Straight line',
	'declining-balance': 'Declining balance, switching to straight line when that is larger',
	schedule: 'A schedule of shares per year'
};

/** The first-year convention; a schedule gives every year's share itself, so it has none. */
function firstYearText(rule: DepreciationRule): string {
	if (rule.method === 'schedule') return 'as the schedule gives it';
	return rule.firstYearConvention === 'half-year' ? "Half a year's charge in year 1 and in the year after the life" : "A whole year's charge in year 1";
}

function lifeText(rule: DepreciationRule, operatingYears: number): string {
	if (rule.method === 'schedule') return `${rule.schedule?.length ?? 0} years, by the schedule`;
	return rule.lifeYears === undefined ? `the operating life, ${operatingYears} years` : withUnit(rule.lifeYears, 'years');
}

/** One rule in a few words, for a row of the asset-class table: "Declining balance 2×", "Straight line". */
function methodShort(rule: DepreciationRule): string {
	if (rule.method === 'declining-balance') return `Declining balance ${withUnit(rule.decliningBalanceFactor ?? 2, '×')}`;
	return rule.method === 'schedule' ? 'Schedule' : 'Straight line';
}

function tax(document: Scenario): AssumptionSection {
	const dep = document.finance.depreciation;
	const years = document.timeline.operatingYears;
	const base: FieldPath = ['finance', 'depreciation'];
	const classes = dep.assetClasses ?? [];
	const list: Fact[] = [...facts(document, [['Tax rate', ['finance', 'taxRate']]])];
	const tables: FactTable[] = [];
	if (classes.length > 0) {
		list.push({ label: 'Depreciation', value: 'By asset class: each a share of the base (capex net of grants) written off by its own rule' });
		tables.push({
			title: 'Depreciation by asset class',
			columns: [
				{ header: 'Class', wrap: true },
				{ header: 'Share of the base', align: 'right' },
				{ header: 'Method' },
				{ header: 'Life', wrap: true },
				{ header: 'First year', wrap: true },
				{ header: 'Schedule', unit: 'share per year', wrap: true }
			],
			rows: classes.map((c) => [
				c.name,
				c.share === undefined ? 'the rest' : withUnit(c.share, 'share'),
				methodShort(c),
				lifeText(c, years),
				firstYearText(c),
				c.method === 'schedule' ? shares(c.schedule) : ''
			])
		});
	} else {
		list.push({ label: 'Depreciation', value: depreciationMethodWords[dep.method] });
		if (dep.method === 'declining-balance') list.push(...facts(document, [['Declining-balance factor', [...base, 'decliningBalanceFactor']]]));
		const life = dep.method === 'schedule' ? undefined : (dep.lifeYears ?? years);
		list.push({ label: 'Depreciation life', value: lifeText(dep, years), ...(life === undefined ? {} : { figure: inputFigure(life, 'years') }) });
		if (dep.method === 'schedule') list.push({ label: 'Share written off each year, year 1 first', value: shares(dep.schedule) });
		else list.push({ label: 'First year', value: firstYearText(dep) });
	}
	list.push({ label: 'Carry tax losses forward', value: yesNo(document.finance.taxLossCarryForward) });
	if (document.finance.taxLossCarryForward && document.finance.taxLossCarryForwardCap !== undefined) {
		const cap = document.finance.taxLossCarryForwardCap;
		const figure = { ...inputFigure(cap, 'share'), unit: "% of a year's taxable profit" };
		list.push({ label: 'Losses brought forward may offset at most', value: `${withUnit(cap, 'share')} of a year's taxable profit`, figure });
	}
	return { title: 'Tax', facts: list, tables };
}

/** Every section of the assumptions, in the editor's order. */
export function assumptionSections(document: Scenario, result: EngineResult, detail: AssumptionDetail = 'summary'): AssumptionSection[] {
	return [
		siteAndResource(document, detail),
		device(document, result, detail),
		arrayAndLosses(document, result),
		timeline(document),
		capitalCosts(document, result),
		operatingCosts(document, result),
		revenue(document, result),
		financeAndDebt(document, result),
		tax(document)
	];
}
