/**
 * The energy uncertainty a run draws from: every component of the scenario's
 * energy estimate, as the estimate itself combines them (../engine/energy/yield.ts):
 * for an assessed-energy resource the assessment's own uncertainty first (a
 * P90, or a total sigma, or a long-term sigma counted as long-term; an
 * inter-annual sigma as inter-annual), then the scenario's components.
 */
import type { Scenario } from '../../schemas/scenario';
import { sigmaFromExceedance } from '../engine/energy/uncertainty';
import type { EnergyComponent } from './sampling';

export function energyComponentsOf(scenario: Scenario): EnergyComponent[] {
	const own: EnergyComponent[] = [];
	const r = scenario.resource;
	if (r.kind === 'assessed-energy') {
		if (r.p90MWh !== undefined) own.push({ sigma: sigmaFromExceedance(r.p50MWh, r.p90MWh, 90).toNumber(), kind: 'long-term' });
		if (r.sigma !== undefined) own.push({ sigma: r.sigma, kind: 'long-term' });
		if (r.longTermSigma !== undefined) own.push({ sigma: r.longTermSigma, kind: 'long-term' });
		if (r.interAnnualSigma !== undefined) own.push({ sigma: r.interAnnualSigma, kind: 'inter-annual' });
	}
	return [...own, ...scenario.uncertainty.components.map((c) => ({ sigma: c.sigma, kind: c.kind }))];
}
