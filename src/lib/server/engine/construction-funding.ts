/**
 * Funding the build: who pays each construction payment, the interest on the
 * debt actually drawn, the commitment fee on the part not yet drawn, and the
 * total funding need that gearing is stated on.
 *
 * Payments fall at the construction points of the timeline (./timeline). At
 * each point, in order:
 *
 *     interest_p     = B x ((1 + r)^(t_p - t_{p-1}) - 1)    on the balance B drawn so far
 *     commitment_p   = c x max(D - B, 0) x (t_p - t_{p-1})   on the undrawn facility D
 *     upfront fee    = u x D, at the first point (financial close falls at the start of construction)
 *     uses_p         = spend_p + commitment_p + upfront fee + (reserve funded at COD, at t = 0: a fixed amount and/or a share of D)
 *
 * Interest is capitalised (added to B) or paid by equity as it falls due.
 * Uses are funded equity first (equity pays every use until its share is
 * spent, then the debt) or pro rata (the debt pays a fixed share of each use).
 *
 *     total funding need U = sum of uses + interest during construction
 *     gearing              = D / U,    D = the balance at COD
 *
 * The debt D the sizing allows depends on U (a gearing or a gearing cap) and
 * U on D (interest and fees), so the two are solved together: the share of
 * each payment the debt funds (pro rata) or the equity's part (equity first),
 * and the facility, by Newton steps located in float64 and polished in decimals
 * until the balance at COD equals what the sizing allows for the funding need
 * it implies. Interest accrues at the annual rate compounded over the exact
 * time between points.
 * Source: common practice in project-finance models (interest during
 * construction on drawn amounts, commitment fees on undrawn commitments,
 * both capitalised into the project cost; E. R. Yescombe, Principles of
 * Project Finance, 2nd ed. 2014, ch. 10 on construction-phase financing
 * costs and the drawdown order of equity and debt).
 */
import { dec, Decimal, numberKind, ONE, roughNumber, ZERO } from './decimal';
import { powersAt } from './fractional-powers';

export type FundingOrder = 'equity-first' | 'pro-rata';

export type ConstructionFundingInputs = {
	/** t of each construction point, ascending, the last at COD (t = 0). */
	times: readonly number[];
	/** Start of construction (t = -C): the commitment fee runs from here. */
	financialClose: number;
	/** Construction spend net of grants at each point, nominal. */
	spend: readonly Decimal[];
	/** A reserve funded at COD as a use of funds (the debt service reserve), nominal. */
	reserveAtCod: Decimal;
	/**
	 * A further reserve at COD in proportion to the loan (months of a first-year
	 * debt service that is proportional to it): reserve = share x balance at COD.
	 */
	reserveShareOfDebt?: Decimal;
	rate: Decimal;
	commitmentFee: Decimal;
	upfrontFee: Decimal;
	capitaliseInterest: boolean;
	order: FundingOrder;
	/** The balance at COD the sizing allows for a given total funding need. */
	debtFor: (totalFundingNeed: Decimal) => Decimal;
	/** Where to start the solve: a previous solution of nearly the same inputs (the tax circle's last round). */
	start?: FundingSolution;
};

/** The solved unknowns: the debt's share (pro rata) or the equity's amount (equity first), and the facility. */
export type FundingSolution = { parameter: number; facility: number };

export type ConstructionFunding = {
	/** The loan balance at COD: everything drawn plus capitalised interest. */
	balanceAtCod: Decimal;
	/** Cash drawn from the lenders at each point (uses the debt funds). */
	draws: Decimal[];
	/** Equity paid in at each point: its part of the uses plus any interest paid. */
	equity: Decimal[];
	/** Interest accrued over the interval ending at each point (capitalised or paid). */
	interest: Decimal[];
	/** Interest paid by equity at each point (zero when capitalised). */
	interestPaid: Decimal[];
	commitmentFees: Decimal[];
	upfrontFee: Decimal;
	interestDuringConstruction: Decimal;
	/** Interest, commitment and upfront fees: capitalised into the depreciable cost. */
	financingCosts: Decimal;
	/** Spend net of grants + financing costs + the reserve funded at COD. */
	totalFundingNeed: Decimal;
	/** The reserve funded at COD (fixed amount plus its share of the loan). */
	reserveAtCod: Decimal;
	/** balanceAtCod / totalFundingNeed. */
	gearing: Decimal;
	settled: boolean;
	solution: FundingSolution;
};

type Simulation = Omit<ConstructionFunding, 'gearing' | 'settled' | 'solution'>;

const GROWTH_CACHE_SIZE = 64;
const growthCache = new Map<string, Decimal[]>();

/**
 * (1 + r)^dt for each interval between points (on whole 1/24ths of a year),
 * kept for the next call with the same rate and points (the rounds of the
 * debt-and-tax circle fund the same build again and again).
 */
function intervalGrowth(rate: Decimal, times: readonly number[], financialClose: number): Decimal[] {
	const key = `${numberKind()}|${rate.toString()}|${financialClose}|${times.join(',')}`;
	const known = growthCache.get(key);
	if (known) return known;
	const growth = powersAt(ONE.plus(rate), times.map((t, p) => t - (p === 0 ? financialClose : times[p - 1])));
	if (growthCache.size >= GROWTH_CACHE_SIZE) growthCache.delete(growthCache.keys().next().value!);
	growthCache.set(key, growth);
	return growth;
}

function simulate(inputs: ConstructionFundingInputs, growth: readonly Decimal[], facility: Decimal, parameter: Decimal): Simulation {
	const { times, spend, order } = inputs;
	const last = times.length - 1;
	const draws: Decimal[] = [];
	const equity: Decimal[] = [];
	const interest: Decimal[] = [];
	const interestPaid: Decimal[] = [];
	const commitmentFees: Decimal[] = [];
	const upfrontFee = facility.times(inputs.upfrontFee);
	let balance = ZERO;
	let equityLeft = parameter;
	let uses = ZERO;
	let accrued = ZERO;
	let fees = upfrontFee;
	times.forEach((t, p) => {
		const dt = t - (p === 0 ? inputs.financialClose : times[p - 1]);
		const due = balance.times(growth[p].minus(ONE));
		const undrawn = Decimal.max(facility.minus(balance), ZERO);
		const commitment = inputs.commitmentFee.isZero() ? ZERO : undrawn.times(inputs.commitmentFee).times(dt);
		interest.push(due);
		commitmentFees.push(commitment);
		accrued = accrued.plus(due);
		fees = fees.plus(commitment);
		const paid = inputs.capitaliseInterest ? ZERO : due;
		if (inputs.capitaliseInterest) balance = balance.plus(due);
		interestPaid.push(paid);
		let use = spend[p].plus(commitment);
		if (p === 0) use = use.plus(upfrontFee);
		if (p === last) use = use.plus(inputs.reserveAtCod).plus(facility.times(inputs.reserveShareOfDebt ?? ZERO));
		uses = uses.plus(use);
		let draw: Decimal;
		if (order === 'pro-rata') draw = use.times(parameter);
		else {
			const fromEquity = Decimal.min(Decimal.max(use, ZERO), Decimal.max(equityLeft, ZERO));
			equityLeft = equityLeft.minus(fromEquity);
			draw = use.minus(fromEquity);
		}
		draws.push(draw);
		equity.push(use.minus(draw).plus(paid));
		balance = balance.plus(draw);
	});
	return {
		balanceAtCod: balance,
		draws,
		equity,
		interest,
		interestPaid,
		commitmentFees,
		upfrontFee,
		interestDuringConstruction: accrued,
		financingCosts: accrued.plus(fees),
		totalFundingNeed: uses.plus(accrued),
		reserveAtCod: inputs.reserveAtCod.plus(facility.times(inputs.reserveShareOfDebt ?? ZERO))
	};
}

const MAX_STEPS = 60;
const POLISH_STEPS = 4;

/**
 * The same simulation in float64, reduced to what the solve needs: the
 * balance at COD and the total funding need for a facility and a parameter.
 */
function simulateFloat(inputs: FloatInputs, facility: number, parameter: number): { balance: number; need: number } {
	const { times, spend, growth } = inputs;
	const last = times.length - 1;
	let balance = 0;
	let equityLeft = parameter;
	let uses = 0;
	let accrued = 0;
	for (let p = 0; p < times.length; p++) {
		const dt = times[p] - (p === 0 ? inputs.financialClose : times[p - 1]);
		const due = balance * (growth[p] - 1);
		accrued += due;
		if (inputs.capitaliseInterest) balance += due;
		let use = spend[p] + inputs.commitmentFee * Math.max(facility - balance, 0) * dt;
		if (p === 0) use += facility * inputs.upfrontFee;
		if (p === last) use += inputs.reserveAtCod + facility * inputs.reserveShareOfDebt;
		uses += use;
		let draw: number;
		if (inputs.order === 'pro-rata') draw = use * parameter;
		else {
			const fromEquity = Math.min(Math.max(use, 0), Math.max(equityLeft, 0));
			equityLeft -= fromEquity;
			draw = use - fromEquity;
		}
		balance += draw;
	}
	return { balance, need: uses + accrued };
}

type FloatInputs = {
	times: readonly number[];
	financialClose: number;
	spend: number[];
	growth: number[];
	reserveAtCod: number;
	reserveShareOfDebt: number;
	commitmentFee: number;
	upfrontFee: number;
	capitaliseInterest: boolean;
	order: FundingOrder;
	debtFor: (need: number) => number;
};

/** Residuals of the two conditions: the balance at COD is the facility, and the facility is what the sizing allows. */
function floatResiduals(f: FloatInputs, parameter: number, facility: number): [number, number] {
	const sim = simulateFloat(f, facility, parameter);
	return [sim.balance - facility, facility - Math.max(f.debtFor(sim.need), 0)];
}

/**
 * Newton step for (parameter, facility) from residuals r, with the Jacobian of
 * the float simulation by finite differences. The simulation is affine in
 * both unknowns between kinks (the gearing cap, equity running out), so the
 * step is exact there.
 */
function newtonStep(f: FloatInputs, parameter: number, facility: number, r: readonly [number, number], scale: number): [number, number] {
	const base = floatResiduals(f, parameter, facility);
	// The parameter is a share (pro rata) or an amount of money (equity first).
	const hp = f.order === 'pro-rata' ? 1e-7 : Math.max(1, scale * 1e-7);
	const hd = Math.max(1, scale * 1e-7);
	const dp = floatResiduals(f, parameter + hp, facility);
	const dd = floatResiduals(f, parameter, facility + hd);
	const a = (dp[0] - base[0]) / hp;
	const b = (dd[0] - base[0]) / hd;
	const c = (dp[1] - base[1]) / hp;
	const d = (dd[1] - base[1]) / hd;
	const det = a * d - b * c;
	if (det === 0 || !Number.isFinite(det)) return [0, -r[1]];
	return [-(d * r[0] - b * r[1]) / det, -(a * r[1] - c * r[0]) / det];
}

/**
 * Solve the construction funding (see the module note). Pro rata the unknown
 * is the debt's share of each use (0..1); equity first it is the equity's
 * total before the debt starts (0..the uses); the facility is the other.
 * Newton steps in float64 locate them; the same steps with the residuals
 * computed in decimals polish them until the balance at COD equals what the
 * sizing allows to 1e-13 of it.
 */
export function fundConstruction(inputs: ConstructionFundingInputs): ConstructionFunding {
	const growth = intervalGrowth(inputs.rate, inputs.times, inputs.financialClose);
	const proRata = inputs.order === 'pro-rata';
	const f: FloatInputs = {
		times: inputs.times,
		financialClose: inputs.financialClose,
		spend: inputs.spend.map(roughNumber),
		growth: growth.map(roughNumber),
		reserveAtCod: roughNumber(inputs.reserveAtCod),
		reserveShareOfDebt: inputs.reserveShareOfDebt ? roughNumber(inputs.reserveShareOfDebt) : 0,
		commitmentFee: roughNumber(inputs.commitmentFee),
		upfrontFee: roughNumber(inputs.upfrontFee),
		capitaliseInterest: inputs.capitaliseInterest,
		order: inputs.order,
		debtFor: (need) => roughNumber(inputs.debtFor(new Decimal(need)))
	};
	let plainUses = f.reserveAtCod;
	for (const x of f.spend) plainUses += x;
	const scale = Math.max(plainUses, 1);
	const clamp = (x: number) => Math.min(Math.max(x, 0), proRata ? 1 : scale * 10);
	let facility = inputs.start?.facility ?? Math.max(f.debtFor(plainUses), 0);
	let parameter = inputs.start?.parameter ?? clamp(proRata ? facility / scale : plainUses - facility);
	for (let step = 0; step < MAX_STEPS; step++) {
		const r = floatResiduals(f, parameter, facility);
		if (Math.abs(r[0]) + Math.abs(r[1]) <= scale * 1e-13) break;
		const [dp, dd] = newtonStep(f, parameter, facility, r, scale);
		parameter = clamp(parameter + dp);
		facility = Math.max(facility + dd, 0);
	}

	let parameterD = new Decimal(parameter);
	let facilityD = new Decimal(facility);
	let sim = simulate(inputs, growth, facilityD, parameterD);
	let settled = false;
	for (let step = 0; step <= POLISH_STEPS; step++) {
		const target = Decimal.max(inputs.debtFor(sim.totalFundingNeed), ZERO);
		const r: [Decimal, Decimal] = [sim.balanceAtCod.minus(facilityD), facilityD.minus(target)];
		const tolerance = Decimal.max(dec(1e-9), target.times(1e-13));
		if (r[0].abs().lte(tolerance) && r[1].abs().lte(tolerance)) {
			settled = true;
			break;
		}
		if (step === POLISH_STEPS) break;
		const [dp, dd] = newtonStep(f, roughNumber(parameterD), roughNumber(facilityD), [roughNumber(r[0]), roughNumber(r[1])], scale);
		parameterD = Decimal.min(Decimal.max(parameterD.plus(dp), ZERO), proRata ? ONE : new Decimal(scale * 10));
		facilityD = Decimal.max(facilityD.plus(dd), ZERO);
		sim = simulate(inputs, growth, facilityD, parameterD);
	}
	return {
		...sim,
		gearing: sim.totalFundingNeed.isZero() ? ZERO : sim.balanceAtCod.div(sim.totalFundingNeed),
		settled,
		solution: { parameter: parameterD.toNumber(), facility: facilityD.toNumber() }
	};
}
