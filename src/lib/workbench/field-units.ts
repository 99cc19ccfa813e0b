/**
 * The unit shown beside a scenario field. Field names carry their unit
 * (`rotorDiameterM`, `cutInSpeedMPerS`, `ratedPowerKW`); money amounts take
 * theirs from the line's basis; shares are fractions, as the schema says, of
 * capex or revenue by the line's basis.
 */
import type { FieldPath } from './schema-fields';

const suffixUnits: [RegExp, string][] = [
	[/KgPerM3$/, 'kg/m³'],
	[/MPerS2$/, 'm/s²'],
	[/MPerS$/, 'm/s'],
	[/KWPerM$/, 'kW/m'],
	[/KW$/, 'kW'],
	[/M2$/, 'm²'],
	[/HsM$|[a-z]M$/, 'm'],
	[/[a-z]S$/, 's'],
	[/Years$/, 'years']
];

/** Fields whose unit is not in their name. `{c}` stands for the currency. */
const namedUnits: Record<string, string> = {
	hoursPerYear: 'h/yr',
	deviceCount: 'devices',
	powerCoefficient: 'Cp, –',
	driveTrainEfficiency: 'fraction',
	shape: 'k, –',
	teOverTp: 'ratio',
	captureWidthRatio: 'fraction',
	sigma: 'fraction of P50',
	interAnnualSigma: 'fraction of P50',
	longTermSigma: 'fraction of P50',
	p50MWh: 'MWh/yr',
	p90MWh: 'MWh/yr',
	targetDscr: '×',
	decliningBalanceFactor: '×',
	inflation: 'fraction/yr',
	realDiscountRate: 'fraction/yr',
	interestRate: 'fraction/yr (nominal)',
	escalation: 'fraction/yr',
	merchantEscalation: 'fraction/yr',
	tariffPerMWh: '{c}/MWh',
	merchantPricePerMWh: '{c}/MWh',
	tariffInflation: 'fraction/yr',
	indexationBaseYearsBeforeCod: 'years',
	curtailment: 'fraction of net energy',
	gearing: 'fraction',
	maxGearing: 'fraction',
	upfrontFee: 'fraction of debt',
	commitmentFee: 'fraction/yr of undrawn debt',
	exceedancePercent: '%',
	months: 'months',
	lockUpDscr: '×',
	defaultDscr: '×',
	share: 'fraction',
	taxRate: 'fraction',
	taxLossCarryForwardCap: 'fraction of profit',
	schedule: 'fraction/yr',
	contingency: 'fraction',
	fraction: 'fraction'
};

const amountUnits: Record<string, string> = {
	'lump-sum': '{c}',
	'per-kW': '{c}/kW',
	'per-device': '{c}/device',
	'fixed-per-year': '{c}/yr',
	'per-kW-year': '{c}/kW·yr',
	'per-MWh': '{c}/MWh'
};

/** A share's unit names what it is a share of. */
const fractionUnits: Record<string, string> = {
	'percent-of-capex': 'fraction of capex',
	'percent-of-revenue': 'fraction of revenue'
};

function at(document: unknown, path: FieldPath): unknown {
	let current: unknown = document;
	for (const key of path) {
		if (current === null || typeof current !== 'object') return undefined;
		current = (current as Record<string | number, unknown>)[key];
	}
	return current;
}

function withCurrency(unit: string, currency: string) {
	return unit.replaceAll('{c}', currency);
}

/** The unit of the field at `path` in `document`, or '' for free text and choices. */
export function unitOf(path: FieldPath, document: unknown, currency: string): string {
	// A cell of a number list (`hsM[2]`, `powerKW[1][3]`) takes the list's unit.
	const key = String([...path].reverse().find((k) => typeof k === 'string') ?? '');
	const parent = at(document, path.slice(0, -1)) as Record<string, unknown> | undefined;

	if (key === 'amount') {
		const basis = String(parent?.basis ?? 'lump-sum');
		if (basis === 'periodic-overhaul') return parent?.perDevice === false ? currency : `${currency}/device`;
		return withCurrency(amountUnits[basis] ?? '{c}', currency);
	}
	if (key === 'fraction') return fractionUnits[String(parent?.basis)] ?? 'fraction';
	// The indexed share is a share of the price, or (scaled-inflation) a share of the inflation rate.
	if (key === 'tariffIndexation') return parent?.indexationMethod === 'scaled-inflation' ? 'fraction of inflation' : 'fraction of price';
	if (key === 'occurrence') {
		const basis = at(document, [...path.slice(0, -3), 'occurrenceBasis']);
		return basis === 'hours' ? 'h/yr' : 'probability';
	}
	if (path[path.length - 2] === 'exceedanceLevels') return '%';
	if (path.includes('phasing')) return 'share';
	if (key in namedUnits) return withCurrency(namedUnits[key], currency);
	if (/Loss$|availability|degradationPerYear/.test(key)) return key === 'degradationPerYear' ? 'fraction/yr' : 'fraction';
	for (const [pattern, unit] of suffixUnits) if (pattern.test(key)) return unit;
	return '';
}
