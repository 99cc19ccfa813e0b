/**
 * A probabilistic run as the form shows it: each driver's distribution in the
 * form's units (per cent for fractions and multiples, as the sensitivity form
 * shows them), and back to the run input the API takes. Safe to import in the
 * browser.
 */
import type { Distribution, DistributionShape, RunInput } from '../schemas/probabilistic';
import { toEngineValue, toFormValue, type DriverUnit } from './driver-inputs';

export const SHAPES: { shape: DistributionShape; label: string }[] = [
	{ shape: 'triangular', label: 'Triangular' },
	{ shape: 'normal', label: 'Normal' },
	{ shape: 'truncated-normal', label: 'Normal, cut to a range' },
	{ shape: 'uniform', label: 'Uniform' },
	{ shape: 'lognormal', label: 'Lognormal' }
];

export type ParamName = 'mean' | 'sd' | 'min' | 'mode' | 'max';

export const SHAPE_PARAMS: Record<DistributionShape, ParamName[]> = {
	triangular: ['min', 'mode', 'max'],
	normal: ['mean', 'sd'],
	'truncated-normal': ['mean', 'sd', 'min', 'max'],
	uniform: ['min', 'max'],
	lognormal: ['mean', 'sd']
};

export const PARAM_LABELS: Record<ParamName, string> = {
	mean: 'Mean',
	sd: 'Std. deviation',
	min: 'Lowest',
	mode: 'Most likely',
	max: 'Highest'
};

export interface DriverRowForm {
	driver: string;
	on: boolean;
	shape: DistributionShape;
	/** Typed text per parameter, in form units. */
	params: Partial<Record<ParamName, string>>;
}

/** Mean, spread and range of a distribution, to carry a row over to another shape. */
function outline(d: Distribution): { centre: number; sd: number; min: number; max: number } {
	switch (d.shape) {
		case 'triangular':
			return { centre: d.mode, sd: (d.max - d.min) / 4, min: d.min, max: d.max };
		case 'uniform':
			return { centre: (d.min + d.max) / 2, sd: (d.max - d.min) / 4, min: d.min, max: d.max };
		case 'truncated-normal':
			return { centre: d.mean, sd: d.sd, min: d.min, max: d.max };
		case 'normal':
		case 'lognormal':
			return { centre: d.mean, sd: d.sd, min: d.mean - 2 * d.sd, max: d.mean + 2 * d.sd };
	}
}

/** The same uncertainty in another shape: same centre, a range of about four standard deviations. */
export function reshape(d: Distribution, shape: DistributionShape): Distribution {
	const o = outline(d);
	const round = (x: number) => Math.round(x * 1e9) / 1e9;
	switch (shape) {
		case 'triangular':
			return { shape, min: round(o.min), mode: round(Math.min(Math.max(o.centre, o.min), o.max)), max: round(o.max) };
		case 'uniform':
			return { shape, min: round(o.min), max: round(o.max) };
		case 'normal':
			return { shape, mean: round(o.centre), sd: round(o.sd) };
		case 'truncated-normal':
			return { shape, mean: round(o.centre), sd: round(o.sd), min: round(o.min), max: round(o.max) };
		case 'lognormal':
			return { shape, mean: round(Math.max(o.centre, Number.EPSILON)), sd: round(o.sd) };
	}
}

/** A distribution's parameters as form text. */
export function paramsToForm(d: Distribution, unit: DriverUnit): Partial<Record<ParamName, string>> {
	const out: Partial<Record<ParamName, string>> = {};
	for (const name of SHAPE_PARAMS[d.shape]) out[name] = String(toFormValue(unit, (d as unknown as Record<ParamName, number>)[name]));
	return out;
}

/** Why a typed parameter cannot be sent, or null. */
export function paramProblem(name: ParamName, text: string | undefined): string | null {
	if (text === undefined || text.trim() === '') return `Enter the ${PARAM_LABELS[name].toLowerCase()}.`;
	const value = Number(text);
	if (!Number.isFinite(value)) return 'Enter a number.';
	if (name === 'sd' && value <= 0) return 'Enter more than 0.';
	return null;
}

/** The distribution a form row stands for, in engine units (numbers unchecked beyond parsing: the schema checks the rest). */
export function distributionFromForm(row: DriverRowForm, unit: DriverUnit): Distribution {
	const value = (name: ParamName) => toEngineValue(unit, Number(row.params[name]));
	const out: Record<string, unknown> = { shape: row.shape };
	for (const name of SHAPE_PARAMS[row.shape]) out[name] = value(name);
	return out as Distribution;
}

/** The form rows for every offered driver: those in the input switched on with their distributions, the rest off with a triangular default. */
export function rowsFromInput(
	choices: readonly { driver: string; unit: DriverUnit; low: number; high: number; baseInput: number }[],
	input: Pick<RunInput, 'drivers'>
): DriverRowForm[] {
	return choices.map((choice) => {
		const drawn = input.drivers.find((d) => d.driver === choice.driver);
		const distribution: Distribution = drawn?.distribution ?? {
			shape: 'triangular',
			min: Math.min(choice.low, choice.baseInput),
			mode: choice.baseInput,
			max: Math.max(choice.high, choice.baseInput)
		};
		return { driver: choice.driver, on: drawn !== undefined, shape: distribution.shape, params: paramsToForm(distribution, choice.unit) };
	});
}
