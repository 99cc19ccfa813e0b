import { describe, expect, it } from 'vitest';
import { resourceSchema } from '../../schemas/scenario';
import { parseTimeSeriesCsv } from './time-series';

const csv = (...lines: string[]) => Buffer.from(lines.join('\n') + '\n', 'utf8');

function parsed(bytes: Uint8Array, options = {}) {
	const result = parseTimeSeriesCsv(bytes, options);
	if (!result.ok) throw new Error(JSON.stringify(result.errors));
	return result;
}
function messages(bytes: Uint8Array, options = {}): string[] {
	const result = parseTimeSeriesCsv(bytes, options);
	if (result.ok) throw new Error('expected the upload to be refused');
	return result.errors.map((e) => e.message);
}

// Six 10-minute samples with one 30-minute interval (a gap) between 00:30 and 01:00.
const SMALL = csv(
	'timestamp,speed_m_s',
	'2025-01-01T00:00:00Z,0.04',
	'2025-01-01T00:10:00Z,0.05',
	'2025-01-01T00:20:00Z,0.149',
	'2025-01-01T00:30:00Z,0.15',
	'2025-01-01T01:00:00Z,0.25',
	'2025-01-01T01:10:00Z,1.0'
);

describe('parseTimeSeriesCsv: binning and summary', () => {
	it('bins speeds into 0.1 m/s bins centred on multiples of 0.1, hours = samples x median interval', () => {
		// Hand calculation. Bin k holds [(k - 0.5) 0.1, (k + 0.5) 0.1):
		//   0.04 -> 0.0; 0.05 and 0.149 -> 0.1; 0.15 -> 0.2; 0.25 -> 0.3; 1.0 -> 1.0; 0.4..0.9 empty.
		// Intervals 10, 10, 10, 30, 10 min: median 10 min, so each sample stands for 1/6 h.
		const { data, summary } = parsed(SMALL);
		expect(summary.bins.map((b) => [b.speedMS, b.samples])).toEqual([
			['0', 1], ['0.1', 2], ['0.2', 1], ['0.3', 1], ['0.4', 0], ['0.5', 0],
			['0.6', 0], ['0.7', 0], ['0.8', 0], ['0.9', 0], ['1', 1]
		]);
		expect(summary.bins[1].hours).toBe('0.333333333333333333333333333333'); // 2 x 10 min = 1/3 h
		expect(summary.bins[1].probability).toBe('0.333333333333333333333333333333'); // 2 of 6 samples
		expect(summary.bins[0].hours).toBe(summary.bins[2].hours);
		expect(data.bins[1]).toEqual({ speedMPerS: 0.1, occurrence: 1 / 3 });
		expect(data.occurrenceBasis).toBe('hours');
	});

	it('reports record length, median interval, gaps, mean and max', () => {
		// Hand calculation: first 00:00, last 01:10 -> 70 min = 7/6 h. One interval (30 min) exceeds
		// 1.5 x 10 min; it misses 30 - 10 = 20 min = 1/3 h. Covered 6 x 10 min = 1 h; recovery
		// 1 h / (70 + 10 min) = 0.75. Mean (0.04 + 0.05 + 0.149 + 0.15 + 0.25 + 1.0) / 6 = 1.639 / 6.
		const { summary, warnings } = parsed(SMALL);
		expect(summary).toMatchObject({
			sampleCount: 6,
			firstTimestamp: '2025-01-01T00:00:00.000Z',
			lastTimestamp: '2025-01-01T01:10:00.000Z',
			recordLengthHours: '1.16666666666666666666666666667',
			samplingIntervalSeconds: '600',
			gapCount: 1,
			gapTotalHours: '0.333333333333333333333333333333',
			longestGapHours: '0.333333333333333333333333333333',
			coveredHours: '1',
			dataRecovery: '0.75',
			meanSpeedMS: '0.273166666666666666666666666667',
			maxSpeedMS: '1',
			binWidthMS: '0.1',
			timestampsReadAsUtc: 0,
			sorted: false
		});
		expect(warnings).toContain(
			'The record has 1 gap (intervals over 1.5 x the 600 s sampling interval) missing 0.3 hours in total.'
		);
		expect(warnings.some((w) => w.startsWith('The record covers 0 days, less than a lunar month'))).toBe(true);
	});

	it('gives exactly 8760 hours for a year of 10-minute samples', () => {
		// 365 days x 144 samples a day = 52,560 samples x 1/6 h = 8760 h (hand calculation).
		const start = Date.UTC(2025, 0, 1);
		const lines = ['timestamp,speed_m_s'];
		for (let i = 0; i < 52_560; i++) {
			lines.push(`${new Date(start + i * 600_000).toISOString()},${((i % 30) / 10).toFixed(1)}`);
		}
		const { summary, data, warnings } = parsed(csv(...lines));
		expect(summary.coveredHours).toBe('8760');
		expect(summary.recordLengthDays).toBe('364.993055555555555555555555556'); // (52,560 - 1) / 144
		expect(summary.gapCount).toBe(0);
		// Speeds 0.0 .. 2.9 each 1,752 times: 1,752 x 1/6 h = 292 h per bin; mean 1.45 m/s.
		expect(data.bins).toHaveLength(30);
		expect(data.bins.every((b) => b.occurrence === 292)).toBe(true);
		expect(summary.meanSpeedMS).toBe('1.45');
		expect(warnings).toEqual([]);
	});

	it('takes the bin width as a parameter', () => {
		const { summary } = parsed(SMALL, { binWidthMS: 0.5 });
		// 0.5 m/s bins: bin 0 is [-0.25, 0.25), bin 0.5 is [0.25, 0.75), bin 1 is [0.75, 1.25).
		// Bin 0 holds 0.04, 0.05, 0.149, 0.15 (4); 0.25 is the lower edge of bin 0.5 (1); 1.0 is in bin 1 (1).
		expect(summary.bins.map((b) => [b.speedMS, b.samples])).toEqual([['0', 4], ['0.5', 1], ['1', 1]]);
		expect(summary.binWidthMS).toBe('0.5');
	});

	it('refuses a histogram of more than 1000 bins (speeds in cm/s, or bins far too narrow)', () => {
		expect(messages(csv('timestamp,speed_m_s', '2025-01-01T00:00Z,0', '2025-01-01T00:10Z,150'))).toEqual([
			'The speeds run from 0 to 150 m/s, which would need 1,501 bins of 0.1 m/s; a scenario takes at most 1000 speed bins. Check the speeds are in m/s, not cm/s or mm/s, or choose wider bins.'
		]);
		expect(messages(SMALL, { binWidthMS: '0.0001' })[0]).toMatch(/would need 9,601 bins of 0\.0001 m\/s/);
	});

	it('refuses a bin width that is not above 0', () => {
		expect(messages(SMALL, { binWidthMS: 0 })).toEqual(['The bin width must be a number above 0 m/s, not 0.']);
		expect(messages(SMALL, { binWidthMS: 'wide' })).toEqual(['The bin width must be a number above 0 m/s, not wide.']);
	});

	it('produces a resource the scenario schema accepts unchanged', () => {
		const { data } = parsed(SMALL);
		expect(resourceSchema.parse(data)).toEqual(data);
	});

	it('accepts a UTF-8 BOM, CRLF line endings, zones and zone-less times', () => {
		const bytes = Buffer.concat([
			Buffer.from([0xef, 0xbb, 0xbf]),
			Buffer.from('timestamp,speed_m_s\r\n2025-01-01 00:00,1.0\r\n2025-01-01T01:10:00+01:00,1.2\r\n')
		]);
		// 01:10+01:00 is 00:10 UTC: ten minutes after the first sample.
		const { summary, warnings } = parsed(bytes);
		expect(summary.samplingIntervalSeconds).toBe('600');
		expect(summary.timestampsReadAsUtc).toBe(1);
		expect(warnings).toContain(
			'1 timestamps name no time zone and were read as UTC, while the others name theirs; check they agree.'
		);
	});

	it('reads a semicolon-separated file with decimal commas', () => {
		const { summary } = parsed(csv('timestamp;speed_m_s', '2025-01-01T00:00Z;1,25', '2025-01-01T00:10Z;0,5'));
		expect(summary.meanSpeedMS).toBe('0.875');
		expect(summary.maxSpeedMS).toBe('1.25');
	});

	it('sorts rows out of time order, with a warning', () => {
		const { summary, warnings } = parsed(
			csv('timestamp,speed_m_s', '2025-01-01T00:20Z,1', '2025-01-01T00:00Z,2', '2025-01-01T00:10Z,3')
		);
		expect(summary.sorted).toBe(true);
		expect(summary.firstTimestamp).toBe('2025-01-01T00:00:00.000Z');
		expect(summary.gapCount).toBe(0);
		expect(warnings).toContain(
			'Rows are not in time order (row 3 is earlier than the row above it); they were sorted by time before binning.'
		);
	});

	it('warns when the speeds look like cm/s or knots', () => {
		const { warnings } = parsed(csv('timestamp,speed_m_s', '2025-01-01T00:00Z,120', '2025-01-01T00:10Z,180'));
		expect(warnings).toContain(
			'The fastest speed is 180 m/s (row 3), faster than any tidal stream (about 6 m/s at most): check the speeds are in m/s, not cm/s or knots.'
		);
	});

	it('ignores extra columns with a warning', () => {
		const { warnings } = parsed(
			csv('timestamp,direction_deg,speed_m_s', '2025-01-01T00:00Z,90,1', '2025-01-01T00:10Z,270,1')
		);
		expect(warnings).toContain('Ignored column "direction_deg": not used by this upload.');
	});
});

describe('parseTimeSeriesCsv: bad files', () => {
	it('empty file', () => {
		expect(messages(Buffer.alloc(0))).toEqual(['The file is empty.']);
	});

	it('header only', () => {
		expect(messages(csv('timestamp,speed_m_s'))).toEqual(['The file has a header (row 1) but no data rows below it.']);
	});

	it('a single measurement', () => {
		expect(messages(csv('timestamp,speed_m_s', '2025-01-01T00:00Z,1'))).toEqual([
			'The file has only one measurement; a time series needs at least two to find its sampling interval.'
		]);
	});

	it('wrong columns', () => {
		expect(messages(csv('time,speed', '2025-01-01T00:00Z,1'))).toEqual([
			'Row 1 (the header) missing columns "timestamp", "speed_m_s". It reads "time", "speed"; the expected header is "timestamp", "speed_m_s".'
		]);
	});

	it('text in a number cell', () => {
		expect(
			messages(csv('timestamp,speed_m_s', ...Array.from({ length: 12 }, (_, i) => `2025-01-01T${String(i).padStart(2, '0')}:00Z,1`), '2025-01-01T12:00Z,abc'))
		).toEqual(['Row 14, column "speed_m_s": "abc" is not a number.']);
	});

	it('negative speed', () => {
		expect(messages(csv('timestamp,speed_m_s', '2025-01-01T00:00Z,1', '2025-01-01T00:10Z,-0.4'))).toEqual([
			'Row 3, column "speed_m_s": "-0.4" is negative; a speed cannot be below 0.'
		]);
	});

	it('NaN and Infinity', () => {
		expect(
			messages(csv('timestamp,speed_m_s', '2025-01-01T00:00Z,NaN', '2025-01-01T00:10Z,Infinity', '2025-01-01T00:20Z,1'))
		).toEqual([
			'Row 2, column "speed_m_s": "NaN" is not a finite number.',
			'Row 3, column "speed_m_s": "Infinity" is not a finite number.'
		]);
	});

	it('an empty speed cell', () => {
		expect(messages(csv('timestamp,speed_m_s', '2025-01-01T00:00Z,', '2025-01-01T00:10Z,1'))).toEqual([
			'Row 2, column "speed_m_s": the cell is empty; a number is needed.'
		]);
	});

	it('duplicate timestamps, also when written in different zones', () => {
		expect(
			messages(
				csv(
					'timestamp,speed_m_s',
					'2025-01-01T00:00Z,1',
					'2025-01-01T00:10Z,1',
					'2025-01-01T00:10Z,1.1',
					'2025-01-01T01:00+01:00,1',
					'2025-01-01T00:10:00Z,1'
				)
			)
		).toEqual([
			// 01:00+01:00 is 00:00Z, the time of row 2.
			'Row 4, column "timestamp": "2025-01-01T00:10Z" is the same time as row 3; each time may appear only once.',
			'Row 5, column "timestamp": "2025-01-01T01:00+01:00" is the same time as row 2; each time may appear only once.',
			'Row 6, column "timestamp": "2025-01-01T00:10:00Z" is the same time as row 3; each time may appear only once.'
		]);
	});

	it('unparseable timestamp', () => {
		expect(messages(csv('timestamp,speed_m_s', '2025-01-01T00:00Z,1', '01/01/2025 00:10,1'))).toEqual([
			'Row 3, column "timestamp": "01/01/2025 00:10" is not a date and time: write it as ISO 8601, e.g. 2025-03-01T00:10:00Z or 2025-03-01 00:10.'
		]);
	});

	it('huge file over the size limit', () => {
		expect(messages(Buffer.alloc(20 * 1024 * 1024 + 1, 0x31))[0]).toMatch(/^The file is 20\.0 MB, over the 20\.0 MB limit/);
		expect(messages(SMALL, { maxBytes: 100 })[0]).toMatch(/over the 0\.0 MB limit/);
	});

	it('too many rows', () => {
		expect(messages(SMALL, { maxRows: 5 })).toEqual([
			'The file has 6 data rows, more than the limit of 5 for this kind of upload.'
		]);
	});

	it('wrong encoding', () => {
		expect(messages(Buffer.from('timestamp,speed_m_s\n', 'utf16le'))[0]).toMatch(/looks like UTF-16/);
		expect(messages(Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from('timestamp', 'utf16le')]))[0]).toMatch(
			/saved as UTF-16/
		);
		expect(messages(Buffer.concat([Buffer.from('timestamp,vitesse_'), Buffer.from([0xe0]), Buffer.from('\n')]))[0]).toMatch(
			/not valid UTF-8 text \(the first bad character is on row 1\)/
		);
	});

	it('binary content', () => {
		expect(messages(Buffer.from([0x50, 0x4b, 0x03, 0x04, 0x0a, 0x00, 0x00, 0x00]))[0]).toMatch(/Excel workbook \(\.xlsx\)/);
	});

	it('ragged rows', () => {
		expect(messages(csv('timestamp,speed_m_s', '2025-01-01T00:00Z,1', '2025-01-01T00:10Z', '2025-01-01T00:20Z,1,2'))).toEqual([
			'Row 3: has 1 value but the header has 2 columns.',
			'Row 4: has 3 values but the header has 2 columns. If the numbers use a decimal comma, separate the columns with semicolons instead.'
		]);
	});

	it('decimal commas in a comma-separated file', () => {
		expect(messages(csv('timestamp,speed_m_s', '2025-01-01T00:00Z,"1,2"', '2025-01-01T00:10Z,1'))).toEqual([
			'Row 2, column "speed_m_s": "1,2" is not a number: use a point as the decimal mark in a comma-separated file.'
		]);
	});

	it('lists 20 errors and counts the rest, with nothing returned', () => {
		const lines = ['timestamp,speed_m_s', ...Array.from({ length: 50 }, (_, i) => `2025-01-01T00:${String(i).padStart(2, '0')}Z,x`)];
		const result = parseTimeSeriesCsv(csv(...lines));
		expect(result.ok).toBe(false);
		if (result.ok) return;
		expect(result).toEqual({ ok: false, errors: expect.any(Array) });
		expect(result.errors).toHaveLength(21);
		expect(result.errors[0]).toEqual({ row: 2, column: 'speed_m_s', message: 'Row 2, column "speed_m_s": "x" is not a number.' });
		expect(result.errors[20].message).toBe('...and 30 more problems not listed. Fix the ones above and upload again.');
	});
});
