/**
 * The one catalogue of the engine's metrics: for each key its label, unit,
 * display precision, scale, which direction is better and its method note.
 * The editor, compare, sensitivity, the method notes and the exports all read
 * it; the engine takes its key list from here. Plain data, safe to import in
 * the browser and from the engine (no I/O, no server imports).
 */
import { methodNoteHref, METHODS_INDEX_HREF, type MethodSlug } from '../methods';

/** In reading order: energy, cost of energy, returns, payback, cover, debt, breakeven. */
export const METRIC_KEYS = [
	'netAepMWh',
	'p90AepMWh',
	'capacityFactor',
	'lcoeReal',
	'lcoeNominal',
	'lcoeFcr',
	'projectIrrPreTax',
	'projectIrrPostTax',
	'equityIrr',
	'npv',
	'paybackYears',
	'minDscr',
	'avgDscr',
	'llcr',
	'yearsInLockUp',
	'debtAmount',
	'breakevenTariff'
] as const;
export type MetricKey = (typeof METRIC_KEYS)[number];

/** higher: a rise is good news for the project (IRR); lower: a fall is (LCOE); neither: a plain fact (debt amount). */
export type BetterWhen = 'higher' | 'lower' | 'neither';

/** plain: shown as the engine gives it; percent: the engine's fraction shown times 100. */
export type MetricScale = 'plain' | 'percent';

export interface MetricDefinition {
	key: MetricKey;
	/** As a lender would read it, the same on every page and in every file. */
	label: string;
	/** The unit the figure is shown in; `{currency}` stands for the project's currency. */
	unit: string;
	/** What the figure is measured on (money of which year, valued when), shown beside the unit; '' when the unit says it all. */
	basis: string;
	/** Decimal places shown, in the display unit. */
	places: number;
	scale: MetricScale;
	betterWhen: BetterWhen;
	/** The method note that explains how the figure is computed. */
	method: MethodSlug;
}

export const CURRENCY_PLACEHOLDER = '{currency}';

type Entry = Omit<MetricDefinition, 'key'>;

const energy = (label: string, method: MethodSlug): Entry => ({
	label,
	unit: 'MWh/yr',
	basis: 'first operating year, before degradation',
	places: 0,
	scale: 'plain',
	betterWhen: 'higher',
	method
});
const pricePerMWh = (label: string, basis: string, method: MethodSlug): Entry => ({
	label,
	unit: '{currency}/MWh',
	basis,
	places: 2,
	scale: 'plain',
	betterWhen: 'lower',
	method
});
const rate = (label: string): Entry => ({ label, unit: '%/yr', basis: 'nominal', places: 2, scale: 'percent', betterWhen: 'higher', method: 'irr' });
const cover = (label: string, method: MethodSlug): Entry => ({ label, unit: '×', basis: '', places: 2, scale: 'plain', betterWhen: 'higher', method });

const ENTRIES: Record<MetricKey, Entry> = {
	netAepMWh: energy('Net annual energy, P50', 'annual-energy'),
	p90AepMWh: energy('Net annual energy, P90', 'exceedance'),
	capacityFactor: { label: 'Capacity factor', unit: '%', basis: 'net, first operating year', places: 1, scale: 'percent', betterWhen: 'higher', method: 'capacity-factor' },
	lcoeReal: pricePerMWh('LCOE, real', 'real, COD-year money', 'lcoe'),
	lcoeNominal: pricePerMWh('LCOE, nominal', 'nominal, levelised', 'lcoe'),
	lcoeFcr: pricePerMWh('LCOE, fixed charge rate', 'real, COD-year money', 'lcoe-fixed-charge-rate'),
	projectIrrPreTax: rate('Project IRR, pre-tax'),
	projectIrrPostTax: rate('Project IRR, post-tax'),
	equityIrr: rate('Equity IRR'),
	npv: { label: 'NPV, post-tax project', unit: '{currency}', basis: 'at COD, nominal discount rate', places: 0, scale: 'plain', betterWhen: 'higher', method: 'npv' },
	paybackYears: { label: 'Payback', unit: 'years', basis: 'from COD, post-tax project cash flow', places: 1, scale: 'plain', betterWhen: 'lower', method: 'payback' },
	minDscr: cover('Minimum DSCR', 'dscr'),
	avgDscr: cover('Average DSCR', 'dscr'),
	llcr: cover('LLCR', 'llcr'),
	yearsInLockUp: { label: 'Years in lock-up', unit: 'years', basis: 'operating years whose DSCR fails the lock-up test', places: 0, scale: 'plain', betterWhen: 'lower', method: 'covenants' },
	debtAmount: { label: 'Debt at COD', unit: '{currency}', basis: 'balance at COD', places: 0, scale: 'plain', betterWhen: 'neither', method: 'debt-sizing' },
	breakevenTariff: pricePerMWh('Breakeven tariff', 'flat in COD-year money, indexed like the tariff', 'breakeven-tariff')
};

export const METRICS: Readonly<Record<MetricKey, MetricDefinition>> = Object.fromEntries(
	METRIC_KEYS.map((key) => [key, { key, ...ENTRIES[key] }])
) as Record<MetricKey, MetricDefinition>;

/** Every metric, in the catalogue's order. */
export const METRIC_LIST: readonly MetricDefinition[] = METRIC_KEYS.map((key) => METRICS[key]);

/**
 * Figures of a case that are no engine metric but are read beside the
 * metrics (the portfolio): the installed capacity and the capex total, both
 * from the stored result's energy and costs. Same fields as a metric, so one
 * formatter serves both; not in METRIC_KEYS, which is what the engine computes.
 */
export const CASE_FIGURE_KEYS = ['installedCapacityMW', 'capexRealTotal'] as const;
export type CaseFigureKey = (typeof CASE_FIGURE_KEYS)[number];

export interface CaseFigureDefinition extends Omit<MetricDefinition, 'key'> {
	key: CaseFigureKey;
}

const CASE_ENTRIES: Record<CaseFigureKey, Entry> = {
	installedCapacityMW: { label: 'Installed capacity', unit: 'MW', basis: 'devices × rated power', places: 2, scale: 'plain', betterWhen: 'neither', method: 'capacity-factor' },
	capexRealTotal: {
		label: 'Capex',
		unit: '{currency}',
		basis: 'real, COD-year money, with contingency, before grants',
		places: 0,
		scale: 'plain',
		betterWhen: 'lower',
		method: 'costs'
	}
};

export const CASE_FIGURES: Readonly<Record<CaseFigureKey, CaseFigureDefinition>> = Object.fromEntries(
	CASE_FIGURE_KEYS.map((key) => [key, { key, ...CASE_ENTRIES[key] }])
) as Record<CaseFigureKey, CaseFigureDefinition>;

/** A metric or a case figure: anything the catalogue gives a label, unit and precision. */
export type FigureKey = MetricKey | CaseFigureKey;

export function isCaseFigureKey(value: string): value is CaseFigureKey {
	return (CASE_FIGURE_KEYS as readonly string[]).includes(value);
}

/** The definition of a metric or case figure. */
export function figureDefinition(key: FigureKey): MetricDefinition | CaseFigureDefinition {
	return isCaseFigureKey(key) ? CASE_FIGURES[key] : METRICS[key];
}

export function isMetricKey(value: string): value is MetricKey {
	return (METRIC_KEYS as readonly string[]).includes(value);
}

/** The definition of a key; throws on a key the engine does not have, so a typo cannot slip through as a blank label. */
export function metricDefinition(key: string): MetricDefinition {
	if (!isMetricKey(key)) throw new Error(`Unknown metric "${key}"; the metrics are ${METRIC_KEYS.join(', ')}.`);
	return METRICS[key];
}

/** The unit a metric (or case figure) is shown in, with the project's currency: "EUR/MWh", "%/yr", "×". */
export function metricUnit(key: FigureKey, currency: string): string {
	return figureDefinition(key).unit.replaceAll(CURRENCY_PLACEHOLDER, currency);
}

/** The unit with its basis, for a table with one unit column: "EUR/MWh (real, COD-year money)". */
export function metricUnitWithBasis(key: FigureKey, currency: string): string {
	const { basis } = figureDefinition(key);
	return basis === '' ? metricUnit(key, currency) : `${metricUnit(key, currency)} (${basis})`;
}

/**
 * The unit of the engine's own value, as the API sends it: per cent figures
 * are fractions there ("fraction/yr (nominal)"), everything else as shown.
 */
export function engineValueUnit(key: MetricKey, currency: string): string {
	const shown = metricUnitWithBasis(key, currency);
	return METRICS[key].scale === 'percent' ? shown.replace('%', 'fraction') : shown;
}

/** Where a metric's (or case figure's) method note lives; a key with no note leads to the index. */
export function metricMethodHref(key: string): string {
	return isMetricKey(key) || isCaseFigureKey(key) ? methodNoteHref(figureDefinition(key).method) : METHODS_INDEX_HREF;
}

/** The metrics a method note explains, in the catalogue's order. */
export function metricsOfNote(slug: string): MetricDefinition[] {
	return METRIC_LIST.filter((metric) => metric.method === slug);
}
