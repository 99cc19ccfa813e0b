import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync } from 'node:fs';
import { join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import { tidalDocument } from '../../../tests/fixtures/scenario-documents';
import { isMethodSlug, METHOD_NOTES } from '../methods';
import { evaluateScenario } from '../server/engine/evaluate';
import {
	CASE_FIGURE_KEYS,
	CASE_FIGURES,
	engineValueUnit,
	figureDefinition,
	isMetricKey,
	METRIC_KEYS,
	METRIC_LIST,
	metricDefinition,
	metricMethodHref,
	METRICS,
	metricsOfNote,
	metricUnit,
	metricUnitWithBasis
} from './catalogue';

describe('METRICS', () => {
	it('covers exactly the metrics the engine computes, in the catalogue order', () => {
		const computed = Object.keys(evaluateScenario(tidalDocument).metrics);
		expect([...computed].sort()).toEqual([...METRIC_KEYS].sort());
		expect(Object.keys(METRICS)).toEqual([...METRIC_KEYS]);
		expect(METRIC_LIST.map((m) => m.key)).toEqual([...METRIC_KEYS]);
	});

	it('gives every metric a method note that exists', () => {
		const slugs = new Set<string>(METHOD_NOTES.map((n) => n.slug));
		for (const metric of METRIC_LIST) expect(slugs.has(metric.method), `${metric.key} -> ${metric.method}`).toBe(true);
	});

	it('gives each metric its own label, a unit and a sensible precision', () => {
		const labels = METRIC_LIST.map((m) => m.label);
		expect(new Set(labels).size).toBe(labels.length);
		for (const metric of METRIC_LIST) {
			expect(metric.key in METRICS && METRICS[metric.key] === metric).toBe(true);
			expect(metric.unit.length, metric.key).toBeGreaterThan(0);
			expect(Number.isInteger(metric.places) && metric.places >= 0 && metric.places <= 4, metric.key).toBe(true);
			// Only per cent figures carry a per cent sign; the rest keep the engine's scale.
			expect(metric.unit.includes('%'), metric.key).toBe(metric.scale === 'percent');
		}
	});

	it('reads a rise in LCOE as bad, in IRR as good and debt as neither', () => {
		expect(METRICS.lcoeReal.betterWhen).toBe('lower');
		expect(METRICS.equityIrr.betterWhen).toBe('higher');
		expect(METRICS.debtAmount.betterWhen).toBe('neither');
	});
});

describe('isMetricKey and metricDefinition', () => {
	it('know the engine keys and refuse others by name', () => {
		expect(isMetricKey('minDscr')).toBe(true);
		expect(isMetricKey('minDSCR')).toBe(false);
		expect(metricDefinition('llcr').label).toBe('LLCR');
		expect(() => metricDefinition('irr')).toThrow(/Unknown metric "irr"/);
	});
});

describe('metricUnit and metricUnitWithBasis', () => {
	it('put the project currency in place of the placeholder', () => {
		expect(metricUnit('lcoeReal', 'GBP')).toBe('GBP/MWh');
		expect(metricUnit('npv', 'EUR')).toBe('EUR');
		expect(metricUnitWithBasis('lcoeReal', 'EUR')).toBe('EUR/MWh (real, COD-year money)');
		expect(metricUnitWithBasis('minDscr', 'EUR')).toBe('×');
	});
});

describe('CASE_FIGURES and figureDefinition', () => {
	it('gives the case figures labels of their own, units and method notes that exist, apart from the engine metrics', () => {
		const slugs = new Set<string>(METHOD_NOTES.map((n) => n.slug));
		const metricLabels = new Set(METRIC_LIST.map((m) => m.label));
		for (const key of CASE_FIGURE_KEYS) {
			expect(isMetricKey(key), key).toBe(false);
			expect(metricLabels.has(CASE_FIGURES[key].label), key).toBe(false);
			expect(slugs.has(CASE_FIGURES[key].method), key).toBe(true);
			expect(figureDefinition(key)).toBe(CASE_FIGURES[key]);
		}
		expect(figureDefinition('lcoeReal')).toBe(METRICS.lcoeReal);
		expect(metricUnit('installedCapacityMW', 'EUR')).toBe('MW');
		expect(metricUnitWithBasis('capexRealTotal', 'GBP')).toBe('GBP (real, COD-year money, with contingency, before grants)');
	});
});

describe('engineValueUnit', () => {
	it('names per cent figures as the fractions the engine sends', () => {
		expect(engineValueUnit('equityIrr', 'EUR')).toBe('fraction/yr (nominal)');
		expect(engineValueUnit('capacityFactor', 'EUR')).toBe('fraction (net, first operating year)');
		expect(engineValueUnit('breakevenTariff', 'NOK')).toBe('NOK/MWh (flat in COD-year money, indexed like the tariff)');
	});
});

describe('metricMethodHref', () => {
	it('leads every metric to its listed note and an unknown key to the index', () => {
		for (const { key } of METRIC_LIST) {
			const slug = metricMethodHref(key).replace('/app/methods/', '');
			expect(isMethodSlug(slug), key).toBe(true);
		}
		expect(metricMethodHref('lcoeFcr')).toBe('/app/methods/lcoe-fixed-charge-rate');
		expect(metricMethodHref('capexRealTotal')).toBe('/app/methods/costs');
		expect(metricMethodHref('noSuchMetric')).toBe('/app/methods');
	});
});

describe('metricsOfNote', () => {
	it('lists the metrics a note explains, in the catalogue order', () => {
		expect(metricsOfNote('irr').map((m) => m.key)).toEqual(['projectIrrPreTax', 'projectIrrPostTax', 'equityIrr']);
		expect(metricsOfNote('sensitivity')).toEqual([]);
	});
});

describe('the catalogue as the only list of metrics', () => {
	const srcDir = fileURLToPath(new URL('../../', import.meta.url));
	const catalogueFile = fileURLToPath(new URL('./catalogue.ts', import.meta.url));
	const sourceFiles = (dir: string): string[] =>
		readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
			const path = join(dir, entry.name);
			if (entry.isDirectory()) return sourceFiles(path);
			return /\.(ts|js|svelte)$/.test(entry.name) && !/\.test\.ts$/.test(entry.name) && path !== catalogueFile ? [path] : [];
		});
	const files = sourceFiles(srcDir).map((path) => ({ path: relative(srcDir, path), text: readFileSync(path, 'utf8') }));

	it('scans the source tree', () => {
		expect(files.some((f) => f.path.endsWith('MetricsGrid.svelte'))).toBe(true);
	});

	it('holds the only copy of each distinctive label, and no older wording survives', () => {
		// Labels that would only appear in a list of metrics (generic words such as "Payback" are also note titles).
		const distinctive = METRIC_LIST.map((m) => m.label).filter((label) => /,|IRR|DSCR|COD/.test(label));
		const older = ['Net AEP, P', 'Net annual energy (P', 'Debt amount', 'Breakeven tariff (flat', "'NPV'"];
		expect(distinctive.length).toBeGreaterThan(8);
		const found = files.flatMap((f) => [...distinctive, ...older].filter((label) => f.text.includes(label)).map((label) => `${f.path}: ${label}`));
		expect(found).toEqual([]);
	});

	it('has no other map from metric keys to text', () => {
		// `lcoeReal: 'LCOE, real'` or `minDscr: { label: ... }`: the shape of a second list of labels, units or notes.
		const keyedText = new RegExp(`\\b(${METRIC_KEYS.join('|')})\\s*:\\s*(['"\`]|\\{\\s*label)`);
		expect(files.filter((f) => keyedText.test(f.text)).map((f) => f.path)).toEqual([]);
	});
});
