/**
 * Power curve upload: `speed_m_s,power_kW`, speeds strictly increasing down
 * the file (the engine interpolates between neighbouring rows, so order is
 * meaning, not presentation: a row out of order is refused, not sorted).
 * Produces the scenario's `power-curve` device.
 */
import { Decimal } from '../engine/decimal';
import { readCsvTable, resolveColumns } from './csv';
import { DEFAULT_MAX_BYTES } from './decode';
import { numberAt } from './fields';
import { beyondScenarioLimit } from './limits';
import { plain, type PowerCurveDevice } from './fragments';
import { ErrorCollector, fileFailure, type UploadResult } from './result';
import { DEFAULT_TABLE_MAX_ROWS } from './speed-histogram';

export const POWER_CURVE_HEADER = ['speed_m_s', 'power_kW'] as const;

export interface PowerCurveOptions {
	maxBytes?: number;
	maxRows?: number;
}

export interface PowerCurveSummary {
	pointCount: number;
	minSpeedMS: string;
	maxSpeedMS: string;
	/** Highest power on the curve. */
	ratedPowerKW: string;
	/** Lowest speed at which the curve reaches its highest power. */
	ratedSpeedMS: string;
	/** Lowest speed with power above 0 (null when the first row already has power). */
	cutInSpeedMS: string | null;
	/** First speed above rated speed where power falls back to 0 (null when it never does). */
	cutOutSpeedMS: string | null;
}

interface Point {
	row: number;
	speed: number;
	speedText: string;
	power: number;
	powerText: string;
}

export function parsePowerCurveCsv(
	bytes: Uint8Array,
	options: PowerCurveOptions = {}
): UploadResult<PowerCurveDevice, PowerCurveSummary> {
	const read = readCsvTable(bytes, {
		maxBytes: options.maxBytes ?? DEFAULT_MAX_BYTES,
		maxRows: options.maxRows ?? DEFAULT_TABLE_MAX_ROWS
	});
	if (!read.ok) return read;
	const { table } = read;
	const tooMany = beyondScenarioLimit('powerCurvePoints', table.rows.length, 'rows (one power-curve point each)');
	if (tooMany) return tooMany;
	const resolved = resolveColumns(table, { required: POWER_CURVE_HEADER }, POWER_CURVE_HEADER);
	if (!resolved.ok) return resolved;
	const speedColumn = resolved.columns.byName.get('speed_m_s')!;
	const powerColumn = resolved.columns.byName.get('power_kw')!;
	const warnings = [...resolved.columns.warnings];

	const errors = new ErrorCollector();
	const points: Point[] = [];
	let previous: { row: number; speed: number; speedText: string } | null = null;
	for (const r of table.rows) {
		const speed = numberAt(r, speedColumn, table.decimalComma, errors, { what: 'a speed', min: 0 });
		const power = numberAt(r, powerColumn, table.decimalComma, errors, { what: 'a power', min: 0 });
		if (speed && previous && speed.value <= previous.speed) {
			const relation = speed.value === previous.speed ? 'repeats' : 'is below';
			errors.add(
				r.row,
				speedColumn.name,
				`${speed.text} m/s ${relation} the speed on row ${previous.row} (${previous.speedText} m/s); ` +
					'speeds must increase down the column.'
			);
		}
		if (speed) previous = { row: r.row, speed: speed.value, speedText: speed.text };
		if (!speed || !power) continue;
		points.push({ row: r.row, speed: speed.value, speedText: speed.text, power: power.value, powerText: power.text });
	}
	if (errors.hasErrors) return errors.toFailure();
	if (points.length < 2) return fileFailure('A power curve needs at least two rows (two speeds).');

	const rated = points.reduce((best, p) => (p.power > best.power ? p : best), points[0]);
	if (rated.power === 0) return fileFailure(`Column "${powerColumn.name}": every power is 0.`);

	const firstProducing = points.findIndex((p) => p.power > 0);
	const cutIn = firstProducing > 0 ? points[firstProducing] : null;
	const cutOut = points.find((p) => p.speed > rated.speed && p.power === 0) ?? null;
	if (points[0].power > 0 && points[0].speed > 0) {
		warnings.push(
			`The curve starts with power at ${points[0].speedText} m/s; below that speed the device is taken to produce nothing.`
		);
	}

	return {
		ok: true,
		data: {
			kind: 'power-curve',
			points: points.map((p) => ({ speedMPerS: p.speed, powerKW: p.power }))
		},
		summary: {
			pointCount: points.length,
			minSpeedMS: plain(new Decimal(points[0].speedText)),
			maxSpeedMS: plain(new Decimal(points[points.length - 1].speedText)),
			ratedPowerKW: plain(new Decimal(rated.powerText)),
			ratedSpeedMS: plain(new Decimal(rated.speedText)),
			cutInSpeedMS: cutIn ? plain(new Decimal(cutIn.speedText)) : null,
			cutOutSpeedMS: cutOut ? plain(new Decimal(cutOut.speedText)) : null
		},
		warnings
	};
}
