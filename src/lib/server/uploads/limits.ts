/**
 * An upload may not fill a list of the scenario document beyond the bound the
 * schema sets (src/lib/schemas/scenario-limits.ts): such a file is refused on
 * upload, in the schema's own words, rather than saved and refused when applied.
 */
import { atMost, SCENARIO_LIMITS, type ScenarioLimit } from '../../schemas/scenario-limits';
import { fileFailure, type UploadFailure } from './result';

/**
 * The refusal of a file that would give `count` entries where the scenario
 * takes at most SCENARIO_LIMITS[limit], or null when it fits.
 * `counted` names what the file has: "rows", "Hs rows", "period columns".
 */
export function beyondScenarioLimit(limit: ScenarioLimit, count: number, counted: string): UploadFailure | null {
	if (count <= SCENARIO_LIMITS[limit]) return null;
	return fileFailure(`The file has ${count.toLocaleString('en')} ${counted}; a scenario takes ${atMost(limit)}.`);
}
