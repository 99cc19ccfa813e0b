import { describe, expect, it } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { Decimal } from './decimal';
import { evaluateDetailed, evaluateScenario } from './evaluate';
import { atbCase, patched, scenarioFrom } from './testing/fixtures';

const examples = readdirSync(join(process.cwd(), 'examples'))
	.filter((f) => f.endsWith('.json'))
	.map((f) => scenarioFrom(JSON.parse(readFileSync(join(process.cwd(), 'examples', f), 'utf8'))));
const num = (s: string | null) => Number(s);

describe('reserves and covenants in the evaluation', () => {
	it('never raises the equity IRR by adding a debt service reserve that earns nothing (property, every example)', () => {
		// Holding cash back and paying it out later cannot raise a positive IRR (common practice; see reserves.md).
		for (const scenario of examples) {
			if (scenario.finance.debt.sizing === 'none') continue;
			const withoutReserve = { ...scenario, finance: { ...scenario.finance, reserves: { ...scenario.finance.reserves, debtService: undefined } } };
			const without = evaluateScenario(withoutReserve);
			for (const funding of ['from-funding', 'from-cash-flow'] as const) {
				for (const months of [3, 6, 12]) {
					const withReserve = evaluateScenario(patched(withoutReserve, { finance: { reserves: { debtService: { months, funding } } } }));
					if (num(without.metrics.equityIrr) <= 0) continue;
					expect(num(withReserve.metrics.equityIrr)).toBeLessThanOrEqual(num(without.metrics.equityIrr) + 1e-12);
				}
			}
		}
	});

	it('funds a reserve from the funding at COD: months/12 of the first debt service, released at maturity', () => {
		// Gearing-sized annuity, year-end one-year build: the reserve is 6/12 of the first year's debt service and is a
		// use of funds at COD (the funding need grows by it); the loan's last year releases it to equity.
		const base = { finance: { debt: { sizing: 'gearing', gearing: 0.6, interestRate: 0.08, tenorYears: 10, repayment: 'annuity' } } };
		const plain = evaluateDetailed(atbCase(base));
		const reserved = evaluateDetailed(atbCase({ ...base, finance: { ...base.finance, reserves: { debtService: { months: 6, funding: 'from-funding' } } } }));
		const w = reserved.financing.waterfall!;
		const firstService = reserved.financing.debtService[0];
		expect(w.dsra.opening[0].div(firstService.div(2)).minus(1).abs().toNumber()).toBeLessThan(1e-9);
		const need = (d: typeof plain) => d.financing.debt!.funding.totalFundingNeed;
		expect(need(reserved).minus(need(plain)).div(w.dsra.opening[0]).minus(1).abs().toNumber()).toBeLessThan(1e-9);
		expect(w.dsra.closing[9].toNumber()).toBeCloseTo(0, 6);
		// Equity receives CFADS - debt service + the release in year 10.
		const year10 = reserved.financing.cfads[9].minus(reserved.financing.debtService[9]).plus(w.dsra.release[9]);
		expect(reserved.financing.equity.operation[9].minus(year10).abs().toNumber()).toBeLessThan(1e-6);
	});

	it('counts years in lock-up and names them, and leaves the metric empty without a lock-up level', () => {
		// A tight loan (annuity at 1.05 cover on P50) with a lock-up at 1.20: every debt-service year is locked up.
		const tight = atbCase({
			finance: { debt: { sizing: 'target-dscr', targetDscr: 1.05, maxGearing: 1, interestRate: 0.08, tenorYears: 10, repayment: 'annuity' }, covenants: { lockUpDscr: 1.2 } }
		});
		const r = evaluateScenario(tight);
		expect(r.metrics.yearsInLockUp).toBe('10');
		expect(evaluateScenario(atbCase()).metrics.yearsInLockUp).toBeNull();
	});

	it('smooths an overhaul through the maintenance reserve so the DSCR does not dip in its year', () => {
		const overhaul = { opex: { lines: [{ name: 'Fixed O&M', basis: 'percent-of-capex', fraction: 0.04 }, { name: 'Overhaul', basis: 'periodic-overhaul', amount: 2_000_000, perDevice: false, intervalYears: 5 }] } };
		const debt = { debt: { sizing: 'gearing', gearing: 0.5, interestRate: 0.08, tenorYears: 12, repayment: 'annuity' } };
		const bare = evaluateDetailed(atbCase({ ...overhaul, finance: debt }));
		const smoothed = evaluateDetailed(atbCase({ ...overhaul, finance: { ...debt, reserves: { maintenance: {} } } }));
		const spread = (values: (Decimal | null)[]) => {
			const xs = values.slice(0, 12).map((d) => d!.toNumber());
			return Math.max(...xs) - Math.min(...xs);
		};
		expect(spread(smoothed.dscr)).toBeLessThan(spread(bare.dscr));
		// 2 M every 5 years funded over 5 years: 400 k a year out of CFADS (hand calculation).
		expect(smoothed.financing.costReserves.maintenance.contribution[0].toNumber()).toBeCloseTo(400_000, 6);
	});
});
