/**
 * A finished probabilistic run as a room version freezes it: its summary and
 * what it drew, with each driver's label and unit as the engine names them
 * today, so the room reads the same after either changes. Pure: no I/O.
 */
import type { ProbabilisticRun } from '../db/probabilistic-runs';
import { DRIVERS } from '../engine/sensitivity';
import type { SnapshotRun } from './snapshot-format';

/** Throws when the run is not done (it has no summary to freeze). */
export function freezeRun(run: ProbabilisticRun): SnapshotRun {
	if (run.state !== 'done' || run.summary === null || run.finishedAt === null) throw new Error(`run ${run.id} is ${run.state}: only a finished run can be frozen`);
	return {
		runId: run.id,
		seed: run.seed,
		draws: run.draws,
		engineVersion: run.engineVersion,
		finishedAt: run.finishedAt.toISOString(),
		drivers: run.input.drivers.map(({ driver, distribution }) => ({ driver, label: DRIVERS[driver].label, unit: DRIVERS[driver].unit, distribution })),
		correlations: run.input.correlations,
		energyUncertainty: run.input.energyUncertainty,
		hurdleRate: run.input.hurdleRate,
		summary: run.summary
	};
}
