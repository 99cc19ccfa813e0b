import { describe, expect, it } from 'vitest';
import { currenciesOf, portfolioTotals, sortPortfolio } from './portfolio-table';
import { portfolioRow } from './testing/portfolio-rows';

const names = (rows: { projectName: string }[]) => rows.map((r) => r.projectName);

describe('sortPortfolio', () => {
	const cheap = portfolioRow({ projectName: 'Quenmoor Sound' }, [['lcoeReal', '180.5'], ['installedCapacityMW', '24']]);
	const dear = portfolioRow({ projectName: 'Tallowick Race' }, [['lcoeReal', '410.25'], ['installedCapacityMW', '4.5']]);
	// 95 sorts below 180.5 as a number, above it as text: the comparison must be numeric.
	const cheapest = portfolioRow({ projectName: 'Ulvenholt Shelf' }, [['lcoeReal', '95'], ['installedCapacityMW', '14']]);
	const noLcoe = portfolioRow({ projectName: 'Aldermoor Pilot' }, [['installedCapacityMW', '1']]);
	const notEvaluated = portfolioRow({ projectName: 'Brackwater Deep', missing: 'not-evaluated' });
	const noBase = portfolioRow({ projectName: 'Corrandel Point', missing: 'no-base-case' });
	const rows = [notEvaluated, dear, noBase, cheap, noLcoe, cheapest];

	it('orders a figure numerically, both ways, with rows lacking it last either way (by name among themselves)', () => {
		expect(names(sortPortfolio(rows, 'lcoeReal', 'asc'))).toEqual(['Ulvenholt Shelf', 'Quenmoor Sound', 'Tallowick Race', 'Aldermoor Pilot', 'Brackwater Deep', 'Corrandel Point']);
		expect(names(sortPortfolio(rows, 'lcoeReal', 'desc'))).toEqual(['Tallowick Race', 'Quenmoor Sound', 'Ulvenholt Shelf', 'Aldermoor Pilot', 'Brackwater Deep', 'Corrandel Point']);
	});

	it('orders text without regard to case, and base cases missing last', () => {
		const lower = portfolioRow({ projectName: 'aldgate bank' });
		expect(names(sortPortfolio([dear, lower, cheap], 'project', 'asc'))).toEqual(['aldgate bank', 'Quenmoor Sound', 'Tallowick Race']);
		expect(names(sortPortfolio([dear, lower, cheap], 'project', 'desc'))).toEqual(['Tallowick Race', 'Quenmoor Sound', 'aldgate bank']);
		expect(names(sortPortfolio(rows, 'baseCase', 'desc')).at(-1)).toBe('Corrandel Point');
	});

	it('orders status live before archived, technology by its label', () => {
		const archived = portfolioRow({ projectName: 'Archived one', status: 'archived', technology: 'wave' });
		const current = portfolioRow({ projectName: 'Zephyr Narrows', technology: 'ocean-current' });
		expect(names(sortPortfolio([archived, current], 'status', 'asc'))).toEqual(['Zephyr Narrows', 'Archived one']);
		expect(names(sortPortfolio([archived, current], 'status', 'desc'))).toEqual(['Archived one', 'Zephyr Narrows']);
		// "Ocean current" before "Wave".
		expect(names(sortPortfolio([archived, current], 'technology', 'asc'))).toEqual(['Zephyr Narrows', 'Archived one']);
	});

	it('orders money within its currency, never one currency against another', () => {
		const eurSmall = portfolioRow({ projectName: 'Euro small', currency: 'EUR' }, [['capexRealTotal', '20000000']]);
		const eurLarge = portfolioRow({ projectName: 'Euro large', currency: 'EUR' }, [['capexRealTotal', '90000000']]);
		const usd = portfolioRow({ projectName: 'Dollar mid', currency: 'USD' }, [['capexRealTotal', '50000000']]);
		expect(names(sortPortfolio([usd, eurLarge, eurSmall], 'capexRealTotal', 'asc'))).toEqual(['Euro small', 'Euro large', 'Dollar mid']);
		expect(names(sortPortfolio([usd, eurLarge, eurSmall], 'capexRealTotal', 'desc'))).toEqual(['Euro large', 'Euro small', 'Dollar mid']);
		// Capacity is no money: it orders across currencies.
		const big = portfolioRow({ projectName: 'Dollar big', currency: 'USD' }, [['installedCapacityMW', '30']]);
		const small = portfolioRow({ projectName: 'Euro tiny', currency: 'EUR' }, [['installedCapacityMW', '2']]);
		expect(names(sortPortfolio([small, big], 'installedCapacityMW', 'desc'))).toEqual(['Dollar big', 'Euro tiny']);
	});

	it('leaves the rows given untouched and breaks ties by name, then id', () => {
		const a = portfolioRow({ projectName: 'Same' }, [['minDscr', '1.3']]);
		const b = portfolioRow({ projectName: 'Same' }, [['minDscr', '1.30']]);
		const given = [b, a];
		expect(sortPortfolio(given, 'minDscr', 'desc').map((r) => r.projectId)).toEqual([a.projectId, b.projectId].sort());
		expect(given).toEqual([b, a]);
	});
});

describe('portfolioTotals', () => {
	it('adds capacity across projects and capex per currency only, leaving out rows without figures', () => {
		const rows = [
			portfolioRow({ currency: 'EUR' }, [['installedCapacityMW', '24'], ['capexRealTotal', '100000000.1']]),
			portfolioRow({ currency: 'USD' }, [['installedCapacityMW', '6'], ['capexRealTotal', '40000000']]),
			portfolioRow({ currency: 'EUR' }, [['installedCapacityMW', '4.5'], ['capexRealTotal', '30000000.2']]),
			portfolioRow({ currency: 'GBP', missing: 'not-evaluated' })
		];
		// 100000000.1 + 30000000.2 = 130000000.3 exactly (a float sum gives 130000000.30000001).
		expect(portfolioTotals(rows)).toEqual({
			installedCapacityMW: '34.5',
			capexByCurrency: [
				{ currency: 'EUR', total: '130000000.3' },
				{ currency: 'USD', total: '40000000' }
			]
		});
	});

	it('totals nothing to zero', () => {
		expect(portfolioTotals([portfolioRow({ missing: 'no-base-case' })])).toEqual({ installedCapacityMW: '0', capexByCurrency: [] });
	});
});

describe('currenciesOf', () => {
	it('lists the currencies of rows with figures once each, A to Z', () => {
		const rows = [portfolioRow({ currency: 'USD' }), portfolioRow({ currency: 'EUR' }), portfolioRow({ currency: 'USD' }), portfolioRow({ currency: 'GBP', missing: 'not-evaluated' })];
		expect(currenciesOf(rows)).toEqual(['EUR', 'USD']);
	});
});
