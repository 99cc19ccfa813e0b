import { describe, expect, it } from 'vitest';
import { METRICS } from '../metrics/catalogue';
import { columnUnit, figureHeading, isMoneyFigure, nextOrder, PORTFOLIO_FIGURE_KEYS, portfolioColumns, portfolioSearch } from './columns';

describe('portfolioColumns', () => {
	it('takes every figure label from the catalogue, and shows the workspace only across workspaces', () => {
		const across = portfolioColumns({ withWorkspace: true });
		const one = portfolioColumns({ withWorkspace: false });
		expect(across.map((c) => c.key).slice(0, 5)).toEqual(['project', 'workspace', 'technology', 'status', 'baseCase']);
		expect(one.map((c) => c.key)).not.toContain('workspace');
		expect(across.find((c) => c.key === 'lcoeReal')?.label).toBe(METRICS.lcoeReal.label);
		expect(across.find((c) => c.key === 'minDscr')?.unit).toBe(METRICS.minDscr.unit);
		expect(across.filter((c) => c.numeric).map((c) => c.key)).toEqual([...PORTFOLIO_FIGURE_KEYS]);
	});
});

describe('isMoneyFigure', () => {
	it('knows money by the currency in its unit', () => {
		expect(['capexRealTotal', 'lcoeReal', 'npv'].every((k) => isMoneyFigure(k as 'npv'))).toBe(true);
		expect(['installedCapacityMW', 'netAepMWh', 'equityIrr', 'minDscr'].some((k) => isMoneyFigure(k as 'npv'))).toBe(false);
	});
});

describe('columnUnit and figureHeading', () => {
	it('name the one currency when all rows share it, else say "currency"', () => {
		expect(columnUnit('lcoeReal', ['EUR'])).toBe('EUR/MWh');
		expect(columnUnit('lcoeReal', ['EUR', 'USD'])).toBe('currency/MWh');
		expect(columnUnit('equityIrr', ['EUR', 'USD'])).toBe('%/yr');
		expect(figureHeading('npv', ['EUR'])).toBe(`${METRICS.npv.label} (EUR; at COD, nominal discount rate)`);
		expect(figureHeading('minDscr', [])).toBe(`${METRICS.minDscr.label} (×)`);
	});
});

describe('portfolioSearch', () => {
	it('keeps filters and a non-default order in the address, and leaves the defaults out', () => {
		expect(portfolioSearch({ technology: 'wave', status: 'archived' }, { sort: 'lcoeReal', dir: 'desc' }).toString()).toBe(
			'technology=wave&status=archived&sort=lcoeReal&dir=desc'
		);
		expect(portfolioSearch({}, { sort: 'project', dir: 'asc' }).toString()).toBe('');
		expect(portfolioSearch({ workspaceId: 'w1' }, { sort: 'project', dir: 'desc' }).toString()).toBe('workspaceId=w1&sort=project&dir=desc');
	});
});

describe('nextOrder', () => {
	it('turns the sorted column around and starts another ascending', () => {
		expect(nextOrder({ sort: 'npv', dir: 'asc' }, 'npv')).toEqual({ sort: 'npv', dir: 'desc' });
		expect(nextOrder({ sort: 'npv', dir: 'desc' }, 'npv')).toEqual({ sort: 'npv', dir: 'asc' });
		expect(nextOrder({ sort: 'npv', dir: 'desc' }, 'project')).toEqual({ sort: 'project', dir: 'asc' });
	});
});
