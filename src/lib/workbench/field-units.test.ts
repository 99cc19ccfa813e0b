import { describe, expect, it } from 'vitest';
import { unitOf } from './field-units';

// The schema's own conventions (src/lib/schemas/scenario.ts header): speeds m/s,
// power kW, lengths m, money in the document's currency, shares as fractions.
const tidal = {
	currency: 'EUR',
	resource: { kind: 'speed-histogram', occurrenceBasis: 'hours', bins: [{ speedMPerS: 1, occurrence: 10 }] },
	capex: { lines: [{ name: 'Turbines', basis: 'per-device', amount: 1 }, { name: 'PM', basis: 'per-kW', amount: 1 }] },
	opex: {
		lines: [
			{ name: 'O&M', basis: 'per-kW-year', amount: 1 },
			{ name: 'Overhaul', basis: 'periodic-overhaul', amount: 1, perDevice: false, intervalYears: 5 }
		]
	}
};

describe('unitOf', () => {
	it('reads the unit from the field name', () => {
		expect(unitOf(['site', 'waterDensityKgPerM3'], tidal, 'EUR')).toBe('kg/m³');
		expect(unitOf(['device', 'cutInSpeedMPerS'], tidal, 'EUR')).toBe('m/s');
		expect(unitOf(['device', 'ratedPowerKW'], tidal, 'EUR')).toBe('kW');
		expect(unitOf(['device', 'sweptAreaM2'], tidal, 'EUR')).toBe('m²');
		expect(unitOf(['device', 'rotorDiameterM'], tidal, 'EUR')).toBe('m');
		expect(unitOf(['timeline', 'operatingYears'], tidal, 'EUR')).toBe('years');
	});

	it('gives a cell of a number list the unit of its list', () => {
		expect(unitOf(['device', 'hsM', 2], {}, 'EUR')).toBe('m');
		expect(unitOf(['device', 'periodS', 0], {}, 'EUR')).toBe('s');
		expect(unitOf(['device', 'powerKW', 1, 3], {}, 'EUR')).toBe('kW');
	});

	it('takes a money amount’s unit from its line’s basis and the currency', () => {
		expect(unitOf(['capex', 'lines', 0, 'amount'], tidal, 'GBP')).toBe('GBP/device');
		expect(unitOf(['capex', 'lines', 1, 'amount'], tidal, 'GBP')).toBe('GBP/kW');
		expect(unitOf(['opex', 'lines', 0, 'amount'], tidal, 'EUR')).toBe('EUR/kW·yr');
		expect(unitOf(['opex', 'lines', 1, 'amount'], tidal, 'EUR')).toBe('EUR');
		expect(unitOf(['revenue', 'tariffPerMWh'], tidal, 'USD')).toBe('USD/MWh');
	});

	it('names what a share is a share of, and never calls money a share', () => {
		const shares = {
			opex: { lines: [{ name: 'Insurance', basis: 'percent-of-capex', fraction: 0.01 }, { name: 'Lease', basis: 'percent-of-revenue', fraction: 0.02 }] },
			decommissioning: { basis: 'percent-of-capex', fraction: 0.05 },
			revenue: { grants: [{ name: 'Fund', basis: 'percent-of-capex', fraction: 0.2 }, { name: 'Prize', basis: 'lump-sum', amount: 1 }] }
		};
		expect(unitOf(['opex', 'lines', 0, 'fraction'], shares, 'EUR')).toBe('fraction of capex');
		expect(unitOf(['opex', 'lines', 1, 'fraction'], shares, 'EUR')).toBe('fraction of revenue');
		expect(unitOf(['decommissioning', 'fraction'], shares, 'EUR')).toBe('fraction of capex');
		expect(unitOf(['revenue', 'grants', 0, 'fraction'], shares, 'EUR')).toBe('fraction of capex');
		expect(unitOf(['revenue', 'grants', 1, 'amount'], shares, 'EUR')).toBe('EUR');
		expect(unitOf(['decommissioning', 'amount'], { decommissioning: { basis: 'per-kW', amount: 1 } }, 'EUR')).toBe('EUR/kW');
	});

	it('reads the tariff’s indexed share by the indexation method, and names the other revenue units', () => {
		expect(unitOf(['revenue', 'tariffIndexation'], { revenue: { indexationMethod: 'indexed-share' } }, 'EUR')).toBe('fraction of price');
		expect(unitOf(['revenue', 'tariffIndexation'], { revenue: { indexationMethod: 'scaled-inflation' } }, 'EUR')).toBe('fraction of inflation');
		expect(unitOf(['revenue', 'indexationBaseYearsBeforeCod'], {}, 'EUR')).toBe('years');
		expect(unitOf(['revenue', 'tariffInflation'], {}, 'EUR')).toBe('fraction/yr');
		expect(unitOf(['revenue', 'curtailment'], {}, 'EUR')).toBe('fraction of net energy');
	});

	it('names occurrences as hours or probabilities by the histogram’s basis', () => {
		expect(unitOf(['resource', 'bins', 0, 'occurrence'], tidal, 'EUR')).toBe('h/yr');
		const byProbability = { resource: { ...tidal.resource, occurrenceBasis: 'probability' } };
		expect(unitOf(['resource', 'bins', 0, 'occurrence'], byProbability, 'EUR')).toBe('probability');
	});

	it('marks shares as fractions', () => {
		expect(unitOf(['array', 'availability'], tidal, 'EUR')).toBe('fraction');
		expect(unitOf(['array', 'arrayLoss'], tidal, 'EUR')).toBe('fraction');
		expect(unitOf(['array', 'degradationPerYear'], tidal, 'EUR')).toBe('fraction/yr');
		expect(unitOf(['capex', 'phasing', 1], tidal, 'EUR')).toBe('share');
		expect(unitOf(['uncertainty', 'exceedanceLevels', 0], tidal, 'EUR')).toBe('%');
	});

	it('gives the reserves and covenants their units', () => {
		expect(unitOf(['finance', 'reserves', 'debtService', 'months'], tidal, 'EUR')).toBe('months');
		expect(unitOf(['finance', 'reserves', 'maintenance', 'fundingYears'], tidal, 'EUR')).toBe('years');
		expect(unitOf(['finance', 'covenants', 'lockUpDscr'], tidal, 'EUR')).toBe('×');
		expect(unitOf(['finance', 'covenants', 'defaultDscr'], tidal, 'EUR')).toBe('×');
		expect(unitOf(['finance', 'covenants', 'cashSweep', 'share'], tidal, 'EUR')).toBe('fraction');
	});

	it('gives the commitment fee a yearly share of the undrawn loan, and a downside case its level in per cent', () => {
		const sized = { finance: { debt: { sizing: 'target-dscr', downsideCases: [{ exceedancePercent: 90, targetDscr: 1.2, horizonYears: 1 }] } } };
		expect(unitOf(['finance', 'debt', 'commitmentFee'], sized, 'EUR')).toBe('fraction/yr of undrawn debt');
		expect(unitOf(['finance', 'debt', 'downsideCases', 0, 'exceedancePercent'], sized, 'EUR')).toBe('%');
		expect(unitOf(['finance', 'debt', 'downsideCases', 0, 'targetDscr'], sized, 'EUR')).toBe('×');
		expect(unitOf(['finance', 'debt', 'downsideCases', 0, 'horizonYears'], sized, 'EUR')).toBe('years');
	});

	it('gives an assessed energy MWh a year and its sigmas a fraction of P50', () => {
		expect(unitOf(['resource', 'p50MWh'], {}, 'EUR')).toBe('MWh/yr');
		expect(unitOf(['resource', 'p90MWh'], {}, 'EUR')).toBe('MWh/yr');
		expect(unitOf(['resource', 'interAnnualSigma'], {}, 'EUR')).toBe('fraction of P50');
		expect(unitOf(['resource', 'longTermSigma'], {}, 'EUR')).toBe('fraction of P50');
	});
});
