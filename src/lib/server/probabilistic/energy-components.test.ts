import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseScenario, type Scenario } from '../../schemas/scenario';
import { evaluateScenario } from '../engine/evaluate';
import { energyComponentsOf } from './energy-components';

function example(file: string): unknown {
	return JSON.parse(readFileSync(join(process.cwd(), 'examples', file), 'utf8'));
}

function parsed(document: unknown): Scenario {
	const result = parseScenario(document);
	if (!result.ok) throw new Error(JSON.stringify(result.issues));
	return result.scenario;
}

/** Root sum of squares of the components of one kind (compared to 9 decimals: the engine reports its sigmas as 10-digit strings). */
function rss(scenario: Scenario, kind: 'long-term' | 'inter-annual'): number {
	return Math.sqrt(energyComponentsOf(scenario).filter((c) => (c.kind ?? 'long-term') === kind).reduce((s, c) => s + c.sigma ** 2, 0));
}

describe('energyComponentsOf', () => {
	it('is the uncertainty the energy estimate itself combines, for a resource and device', () => {
		const tidal = parsed(example('tidal-stream-kestle-narrows.json'));
		const energy = evaluateScenario(tidal).energy;
		expect(energyComponentsOf(tidal)).toHaveLength(tidal.uncertainty.components.length);
		expect(rss(tidal, 'long-term')).toBeCloseTo(Number(energy.sigmaLongTerm), 9);
		expect(rss(tidal, 'inter-annual')).toBeCloseTo(Number(energy.sigmaInterAnnual), 9);
	});

	it("counts an assessment's P90 as long-term: sigma = (1 - P90/P50) / 1.2816", () => {
		const lender = parsed(example('lender-case-skerrow-sound.json'));
		if (lender.resource.kind !== 'assessed-energy') throw new Error('the lender example is an assessed energy');
		const [own] = energyComponentsOf(lender);
		// z at 90 % exceedance is 1.2815516 (standard normal table).
		expect(own.sigma).toBeCloseTo((1 - lender.resource.p90MWh! / lender.resource.p50MWh) / 1.2815516, 6);
		expect(rss(lender, 'long-term')).toBeCloseTo(Number(evaluateScenario(lender).energy.sigmaLongTerm), 9);
	});

	it("keeps an assessment's inter-annual sigma inter-annual, beside the scenario's own components", () => {
		const document = example('lender-case-skerrow-sound.json') as { resource: Record<string, unknown>; uncertainty: Record<string, unknown> };
		delete document.resource.p90MWh;
		document.resource.interAnnualSigma = 0.06;
		document.resource.longTermSigma = 0.08;
		document.uncertainty = { ...document.uncertainty, components: [{ name: 'Curtailment model', sigma: 0.02, kind: 'inter-annual' }] };
		const scenario = parsed(document);
		const energy = evaluateScenario(scenario).energy;
		expect(energyComponentsOf(scenario).map((c) => c.kind)).toEqual(['long-term', 'inter-annual', 'inter-annual']);
		expect(rss(scenario, 'long-term')).toBeCloseTo(Number(energy.sigmaLongTerm), 9);
		expect(rss(scenario, 'inter-annual')).toBeCloseTo(Number(energy.sigmaInterAnnual), 9);
	});
});
