/**
 * Sensitivity drivers as the form shows them. The engine takes multipliers
 * (1 = base) and fractions; people read "% of base" and per cent, so values
 * are scaled by 100 on the way in and back on the way out. Driver values are
 * plain numbers in the engine's API as well. Safe to import in the browser.
 */

/** The engine's unit of a driver value (DRIVERS[id].unit in the sensitivity module). */
export type DriverUnit = 'x base' | 'fraction' | 'fraction/yr' | 'years' | 'devices';

export interface DriverChoice {
	driver: string;
	label: string;
	unit: DriverUnit;
	/** The driver's value in the saved scenario, in engine units. */
	baseInput: number;
	low: number;
	high: number;
	/** Among the usual screening set, chosen at first. */
	usual: boolean;
}

const percentUnits: Record<DriverUnit, string | null> = {
	'x base': '% of base',
	fraction: '%',
	'fraction/yr': '%/yr',
	years: null,
	devices: null
};

export function formUnit(unit: DriverUnit): string {
	return percentUnits[unit] ?? unit;
}

function isPercent(unit: DriverUnit): boolean {
	return typeof percentUnits[unit] === 'string';
}

/** Rounds away float noise (0.9600000000000001 -> 0.96) without losing a typed value. */
function tidy(x: number): number {
	return Math.round(x * 1e9) / 1e9;
}

export function toFormValue(unit: DriverUnit, engineValue: number): number {
	return tidy(isPercent(unit) ? engineValue * 100 : engineValue);
}

export function toEngineValue(unit: DriverUnit, formValue: number): number {
	return tidy(isPercent(unit) ? formValue / 100 : formValue);
}

/** A driver value for the table: "80 % of base", "5.5 %/yr", "25 years". */
export function describeInput(unit: DriverUnit, engineValue: number): string {
	const value = toFormValue(unit, engineValue);
	const text = Number.isInteger(value) ? String(value) : value.toFixed(unit === 'x base' ? 0 : 2).replace(/\.?0+$/, '');
	return `${text.replace('-', '−')} ${formUnit(unit)}`;
}

/** Why a typed value (form units) cannot be sent, or null when it can. */
export function inputProblem(unit: DriverUnit, text: string): string | null {
	if (text.trim() === '') return 'Enter a value.';
	const value = Number(text);
	if (!Number.isFinite(value)) return 'Enter a number.';
	switch (unit) {
		case 'x base':
			return value <= 0 ? 'Enter more than 0 % of base.' : value > 500 ? 'Enter at most 500 % of base.' : null;
		case 'fraction':
			return value < 0 || value > 100 ? 'Enter a share from 0 to 100 %.' : null;
		case 'fraction/yr':
			return value < -50 || value > 100 ? 'Enter a rate from −50 to 100 %/yr.' : null;
		case 'years':
			return value < 1 || !Number.isInteger(value) ? 'Enter whole years, at least 1.' : null;
		case 'devices':
			return value < 1 || !Number.isInteger(value) ? 'Enter a whole number of devices, at least 1.' : null;
		default:
			return null;
	}
}
