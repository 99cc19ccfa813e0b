/**
 * Speed histogram upload: `speed_m_s` (bin centre) with either `hours` or
 * `probability`. Produces the scenario's `speed-histogram` resource. Rows may
 * come in any order (they are sorted, with a warning); a bin speed may appear
 * only once.
 */
import { Decimal, ZERO } from '../engine/decimal';
import { readCsvTable, resolveColumns } from './csv';
import { DEFAULT_MAX_BYTES } from './decode';
import { numberAt, type Column } from './fields';
import { beyondScenarioLimit } from './limits';
import { plain, type SpeedHistogramResource } from './fragments';
import {
	checkOccurrenceTotal,
	DEFAULT_PROBABILITY_TOLERANCE,
	readOccurrence,
	shares,
	type Occurrence,
	type OccurrenceBasis
} from './occurrence';
import { ErrorCollector, failure, type UploadResult } from './result';

export const SPEED_HISTOGRAM_HEADER = ['speed_m_s', 'hours'] as const;
export const DEFAULT_TABLE_MAX_ROWS = 10_000;

export interface SpeedHistogramOptions {
	maxBytes?: number;
	maxRows?: number;
	/** How far from 1 the probabilities may sum before the upload is refused (default 0.01). */
	probabilityTolerance?: number;
}

export interface SpeedHistogramSummary {
	binCount: number;
	occurrenceBasis: OccurrenceBasis;
	/** Sum of the occurrence column: hours, or probabilities as given. */
	occurrenceTotal: string;
	minSpeedMS: string;
	maxSpeedMS: string;
	/** Time-weighted mean of the bin speeds: sum(p_i v_i) with p_i = x_i / sum(x). */
	meanSpeedMS: string;
	sorted: boolean;
}

interface BinRow {
	row: number;
	speed: number;
	speedExact: Decimal;
	occurrence: Occurrence;
}

/** Reads a bin-speed column, refusing a speed that already appeared. */
export function readUniqueSpeed(
	r: { row: number; cells: string[] },
	column: Column,
	decimalComma: boolean,
	errors: ErrorCollector,
	firstRowOfSpeed: Map<number, number>
) {
	const speed = numberAt(r, column, decimalComma, errors, { what: 'a speed', min: 0 });
	if (!speed) return null;
	const earlier = firstRowOfSpeed.get(speed.value);
	if (earlier !== undefined) {
		errors.add(r.row, column.name, `the speed ${speed.text} m/s already appears on row ${earlier}.`);
		return null;
	}
	firstRowOfSpeed.set(speed.value, r.row);
	return speed;
}

export function parseSpeedHistogramCsv(
	bytes: Uint8Array,
	options: SpeedHistogramOptions = {}
): UploadResult<SpeedHistogramResource, SpeedHistogramSummary> {
	const read = readCsvTable(bytes, {
		maxBytes: options.maxBytes ?? DEFAULT_MAX_BYTES,
		maxRows: options.maxRows ?? DEFAULT_TABLE_MAX_ROWS
	});
	if (!read.ok) return read;
	const { table } = read;
	const tooMany = beyondScenarioLimit('speedBins', table.rows.length, 'rows (one speed bin each)');
	if (tooMany) return tooMany;
	const resolved = resolveColumns(
		table,
		{ required: ['speed_m_s'], oneOf: [['hours', 'probability']] },
		SPEED_HISTOGRAM_HEADER
	);
	if (!resolved.ok) return resolved;
	const { byName, chosen } = resolved.columns;
	const basis = chosen[0] as OccurrenceBasis;
	const speedColumn = byName.get('speed_m_s')!;
	const occurrenceColumn = byName.get(basis)!;
	const warnings = [...resolved.columns.warnings];

	const errors = new ErrorCollector();
	const bins: BinRow[] = [];
	const firstRowOfSpeed = new Map<number, number>();
	for (const r of table.rows) {
		const speed = readUniqueSpeed(r, speedColumn, table.decimalComma, errors, firstRowOfSpeed);
		const occurrence = readOccurrence(r, occurrenceColumn, basis, table.decimalComma, errors);
		if (!speed || !occurrence) continue;
		bins.push({ row: r.row, speed: speed.value, speedExact: new Decimal(speed.text), occurrence });
	}
	if (errors.hasErrors) return errors.toFailure();

	const sorted = bins.some((b, i) => i > 0 && b.speed < bins[i - 1].speed);
	if (sorted) {
		bins.sort((a, b) => a.speed - b.speed);
		warnings.push('The bins were not in order of speed; they were sorted.');
	}

	const occurrences = bins.map((b) => b.occurrence);
	const total = checkOccurrenceTotal(
		occurrences,
		basis,
		occurrenceColumn,
		options.probabilityTolerance ?? DEFAULT_PROBABILITY_TOLERANCE,
		warnings
	);
	if (!total.ok) return failure([total.error]);

	const p = shares(occurrences, total.total);
	const meanSpeed = bins.reduce((acc, b, i) => acc.plus(b.speedExact.times(p[i])), ZERO);

	return {
		ok: true,
		data: {
			kind: 'speed-histogram',
			occurrenceBasis: basis,
			bins: bins.map((b) => ({ speedMPerS: b.speed, occurrence: b.occurrence.value }))
		},
		summary: {
			binCount: bins.length,
			occurrenceBasis: basis,
			occurrenceTotal: plain(total.total),
			minSpeedMS: plain(bins[0].speedExact),
			maxSpeedMS: plain(bins[bins.length - 1].speedExact),
			meanSpeedMS: plain(meanSpeed),
			sorted
		},
		warnings
	};
}
