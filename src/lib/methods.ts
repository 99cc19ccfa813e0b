/**
 * The method notes: one markdown file a topic in docs/methods/<slug>.md,
 * shown at /app/methods/<slug>. The slugs are stable: result surfaces link
 * to them through the metric catalogue (src/lib/metrics/catalogue.ts), so a
 * note may be rewritten but not renamed.
 * Safe to import in the browser.
 */

export interface MethodNote {
	slug: string;
	title: string;
}

/** In reading order: the time axis first, then energy, costs, finance, metrics and sensitivity. */
export const METHOD_NOTES = [
	{ slug: 'time-convention', title: 'Time convention: COD at t = 0' },
	{ slug: 'current-power', title: 'Power of a current: kinetic power, Betz limit and power curve' },
	{ slug: 'wave-power', title: 'Power of waves: wave energy flux and power matrix' },
	{ slug: 'resource-distributions', title: 'Resource distributions: histograms, Weibull and Rayleigh' },
	{ slug: 'annual-energy', title: 'Annual energy: gross, losses and net' },
	{ slug: 'exceedance', title: 'Exceedance: P50, P90 and any Pxx' },
	{ slug: 'capacity-factor', title: 'Capacity factor' },
	{ slug: 'costs', title: 'Capex and opex lines, escalation and decommissioning' },
	{ slug: 'revenue', title: 'Revenue: tariff, indexation and merchant price' },
	{ slug: 'real-and-nominal-rates', title: 'Real and nominal rates (Fisher)' },
	{ slug: 'depreciation-and-tax', title: 'Depreciation, tax and losses carried forward' },
	{ slug: 'lcoe', title: 'Levelised cost of energy (discounted, real and nominal)' },
	{ slug: 'lcoe-fixed-charge-rate', title: 'LCOE by fixed charge rate' },
	{ slug: 'npv', title: 'Net present value' },
	{ slug: 'irr', title: 'Internal rate of return: project and equity' },
	{ slug: 'payback', title: 'Payback period' },
	{ slug: 'debt-sizing', title: 'Debt sizing: gearing or target DSCR' },
	{ slug: 'loan-repayment', title: 'Loan repayment: annuity, straight line, sculpted' },
	{ slug: 'dscr', title: 'Debt service cover ratio (DSCR)' },
	{ slug: 'llcr', title: 'Loan life cover ratio (LLCR)' },
	{ slug: 'reserves', title: 'Reserve accounts: debt service, maintenance and decommissioning' },
	{ slug: 'covenants', title: 'Covenants: lock-up, default and cash sweep' },
	{ slug: 'breakeven-tariff', title: 'Breakeven tariff' },
	{ slug: 'sensitivity', title: 'Sensitivity: tornado and spider' },
	{ slug: 'probabilistic-runs', title: 'Probabilistic runs: P10, P50 and P90 of every result' }
] as const satisfies readonly MethodNote[];

export type MethodSlug = (typeof METHOD_NOTES)[number]['slug'];

export const METHODS_INDEX_HREF = '/app/methods';

export function methodNoteHref(slug: string): string {
	return `${METHODS_INDEX_HREF}/${encodeURIComponent(slug)}`;
}

export function isMethodSlug(value: string): value is MethodSlug {
	return METHOD_NOTES.some((note) => note.slug === value);
}
