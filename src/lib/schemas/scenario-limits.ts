/**
 * Upper bounds on every list in a scenario document. The schema refuses a
 * longer list with the words of `atMost` (`at most 1000 speed bins`); the
 * upload parsers refuse files that would produce one, in the same words, and
 * docs/scenario-format.md quotes the same figures.
 *
 * Each bound is far above real data (common practice): a 0.1 m/s histogram
 * to 6 m/s has 60 bins, a scatter diagram at Hs 0.5 m x Te 1 s bins a few
 * hundred states, a power matrix a few dozen rows and columns.
 */
export const SCENARIO_LIMITS = {
	/** resource.bins: 0.01 m/s bins up to 10 m/s. */
	speedBins: 1000,
	/** resource.states: Hs 0.25 m x Te 0.5 s bins over 20 m x 20 s is 3200; real tables are under 1000. */
	seaStates: 2000,
	/** device.points */
	powerCurvePoints: 500,
	/** device.hsM, and rows of device.powerKW */
	powerMatrixHsValues: 100,
	/** device.periodS, and cells in each row of device.powerKW (so at most 100 x 100 cells) */
	powerMatrixPeriodValues: 100,
	capexLines: 100,
	opexLines: 100,
	grants: 50,
	uncertaintyComponents: 50,
	exceedanceLevels: 20,
	/** timeline.constructionYears, and so the entries of every phasing list */
	constructionYears: 20,
	/** timeline.operatingYears */
	operatingYears: 60,
	/** finance.depreciation.lifeYears */
	depreciationLifeYears: 100,
	/** finance.depreciation.schedule (and each asset class's): a share per operating year */
	depreciationScheduleYears: 100,
	/** finance.depreciation.assetClasses: tax regimes have a handful of pools */
	depreciationAssetClasses: 20,
	/** finance.debt.downsideCases: P90 and P99 are the usual ones */
	downsideCases: 4,
	/** revenue.indexationBaseYearsBeforeCod: a tariff priced at bid or financial close, a few years before COD */
	indexationBaseYears: 20
} as const;

export type ScenarioLimit = keyof typeof SCENARIO_LIMITS;

/** What each bound counts, in the words of the refusal. */
export const SCENARIO_LIMIT_WORDS: Record<ScenarioLimit, string> = {
	speedBins: 'speed bins',
	seaStates: 'sea states',
	powerCurvePoints: 'power-curve points',
	powerMatrixHsValues: 'Hs values',
	powerMatrixPeriodValues: 'period values',
	capexLines: 'capex lines',
	opexLines: 'opex lines',
	grants: 'grants',
	uncertaintyComponents: 'uncertainty components',
	exceedanceLevels: 'exceedance levels',
	constructionYears: 'construction years',
	operatingYears: 'operating years',
	depreciationLifeYears: 'years of depreciation life',
	depreciationScheduleYears: 'years in a depreciation schedule',
	depreciationAssetClasses: 'asset classes',
	downsideCases: 'downside sizing cases',
	indexationBaseYears: 'years between the indexation base year and COD'
};

/** `at most 1000 speed bins` */
export function atMost(limit: ScenarioLimit, words = SCENARIO_LIMIT_WORDS[limit]): string {
	return `at most ${SCENARIO_LIMITS[limit]} ${words}`;
}
