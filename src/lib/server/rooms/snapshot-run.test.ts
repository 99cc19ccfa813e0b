import { describe, expect, it } from 'vitest';
import type { ProbabilisticRun } from '../db/probabilistic-runs';
import { handMadeInput, handMadeSummary } from '../../../../tests/fixtures/probabilistic-run';
import { DRIVERS } from '../engine/sensitivity';
import { freezeRun } from './snapshot-run';

function run(overrides: Partial<ProbabilisticRun> = {}): ProbabilisticRun {
	const input = handMadeInput();
	return {
		id: '00000000-0000-4000-8000-0000000000aa',
		workspaceId: '00000000-0000-4000-8000-0000000000bb',
		projectId: '00000000-0000-4000-8000-0000000000cc',
		scenarioId: '00000000-0000-4000-8000-0000000000dd',
		scenarioRevision: 3,
		engineVersion: '7',
		input,
		seed: input.seed,
		draws: input.draws,
		chunkSize: 50,
		state: 'done',
		drawsDone: input.draws,
		failure: null,
		summary: handMadeSummary(),
		createdBy: null,
		createdAt: new Date('2026-12-08T10:00:00Z'),
		startedAt: new Date('2026-12-08T10:00:05Z'),
		finishedAt: new Date('2026-12-08T10:30:00Z'),
		...overrides
	};
}

describe('freezeRun', () => {
	it('keeps the summary, seed, draws, engine, finishing time, drivers with their labels and units, correlations, energy and hurdle', () => {
		const frozen = freezeRun(run());
		const input = handMadeInput();
		expect(frozen).toEqual({
			runId: '00000000-0000-4000-8000-0000000000aa',
			seed: 4242,
			draws: 100,
			engineVersion: '7',
			finishedAt: '2026-12-08T10:30:00.000Z',
			drivers: [
				{ driver: 'capex', label: DRIVERS.capex.label, unit: 'x base', distribution: input.drivers[0].distribution },
				{ driver: 'opex', label: DRIVERS.opex.label, unit: 'x base', distribution: input.drivers[1].distribution }
			],
			correlations: [{ a: 'capex', b: 'opex', rankCorrelation: 0.4 }],
			energyUncertainty: true,
			hurdleRate: 0.08,
			summary: handMadeSummary()
		});
		// Survives the trip through a jsonb column unchanged.
		expect(JSON.parse(JSON.stringify(frozen))).toEqual(frozen);
	});

	it('refuses a run that has not finished', () => {
		expect(() => freezeRun(run({ state: 'running', summary: null, finishedAt: null }))).toThrow(/only a finished run/);
		expect(() => freezeRun(run({ state: 'cancelled', summary: null }))).toThrow(/cancelled/);
	});
});
