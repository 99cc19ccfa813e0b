/**
 * The shape of a room version's frozen snapshot, and its assembly from parts
 * already read (pure: no database, no bundler features), so the app and the
 * demo seed freeze rooms alike.
 */
import type { EngineResult } from '../engine/evaluate';
import type { ScenarioDocument } from '../db/scenarios';
import type { RunSummary } from '../probabilistic/summary';
import type { Distribution, ProbabilisticDriverId, RunInput } from '../../schemas/probabilistic';
import { ENGINE_VERSION } from '../engine/version';

export const SNAPSHOT_FORMAT = 1;

/**
 * A finished probabilistic run of the published revision, frozen with what it
 * drew: each driver with its label and unit as they were, the distributions,
 * correlations, energy uncertainty and hurdle rate, and the run's summary.
 */
export interface SnapshotRun {
	runId: string;
	seed: number;
	draws: number;
	/** The engine the run's draws were computed with (may be older than the snapshot's). */
	engineVersion: string;
	/** ISO 8601. */
	finishedAt: string;
	/** In the run's order; unit as the sensitivity drivers give it ('x base', 'fraction', 'fraction/yr', 'years', 'devices'). */
	drivers: { driver: ProbabilisticDriverId; label: string; unit: string; distribution: Distribution }[];
	correlations: RunInput['correlations'];
	energyUncertainty: boolean;
	/** Fraction per year, nominal. */
	hurdleRate: number;
	summary: RunSummary;
}

export interface SnapshotScenario {
	id: string;
	name: string;
	notes: string;
	revision: number;
	isBaseCase: boolean;
	document: ScenarioDocument;
	result: EngineResult;
	/** Chosen at publication; versions published before runs existed (or without one) have none. */
	probabilisticRun?: SnapshotRun;
}

export interface RoomSnapshot {
	format: typeof SNAPSHOT_FORMAT;
	engineVersion: string;
	project: { id: string; name: string; technology: string; siteName: string; siteDescription: string; currency: string };
	scenarios: SnapshotScenario[];
	/** As they were: the HTML the room pages show and the markdown the PDF prints. */
	methodNotes: { slug: string; title: string; summary: string; html: string; markdown: string }[];
	cautions: string[];
}

export function assembleSnapshot(parts: {
	project: { id: string; name: string; technology: string; site_name: string; site_description: string; currency: string };
	scenarios: SnapshotScenario[];
	methodNotes: readonly { slug: string; title: string; summary: string; html: string; markdown: string }[];
	cautions: readonly string[];
}): RoomSnapshot {
	const { project } = parts;
	return {
		format: SNAPSHOT_FORMAT,
		engineVersion: ENGINE_VERSION,
		project: { id: project.id, name: project.name, technology: project.technology, siteName: project.site_name, siteDescription: project.site_description, currency: project.currency },
		scenarios: parts.scenarios,
		methodNotes: parts.methodNotes.map(({ slug, title, summary, html, markdown }) => ({ slug, title, summary, html, markdown })),
		cautions: [...parts.cautions]
	};
}
