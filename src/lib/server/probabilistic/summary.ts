/**
 * What a finished run reports, from all its draws in draw order: per output
 * the summary table, histogram and cumulative curve; the chances of the
 * minimum DSCR under the lock-up level and under 1 and of the equity IRR
 * under the hurdle; and which drawn driver each output follows (Spearman).
 * Pure: no I/O.
 */
import type { ProbabilisticDriverId } from '../../schemas/probabilistic';
import { RUN_OUTPUTS, type RunOutput } from './draw-evaluation';
import { cumulativeCurve, histogram, probabilityBelow, spearmanTable, summarise, type CurvePoint, type Histogram, type Summary } from './statistics';

/** Every draw of a run, in draw order: each output (null where the draw has none), each drawn driver, the energy factor. */
export interface RunDraws {
	outputs: Record<RunOutput, (number | null)[]>;
	drivers: Partial<Record<ProbabilisticDriverId, number[]>>;
	energyFactor: number[];
}

export interface OutputSummary {
	higherIsBetter: boolean;
	stats: Summary;
	histogram: Histogram;
	cumulative: CurvePoint[];
}

/** A drawn factor (a driver, or the energy factor) and its rank correlation with each output. */
export interface FactorImportance {
	factor: ProbabilisticDriverId | 'energyFactor';
	rankCorrelation: Record<RunOutput, number | null>;
}

export interface RunSummary {
	draws: number;
	outputs: Record<RunOutput, OutputSummary>;
	/** Draws with no value, per output (no IRR, no debt, a draw the engine refused). */
	missing: Record<RunOutput, number>;
	thresholds: { lockUpDscr: number | null; hurdleRate: number };
	/** Shares of the draws that have the output; null when none has it (or, for the lock-up, when the scenario has no lock-up). */
	probabilities: { minDscrBelowLockUp: number | null; minDscrBelowOne: number | null; equityIrrBelowHurdle: number | null };
	importance: FactorImportance[];
}

/** Lower is better for the LCOE alone. */
export const HIGHER_IS_BETTER: Record<RunOutput, boolean> = { lcoeReal: false, projectIrrPostTax: true, equityIrr: true, npv: true, minDscr: true };

/** Joins chunks' draws, given in draw order, into one list per column. */
export function joinDraws(chunks: readonly RunDraws[]): RunDraws {
	const outputs = Object.fromEntries(RUN_OUTPUTS.map((key) => [key, chunks.flatMap((c) => c.outputs[key])])) as RunDraws['outputs'];
	const driverIds = [...new Set(chunks.flatMap((c) => Object.keys(c.drivers)))] as ProbabilisticDriverId[];
	const drivers = Object.fromEntries(driverIds.map((id) => [id, chunks.flatMap((c) => c.drivers[id] ?? [])]));
	return { outputs, drivers, energyFactor: chunks.flatMap((c) => c.energyFactor) };
}

export interface SummaryOptions {
	/** The drawn drivers, in the order the run lists them. */
	drivers: readonly ProbabilisticDriverId[];
	energyUncertainty: boolean;
	lockUpDscr: number | null;
	hurdleRate: number;
}

/**
 * The run's summary. Missing values are left out of every statistic and
 * every probability (reported in `missing`), as the method note says.
 */
export function summariseRun(draws: RunDraws, options: SummaryOptions): RunSummary {
	const outputs = {} as RunSummary['outputs'];
	const missing = {} as RunSummary['missing'];
	for (const key of RUN_OUTPUTS) {
		const values = draws.outputs[key];
		const stats = summarise(values, HIGHER_IS_BETTER[key]);
		outputs[key] = { higherIsBetter: HIGHER_IS_BETTER[key], stats, histogram: histogram(values), cumulative: cumulativeCurve(values) };
		missing[key] = stats.missing;
	}
	const { minDscr, equityIrr } = draws.outputs;
	const factors: { factor: FactorImportance['factor']; values: number[] }[] = options.drivers.map((driver) => ({ factor: driver, values: draws.drivers[driver] ?? [] }));
	if (options.energyUncertainty) factors.push({ factor: 'energyFactor', values: draws.energyFactor });
	const correlations = spearmanTable(
		factors.map((f) => f.values),
		RUN_OUTPUTS.map((key) => draws.outputs[key])
	);
	return {
		draws: draws.energyFactor.length,
		outputs,
		missing,
		thresholds: { lockUpDscr: options.lockUpDscr, hurdleRate: options.hurdleRate },
		probabilities: {
			minDscrBelowLockUp: options.lockUpDscr === null ? null : probabilityBelow(minDscr, options.lockUpDscr),
			minDscrBelowOne: probabilityBelow(minDscr, 1),
			// No equity IRR: the equity never earns its money back, short of any hurdle.
			equityIrrBelowHurdle: probabilityBelow(equityIrr, options.hurdleRate, 'below')
		},
		importance: factors.map(({ factor }, f) => ({
			factor,
			rankCorrelation: Object.fromEntries(RUN_OUTPUTS.map((key, o) => [key, correlations[f][o]])) as Record<RunOutput, number | null>
		}))
	};
}
