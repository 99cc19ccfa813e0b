import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runInputSchema } from '../../schemas/probabilistic';
import { parseScenario, type Scenario } from '../../schemas/scenario';
import { defaultDrivers } from '../engine/sensitivity';
import { atbCase } from '../engine/testing/fixtures';
import { defaultRunInput } from './defaults';

function example(file: string): Scenario {
	const parsed = parseScenario(JSON.parse(readFileSync(join(process.cwd(), 'examples', file), 'utf8')));
	if (!parsed.ok) throw new Error(`${file} is not a valid scenario`);
	return parsed.scenario;
}

describe('defaultRunInput', () => {
	it('draws each screening driver from triangular(low, base, high), with the run settings as documented', () => {
		const tidal = example('tidal-stream-kestle-narrows.json'); // debt sized on a target DSCR, real 6 %, inflation 2 %
		const input = defaultRunInput(tidal);
		const ranges = defaultDrivers(tidal);
		expect(input.drivers.map((d) => d.driver)).toEqual(ranges.map((r) => r.driver));
		const availability = input.drivers.find((d) => d.driver === 'availability')!.distribution;
		expect(availability).toEqual({ shape: 'triangular', min: 0.88, mode: 0.93, max: 0.96 });
		expect(input.drivers.find((d) => d.driver === 'capex')!.distribution).toEqual({ shape: 'triangular', min: 0.8, mode: 1, max: 1.2 });
		expect(input).toMatchObject({ energyUncertainty: true, correlations: [], seed: 1, draws: 10_000 });
		// Nominal by Fisher: 1.06 x 1.02 - 1 = 0.0812 (by hand).
		expect(input.hurdleRate).toBe(0.0812);
		expect(runInputSchema.parse(input)).toEqual(input);
	});

	it('leaves out debt drivers without debt, and keeps the mode inside a clipped range', () => {
		const atb = atbCase(); // no debt, availability 1, no degradation, real 8 %, no inflation
		const input = defaultRunInput(atb);
		const drivers = input.drivers.map((d) => d.driver);
		expect(drivers).not.toContain('interestRate');
		expect(drivers).not.toContain('gearing');
		expect(input.drivers.find((d) => d.driver === 'availability')!.distribution).toEqual({ shape: 'triangular', min: 0.95, mode: 1, max: 1 });
		expect(input.drivers.find((d) => d.driver === 'degradation')!.distribution).toEqual({ shape: 'triangular', min: 0, mode: 0, max: 0.005 });
		expect(input.hurdleRate).toBe(0.08);
		expect(runInputSchema.safeParse(input).success).toBe(true);
	});

	it('takes the base values it is given', () => {
		const input = defaultRunInput(atbCase(), (d) => (d === 'capex' ? 1.1 : d === 'tariff' ? 5 : 1));
		expect(input.drivers.find((d) => d.driver === 'capex')!.distribution).toMatchObject({ mode: 1.1 });
		expect(input.drivers.find((d) => d.driver === 'tariff')!.distribution).toMatchObject({ mode: 1.1 }); // clamped to its high
	});

	it('gives a valid run for every example scenario', () => {
		for (const file of ['lender-case-skerrow-sound.json', 'ocean-current-mornstrand.json', 'wave-orrin-bank.json', 'wave-tolvey-shelf-nearshore.json']) {
			expect(runInputSchema.safeParse(defaultRunInput(example(file))).success, file).toBe(true);
		}
	});
});
