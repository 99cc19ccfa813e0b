import { describe, expect, it } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { parseScenario, type Scenario } from '../../schemas/scenario';
import { atbCase } from './testing/fixtures';
import { evaluateDetailed, METRIC_KEYS } from './evaluate';
import { evaluateFloat } from './float-twin';

// Not an outside source: the float64 twin is a second, independent implementation of the same
// formulas, so agreement catches slips in either (and the benchmark needs it to be the same model).
function expectSame(s: Scenario, label: string) {
	const decimal = evaluateDetailed(s).metrics;
	const float = evaluateFloat(s);
	for (const key of METRIC_KEYS) {
		const d = decimal[key];
		const f = float[key];
		if (d === null || f === null) {
			expect(f, `${label} ${key}`).toBe(d === null ? null : f);
			expect(d === null, `${label} ${key} null in one only`).toBe(f === null);
			continue;
		}
		const scale = Math.max(1, Math.abs(d.toNumber()));
		expect(Math.abs(d.toNumber() - f) / scale, `${label} ${key}: ${d} vs ${f}`).toBeLessThan(1e-8);
	}
}

describe('evaluateFloat', () => {
	it('agrees with the decimal engine on every example', () => {
		const dir = join(process.cwd(), 'examples');
		for (const file of readdirSync(dir).filter((f) => f.endsWith('.json'))) {
			const parsed = parseScenario(JSON.parse(readFileSync(join(dir, file), 'utf8')));
			if (!parsed.ok) throw new Error(file);
			expectSame(parsed.scenario, file);
		}
	});

	it('agrees on debt, tax and depreciation variants', () => {
		const variants = [
			{ finance: { taxRate: 0.3, depreciation: { method: 'declining-balance', lifeYears: 10 } } },
			{ timeline: { constructionYears: 3 }, finance: { inflation: 0.03, debt: { sizing: 'gearing', gearing: 0.7, interestRate: 0.06, tenorYears: 15, graceYears: 2, repayment: 'sculpted', capitalizeInterestDuringConstruction: false } } },
			{ finance: { taxRate: 0.25, debt: { sizing: 'target-dscr', targetDscr: 1.25, maxGearing: 0.85, interestRate: 0.07, tenorYears: 12, repayment: 'straight-line' } } },
			{ opex: { lines: [{ name: 'lease', basis: 'percent-of-revenue', fraction: 0.03 }, { name: 'o', basis: 'periodic-overhaul', amount: 2e6, perDevice: false, intervalYears: 5, escalation: 0.01 }] } },
			{
				revenue: { supportYears: 12, tariffIndexation: 0.4, indexationBaseYearsBeforeCod: 2, tariffInflation: 0.035, curtailment: 0.05, merchantPricePerMWh: 90, merchantEscalation: 0.01 },
				opex: { lines: [{ name: 'lease', basis: 'percent-of-revenue', fraction: 0.02 }, { name: 'grid', basis: 'per-MWh', amount: 6 }] },
				finance: { inflation: 0.02, taxRate: 0.25 }
			},
			{ revenue: { supportYears: 15, tariffIndexation: 0.6, indexationMethod: 'scaled-inflation', indexationBaseYearsBeforeCod: 1 }, finance: { inflation: 0.03 } }
		];
		variants.forEach((v, n) => expectSame(atbCase(v), `variant ${n}`));
	});
});
