/**
 * Reserve accounts that depend only on costs: the maintenance reserve (for the
 * periodic overhauls) and the decommissioning reserve. Each is funded ahead of
 * its cost in equal nominal contributions and drawn to pay it, so a lumpy cost
 * is spread over the years before it. They are computed before the debt:
 *
 *     CFADS after reserves_k = CFADS_k - contributions_k + releases_k
 *
 * so a year with an overhaul or the decommissioning does not show a DSCR dip
 * of its own. A maintenance reserve account sets cash aside ahead of a major
 * overhaul (E. Bodmer, Corporate and Project Finance Modeling, Wiley 2014,
 * ch. 44); netting its movements in CFADS, rather than paying into it below
 * debt service as in the cascade of E. R. Yescombe, Principles of Project
 * Finance (2002), section 13.5.1, is common practice. The accounts earn no
 * interest. Tax is unchanged: the costs are deducted when incurred, the
 * reserve only moves cash.
 *
 * Amounts are nominal; index k = 0 is operating year 1.
 */
import { Decimal, ZERO } from './decimal';
import type { ReservesSpec } from '../../schemas/scenario';

export type ReserveMovements = {
	/** Paid into the account in each operating year. */
	contribution: Decimal[];
	/** Drawn from the account to pay the cost, in each operating year. */
	release: Decimal[];
	/** Balance at the end of each operating year. */
	balance: Decimal[];
};

export type CostReserves = {
	maintenance: ReserveMovements;
	decommissioning: ReserveMovements;
	/** Contributions less releases of both accounts: subtract from CFADS. */
	netContribution: Decimal[];
};

const zeros = (years: number) => Array.from({ length: years }, () => ZERO);
/** a + b and a - b, skipping zeros (most years of an account move nothing): the same values without decimal work. */
const more = (a: Decimal, b: Decimal) => (b.isZero() ? a : a.isZero() ? b : a.plus(b));
const less = (a: Decimal, b: Decimal) => (b.isZero() ? a : a.minus(b));

/**
 * Funding of one series of costs ahead of each cost.
 *
 *     for each year m with cost C_m > 0:  window = years max(1, m - F + 1) .. m
 *         contribution_j += C_m / (years in window)   for j in the window
 *         release_m      += C_m
 *     balance_k = balance_{k-1} + contribution_k - release_k
 *
 * The window ends in the cost's own year (flows are at the end of each year,
 * so the last contribution and the draw fall together) and cannot start before
 * operating year 1. The last contribution of each window is the cost less the
 * earlier ones, so the balance returns to exactly zero. Source: common
 * practice (a sinking fund without interest).
 *
 * Example: a cost of 300 in year 5 funded over 5 years gives contributions
 * 60 in years 1 to 5, balance 60, 120, 180, 240, then 300 - 300 = 0.
 *
 * @throws RangeError when fundingYears is not a whole number >= 1.
 */
export function fundAhead(costs: readonly Decimal[], fundingYears: number): ReserveMovements {
	if (!Number.isInteger(fundingYears) || fundingYears < 1) {
		throw new RangeError(`funding years must be a whole number >= 1, got ${fundingYears}`);
	}
	const years = costs.length;
	const contribution = zeros(years);
	const release = zeros(years);
	costs.forEach((cost, m) => {
		if (cost.lte(0)) return;
		const start = Math.max(0, m - fundingYears + 1);
		const share = cost.div(m - start + 1);
		let paid = ZERO;
		for (let j = start; j < m; j++) {
			contribution[j] = contribution[j].plus(share);
			paid = paid.plus(share);
		}
		contribution[m] = contribution[m].plus(cost.minus(paid));
		release[m] = release[m].plus(cost);
	});
	let running = ZERO;
	const balance = contribution.map((c, k) => (running = less(more(running, c), release[k])));
	return { contribution, release, balance };
}

function addMovements(a: ReserveMovements, b: ReserveMovements): ReserveMovements {
	return {
		contribution: a.contribution.map((v, k) => more(v, b.contribution[k])),
		release: a.release.map((v, k) => more(v, b.release[k])),
		balance: a.balance.map((v, k) => more(v, b.balance[k]))
	};
}

function noMovements(years: number): ReserveMovements {
	return { contribution: zeros(years), release: zeros(years), balance: zeros(years) };
}

/**
 * The maintenance reserve: every periodic overhaul funded over
 * spec.fundingYears (default: that line's interval) ending in its year, the
 * lines added together. No account (all zeros) when spec is undefined.
 * Source: as fundAhead; Bodmer (2014) ch. 44 for the account itself.
 */
export function maintenanceReserve(
	overhauls: readonly { intervalYears: number; nominal: readonly Decimal[] }[],
	spec: ReservesSpec['maintenance'],
	operatingYears: number
): ReserveMovements {
	let total = noMovements(operatingYears);
	if (!spec) return total;
	for (const line of overhauls) total = addMovements(total, fundAhead(line.nominal, spec.fundingYears ?? line.intervalYears));
	return total;
}

/**
 * The decommissioning reserve: the decommissioning cost (nominal, in the final
 * operating year) funded over the last spec.fundingYears operating years and
 * drawn in the final year. No account when spec is undefined. Source: common
 * practice (a sinking fund for end-of-life costs).
 */
export function decommissioningReserve(costPerYear: readonly Decimal[], spec: ReservesSpec['decommissioning']): ReserveMovements {
	if (!spec) return noMovements(costPerYear.length);
	return fundAhead(costPerYear, spec.fundingYears);
}

/**
 * Both cost reserves and their net effect on CFADS, from the scenario's
 * finance.reserves (undefined: no accounts, all zeros).
 *
 *     netContribution_k = maintenance (contribution - release)_k + decommissioning (contribution - release)_k
 *     CFADS after reserves_k = CFADS_k - netContribution_k
 */
export function costReserves(input: {
	overhauls: readonly { intervalYears: number; nominal: readonly Decimal[] }[];
	/** Decommissioning cost per operating year (the final year only), nominal. */
	decommissioning: readonly Decimal[];
	spec: ReservesSpec | undefined;
}): CostReserves {
	const years = input.decommissioning.length;
	const maintenance = maintenanceReserve(input.overhauls, input.spec?.maintenance, years);
	const decommissioning = decommissioningReserve(input.decommissioning, input.spec?.decommissioning);
	const netContribution = maintenance.contribution.map((c, k) =>
		less(more(less(c, maintenance.release[k]), decommissioning.contribution[k]), decommissioning.release[k])
	);
	return { maintenance, decommissioning, netContribution };
}

/** CFADS_k - netContribution_k: the CFADS the debt is sized and tested on. */
export function cfadsAfterReserves(cfads: readonly Decimal[], reserves: CostReserves): Decimal[] {
	return cfads.map((c, k) => c.minus(reserves.netContribution[k]));
}
