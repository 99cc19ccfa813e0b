/**
 * The key metrics as the results panel shows them: label, unit and how to
 * format each, and where its method note lives.
 */
import { methodHref } from '../methods';
import { formatMoneyShort, formatNumber, formatPercent } from './format';

export const metricKeys = [
	'lcoeReal',
	'lcoeNominal',
	'lcoeFcr',
	'projectIrrPreTax',
	'projectIrrPostTax',
	'equityIrr',
	'npv',
	'minDscr',
	'avgDscr',
	'llcr',
	'netAepMWh',
	'p90AepMWh',
	'capacityFactor',
	'debtAmount',
	'breakevenTariff',
	'paybackYears'
] as const;
export type MetricKey = (typeof metricKeys)[number];

export type MetricValues = Record<MetricKey, string | null>;

type Kind = 'per-mwh' | 'rate' | 'money' | 'ratio' | 'energy' | 'years';

export interface MetricInfo {
	label: string;
	/** `{c}` stands for the currency. */
	unit: string;
	kind: Kind;
	/** Where a higher value is the better one; null when neither is. */
	higherIsBetter: boolean | null;
}

export const metricInfo: Record<MetricKey, MetricInfo> = {
	lcoeReal: { label: 'LCOE, real', unit: '{c}/MWh', kind: 'per-mwh', higherIsBetter: false },
	lcoeNominal: { label: 'LCOE, nominal', unit: '{c}/MWh', kind: 'per-mwh', higherIsBetter: false },
	lcoeFcr: { label: 'LCOE, fixed charge rate', unit: '{c}/MWh', kind: 'per-mwh', higherIsBetter: false },
	projectIrrPreTax: { label: 'Project IRR, pre-tax', unit: 'nominal, per year', kind: 'rate', higherIsBetter: true },
	projectIrrPostTax: { label: 'Project IRR, post-tax', unit: 'nominal, per year', kind: 'rate', higherIsBetter: true },
	equityIrr: { label: 'Equity IRR', unit: 'nominal, per year', kind: 'rate', higherIsBetter: true },
	npv: { label: 'NPV', unit: '{c} at COD, post-tax', kind: 'money', higherIsBetter: true },
	minDscr: { label: 'Minimum DSCR', unit: 'ratio', kind: 'ratio', higherIsBetter: true },
	avgDscr: { label: 'Average DSCR', unit: 'ratio', kind: 'ratio', higherIsBetter: true },
	llcr: { label: 'LLCR', unit: 'ratio', kind: 'ratio', higherIsBetter: true },
	netAepMWh: { label: 'Net AEP, P50', unit: 'MWh/yr', kind: 'energy', higherIsBetter: true },
	p90AepMWh: { label: 'Net AEP, P90', unit: 'MWh/yr', kind: 'energy', higherIsBetter: true },
	capacityFactor: { label: 'Capacity factor', unit: 'net, first year', kind: 'rate', higherIsBetter: true },
	debtAmount: { label: 'Debt', unit: '{c}, balance at COD', kind: 'money', higherIsBetter: null },
	breakevenTariff: { label: 'Breakeven tariff', unit: '{c}/MWh, flat real', kind: 'per-mwh', higherIsBetter: false },
	paybackYears: { label: 'Payback', unit: 'years from COD', kind: 'years', higherIsBetter: false }
};

export function metricUnit(key: MetricKey, currency: string): string {
	return metricInfo[key].unit.replaceAll('{c}', currency);
}

export function formatMetric(key: MetricKey, value: string | null): string {
	if (value === null) return '—';
	switch (metricInfo[key].kind) {
		case 'per-mwh':
			return formatNumber(value, 1);
		case 'rate':
			return formatPercent(value, 2);
		case 'money':
			return formatMoneyShort(value);
		case 'ratio':
			return `${formatNumber(value, 2)}×`;
		case 'energy':
			return formatNumber(value, 0);
		case 'years':
			return formatNumber(value, 1);
	}
}

/** The method note that explains how a metric is computed. */
export function metricMethodHref(key: MetricKey): string {
	return methodHref(key);
}
