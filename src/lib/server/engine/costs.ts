/**
 * Capital, operating and decommissioning cost schedules. Inputs are real money
 * in COD-year prices; schedules come out in nominal money of each year
 * (real x price index (1 + inflation)^t, times any real escalation).
 */
import { dec, Decimal, ONE, ZERO } from './decimal';
import type { Scenario, OpexLine } from '../../schemas/scenario';

export type CapexSchedule = {
	/** Each line's real total with contingency. */
	lines: { name: string; realTotal: Decimal }[];
	/** Real total of all lines with contingency. */
	realTotal: Decimal;
	/** Real spend per construction year (first first). */
	real: Decimal[];
	/** Nominal spend per construction year. */
	nominal: Decimal[];
};

function evenPhasing(years: number): Decimal[] {
	return Array.from({ length: years }, () => ONE.div(years));
}

/**
 * Capex per construction year.
 *
 *     line total = amount x (1 | installed kW | device count) x (1 + contingency)
 *     real_j = sum over lines of line total x phasing_j;  nominal_j = real_j x (1 + i)^t_j
 *
 * Phasing defaults to the capex-level phasing, then to an even spread.
 * Source: common practice.
 */
export function capexSchedule(
	capex: Scenario['capex'],
	installedKW: Decimal,
	deviceCount: number,
	priceIndex: readonly Decimal[]
): CapexSchedule {
	const years = priceIndex.length;
	const defaultPhasing = capex.phasing ? capex.phasing.map(dec) : evenPhasing(years);
	const withContingency = ONE.plus(capex.contingency);
	const real: Decimal[] = Array.from({ length: years }, () => ZERO);
	const lines = capex.lines.map((line) => {
		const quantity = line.basis === 'per-kW' ? installedKW : line.basis === 'per-device' ? dec(deviceCount) : ONE;
		const realTotal = quantity.times(line.amount).times(withContingency);
		const phasing = line.phasing ? line.phasing.map(dec) : defaultPhasing;
		phasing.forEach((share, j) => (real[j] = real[j].plus(realTotal.times(share))));
		return { name: line.name, realTotal };
	});
	let realTotal = ZERO;
	for (const l of lines) realTotal = realTotal.plus(l.realTotal);
	return { lines, realTotal, real, nominal: real.map((r, j) => r.times(priceIndex[j])) };
}

export type OpexContext = {
	installedKW: Decimal;
	deviceCount: number;
	capexRealTotal: Decimal;
	/** Net energy delivered in each operating year, MWh. */
	energyMWh: readonly Decimal[];
	/** (1 + inflation)^k for each operating year k. */
	priceIndex: readonly Decimal[];
};

export type OpexSchedule = {
	/** Nominal cost per operating year of each line that does not depend on revenue. */
	lines: { name: string; nominal: Decimal[] }[];
	/** Sum of those lines per operating year. */
	revenueIndependent: Decimal[];
	/** The part of revenueIndependent in proportion to the energy delivered (the per-MWh lines), per operating year. */
	energyDriven: Decimal[];
	/** Lines charged as a share of revenue (leases). */
	revenueShareLines: { name: string; fraction: Decimal }[];
	revenueShare: Decimal;
};

/** Index for a line with real escalation e: (1 + i)^k (1 + e)^k, by repeated multiplication. */
function escalatedIndex(priceIndex: readonly Decimal[], escalation: number): Decimal[] {
	if (escalation === 0) return [...priceIndex];
	const step = ONE.plus(escalation);
	let extra = ONE;
	return priceIndex.map((p) => {
		extra = extra.times(step);
		return p.times(extra);
	});
}

function lineRealAmounts(line: Exclude<OpexLine, { basis: 'percent-of-revenue' }>, ctx: OpexContext): Decimal[] {
	const years = ctx.priceIndex.length;
	switch (line.basis) {
		case 'fixed-per-year':
			return Array.from({ length: years }, () => dec(line.amount));
		case 'per-kW-year': {
			const perYear = ctx.installedKW.times(line.amount);
			return Array.from({ length: years }, () => perYear);
		}
		case 'per-MWh':
			return ctx.energyMWh.map((e) => e.times(line.amount));
		case 'percent-of-capex': {
			const perYear = ctx.capexRealTotal.times(line.fraction);
			return Array.from({ length: years }, () => perYear);
		}
		case 'periodic-overhaul': {
			const cost = line.perDevice ? dec(line.amount).times(ctx.deviceCount) : dec(line.amount);
			// Overhauls fall in years N, 2N, ... but never in the final operating year.
			return Array.from({ length: years }, (_, i) => ((i + 1) % line.intervalYears === 0 && i + 1 < years ? cost : ZERO));
		}
	}
}

/**
 * Opex per operating year, nominal.
 *
 *     fixed-per-year: A;  per-kW-year: A x kW;  per-MWh: A x E_k;  percent-of-capex: f x capex;
 *     periodic-overhaul: A (x devices) in years n, 2n, ... before the final year;
 *     each x (1 + i)^k (1 + e)^k.   percent-of-revenue: f x revenue_k (nominal already).
 *
 * Source: common practice for O&M cost models.
 */
export function opexSchedule(opex: Scenario['opex'], ctx: OpexContext): OpexSchedule {
	const years = ctx.priceIndex.length;
	const revenueIndependent: Decimal[] = Array.from({ length: years }, () => ZERO);
	const energyDriven: Decimal[] = Array.from({ length: years }, () => ZERO);
	const lines: OpexSchedule['lines'] = [];
	const revenueShareLines: OpexSchedule['revenueShareLines'] = [];
	let revenueShare = ZERO;
	for (const line of opex.lines) {
		if (line.basis === 'percent-of-revenue') {
			revenueShareLines.push({ name: line.name, fraction: dec(line.fraction) });
			revenueShare = revenueShare.plus(line.fraction);
			continue;
		}
		const nominal = nominalAmounts(line, ctx);
		nominal.forEach((v, k) => (revenueIndependent[k] = revenueIndependent[k].plus(v)));
		if (line.basis === 'per-MWh') nominal.forEach((v, k) => (energyDriven[k] = energyDriven[k].plus(v)));
		lines.push({ name: line.name, nominal });
	}
	return { lines, revenueIndependent, energyDriven, revenueShareLines, revenueShare };
}

function nominalAmounts(line: Exclude<OpexLine, { basis: 'percent-of-revenue' }>, ctx: OpexContext): Decimal[] {
	const index = escalatedIndex(ctx.priceIndex, line.escalation);
	return lineRealAmounts(line, ctx).map((real, k) => (real.isZero() ? ZERO : real.times(index[k])));
}

export type OverhaulSchedule = { name: string; intervalYears: number; nominal: Decimal[] };

/**
 * The periodic-overhaul opex lines on their own, each with its interval and
 * its nominal cost per operating year: the same amounts opexSchedule counts in
 * the opex (A (x devices) x (1 + i)^k (1 + e)^k in years n, 2n, ... before the
 * final year), for the maintenance reserve (./reserves). Source: common practice.
 */
export function overhaulSchedules(opex: Scenario['opex'], ctx: OpexContext): OverhaulSchedule[] {
	return opex.lines.flatMap((line) =>
		line.basis === 'periodic-overhaul' ? [{ name: line.name, intervalYears: line.intervalYears, nominal: nominalAmounts(line, ctx) }] : []
	);
}

/** Total opex per year once revenue is known. */
export function totalOpex(schedule: OpexSchedule, revenue: readonly Decimal[]): Decimal[] {
	if (schedule.revenueShare.isZero()) return schedule.revenueIndependent;
	return schedule.revenueIndependent.map((v, k) => v.plus(revenue[k].times(schedule.revenueShare)));
}

/**
 * Decommissioning cost, nominal, paid at the end of the final operating year
 * (t = N): real cost x (1 + i)^N, the real cost being `amount` for the project,
 * per device or per kW installed, or `fraction` x total capex (with contingency).
 * Source: common practice.
 */
export function decommissioningCost(
	spec: Scenario['decommissioning'],
	ctx: { installedKW: Decimal; deviceCount: number; capexRealTotal: Decimal; finalPriceIndex: Decimal }
): Decimal {
	return decommissioningRealCost(spec, ctx).times(ctx.finalPriceIndex);
}

function decommissioningRealCost(spec: Scenario['decommissioning'], ctx: { installedKW: Decimal; deviceCount: number; capexRealTotal: Decimal }): Decimal {
	switch (spec.basis) {
		case 'lump-sum':
			return dec(spec.amount);
		case 'per-device':
			return dec(spec.amount).times(ctx.deviceCount);
		case 'per-kW':
			return ctx.installedKW.times(spec.amount);
		case 'percent-of-capex':
			return ctx.capexRealTotal.times(spec.fraction);
	}
}
