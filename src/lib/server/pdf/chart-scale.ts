/**
 * Axis arithmetic for the summary's charts: round tick steps (1, 2 or 5
 * times a power of ten) and tick labels. Floats, for drawing only.
 */

export interface Ticks {
	min: number;
	max: number;
	step: number;
	values: number[];
}

/**
 * Ticks covering [min, max] in about `count` round steps, the rough step
 * rounded at 1.5, 3 and 7 (Heckbert, "Nice numbers for graph labels",
 * Graphics Gems, 1990); a flat range is widened so the axis has height.
 */
export function niceTicks(min: number, max: number, count = 5): Ticks {
	let lo = Math.min(min, max);
	let hi = Math.max(min, max);
	if (!Number.isFinite(lo) || !Number.isFinite(hi)) {
		lo = 0;
		hi = 1;
	}
	if (hi - lo < 1e-12) {
		const pad = Math.abs(hi) > 1e-12 ? Math.abs(hi) * 0.1 : 1;
		lo -= pad;
		hi += pad;
	}
	const rough = (hi - lo) / Math.max(1, count);
	const magnitude = 10 ** Math.floor(Math.log10(rough));
	const normalised = rough / magnitude;
	const step = (normalised < 1.5 ? 1 : normalised < 3 ? 2 : normalised < 7 ? 5 : 10) * magnitude;
	const first = Math.floor(lo / step + 1e-9) * step;
	const last = Math.ceil(hi / step - 1e-9) * step;
	const values: number[] = [];
	for (let v = first; v <= last + step / 2; v += step) values.push(Math.abs(v) < step * 1e-9 ? 0 : v);
	return { min: first, max: last, step, values };
}

/** Decimals a tick label needs at this step: 0 for 5, 1 for 0.5, 2 for 0.25 steps' 0.05 parts. */
export function stepPlaces(step: number): number {
	if (step >= 1) return 0;
	return Math.min(6, Math.ceil(-Math.log10(step) - 1e-9));
}

const formats = new Map<number, Intl.NumberFormat>();

/** A tick label: grouped, at the step's decimals, with a true minus sign. */
export function tickLabel(value: number, step: number): string {
	const places = stepPlaces(step);
	let format = formats.get(places);
	if (!format) {
		format = new Intl.NumberFormat('en-GB', { minimumFractionDigits: places, maximumFractionDigits: places });
		formats.set(places, format);
	}
	return format.format(Math.abs(value) < step * 1e-9 ? 0 : value).replace('-', '−');
}

/** A linear map from data to page coordinates. */
export function linearScale(domain: readonly [number, number], range: readonly [number, number]): (value: number) => number {
	const [d0, d1] = domain;
	const [r0, r1] = range;
	const span = d1 - d0 === 0 ? 1 : d1 - d0;
	return (value) => r0 + ((value - d0) / span) * (r1 - r0);
}

/** Every how many categories a label fits, given the room per category and the widest label. */
export function labelEvery(categoryWidth: number, widestLabel: number, gap = 6): number {
	if (categoryWidth <= 0) return 1;
	return Math.max(1, Math.ceil((widestLabel + gap) / categoryWidth));
}
