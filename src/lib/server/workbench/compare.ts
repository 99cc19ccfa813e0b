/**
 * Scenarios side by side: each scenario's metrics and its differences from
 * the base case, in decimal arithmetic on the engine's decimal strings.
 */
import { Decimal } from '../engine/decimal';
import { decimalString, type EngineResult } from '../engine/evaluate';
import { CURRENCY_PLACEHOLDER, engineValueUnit, METRIC_KEYS, METRICS, type MetricKey } from '../../metrics/catalogue';
import type { CoverShortfalls } from '../engine/cover-shortfalls';

export interface CompareEntry {
	id: string;
	name: string;
	revision: number;
	isBaseCase: boolean;
	result: EngineResult;
}

export interface MetricDifference {
	/** scenario - base case, in the metric's unit. */
	absolute: string;
	/** (scenario - base case) / |base case|; null when the base case is 0. */
	relative: string | null;
}

export interface ComparedScenario {
	id: string;
	name: string;
	revision: number;
	isBaseCase: boolean;
	metrics: Record<MetricKey, string | null>;
	/** Null for every metric when there is no base case; null for one metric when either side has no value. */
	differences: Record<MetricKey, MetricDifference | null> | null;
	/** The loan years the minimum DSCR leaves out or that fall short, shown beside it; none for a result stored before them. */
	coverShortfalls: CoverShortfalls;
	/** For each metric without a value, why, in words ("no IRR: …"), to show in its place. */
	missingValues: Partial<Record<MetricKey, string>>;
	warnings: string[];
}

export interface Comparison {
	/** The catalogue's metrics in its order, each with the unit of its values as sent (rates as fractions). */
	metrics: { key: MetricKey; unit: string }[];
	baseCase: { id: string; name: string; revision: number; metrics: Record<MetricKey, string | null> } | null;
	scenarios: ComparedScenario[];
}

export function metricDifference(value: string | null, base: string | null): MetricDifference | null {
	if (value === null || base === null) return null;
	const v = new Decimal(value);
	const b = new Decimal(base);
	const absolute = v.minus(b);
	return { absolute: decimalString(absolute), relative: b.isZero() ? null : decimalString(absolute.div(b.abs())) };
}

/** What a missing metric is called before the reason: "no <label in lower case>: …". */
function missingHead(key: MetricKey): string {
	const label = METRICS[key].label;
	return `no ${/^[A-Z]{2}/.test(label) ? label : label.charAt(0).toLowerCase() + label.slice(1)}`;
}

/** Metrics the engine leaves without a note of their own, each with the metric whose reason they share. */
const MISSING_LIKE: readonly (readonly [MetricKey, MetricKey])[] = [
	['lcoeNominal', 'lcoeReal'],
	['lcoeFcr', 'lcoeReal'],
	['avgDscr', 'minDscr']
];

/** Reasons where the engine writes none: a lock-up count needs a lock-up test among the covenants. */
function fixedReason(key: MetricKey): string | null {
	return key === 'yearsInLockUp' ? 'the covenants set no lock-up DSCR' : null;
}
const UNKNOWN_REASON = 'the engine gave no value (see what it noted)';

/** The reason the engine wrote for a metric ("<label> is not available: <reason>."), if the stored result has it. */
function engineReason(key: MetricKey, warnings: readonly string[]): string | null {
	const prefix = `${METRICS[key].label} is not available: `;
	const found = warnings.find((w) => w.startsWith(prefix));
	return found ? found.slice(prefix.length).replace(/\.$/, '') : null;
}

/**
 * Words for each metric the result has no value for, in place of a dash:
 * "no IRR: cash flows never change sign …", from the engine's own reason
 * when the stored result carries it, else a short fixed reason.
 */
export function missingValueWords(result: Pick<EngineResult, 'metrics' | 'warnings'>): Partial<Record<MetricKey, string>> {
	const words: Partial<Record<MetricKey, string>> = {};
	for (const key of METRIC_KEYS) {
		if (result.metrics[key] !== null && result.metrics[key] !== undefined) continue;
		const like = MISSING_LIKE.find(([metric]) => metric === key)?.[1];
		const reason = engineReason(key, result.warnings) ?? (like ? engineReason(like, result.warnings) : null) ?? fixedReason(key) ?? UNKNOWN_REASON;
		words[key] = `${missingHead(key)}: ${reason}`;
	}
	return words;
}

export function compareScenarios(entries: readonly CompareEntry[], baseCase: CompareEntry | null): Comparison {
	const baseMetrics = baseCase?.result.metrics ?? null;
	// Scenarios of one project share its currency; with nothing to compare the unit keeps its placeholder.
	const currency = (entries[0] ?? baseCase)?.result.currency ?? CURRENCY_PLACEHOLDER;
	return {
		metrics: METRIC_KEYS.map((key) => ({ key, unit: engineValueUnit(key, currency) })),
		baseCase: baseCase && { id: baseCase.id, name: baseCase.name, revision: baseCase.revision, metrics: baseCase.result.metrics },
		scenarios: entries.map((entry) => ({
			id: entry.id,
			name: entry.name,
			revision: entry.revision,
			isBaseCase: entry.isBaseCase,
			metrics: entry.result.metrics,
			differences: baseMetrics
				? (Object.fromEntries(METRIC_KEYS.map((key) => [key, metricDifference(entry.result.metrics[key], baseMetrics[key])])) as Record<
						MetricKey,
						MetricDifference | null
					>)
				: null,
			coverShortfalls: {
				negativeCfadsYears: entry.result.coverShortfalls?.negativeCfadsYears ?? [],
				dscrBelowOneYears: entry.result.coverShortfalls?.dscrBelowOneYears ?? []
			},
			missingValues: missingValueWords(entry.result),
			warnings: entry.result.warnings
		}))
	};
}
