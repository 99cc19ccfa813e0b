/**
 * The downloadable templates in static/templates/ must be what the parsers
 * expect: each parses with no errors, into a fragment the scenario schema takes.
 */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { deviceSchema, resourceSchema } from '../../schemas/scenario';
import { isUploadKind, UPLOAD_KINDS } from './index';
import { POWER_CURVE_HEADER } from './power-curve';
import { POWER_MATRIX_CORNER } from './power-matrix';
import { SEA_STATE_TABLE_HEADER } from './sea-state-table';
import { SPEED_HISTOGRAM_HEADER } from './speed-histogram';
import { TIME_SERIES_HEADER } from './time-series';

const staticDir = resolve(import.meta.dirname, '../../../../static');
const template = (path: string) => readFileSync(resolve(staticDir, `.${path}`));
const firstLine = (path: string) => template(path).toString('utf8').split('\n')[0];

describe('upload templates', () => {
	for (const [kind, spec] of Object.entries(UPLOAD_KINDS)) {
		it(`${kind}: parses cleanly into a scenario ${spec.target}`, () => {
			const result = spec.parse(template(spec.template));
			if (!result.ok) throw new Error(JSON.stringify(result.errors));
			const schema = spec.target === 'resource' ? resourceSchema : deviceSchema;
			expect(schema.parse(result.data)).toEqual(result.data);
			// The matrix template leaves impossible (too steep) sea states blank on purpose, to show the convention.
			const expected = kind === 'power-matrix' ? [expect.stringMatching(/^27 blank cells were read as 0 kW/)] : [];
			expect(result.warnings).toEqual(expected);
		});
	}

	it('use exactly the header names the parsers ask for', () => {
		expect(firstLine(UPLOAD_KINDS['current-speed-time-series'].template)).toBe(TIME_SERIES_HEADER.join(','));
		expect(firstLine(UPLOAD_KINDS['speed-histogram'].template)).toBe(SPEED_HISTOGRAM_HEADER.join(','));
		expect(firstLine(UPLOAD_KINDS['power-curve'].template)).toBe(POWER_CURVE_HEADER.join(','));
		expect(firstLine(UPLOAD_KINDS['sea-state-table'].template)).toBe(SEA_STATE_TABLE_HEADER.join(','));
		expect(firstLine(UPLOAD_KINDS['power-matrix'].template).split(',')[0]).toBe(POWER_MATRIX_CORNER);
	});

	it('stay small', () => {
		for (const spec of Object.values(UPLOAD_KINDS)) {
			expect(template(spec.template).byteLength).toBeLessThan(150 * 1024);
		}
	});

	it('a month of 10-minute samples: 4320 rows, 720 h, no gaps', () => {
		// 30 days x 144 ten-minute samples = 4320; 4320 x 1/6 h = 720 h (IEC TS 62600-200 uses 600 s averages, from memory).
		const result = UPLOAD_KINDS['current-speed-time-series'].parse(
			template(UPLOAD_KINDS['current-speed-time-series'].template)
		);
		if (!result.ok) throw new Error('template refused');
		expect(result.summary).toMatchObject({ sampleCount: 4320, coveredHours: '720', gapCount: 0, samplingIntervalSeconds: '600' });
	});
});

describe('isUploadKind', () => {
	it('knows the five kinds and nothing else', () => {
		expect(Object.keys(UPLOAD_KINDS)).toHaveLength(5);
		expect(isUploadKind('power-matrix')).toBe(true);
		expect(isUploadKind('toString')).toBe(false);
		expect(isUploadKind('xlsx')).toBe(false);
	});
});
