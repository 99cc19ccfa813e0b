/**
 * The upload kinds, their parsers and templates, for the route layer: pass the
 * uploaded bytes and the kind, get the scenario fragment or the errors.
 */
import type { UploadKind } from '../../schemas/workbench';
import { parsePowerCurveCsv } from './power-curve';
import { parsePowerMatrixCsv } from './power-matrix';
import { parseSeaStateTableCsv } from './sea-state-table';
import { parseSpeedHistogramCsv } from './speed-histogram';
import { parseTimeSeriesCsv } from './time-series';

export const UPLOAD_KINDS = {
	'current-speed-time-series': {
		label: 'Current-speed time series',
		target: 'resource',
		template: '/templates/current-speed-time-series.csv',
		parse: parseTimeSeriesCsv
	},
	'speed-histogram': {
		label: 'Speed histogram',
		target: 'resource',
		template: '/templates/speed-histogram.csv',
		parse: parseSpeedHistogramCsv
	},
	'power-curve': {
		label: 'Power curve',
		target: 'device',
		template: '/templates/power-curve.csv',
		parse: parsePowerCurveCsv
	},
	'sea-state-table': {
		label: 'Wave sea-state table',
		target: 'resource',
		template: '/templates/sea-state-table.csv',
		parse: parseSeaStateTableCsv
	},
	'power-matrix': {
		label: 'Wave power matrix',
		target: 'device',
		template: '/templates/power-matrix.csv',
		parse: parsePowerMatrixCsv
	}
} as const satisfies Record<UploadKind, { label: string; target: 'resource' | 'device'; template: string; parse: unknown }>;

export type { UploadKind };

export function isUploadKind(value: string): value is UploadKind {
	return Object.hasOwn(UPLOAD_KINDS, value);
}

export type { UploadError, UploadResult } from './result';
export { DEFAULT_MAX_BYTES } from './decode';
export { parsePowerCurveCsv, parsePowerMatrixCsv, parseSeaStateTableCsv, parseSpeedHistogramCsv, parseTimeSeriesCsv };
