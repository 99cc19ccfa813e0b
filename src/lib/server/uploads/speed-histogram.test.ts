import { describe, expect, it } from 'vitest';
import { resourceSchema } from '../../schemas/scenario';
import { parseSpeedHistogramCsv } from './speed-histogram';

const csv = (...lines: string[]) => new TextEncoder().encode(lines.join('\n') + '\n');

function parsed(bytes: Uint8Array, options = {}) {
	const result = parseSpeedHistogramCsv(bytes, options);
	if (!result.ok) throw new Error(JSON.stringify(result.errors));
	return result;
}
function messages(bytes: Uint8Array, options = {}): string[] {
	const result = parseSpeedHistogramCsv(bytes, options);
	if (result.ok) throw new Error('expected the upload to be refused');
	return result.errors.map((e) => e.message);
}

describe('parseSpeedHistogramCsv: good files', () => {
	it('reads hours per bin and reports the time-weighted mean speed', () => {
		// Hand calculation: total 1000 h; mean = (0.5 x 200 + 1.0 x 500 + 1.5 x 300) / 1000 = 1.05 m/s.
		const { data, summary, warnings } = parsed(csv('speed_m_s,hours', '0.5,200', '1.0,500', '1.5,300'));
		expect(data).toEqual({
			kind: 'speed-histogram',
			occurrenceBasis: 'hours',
			bins: [
				{ speedMPerS: 0.5, occurrence: 200 },
				{ speedMPerS: 1, occurrence: 500 },
				{ speedMPerS: 1.5, occurrence: 300 }
			]
		});
		expect(summary).toEqual({
			binCount: 3,
			occurrenceBasis: 'hours',
			occurrenceTotal: '1000',
			minSpeedMS: '0.5',
			maxSpeedMS: '1.5',
			meanSpeedMS: '1.05',
			sorted: false
		});
		expect(warnings).toEqual([]);
	});

	it('reads probabilities summing to 1', () => {
		const { data, summary } = parsed(csv('speed_m_s,probability', '0.5,0.2', '1.0,0.5', '1.5,0.3'));
		expect(data.occurrenceBasis).toBe('probability');
		expect(summary.occurrenceTotal).toBe('1');
		expect(summary.meanSpeedMS).toBe('1.05');
	});

	it('accepts probabilities within the tolerance, and says they are scaled', () => {
		// 0.333 x 3 = 0.999: within the default tolerance 0.01.
		const { warnings } = parsed(csv('speed_m_s,probability', '0.5,0.333', '1.0,0.333', '1.5,0.333'));
		expect(warnings).toEqual(['The probabilities add up to 0.999; they are scaled to add up to 1 when energy is computed.']);
	});

	it('sorts bins given out of order, with a warning', () => {
		const { data, summary, warnings } = parsed(csv('speed_m_s,hours', '1.5,300', '0.5,200', '1.0,500'));
		expect(data.bins.map((b) => b.speedMPerS)).toEqual([0.5, 1, 1.5]);
		expect(summary.sorted).toBe(true);
		expect(warnings).toEqual(['The bins were not in order of speed; they were sorted.']);
	});

	it('reads a semicolon-separated file with decimal commas', () => {
		const { data } = parsed(csv('speed_m_s;hours', '0,5;200,5', '1,0;500'));
		expect(data.bins).toEqual([
			{ speedMPerS: 0.5, occurrence: 200.5 },
			{ speedMPerS: 1, occurrence: 500 }
		]);
	});

	it('produces a resource the scenario schema accepts unchanged', () => {
		const { data } = parsed(csv('speed_m_s,hours', '0.5,200', '1.0,500'));
		expect(resourceSchema.parse(data)).toEqual(data);
	});
});

describe('parseSpeedHistogramCsv: bad files', () => {
	it('empty file and header only', () => {
		expect(messages(new Uint8Array(0))).toEqual(['The file is empty.']);
		expect(messages(csv('speed_m_s,hours'))).toEqual(['The file has a header (row 1) but no data rows below it.']);
	});

	it('missing occurrence column, or both hours and probability', () => {
		expect(messages(csv('speed_m_s,count', '0.5,3'))[0]).toBe(
			'Row 1 (the header) needs one of the columns "hours", "probability". It reads "speed_m_s", "count"; the expected header is "speed_m_s", "hours".'
		);
		expect(messages(csv('speed_m_s,hours,probability', '0.5,3,1'))[0]).toMatch(/has both "hours", "probability"/);
	});

	it('text, negative and non-finite values', () => {
		expect(messages(csv('speed_m_s,hours', '0.5,abc', '-1,20', '1.5,Infinity'))).toEqual([
			'Row 2, column "hours": "abc" is not a number.',
			'Row 3, column "speed_m_s": "-1" is negative; a speed cannot be below 0.',
			'Row 4, column "hours": "Infinity" is not a finite number.'
		]);
	});

	it('a bin speed given twice', () => {
		expect(messages(csv('speed_m_s,hours', '0.5,1', '1.0,2', '0.50,3'))).toEqual([
			'Row 4, column "speed_m_s": the speed 0.50 m/s already appears on row 2.'
		]);
	});

	it('probabilities not summing to 1', () => {
		expect(messages(csv('speed_m_s,probability', '0.5,0.2', '1.0,0.5'))).toEqual([
			'Column "probability": the probabilities add up to 0.7, not 1 (allowed difference 0.01). Check for a missing or doubled row, or give hours instead.'
		]);
		// A tighter tolerance refuses what the default accepts.
		expect(messages(csv('speed_m_s,probability', '0.5,0.333', '1.0,0.333', '1.5,0.333'), { probabilityTolerance: 0.0001 })[0]).toMatch(
			/add up to 0\.999, not 1 \(allowed difference 0\.0001\)/
		);
	});

	it('percentages in a probability column', () => {
		expect(messages(csv('speed_m_s,probability', '0.5,20', '1.0,80'))).toEqual([
			'Row 2, column "probability": "20" is above 1; a probability cannot be above 1. Give probabilities as fractions (0.125), not percentages (12.5).',
			'Row 3, column "probability": "80" is above 1; a probability cannot be above 1. Give probabilities as fractions (0.125), not percentages (12.5).'
		]);
	});

	it('hours that are all zero', () => {
		expect(messages(csv('speed_m_s,hours', '0.5,0', '1.0,0'))).toEqual([
			'Column "hours": every value is 0, so there is no time to share out.'
		]);
	});

	it('ragged rows and too many rows', () => {
		expect(messages(csv('speed_m_s,hours', '0.5', '1.0,2'))).toEqual(['Row 2: has 1 value but the header has 2 columns.']);
		expect(messages(csv('speed_m_s,hours', '0.5,1', '1.0,2'), { maxRows: 1 })).toEqual([
			'The file has 2 data rows, more than the limit of 1 for this kind of upload.'
		]);
	});

	it('over the size limit, wrong encoding, binary', () => {
		expect(messages(csv('speed_m_s,hours', '0.5,1'), { maxBytes: 10 })[0]).toMatch(/over the 0\.0 MB limit/);
		expect(messages(Uint8Array.from([0xfe, 0xff, 0, 0x73]))[0]).toMatch(/UTF-16/);
		expect(messages(Uint8Array.from([0x25, 0x50, 0x44, 0x46, 0x2d, 0x31, 0x00]))[0]).toMatch(/PDF/);
	});
});

describe('parseSpeedHistogramCsv: the scenario’s bound on speed bins', () => {
	const rows = (n: number) => csv('speed_m_s,probability', ...Array.from({ length: n }, (_, i) => `${(i * 0.01).toFixed(2)},0.001`));

	it('takes as many bins as a scenario does, and the result fits the schema', () => {
		const result = parseSpeedHistogramCsv(rows(1000));
		if (!result.ok) throw new Error(JSON.stringify(result.errors));
		expect(result.data.bins).toHaveLength(1000);
		expect(resourceSchema.safeParse(result.data).success).toBe(true);
	});

	it('refuses one bin more, in the schema’s words', () => {
		expect(messages(rows(1001))).toEqual(['The file has 1,001 rows (one speed bin each); a scenario takes at most 1000 speed bins.']);
	});
});
