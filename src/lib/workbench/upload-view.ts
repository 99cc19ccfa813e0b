/**
 * How the upload preview reads a parsed file: a few facts from the parser's
 * summary, and the rows as a table (and a chart) or a grid.
 */
import { uploadKindInfo } from '../schemas/workbench';
import type { UploadJson } from './api-types';
import { formatDateTime, formatNumber, formatPercent } from './format';

type Fact = { label: string; value: string };

type Shape =
	| { type: 'histogram'; columns: string[]; cells: string[][]; rows: { speed: number; occurrence: number }[]; occurrenceLabel: string }
	| { type: 'curve'; columns: string[]; cells: string[][]; rows: { speed: number; power: number }[] }
	| { type: 'grid'; caption: string; rowLabel: string; columnLabel: string; rows: number[]; columns: number[]; cells: (number | null)[][]; digits: number };

export interface UploadFacts {
	title: string;
	section: 'resource' | 'device';
	facts: Fact[];
	shape: Shape;
}

type Summary = Record<string, unknown>;
const text = (s: Summary, key: string) => (s[key] === null || s[key] === undefined ? '—' : String(s[key]));
const num = (s: Summary, key: string, digits: number, unit = '') => {
	const value = s[key];
	if (value === null || value === undefined) return '—';
	return `${formatNumber(String(value), digits)}${unit ? ` ${unit}` : ''}`;
};

interface HistogramData {
	occurrenceBasis: 'hours' | 'probability';
	bins: { speedMPerS: number; occurrence: number }[];
}
interface CurveData {
	points: { speedMPerS: number; powerKW: number }[];
}
interface SeaStateData {
	periodType: 'energy-period' | 'peak-period';
	occurrenceBasis: 'hours' | 'probability';
	states: { hsM: number; periodS: number; occurrence: number }[];
}
interface MatrixData {
	periodType: 'energy-period' | 'peak-period';
	hsM: number[];
	periodS: number[];
	powerKW: number[][];
}
interface SeriesBin {
	speedMS: string;
	samples: number;
	hours: string;
	probability: string;
}

function histogram(data: HistogramData): Shape {
	const hours = data.occurrenceBasis === 'hours';
	return {
		type: 'histogram',
		columns: ['Speed (m/s)', hours ? 'Hours (h/yr)' : 'Probability'],
		cells: data.bins.map((b) => [formatNumber(b.speedMPerS, 2), formatNumber(b.occurrence, hours ? 1 : 4)]),
		rows: data.bins.map((b) => ({ speed: b.speedMPerS, occurrence: b.occurrence })),
		occurrenceLabel: hours ? 'Hours' : 'Probability'
	};
}

export function describeUpload(upload: UploadJson): UploadFacts {
	const { label: title, section } = uploadKindInfo[upload.kind];
	const s = upload.summary;
	switch (upload.kind) {
		case 'current-speed-time-series': {
			const bins = (s.bins as SeriesBin[] | undefined) ?? [];
			return {
				title,
				section,
				facts: [
					{ label: 'Samples', value: num(s, 'sampleCount', 0) },
					{ label: 'Record length', value: `${num(s, 'recordLengthDays', 1)} days` },
					{ label: 'First sample', value: formatDateTime(text(s, 'firstTimestamp')) },
					{ label: 'Last sample', value: formatDateTime(text(s, 'lastTimestamp')) },
					{ label: 'Sampling interval', value: num(s, 'samplingIntervalSeconds', 0, 's') },
					{ label: 'Gaps', value: `${num(s, 'gapCount', 0)} (${num(s, 'gapTotalHours', 1, 'h')})` },
					{ label: 'Longest gap', value: num(s, 'longestGapHours', 1, 'h') },
					{ label: 'Data recovery', value: formatPercent(text(s, 'dataRecovery'), 1) },
					{ label: 'Mean speed', value: num(s, 'meanSpeedMS', 3, 'm/s') },
					{ label: 'Highest speed', value: num(s, 'maxSpeedMS', 2, 'm/s') },
					{ label: 'Bin width', value: num(s, 'binWidthMS', 2, 'm/s') }
				],
				shape: {
					type: 'histogram',
					columns: ['Speed (m/s)', 'Samples', 'Hours', 'Probability'],
					cells: bins.map((b) => [formatNumber(b.speedMS, 2), formatNumber(b.samples), formatNumber(b.hours, 1), formatNumber(b.probability, 4)]),
					rows: bins.map((b) => ({ speed: Number(b.speedMS), occurrence: Number(b.hours) })),
					occurrenceLabel: 'Hours in the record'
				}
			};
		}
		case 'speed-histogram':
			return {
				title,
				section,
				facts: [
					{ label: 'Bins', value: num(s, 'binCount', 0) },
					{ label: 'Occurrences as', value: text(s, 'occurrenceBasis') },
					{ label: 'Occurrence total', value: num(s, 'occurrenceTotal', 2) },
					{ label: 'Speeds', value: `${num(s, 'minSpeedMS', 2)} to ${num(s, 'maxSpeedMS', 2, 'm/s')}` },
					{ label: 'Mean speed', value: num(s, 'meanSpeedMS', 3, 'm/s') }
				],
				shape: histogram(upload.data as HistogramData)
			};
		case 'power-curve': {
			const data = upload.data as CurveData;
			return {
				title,
				section,
				facts: [
					{ label: 'Points', value: num(s, 'pointCount', 0) },
					{ label: 'Rated power', value: num(s, 'ratedPowerKW', 0, 'kW') },
					{ label: 'Rated speed', value: num(s, 'ratedSpeedMS', 2, 'm/s') },
					{ label: 'Cut-in speed', value: num(s, 'cutInSpeedMS', 2, 'm/s') },
					{ label: 'Cut-out speed', value: num(s, 'cutOutSpeedMS', 2, 'm/s') }
				],
				shape: {
					type: 'curve',
					columns: ['Speed (m/s)', 'Power (kW)'],
					cells: data.points.map((p) => [formatNumber(p.speedMPerS, 2), formatNumber(p.powerKW, 1)]),
					rows: data.points.map((p) => ({ speed: p.speedMPerS, power: p.powerKW }))
				}
			};
		}
		case 'sea-state-table': {
			const data = upload.data as SeaStateData;
			const hs = [...new Set(data.states.map((st) => st.hsM))].sort((a, b) => a - b);
			const periods = [...new Set(data.states.map((st) => st.periodS))].sort((a, b) => a - b);
			const cells = hs.map((h) => periods.map((p) => data.states.find((st) => st.hsM === h && st.periodS === p)?.occurrence ?? null));
			const period = data.periodType === 'peak-period' ? 'Tp (s)' : 'Te (s)';
			return {
				title,
				section,
				facts: [
					{ label: 'Sea states', value: num(s, 'stateCount', 0) },
					{ label: 'Occurrences as', value: text(s, 'occurrenceBasis') },
					{ label: 'Occurrence total', value: num(s, 'occurrenceTotal', 2) },
					{ label: 'Hs range', value: `${num(s, 'minHsM', 1)} to ${num(s, 'maxHsM', 1, 'm')}` },
					{ label: 'Period range', value: `${num(s, 'minPeriodS', 1)} to ${num(s, 'maxPeriodS', 1, 's')}` }
				],
				shape: { type: 'grid', caption: `Occurrence by Hs and ${period}`, rowLabel: 'Hs (m)', columnLabel: period, rows: hs, columns: periods, cells, digits: data.occurrenceBasis === 'hours' ? 1 : 4 }
			};
		}
		case 'power-matrix': {
			const data = upload.data as MatrixData;
			const period = data.periodType === 'peak-period' ? 'Tp (s)' : 'Te (s)';
			return {
				title,
				section,
				facts: [
					{ label: 'Hs rows', value: num(s, 'hsCount', 0) },
					{ label: 'Period columns', value: num(s, 'periodCount', 0) },
					{ label: 'Rated power', value: num(s, 'ratedPowerKW', 0, 'kW') },
					{ label: 'Operating cells', value: num(s, 'operatingCells', 0) },
					{ label: 'Blank cells (0 kW)', value: num(s, 'blankCells', 0) }
				],
				shape: { type: 'grid', caption: `Power (kW) by Hs and ${period}`, rowLabel: 'Hs (m)', columnLabel: period, rows: data.hsM, columns: data.periodS, cells: data.powerKW, digits: 0 }
			};
		}
	}
}
