/**
 * The same model as evaluate.ts in plain float64, for the benchmark's
 * decimal-versus-float ratio and as an independent cross-check of the decimal
 * engine (a test holds the two within 1e-9). Never used for results: money
 * and energy are computed in decimals (see evaluate.ts). Compact on purpose;
 * every formula and convention mirrors the decimal modules it names.
 */
import type { Scenario } from '../../schemas/scenario';
import { solveRoot } from './finance/roots';

export type FloatMetrics = {
	netAepMWh: number;
	p90AepMWh: number;
	capacityFactor: number;
	lcoeReal: number;
	lcoeNominal: number;
	lcoeFcr: number;
	projectIrrPreTax: number | null;
	projectIrrPostTax: number | null;
	equityIrr: number | null;
	npv: number;
	paybackYears: number | null;
	minDscr: number | null;
	avgDscr: number | null;
	llcr: number | null;
	debtAmount: number;
	breakevenTariff: number | null;
};

const sumOf = (xs: readonly number[]) => xs.reduce((a, b) => a + b, 0);

/** energy/distributions.weibullBins in float64. */
function weibull(c: number, k: number, w: number): { v: number; p: number }[] {
	const count = Math.min(10000, Math.max(1, Math.ceil((c * Math.pow(-Math.log(1e-9), 1 / k)) / w)));
	const bins = [];
	let lower = 1;
	for (let j = 0; j < count; j++) {
		const upper = j === count - 1 ? 0 : Math.exp(-Math.pow(((j + 1) * w) / c, k));
		bins.push({ v: w * (j + 0.5), p: lower - upper });
		lower = upper;
	}
	return bins;
}

function normalise<T extends { p: number }>(bins: T[]): T[] {
	const total = sumOf(bins.map((b) => b.p));
	return bins.map((b) => ({ ...b, p: b.p / total }));
}

/** Standard normal quantile by bisection on erf (accurate enough for a twin). */
function z(p: number): number {
	const cdf = (x: number) => {
		const t = Math.abs(x) / Math.SQRT2;
		let term = t;
		let total = t;
		for (let n = 1; n < 200 && term > total * 1e-17; n++) total += term *= (2 * t * t) / (2 * n + 1);
		const erf = (2 / Math.sqrt(Math.PI)) * Math.exp(-t * t) * total;
		return x >= 0 ? 0.5 * (1 + erf) : 0.5 * (1 - erf);
	};
	return solveRoot((x) => cdf(x) - p, -8, 8, { xTolerance: 1e-15 })!.x;
}

/** energy/yield.estimateEnergy: mean device power over the resource, kW, and rated power. */
function devicePower(s: Scenario): { meanKW: number; ratedKW: number } {
	const { device: d, resource: r, site } = s;
	if (d.kind === 'rotor' || d.kind === 'power-curve') {
		const bins =
			r.kind === 'weibull'
				? weibull(r.scaleMPerS, r.shape, r.binWidthMPerS)
				: r.kind === 'rayleigh'
					? weibull((2 * r.meanSpeedMPerS) / Math.sqrt(Math.PI), 2, r.binWidthMPerS)
					: r.kind === 'speed-histogram'
						? normalise(r.bins.map((b) => ({ v: b.speedMPerS, p: b.occurrence })))
						: [];
		let power: (v: number) => number;
		let ratedKW: number;
		if (d.kind === 'rotor') {
			const area = d.sweptAreaM2 ?? (Math.PI * (d.rotorDiameterM ?? 0) ** 2) / 4;
			const k = (site.waterDensityKgPerM3 * area * d.powerCoefficient * d.driveTrainEfficiency) / 2000;
			power = (v) => (v < d.cutInSpeedMPerS || v >= d.cutOutSpeedMPerS ? 0 : Math.min(k * v ** 3, d.ratedPowerKW));
			ratedKW = d.ratedPowerKW;
		} else {
			const pts = d.points;
			power = (v) => {
				if (v < pts[0].speedMPerS || v > pts[pts.length - 1].speedMPerS) return 0;
				let i = 0;
				while (v > pts[i + 1].speedMPerS) i++;
				const a = pts[i];
				const b = pts[i + 1];
				return a.powerKW + ((b.powerKW - a.powerKW) * (v - a.speedMPerS)) / (b.speedMPerS - a.speedMPerS);
			};
			ratedKW = d.ratedPowerKW ?? Math.max(...pts.map((p) => p.powerKW));
		}
		return { meanKW: sumOf(bins.map((b) => b.p * power(b.v))), ratedKW };
	}
	const te = (period: number, type: string, ratio: number) => (type === 'peak-period' ? period * ratio : period);
	const states =
		r.kind === 'sea-state'
			? [{ hs: r.hsM, te: te(r.periodS, r.periodType, r.teOverTp), p: 1 }]
			: r.kind === 'sea-state-table'
				? normalise(r.states.map((x) => ({ hs: x.hsM, te: te(x.periodS, r.periodType, r.teOverTp), p: x.occurrence })))
				: [];
	const flux = (hs: number, t: number) => (site.waterDensityKgPerM3 * site.gravityMPerS2 ** 2 * hs * hs * t) / (64000 * Math.PI);
	if (d.kind === 'capture-width') {
		const mean = sumOf(states.map((x) => x.p * Math.min(d.ratedPowerKW, flux(x.hs, x.te) * d.captureWidthRatio * d.characteristicWidthM)));
		return { meanKW: mean, ratedKW: d.ratedPowerKW };
	}
	const teAxis = d.periodS.map((p) => (d.periodType === 'peak-period' ? p * d.teOverTp : p));
	const locate = (axis: number[], x: number) => {
		const n = axis.length;
		const m0 = n > 1 ? (axis[1] - axis[0]) / 2 : 0;
		const m1 = n > 1 ? (axis[n - 1] - axis[n - 2]) / 2 : 0;
		if (x < axis[0] - m0 - 1e-12 || x > axis[n - 1] + m1 + 1e-12) return null;
		if (x <= axis[0]) return { lo: 0, hi: 0, w: 0, near: 0 };
		if (x >= axis[n - 1]) return { lo: n - 1, hi: n - 1, w: 0, near: n - 1 };
		let i = 0;
		while (axis[i + 1] < x) i++;
		return { lo: i, hi: i + 1, w: (x - axis[i]) / (axis[i + 1] - axis[i]), near: x - axis[i] < axis[i + 1] - x ? i : i + 1 };
	};
	const m = d.powerKW;
	const look = (hs: number, t: number) => {
		const a = locate(d.hsM, hs);
		const b = locate(teAxis, t);
		if (!a || !b) return 0;
		if (d.lookup === 'nearest') return m[a.near][b.near];
		const low = m[a.lo][b.lo] + b.w * (m[a.lo][b.hi] - m[a.lo][b.lo]);
		const high = m[a.hi][b.lo] + b.w * (m[a.hi][b.hi] - m[a.hi][b.lo]);
		return low + a.w * (high - low);
	};
	return { meanKW: sumOf(states.map((x) => x.p * look(x.hs, x.te))), ratedKW: d.ratedPowerKW ?? Math.max(...m.flat()) };
}

/** finance/depreciation.depreciationSchedule semantics: DB switches to straight line when larger. */
function depreciation(method: string, cost: number, life: number, horizon: number, factor: number): number[] {
	const out: number[] = [];
	let book = cost;
	for (let k = 1; k <= horizon; k++) {
		if (k > life) {
			out.push(0);
			continue;
		}
		const straight = book / (life - k + 1);
		const charge = method === 'straight-line' ? cost / life : Math.min(book, Math.max((book * factor) / life, straight));
		out.push(charge);
		book -= charge;
	}
	return out;
}

function tax(income: number[], rate: number, carry: boolean): number[] {
	let pool = 0;
	return income.map((x) => {
		if (!carry) return x > 0 ? x * rate : 0;
		const after = x - pool;
		if (after > 0) {
			pool = 0;
			return after * rate;
		}
		pool = -after;
		return 0;
	});
}

/** IRR of flows at t = t0, t0 + 1, ...: Brent on the NPV over a wide bracket, the root nearest 0. */
function irr(flows: number[]): number | null {
	const f = (r: number) => flows.reduce((acc, c, t) => acc + c / Math.pow(1 + r, t), 0);
	const grid = [-0.99, -0.5, -0.2, -0.05, 0, 0.05, 0.2, 0.5, 1, 3, 10];
	let best: number | null = null;
	for (let i = 0; i < grid.length - 1; i++) {
		if (Math.sign(f(grid[i])) === Math.sign(f(grid[i + 1]))) continue;
		const root = solveRoot(f, grid[i], grid[i + 1], { xTolerance: 1e-15 });
		if (root && (best === null || Math.abs(root.x) < Math.abs(best))) best = root.x;
	}
	return best;
}

type Loan = { interest: number[]; principal: number[]; balance: number };

/** finance/loans schedules (annuity, straight line, sculpted) in float64, padded to n years. */
function loan(kind: string, principal: number, r: number, tenor: number, grace: number, n: number, cfadsOverTarget?: number[]): Loan {
	const interest = new Array(n).fill(0);
	const repaid = new Array(n).fill(0);
	let open = principal;
	const reps = tenor - grace;
	const pmt = r === 0 ? principal / reps : (principal * r) / (1 - Math.pow(1 + r, -reps));
	for (let k = 1; k <= tenor; k++) {
		interest[k - 1] = open * r;
		let rep = 0;
		if (k > grace) {
			if (k === tenor) rep = open;
			else if (kind === 'annuity') rep = pmt - open * r;
			else if (kind === 'straight-line') rep = principal / reps;
			else rep = cfadsOverTarget![k - 1] - open * r;
		}
		repaid[k - 1] = rep;
		open -= rep;
	}
	return { interest, principal: repaid, balance: principal };
}

function sculptedPrincipal(service: number[], r: number, tenor: number, grace: number): number {
	let pv = 0;
	for (let j = tenor - grace; j >= 1; j--) pv = (pv + service[grace + j - 1]) / (1 + r);
	return Math.max(0, pv);
}

/** evaluate.evaluateDetailed in float64: the same metrics. */
export function evaluateFloat(s: Scenario): FloatMetrics {
	const f = s.finance;
	const C = s.timeline.constructionYears;
	const N = s.timeline.operatingYears;
	const { meanKW, ratedKW } = devicePower(s);
	const devices = s.array.deviceCount;
	const a = s.array;
	const gross = (meanKW * s.hoursPerYear * devices) / 1000;
	const net = gross * (1 - a.arrayLoss) * a.availability * (1 - a.electricalLoss) * (1 - a.otherLoss);
	const sigma = Math.sqrt(sumOf(s.uncertainty.components.map((c) => c.sigma ** 2)));
	const kW = ratedKW * devices;
	const i = f.inflation;
	const rv = s.revenue;
	const tariffInflation = rv.tariffInflation ?? i;
	const nominalRate = (1 + f.realDiscountRate) * (1 + i) - 1;
	const idxC = Array.from({ length: C }, (_, j) => Math.pow(1 + i, j + 1 - C));
	const idx = Array.from({ length: N }, (_, k) => Math.pow(1 + i, k + 1));
	const delivered = net * (1 - rv.curtailment);
	const energy = idx.map((_, k) => delivered * Math.pow(1 - a.degradationPerYear, k));
	const tariffIdx = idx.map((_, k) => Math.pow(1 + tariffInflation, k + 1));

	const even = Array(C).fill(1 / C);
	const realC = Array(C).fill(0);
	let capexReal = 0;
	for (const l of s.capex.lines) {
		const total = l.amount * (l.basis === 'per-kW' ? kW : l.basis === 'per-device' ? devices : 1) * (1 + s.capex.contingency);
		capexReal += total;
		(l.phasing ?? s.capex.phasing ?? even).forEach((share, j) => (realC[j] += total * share));
	}
	const capexNom = realC.map((x, j) => x * idxC[j]);
	let grantReal = sumOf(s.revenue.grants.map((g) => (g.basis === 'lump-sum' ? g.amount : capexReal * g.fraction)));
	grantReal = Math.min(grantReal, capexReal);
	const funding = capexNom.map((c) => c * (1 - (capexReal ? grantReal / capexReal : 0)));

	let leaseShare = 0;
	const fixedOpex = Array(N).fill(0);
	for (const l of s.opex.lines) {
		if (l.basis === 'percent-of-revenue') {
			leaseShare += l.fraction;
			continue;
		}
		for (let k = 0; k < N; k++) {
			const index = idx[k] * Math.pow(1 + l.escalation, k + 1);
			const real =
				l.basis === 'fixed-per-year'
					? l.amount
					: l.basis === 'per-kW-year'
						? l.amount * kW
						: l.basis === 'per-MWh'
							? l.amount * energy[k]
							: l.basis === 'percent-of-capex'
								? l.fraction * capexReal
								: (k + 1) % l.intervalYears === 0 && k + 1 < N
									? l.amount * (l.perDevice ? devices : 1)
									: 0;
			fixedOpex[k] += real * index;
		}
	}
	const dc = s.decommissioning;
	const decomReal = dc.basis === 'per-device' ? dc.amount * devices : dc.basis === 'per-kW' ? dc.amount * kW : dc.basis === 'percent-of-capex' ? dc.fraction * capexReal : dc.amount;
	const decom = idx.map((x, k) => (k === N - 1 ? decomReal * x : 0));
	const dep = depreciation(f.depreciation.method, sumOf(funding), f.depreciation.lifeYears ?? N, N, f.depreciation.decliningBalanceFactor);
	const dfN = (t: number) => Math.pow(1 + nominalRate, -t);

	const operate = (price: number[]) => {
		const revenue = energy.map((e, k) => e * price[k]);
		const opex = fixedOpex.map((o, k) => o + leaseShare * revenue[k]);
		const ebitda = revenue.map((r, k) => r - opex[k]);
		const unlevered = tax(ebitda.map((e, k) => e - dep[k] - decom[k]), f.taxRate, f.taxLossCarryForward);
		const pre = ebitda.map((e, k) => e - decom[k]);
		const post = pre.map((x, k) => x - unlevered[k]);
		const npv = sumOf(funding.map((x, j) => -x * dfN(j + 1 - C))) + sumOf(post.map((x, k) => x * dfN(k + 1)));
		return { opex, ebitda, pre, post, npv };
	};
	// revenue.tariffIndexPath and nominalPricePath: indexed share or scaled inflation, from the base year.
	const indexedShare = rv.tariffIndexation;
	const years = (k: number) => rv.indexationBaseYearsBeforeCod + k + 1;
	const tariffIndex = (k: number) =>
		rv.indexationMethod === 'scaled-inflation'
			? Math.pow(1 + indexedShare * tariffInflation, years(k))
			: indexedShare * Math.pow(1 + tariffInflation, years(k)) + 1 - indexedShare;
	const price = tariffIdx.map((x, k) =>
		k + 1 <= rv.supportYears ? rv.tariffPerMWh * tariffIndex(k) : rv.merchantPricePerMWh * x * Math.pow(1 + rv.merchantEscalation, k + 1)
	);
	const op = operate(price);

	// metrics.discountedLcoe: revenue-share opex is a deduction from the price, not a cost.
	const kept = 1 - leaseShare;
	const pvCosts = sumOf(capexNom.map((c, j) => c * dfN(j + 1 - C))) + sumOf(fixedOpex.map((o, k) => (o + decom[k]) * dfN(k + 1)));
	const lcoeReal = pvCosts / (kept * sumOf(energy.map((e, k) => e * Math.pow(1 + f.realDiscountRate, -(k + 1)))));
	const lcoeNominal = pvCosts / (kept * sumOf(energy.map((e, k) => e * dfN(k + 1))));
	const r = f.realDiscountRate;
	const crf = r === 0 ? 1 / N : r / (1 - Math.pow(1 + r, -N));
	const lcoeFcr = (crf * capexReal + sumOf(fixedOpex.map((o, k) => o / idx[k])) / N) / (delivered * kept);

	// Debt and the tax-interest circle (cashflow.financeCase, debt.structureDebt).
	const debt = f.debt;
	let interest = Array(N).fill(0);
	let cfads: number[] = [];
	let service = Array(N).fill(0);
	let balance = 0;
	let draws = Array(C).fill(0);
	let paidIdc = Array(C).fill(0);
	const levered = () => {
		const t = tax(op.ebitda.map((e, k) => e - dep[k] - decom[k] - interest[k]), f.taxRate, f.taxLossCarryForward);
		cfads = op.ebitda.map((e, k) => e - decom[k] - t[k]);
	};
	levered();
	if (debt.sizing !== 'none') {
		const rate = debt.interestRate;
		const grow = funding.map((_, j) => (debt.capitalizeInterestDuringConstruction ? Math.pow(1 + rate, C - 1 - j) : 1));
		const perShare = sumOf(funding.map((x, j) => x * grow[j]));
		for (let round = 0; round < 60; round++) {
			let share: number;
			const clamped = cfads.map((c) => Math.max(c, 0));
			if (debt.sizing === 'gearing') share = debt.gearing;
			else {
				let wanted: number;
				if (debt.repayment === 'sculpted') wanted = sculptedPrincipal(clamped.map((c) => c / debt.targetDscr), rate, debt.tenorYears, debt.graceYears);
				else if (cfads.slice(0, debt.tenorYears).some((c) => c <= 0)) wanted = 0;
				else {
					const unit = loan(debt.repayment, 1, rate, debt.tenorYears, debt.graceYears, N);
					wanted = Math.min(...unit.interest.slice(0, debt.tenorYears).map((x, k) => cfads[k] / ((x + unit.principal[k]) * debt.targetDscr)));
				}
				share = perShare ? Math.min(wanted / perShare, debt.maxGearing) : 0;
			}
			draws = funding.map((x) => x * share);
			balance = perShare * share;
			let out = 0;
			paidIdc = draws.map((x) => {
				const paid = debt.capitalizeInterestDuringConstruction ? 0 : out * rate;
				out += x;
				return paid;
			});
			const unitCover = sculptedPrincipal(clamped, rate, debt.tenorYears, debt.graceYears);
			const l = loan(debt.repayment, balance, rate, debt.tenorYears, debt.graceYears, N, clamped.map((c) => (c * balance) / unitCover));
			const move = Math.max(...l.interest.map((x, k) => Math.abs(x - interest[k])));
			interest = l.interest;
			service = l.interest.map((x, k) => x + l.principal[k]);
			levered();
			if (move < Math.max(1e-6, balance * 1e-10)) break;
		}
	}
	const fee = debt.sizing === 'none' ? 0 : balance * debt.upfrontFee;
	const equity = [...funding.map((x, j) => -(x - draws[j]) - (j === 0 ? fee : 0) - paidIdc[j]), ...cfads.map((c, k) => c - service[k])];
	const dscr = service.map((x, k) => (x > 0 ? cfads[k] / x : null)).filter((x): x is number => x !== null);
	let llcr: number | null = null;
	if (debt.sizing !== 'none' && balance > 0) llcr = sumOf(cfads.slice(0, debt.tenorYears).map((c, k) => c / Math.pow(1 + debt.interestRate, k + 1))) / balance;

	const projectPre = [...funding.map((x) => -x), ...op.pre];
	const projectPost = [...funding.map((x) => -x), ...op.post];
	let cumulative = sumOf(funding.map((x) => -x));
	let payback: number | null = cumulative >= 0 ? 0 : null;
	for (let k = 0; payback === null && k < N; k++) {
		if (cumulative + op.post[k] >= 0) payback = k + -cumulative / op.post[k];
		cumulative += op.post[k];
	}

	const flat = (p: number) => operate(tariffIdx.map((x) => x * p)).npv;
	const root = solveRoot(flat, -10 * lcoeReal - 1000, 10 * lcoeReal + 1000, { xTolerance: 1e-9 });

	return {
		netAepMWh: net,
		p90AepMWh: net * Math.max(0, 1 - z(0.9) * sigma),
		capacityFactor: net / ((kW * s.hoursPerYear) / 1000),
		lcoeReal,
		lcoeNominal,
		lcoeFcr,
		projectIrrPreTax: irr(projectPre),
		projectIrrPostTax: irr(projectPost),
		equityIrr: irr(equity),
		npv: op.npv,
		paybackYears: payback,
		minDscr: dscr.length ? Math.min(...dscr) : null,
		avgDscr: dscr.length ? sumOf(dscr) / dscr.length : null,
		llcr,
		debtAmount: balance,
		breakevenTariff: root ? root.x : null
	};
}
