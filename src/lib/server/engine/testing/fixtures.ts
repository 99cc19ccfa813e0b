/**
 * Scenario builders for the engine's tests. Not used by the app.
 */
import { parseScenario, type Scenario, type ScenarioInput } from '../../../schemas/scenario';

/** The fields that choose a union member: a patch that changes one replaces the object. */
const discriminators = ['kind', 'basis', 'sizing'];

/**
 * Deep merge of plain objects; arrays and scalars in `patch` replace, and so
 * does an object of another union member (another `kind`, `basis` or `sizing`):
 * the old member's fields would be unknown keys in the new one.
 */
function merge<T>(base: T, patch: unknown): T {
	if (patch === undefined) return base;
	if (typeof base !== 'object' || base === null || Array.isArray(base) || typeof patch !== 'object' || patch === null || Array.isArray(patch)) {
		return patch as T;
	}
	const from = base as Record<string, unknown>;
	const to = patch as Record<string, unknown>;
	if (discriminators.some((key) => key in to && key in from && to[key] !== from[key])) return patch as T;
	const out: Record<string, unknown> = { ...(base as Record<string, unknown>) };
	for (const [k, v] of Object.entries(patch as Record<string, unknown>)) out[k] = merge(out[k], v);
	return out as T;
}

/** Validate a scenario document or throw with the issues listed. */
export function scenarioFrom(input: unknown): Scenario {
	const parsed = parseScenario(input);
	if (!parsed.ok) throw new Error(parsed.issues.map((i) => `${i.path}: ${i.message}`).join('\n'));
	return parsed.scenario;
}

/**
 * The fixed-charge-rate check case (NREL ATB LCOE equations, derived in
 * CHECK-VALUES): 10 MW, 5000 per kW, fixed O&M 4 % of capex a year, capacity
 * factor 35 % on 8760 h, 20 years at 8 %, capex at t = 0 (year-end spend), no tax, no
 * inflation, no losses. One 10 MW device: the power curve is at rated power
 * in the 3 m/s bin (35 % of the time) and zero in the 0.2 m/s bin.
 */
export const atbCaseInput: ScenarioInput = {
	schemaVersion: 3,
	name: 'Fixed-charge-rate check case',
	technology: 'tidal-stream',
	resource: {
		kind: 'speed-histogram',
		bins: [
			{ speedMPerS: 0.2, occurrence: 0.65 },
			{ speedMPerS: 3, occurrence: 0.35 }
		]
	},
	device: {
		kind: 'power-curve',
		points: [
			{ speedMPerS: 0.5, powerKW: 0 },
			{ speedMPerS: 2, powerKW: 10000 },
			{ speedMPerS: 4, powerKW: 10000 }
		]
	},
	array: { deviceCount: 1 },
	timeline: { constructionYears: 1, operatingYears: 20, spendTiming: 'year-end' },
	capex: { lines: [{ name: 'Installed cost', basis: 'per-kW', amount: 5000 }] },
	opex: { lines: [{ name: 'Fixed O&M', basis: 'percent-of-capex', fraction: 0.04 }] },
	revenue: { tariffPerMWh: 300, supportYears: 20 },
	finance: { inflation: 0, realDiscountRate: 0.08, taxRate: 0 }
};

/** A patch is a nested object whose leaves (and arrays) replace those of the base. */
export type Patch = Record<string, unknown>;

export function atbCase(patch?: Patch): Scenario {
	return scenarioFrom(merge(atbCaseInput, patch));
}

/** Any scenario input with a patch applied, validated. */
export function patched(input: ScenarioInput, patch?: Patch): Scenario {
	return scenarioFrom(merge(input, patch));
}
