/**
 * The energy uncertainty a run draws from: every component of the scenario's
 * energy estimate, as the estimate itself combines them (../engine/energy/yield.ts):
 * for an assessed-energy resource the assessment's own uncertainty first,
 * then the scenario's components.
 */
import type { Scenario } from '../../schemas/scenario';
import { uncertaintyComponents } from '../engine/energy/yield';
import type { EnergyComponent } from './sampling';

export function energyComponentsOf(scenario: Scenario): EnergyComponent[] {
	return uncertaintyComponents(scenario).map((c) => ({ sigma: c.sigma.toNumber(), kind: c.kind }));
}
