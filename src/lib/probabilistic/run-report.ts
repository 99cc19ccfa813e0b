/**
 * A finished probabilistic run in words and figures, as a room page and the
 * PDF summary print it: the P10/P50/P90 table in the catalogue's units and
 * precision, the probabilities, what was drawn, and the histogram of one
 * output in display units. Pure, and safe to import in the browser.
 */
import type { RunSummary } from '../server/probabilistic/summary';
import type { SnapshotRun } from '../server/rooms/snapshot-format';
import type { Distribution } from '../schemas/probabilistic';
import { METRIC_LIST, METRICS, metricUnit, type MetricKey } from '../metrics/catalogue';
import { chartValue, formatMetric, groupDigits, NO_VALUE } from '../metrics/format';
import { formUnit, toFormValue, type DriverUnit } from '../analysis/driver-inputs';

export type RunOutputKey = keyof RunSummary['outputs'] & MetricKey;

export const RUN_SECTION_TITLE = 'Probabilistic run';

/** The P90 convention, in the words of the method note. */
export const P90_CONVENTION =
	'P90 is the value the result reaches or betters with 90 % probability, as with P90 energy: for the IRRs, the NPV and the minimum DSCR (higher is better) it is the 10th percentile of the draws; for the LCOE (lower is better) the 90th. P10 is the other way round, a value bettered in one draw out of ten; P50 is the median.';

/** The run's outputs in the catalogue's order. */
export function runOutputKeys(summary: Pick<RunSummary, 'outputs'>): RunOutputKey[] {
	return METRIC_LIST.map((m) => m.key).filter((key): key is RunOutputKey => key in summary.outputs);
}

/** A run's float in the metric's display unit at the catalogue's precision; a missing value reads as an en dash. */
export function runFigure(key: MetricKey, value: number | null): string {
	return value === null || !Number.isFinite(value) ? NO_VALUE : formatMetric(key, String(value));
}

export interface RunTableRow {
	key: RunOutputKey;
	label: string;
	unit: string;
	mean: string;
	p90: string;
	p50: string;
	p10: string;
	/** Draws with a value, and without one. */
	count: number;
	missing: number;
}

export function runTableRows(summary: Pick<RunSummary, 'outputs'>, currency: string): RunTableRow[] {
	return runOutputKeys(summary).map((key) => {
		const { stats } = summary.outputs[key];
		return {
			key,
			label: METRICS[key].label,
			unit: metricUnit(key, currency),
			mean: runFigure(key, stats.mean),
			p90: runFigure(key, stats.p90),
			p50: runFigure(key, stats.p50),
			p10: runFigure(key, stats.p10),
			count: stats.count,
			missing: stats.missing
		};
	});
}

/** Why an output can have no value in a draw. */
function whyMissing(key: RunOutputKey): string | null {
	if (key === 'minDscr') return 'no debt service';
	return key === 'projectIrrPostTax' || key === 'equityIrr' ? 'no IRR' : null;
}

/** One sentence per output with draws that have no value: "<label>: 12 of 10,000 draws have none (no IRR) and are left out." */
export function missingNotes(summary: Pick<RunSummary, 'outputs' | 'draws'>): string[] {
	return runOutputKeys(summary).flatMap((key) => {
		const { count, missing } = summary.outputs[key].stats;
		if (missing === 0) return [];
		const total = groupDigits(count + missing, 0);
		if (count === 0) return [`${METRICS[key].label}: no draw has a value${whyMissing(key) ? ` (${whyMissing(key)})` : ''}.`];
		return [`${METRICS[key].label}: ${groupDigits(missing, 0)} of ${total} draws have none${whyMissing(key) ? ` (${whyMissing(key)}, or the draw was refused)` : ''} and are left out.`];
	});
}

/**
 * A probability as a share in per cent to one decimal, never rounded to a
 * certainty it is not: 0.0004 reads "below 0.1 %", 0.9996 "above 99.9 %".
 */
export function formatProbability(p: number): string {
	if (p > 0 && p < 0.001) return 'below 0.1 %';
	if (p < 1 && p > 0.999) return 'above 99.9 %';
	return `${groupDigits(p * 100, 1)} %`;
}

export interface RunProbability {
	label: string;
	value: string;
}

/** The chances the method note reports: minimum DSCR below the lock-up level and below 1, equity IRR below the hurdle. */
export function runProbabilities(summary: Pick<RunSummary, 'probabilities' | 'thresholds'>): RunProbability[] {
	const { probabilities: p, thresholds } = summary;
	const cover = (value: number) => `${groupDigits(value, 2)}×`;
	const lockUp: RunProbability =
		thresholds.lockUpDscr === null
			? { label: `${METRICS.minDscr.label} below the lock-up level`, value: 'no lock-up level in this scenario' }
			: {
					label: `${METRICS.minDscr.label} below the lock-up level (${cover(thresholds.lockUpDscr)})`,
					value: p.minDscrBelowLockUp === null ? 'not defined: no draw has debt service' : formatProbability(p.minDscrBelowLockUp)
				};
	return [
		lockUp,
		{ label: `${METRICS.minDscr.label} below ${cover(1)}`, value: p.minDscrBelowOne === null ? 'not defined: no draw has debt service' : formatProbability(p.minDscrBelowOne) },
		{
			label: `${METRICS.equityIrr.label} below the hurdle rate (${runFigure('equityIrr', thresholds.hurdleRate)} ${metricUnit('equityIrr', '')})`,
			value: p.equityIrrBelowHurdle === null ? 'not defined: no draw has an equity IRR' : formatProbability(p.equityIrrBelowHurdle)
		}
	];
}

/**
 * About how far a percentile of N draws may sit from the true one, in
 * probability: sqrt(p (1 - p) / N) at p = 0.9 (the binomial standard error;
 * the method note's "Sampling error"), in percentage points to one decimal.
 */
export function samplingNote(draws: number): string {
	const points = Math.sqrt((0.9 * 0.1) / draws) * 100;
	return `With ${groupDigits(draws, 0)} draws a P90 or P10 is uncertain by about ${groupDigits(points, 1)} percentage points of probability: figures of two runs that differ by less are the same.`;
}

/** A driver value in the form's units, to six significant digits: "90 % of base", "5.5 %/yr", "25 years". */
export function driverValueText(unit: DriverUnit, engineValue: number): string {
	const value = Number(toFormValue(unit, engineValue).toPrecision(6));
	return `${String(value).replace('-', '−')} ${formUnit(unit)}`;
}

/** "90 to 130 % of base": the unit once, after the high value. */
function rangeText(unit: DriverUnit, low: number, high: number): string {
	const suffix = ` ${formUnit(unit)}`;
	const lowText = driverValueText(unit, low);
	return `${lowText.endsWith(suffix) ? lowText.slice(0, -suffix.length) : lowText} to ${driverValueText(unit, high)}`;
}

/** A distribution in words, in the driver's form units. */
export function distributionText(distribution: Distribution, unit: DriverUnit): string {
	const v = (x: number) => driverValueText(unit, x);
	switch (distribution.shape) {
		case 'triangular':
			return `triangular, ${rangeText(unit, distribution.min, distribution.max)}, most likely ${v(distribution.mode)}`;
		case 'uniform':
			return `uniform, ${rangeText(unit, distribution.min, distribution.max)}`;
		case 'normal':
			return `normal, mean ${v(distribution.mean)}, standard deviation ${v(distribution.sd)}`;
		case 'truncated-normal':
			return `normal cut to ${rangeText(unit, distribution.min, distribution.max)}, mean ${v(distribution.mean)}, standard deviation ${v(distribution.sd)}`;
		case 'lognormal':
			return `lognormal, mean ${v(distribution.mean)}, standard deviation ${v(distribution.sd)}`;
	}
}

const KNOWN_UNITS: readonly DriverUnit[] = ['x base', 'fraction', 'fraction/yr', 'years', 'devices'];
const asDriverUnit = (unit: string): DriverUnit => (KNOWN_UNITS as readonly string[]).includes(unit) ? (unit as DriverUnit) : 'devices';

const dayFormat = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' });

export interface RunFact {
	label: string;
	value: string;
}

/** What was drawn and how, as label and value: draws, seed, each driver, correlations, energy, hurdle, engine, date. */
export function runFacts(run: SnapshotRun): RunFact[] {
	const labelOf = new Map(run.drivers.map((d) => [d.driver, d.label]));
	const facts: RunFact[] = [
		{ label: 'Draws', value: groupDigits(run.draws, 0) },
		{ label: 'Seed', value: String(run.seed) },
		...run.drivers.map((d) => ({ label: d.label, value: distributionText(d.distribution, asDriverUnit(d.unit)) })),
		{
			label: 'Energy uncertainty',
			value: run.energyUncertainty ? "drawn from the scenario's uncertainty components, around the P50 estimate" : 'not drawn: every draw has the P50 energy'
		}
	];
	if (run.correlations.length > 0) {
		facts.push({
			label: 'Rank correlations',
			value: run.correlations.map((c) => `${labelOf.get(c.a) ?? c.a} with ${labelOf.get(c.b) ?? c.b}: ${groupDigits(c.rankCorrelation, 2)}`).join('; ')
		});
	}
	facts.push(
		{ label: 'Hurdle rate', value: `${runFigure('equityIrr', run.hurdleRate)} ${metricUnit('equityIrr', '')}` },
		{ label: 'Engine version', value: run.engineVersion },
		{ label: 'Finished', value: dayFormat.format(new Date(run.finishedAt)) }
	);
	return facts;
}

/** "10,000 draws, seed 20261208, finished 8 December 2026": one line for a heading or a caption. */
export function runBasisLine(run: Pick<SnapshotRun, 'draws' | 'seed' | 'finishedAt' | 'engineVersion'>): string {
	return `${groupDigits(run.draws, 0)} draws, seed ${run.seed}, engine ${run.engineVersion}, finished ${dayFormat.format(new Date(run.finishedAt))}`;
}

export interface RunHistogramView {
	key: RunOutputKey;
	label: string;
	unit: string;
	/** In the display unit (per cent figures times 100), ascending and touching. */
	bins: { from: number; to: number; count: number }[];
	/** Draws with a value. */
	count: number;
	/** P90, P50 and P10 in the display unit, where defined. */
	markers: { name: 'P90' | 'P50' | 'P10'; value: number; text: string }[];
}

/** The output the histogram shows: the equity IRR, or the LCOE when no draw has an equity IRR (no debt, or never paid back). */
export function histogramOutput(summary: Pick<RunSummary, 'outputs'>): RunOutputKey | null {
	const usable = (key: RunOutputKey) => key in summary.outputs && summary.outputs[key].stats.count > 0 && summary.outputs[key].histogram.counts.length > 0;
	if (usable('equityIrr')) return 'equityIrr';
	if (usable('lcoeReal')) return 'lcoeReal';
	return null;
}

/** The histogram of one output (by default `histogramOutput`), in display units; null when it has no value. */
export function runHistogram(summary: Pick<RunSummary, 'outputs'>, currency: string, key: RunOutputKey | null = histogramOutput(summary)): RunHistogramView | null {
	if (key === null || !(key in summary.outputs) || summary.outputs[key].stats.count === 0) return null;
	const { histogram, stats } = summary.outputs[key];
	const display = (value: number) => chartValue(key, String(value))!;
	const edges = histogram.edges.map(display);
	const markers = (['p90', 'p50', 'p10'] as const).flatMap((level) => {
		const value = stats[level];
		return value === null ? [] : [{ name: level.toUpperCase() as 'P90' | 'P50' | 'P10', value: display(value), text: runFigure(key, value) }];
	});
	return {
		key,
		label: METRICS[key].label,
		unit: metricUnit(key, currency),
		bins: histogram.counts.map((count, i) => ({ from: edges[i], to: edges[i + 1], count })),
		count: stats.count,
		markers
	};
}

/** A bin edge for a label: float noise rounded away (7.000000000000001 -> "7"), grouped, with a real minus sign. */
export function edgeText(value: number): string {
	const tidy = Number(value.toPrecision(12));
	return tidy.toLocaleString('en-GB', { maximumFractionDigits: 6 }).replace('-', '−');
}
