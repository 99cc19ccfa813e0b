import { describe, expect, it } from 'vitest';
import type { PortfolioRecord } from '../db/portfolio';
import type { EngineResult } from '../engine/evaluate';
import { kilowattsToMegawatts, parsePortfolioQuery, portfolioRowJson, portfolioRowOf } from './portfolio';
import { portfolioRow } from './testing/portfolio-rows';

describe('kilowattsToMegawatts', () => {
	it('divides by 1000 exactly, keeping the digits a float would lose', () => {
		// SI prefixes: 1 MW = 1000 kW.
		expect(kilowattsToMegawatts('15000')).toBe('15');
		expect(kilowattsToMegawatts('350')).toBe('0.35');
		expect(kilowattsToMegawatts('12345678901234.5678')).toBe('12345678901.2345678');
		expect(kilowattsToMegawatts(null)).toBeNull();
	});
});

function record(overrides: Partial<PortfolioRecord> = {}): PortfolioRecord {
	return {
		projectId: '00000000-0000-4000-8000-000000000001',
		projectName: 'Quenmoor Sound Tidal Array',
		workspaceId: '00000000-0000-4000-8000-0000000000aa',
		workspaceName: 'Corvane Advisory',
		technology: 'tidal-stream',
		projectCurrency: 'EUR',
		archivedAt: null,
		baseCase: { id: '00000000-0000-4000-8000-000000000002', name: 'Base case', revision: 3 },
		stored: {
			metrics: { netAepMWh: '40258.75', lcoeReal: '252.64', equityIrr: '0.0915', llcr: '1.5' } as unknown as EngineResult['metrics'],
			currency: 'GBP',
			installedCapacityKW: '15000',
			capexRealTotal: '86350000'
		},
		...overrides
	};
}

describe('portfolioRowOf', () => {
	it('takes the figures of the stored result, capacity in MW, money in the result currency', () => {
		const row = portfolioRowOf(record());
		expect(row.missing).toBeNull();
		expect(row.reason).toBeNull();
		expect(row.status).toBe('live');
		expect(row.currency).toBe('GBP');
		expect(row.baseCase).toEqual({ id: '00000000-0000-4000-8000-000000000002', name: 'Base case' });
		expect(row.figures.installedCapacityMW).toBe('15');
		expect(row.figures.capexRealTotal).toBe('86350000');
		expect(row.figures.lcoeReal).toBe('252.64');
		expect(row.figures.equityIrr).toBe('0.0915');
		// A metric the engine left undefined (or the table does not show) is null, never undefined.
		expect(row.figures.minDscr).toBeNull();
		expect(Object.keys(row.figures)).not.toContain('llcr');
	});

	it('says in words why a project without a base case or without a current result has no figures', () => {
		const noBase = portfolioRowOf(record({ baseCase: null, stored: null }));
		expect(noBase.missing).toBe('no-base-case');
		expect(noBase.reason).toBe('no base case yet');
		expect(noBase.currency).toBe('EUR');
		expect(Object.values(noBase.figures).every((v) => v === null)).toBe(true);
		const notEvaluated = portfolioRowOf(record({ stored: null }));
		expect(notEvaluated.missing).toBe('not-evaluated');
		expect(notEvaluated.reason).toBe('not evaluated by the current engine yet');
	});

	it('marks an archived project as archived', () => {
		expect(portfolioRowOf(record({ archivedAt: new Date('2026-11-02T10:00:00Z') })).status).toBe('archived');
	});
});

describe('parsePortfolioQuery', () => {
	it('reads filters and order, an empty value as left out, and defaults to project ascending', () => {
		const parsed = parsePortfolioQuery(new URLSearchParams('technology=wave&status=&sort=lcoeReal&dir=desc&page=2'));
		expect(parsed).toEqual({ ok: true, query: { technology: 'wave', sort: 'lcoeReal', dir: 'desc' } });
		expect(parsePortfolioQuery(new URLSearchParams(''))).toEqual({ ok: true, query: { sort: 'project', dir: 'asc' } });
	});

	it('refuses each bad parameter by name', () => {
		const parsed = parsePortfolioQuery(new URLSearchParams('technology=hydro&sort=llcr&dir=up&workspaceId=nope'));
		expect(parsed.ok).toBe(false);
		if (parsed.ok) return;
		expect(parsed.issues.map((i) => i.path).sort()).toEqual(['dir', 'sort', 'technology', 'workspaceId']);
		expect(parsed.issues.find((i) => i.path === 'sort')?.message).toMatch(/sort "llcr" is not accepted: one of project, workspace/);
	});
});

describe('portfolioRowJson', () => {
	it('sends figures as numbers in the engine units (fractions for rates), null where missing', () => {
		const json = portfolioRowJson(portfolioRow({ currency: 'USD' }, [['equityIrr', '0.0915207133'], ['capexRealTotal', '63250000'], ['installedCapacityMW', '6']]));
		expect(json.currency).toBe('USD');
		expect(json.installedCapacityMW).toBe(6);
		expect(json.capexRealTotal).toBe(63250000);
		expect(json.metrics.equityIrr).toBe(0.0915207133);
		expect(json.metrics.npv).toBeNull();
		expect(json).not.toHaveProperty('figures');
	});
});
