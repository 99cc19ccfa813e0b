/**
 * Current-speed time series upload: `timestamp,speed_m_s`, one row per
 * measurement, binned on upload into a speed histogram.
 *
 * Each sample stands for the median sampling interval: hours in a bin are
 * (samples in the bin) x (median interval), and the bin's probability is
 * (samples in the bin) / (all samples). Gaps (intervals over 1.5 x the median)
 * therefore add no hours. Rows out of time order are sorted, with a warning;
 * two rows at the same instant fail the upload.
 */
import { Decimal, sum } from '../engine/decimal';
import { binIndexer, DEFAULT_BIN_WIDTH_M_S, type BinIndexer } from './binning';
import { readCsvTable, resolveColumns, type CsvTable } from './csv';
import { DEFAULT_MAX_BYTES } from './decode';
import { numberAt, timestampAt, type Column } from './fields';
import { atMost, SCENARIO_LIMITS } from '../../schemas/scenario-limits';
import { plain, type SpeedHistogramResource } from './fragments';
import { ErrorCollector, fileFailure, type UploadResult } from './result';

export const TIME_SERIES_HEADER = ['timestamp', 'speed_m_s'] as const;

/** More than a year of 1-minute samples (525,600). */
export const DEFAULT_TIME_SERIES_MAX_ROWS = 600_000;

/** An interval longer than this multiple of the median counts as a gap. */
export const GAP_FACTOR = 1.5;

/**
 * Above this the unit is probably not m/s (cm/s or knots); the fastest tidal
 * streams run at about 5 m/s (common practice).
 */
export const PLAUSIBLE_MAX_SPEED_M_S = 6;

/** A histogram longer than the scenario takes is a unit mistake (cm/s) or a bin width far too fine. */
export const MAX_BINS = SCENARIO_LIMITS.speedBins;

/** Shorter records miss part of the lunar month's two spring-neap cycles (common practice). */
const SHORT_RECORD_DAYS = 29.5;

export interface TimeSeriesOptions {
	maxBytes?: number;
	maxRows?: number;
	/** Histogram bin width, m/s (default 0.1). */
	binWidthMS?: number | string;
}

export interface TimeSeriesSummary {
	sampleCount: number;
	/** First and last sample, ISO 8601 in UTC. */
	firstTimestamp: string;
	lastTimestamp: string;
	/** Last minus first sample. */
	recordLengthHours: string;
	recordLengthDays: string;
	/** Median of the intervals between consecutive samples. */
	samplingIntervalSeconds: string;
	/** Intervals longer than 1.5 x the median. */
	gapCount: number;
	/** Time missing in the gaps: the sum over gaps of (interval - median interval). */
	gapTotalHours: string;
	longestGapHours: string;
	/** Samples x median interval: the time the histogram stands for. */
	coveredHours: string;
	/** Covered hours over (record length + one interval), at most 1. */
	dataRecovery: string;
	meanSpeedMS: string;
	maxSpeedMS: string;
	binWidthMS: string;
	/** Rows whose timestamp named no zone and were read as UTC. */
	timestampsReadAsUtc: number;
	/** True when rows were out of time order and have been sorted. */
	sorted: boolean;
	/** The histogram in exact decimals, for the preview table and chart. */
	bins: BinSummary[];
}

export interface BinSummary {
	speedMS: string;
	samples: number;
	hours: string;
	/** samples / all samples */
	probability: string;
}

interface Sample {
	row: number;
	epochMs: number;
	timestampText: string;
	speed: number;
	speedText: string;
}

const MS_PER_HOUR = 3_600_000;
const MS_PER_DAY = 86_400_000;

function median(sortedValues: readonly number[]): number {
	const mid = Math.floor(sortedValues.length / 2);
	return sortedValues.length % 2 === 1
		? sortedValues[mid]
		: (sortedValues[mid - 1] + sortedValues[mid]) / 2;
}

function hoursOf(ms: number): Decimal {
	return new Decimal(ms).div(MS_PER_HOUR);
}

function readSamples(table: CsvTable, timeColumn: Column, speedColumn: Column, errors: ErrorCollector) {
	const samples: Sample[] = [];
	let withoutZone = 0;
	for (const r of table.rows) {
		const time = timestampAt(r, timeColumn, errors);
		const speed = numberAt(r, speedColumn, table.decimalComma, errors, { what: 'a speed', min: 0 });
		if (!time || !speed) continue;
		if (!time.hasZone) withoutZone++;
		samples.push({
			row: r.row,
			epochMs: time.epochMs,
			timestampText: r.cells[timeColumn.index],
			speed: speed.value,
			speedText: speed.text
		});
	}
	return { samples, withoutZone };
}

/**
 * Sorts the samples by time when they are not in order, and reports every
 * repeated instant against the first row with that time, in file order.
 * Returns the first sample found out of order, or null.
 */
function putInTimeOrder(samples: Sample[], timeColumn: Column, errors: ErrorCollector): Sample | null {
	let firstOutOfOrder: Sample | null = null;
	for (let i = 1; i < samples.length; i++) {
		if (samples[i].epochMs < samples[i - 1].epochMs) {
			firstOutOfOrder = samples[i];
			break;
		}
	}
	if (firstOutOfOrder) samples.sort((a, b) => a.epochMs - b.epochMs || a.row - b.row);

	const repeats: { earlier: Sample; later: Sample }[] = [];
	for (let i = 1; i < samples.length; i++) {
		if (samples[i].epochMs !== samples[i - 1].epochMs) continue;
		let first = i - 1;
		while (first > 0 && samples[first - 1].epochMs === samples[i].epochMs) first--;
		repeats.push({ earlier: samples[first], later: samples[i] });
	}
	repeats.sort((a, b) => a.later.row - b.later.row);
	for (const { earlier, later } of repeats) {
		errors.add(
			later.row,
			timeColumn.name,
			`"${later.timestampText}" is the same time as row ${earlier.row}; each time may appear only once.`
		);
	}
	return firstOutOfOrder;
}

/** Median interval and the gaps: intervals over GAP_FACTOR x the median, each missing (interval - median). */
function samplingStatistics(samples: readonly Sample[]) {
	const intervals: number[] = new Array(samples.length - 1);
	for (let i = 1; i < samples.length; i++) intervals[i - 1] = samples[i].epochMs - samples[i - 1].epochMs;
	const intervalMs = median([...intervals].sort((a, b) => a - b));
	let gapCount = 0;
	let gapMs = 0;
	let longestGapMs = 0;
	for (const dt of intervals) {
		if (dt <= GAP_FACTOR * intervalMs) continue;
		gapCount++;
		gapMs += dt - intervalMs;
		longestGapMs = Math.max(longestGapMs, dt - intervalMs);
	}
	return { intervalMs, gapCount, gapMs, longestGapMs };
}

/**
 * Counts samples per bin and turns counts into hours (count x interval) and
 * probabilities (count / samples), for every bin from the lowest occupied to
 * the highest. Hours are (count x interval ms) / ms per hour, one division,
 * so a year of 10-minute samples is exactly 8760 h.
 */
function binSpeeds(samples: readonly Sample[], indexer: BinIndexer, intervalMs: number) {
	const counts = new Map<number, number>();
	for (const s of samples) {
		const k = indexer.indexOf(s.speed, s.speedText);
		counts.set(k, (counts.get(k) ?? 0) + 1);
	}
	const lowest = Math.min(...counts.keys());
	const highest = Math.max(...counts.keys());
	const binCount = highest - lowest + 1;
	if (binCount > MAX_BINS) return { ok: false as const, binCount };

	const n = new Decimal(samples.length);
	const bins: BinSummary[] = [];
	const resourceBins: SpeedHistogramResource['bins'] = [];
	for (let k = lowest; k <= highest; k++) {
		const count = counts.get(k) ?? 0;
		const centre = indexer.centreOf(k);
		const hours = hoursOf(count * intervalMs);
		bins.push({
			speedMS: plain(centre),
			samples: count,
			hours: plain(hours),
			probability: plain(new Decimal(count).div(n))
		});
		resourceBins.push({ speedMPerS: centre.toNumber(), occurrence: hours.toNumber() });
	}
	return { ok: true as const, bins, resourceBins };
}

function makeIndexer(width: number | string | undefined): BinIndexer | null {
	try {
		const indexer = binIndexer(width ?? DEFAULT_BIN_WIDTH_M_S);
		return indexer.width.isFinite() && indexer.width.greaterThan(0) ? indexer : null;
	} catch {
		return null;
	}
}

export function parseTimeSeriesCsv(
	bytes: Uint8Array,
	options: TimeSeriesOptions = {}
): UploadResult<SpeedHistogramResource, TimeSeriesSummary> {
	const indexer = makeIndexer(options.binWidthMS);
	if (!indexer) return fileFailure(`The bin width must be a number above 0 m/s, not ${options.binWidthMS}.`);

	const read = readCsvTable(bytes, {
		maxBytes: options.maxBytes ?? DEFAULT_MAX_BYTES,
		maxRows: options.maxRows ?? DEFAULT_TIME_SERIES_MAX_ROWS
	});
	if (!read.ok) return read;
	const { table } = read;
	const resolved = resolveColumns(table, { required: TIME_SERIES_HEADER }, TIME_SERIES_HEADER);
	if (!resolved.ok) return resolved;
	const timeColumn = resolved.columns.byName.get('timestamp')!;
	const speedColumn = resolved.columns.byName.get('speed_m_s')!;
	const warnings = [...resolved.columns.warnings];

	const errors = new ErrorCollector();
	const { samples, withoutZone } = readSamples(table, timeColumn, speedColumn, errors);
	if (errors.hasErrors) return errors.toFailure();
	if (samples.length < 2) {
		return fileFailure('The file has only one measurement; a time series needs at least two to find its sampling interval.');
	}
	const firstOutOfOrder = putInTimeOrder(samples, timeColumn, errors);
	if (errors.hasErrors) return errors.toFailure();

	const { intervalMs, gapCount, gapMs, longestGapMs } = samplingStatistics(samples);
	const slowest = samples.reduce((low, s) => (s.speed < low.speed ? s : low), samples[0]);
	const fastest = samples.reduce((high, s) => (s.speed > high.speed ? s : high), samples[0]);
	const binned = binSpeeds(samples, indexer, intervalMs);
	if (!binned.ok) {
		return fileFailure(
			`The speeds run from ${slowest.speedText} to ${fastest.speedText} m/s, which would need ` +
				`${binned.binCount.toLocaleString('en')} bins of ${plain(indexer.width)} m/s; a scenario takes ${atMost('speedBins')}. ` +
				'Check the speeds are in m/s, not cm/s or mm/s, or choose wider bins.'
		);
	}

	const first = samples[0];
	const last = samples[samples.length - 1];
	const recordMs = last.epochMs - first.epochMs;
	const recordDays = new Decimal(recordMs).div(MS_PER_DAY);

	if (firstOutOfOrder) {
		warnings.push(
			`Rows are not in time order (row ${firstOutOfOrder.row} is earlier than the row above it); ` +
				'they were sorted by time before binning.'
		);
	}
	if (withoutZone === samples.length) {
		warnings.push('The timestamps name no time zone; they were read as UTC.');
	} else if (withoutZone > 0) {
		warnings.push(
			`${withoutZone} timestamps name no time zone and were read as UTC, while the others name theirs; check they agree.`
		);
	}
	if (fastest.speed > PLAUSIBLE_MAX_SPEED_M_S) {
		warnings.push(
			`The fastest speed is ${fastest.speedText} m/s (row ${fastest.row}), faster than any tidal stream ` +
				`(about ${PLAUSIBLE_MAX_SPEED_M_S} m/s at most): check the speeds are in m/s, not cm/s or knots.`
		);
	}
	if (recordDays.lessThan(SHORT_RECORD_DAYS)) {
		warnings.push(
			`The record covers ${recordDays.toDecimalPlaces(1).toFixed()} days, less than a lunar month: ` +
				'the histogram may not represent a whole year of spring and neap tides.'
		);
	}
	if (gapCount > 0) {
		warnings.push(
			`The record has ${gapCount} ${gapCount === 1 ? 'gap' : 'gaps'} (intervals over ${GAP_FACTOR} x the ` +
				`${intervalMs / 1000} s sampling interval) missing ${hoursOf(gapMs).toDecimalPlaces(1).toFixed()} hours in total.`
		);
	}

	const meanSpeed = sum(samples.map((s) => new Decimal(s.speedText))).div(samples.length);
	// Ratios of whole milliseconds, divided once, so round figures stay round.
	const recovery = Decimal.min(1, new Decimal(samples.length * intervalMs).div(recordMs + intervalMs));

	return {
		ok: true,
		data: { kind: 'speed-histogram', occurrenceBasis: 'hours', bins: binned.resourceBins },
		summary: {
			sampleCount: samples.length,
			firstTimestamp: new Date(first.epochMs).toISOString(),
			lastTimestamp: new Date(last.epochMs).toISOString(),
			recordLengthHours: plain(hoursOf(recordMs)),
			recordLengthDays: plain(recordDays),
			samplingIntervalSeconds: plain(new Decimal(intervalMs).div(1000)),
			gapCount,
			gapTotalHours: plain(hoursOf(gapMs)),
			longestGapHours: plain(hoursOf(longestGapMs)),
			coveredHours: plain(hoursOf(samples.length * intervalMs)),
			dataRecovery: plain(recovery),
			meanSpeedMS: plain(meanSpeed),
			maxSpeedMS: plain(new Decimal(fastest.speedText)),
			binWidthMS: plain(indexer.width),
			timestampsReadAsUtc: withoutZone,
			sorted: firstOutOfOrder !== null,
			bins: binned.bins
		},
		warnings
	};
}
