import { describe, expect, it } from 'vitest';
import { deviceSchema } from '../../schemas/scenario';
import { parsePowerCurveCsv } from './power-curve';

const csv = (...lines: string[]) => new TextEncoder().encode(lines.join('\n') + '\n');

function parsed(bytes: Uint8Array, options = {}) {
	const result = parsePowerCurveCsv(bytes, options);
	if (!result.ok) throw new Error(JSON.stringify(result.errors));
	return result;
}
function messages(bytes: Uint8Array, options = {}): string[] {
	const result = parsePowerCurveCsv(bytes, options);
	if (result.ok) throw new Error('expected the upload to be refused');
	return result.errors.map((e) => e.message);
}

const CURVE = csv(
	'speed_m_s,power_kW',
	'0.5,0',
	'1.0,40',
	'1.5,135',
	'2.0,320',
	'2.5,500',
	'3.0,500',
	'3.5,0'
);

describe('parsePowerCurveCsv: good files', () => {
	it('reads the points and finds cut-in, rated and cut-out', () => {
		const { data, summary, warnings } = parsed(CURVE);
		expect(data).toEqual({
			kind: 'power-curve',
			points: [
				{ speedMPerS: 0.5, powerKW: 0 },
				{ speedMPerS: 1, powerKW: 40 },
				{ speedMPerS: 1.5, powerKW: 135 },
				{ speedMPerS: 2, powerKW: 320 },
				{ speedMPerS: 2.5, powerKW: 500 },
				{ speedMPerS: 3, powerKW: 500 },
				{ speedMPerS: 3.5, powerKW: 0 }
			]
		});
		expect(summary).toEqual({
			pointCount: 7,
			minSpeedMS: '0.5',
			maxSpeedMS: '3.5',
			ratedPowerKW: '500',
			ratedSpeedMS: '2.5',
			cutInSpeedMS: '1',
			cutOutSpeedMS: '3.5'
		});
		expect(warnings).toEqual([]);
	});

	it('matches the power column name without case, and reads decimal commas after semicolons', () => {
		const { data } = parsed(csv('Speed_m_s;POWER_KW', '1,0;12,5', '2,0;100'));
		expect(data.points).toEqual([
			{ speedMPerS: 1, powerKW: 12.5 },
			{ speedMPerS: 2, powerKW: 100 }
		]);
	});

	it('warns when the curve starts with power above 0 m/s', () => {
		const { summary, warnings } = parsed(csv('speed_m_s,power_kW', '1.0,40', '2.0,320'));
		expect(summary.cutInSpeedMS).toBeNull();
		expect(warnings).toEqual([
			'The curve starts with power at 1.0 m/s; below that speed the device is taken to produce nothing.'
		]);
	});

	it('produces a device the scenario schema accepts unchanged', () => {
		const { data } = parsed(CURVE);
		expect(deviceSchema.parse(data)).toEqual(data);
	});
});

describe('parsePowerCurveCsv: bad files', () => {
	it('speeds not increasing', () => {
		expect(messages(csv('speed_m_s,power_kW', '0.5,0', '1.0,40', '1.0,50', '0.8,60', '2.0,100'))).toEqual([
			'Row 4, column "speed_m_s": 1.0 m/s repeats the speed on row 3 (1.0 m/s); speeds must increase down the column.',
			'Row 5, column "speed_m_s": 0.8 m/s is below the speed on row 4 (1.0 m/s); speeds must increase down the column.'
		]);
	});

	it('negative power, negative speed, text and NaN', () => {
		expect(messages(csv('speed_m_s,power_kW', '0.5,-3', '-1.0,40', '1.5,n/a', '2.0,NaN'))).toEqual([
			'Row 2, column "power_kW": "-3" is negative; a power cannot be below 0.',
			'Row 3, column "speed_m_s": "-1.0" is negative; a speed cannot be below 0.',
			'Row 4, column "power_kW": "n/a" is not a number.',
			'Row 5, column "power_kW": "NaN" is not a finite number.'
		]);
	});

	it('a single point, or no power anywhere', () => {
		expect(messages(csv('speed_m_s,power_kW', '1.0,40'))).toEqual(['A power curve needs at least two rows (two speeds).']);
		expect(messages(csv('speed_m_s,power_kW', '1.0,0', '2.0,0'))).toEqual(['Column "power_kW": every power is 0.']);
	});

	it('wrong columns (power in W)', () => {
		expect(messages(csv('speed_m_s,power_W', '1.0,40000'))).toEqual([
			'Row 1 (the header) missing column "power_kW". It reads "speed_m_s", "power_W"; the expected header is "speed_m_s", "power_kW".'
		]);
	});

	it('empty file, header only, ragged rows', () => {
		expect(messages(csv(''))).toEqual(['The file is empty.']);
		expect(messages(csv('speed_m_s,power_kW'))).toEqual(['The file has a header (row 1) but no data rows below it.']);
		expect(messages(csv('speed_m_s,power_kW', '1.0,40,7', '2.0,80'))[0]).toMatch(/^Row 2: has 3 values but the header has 2 columns\./);
	});
});

describe('parsePowerCurveCsv: the scenario’s bound on points', () => {
	const rows = (n: number) => csv('speed_m_s,power_kW', ...Array.from({ length: n }, (_, i) => `${(i * 0.01).toFixed(2)},${i}`));

	it('takes as many points as a scenario does, and the result fits the schema', () => {
		const result = parsed(rows(500));
		expect(result.data.points).toHaveLength(500);
		expect(deviceSchema.safeParse(result.data).success).toBe(true);
	});

	it('refuses one point more, in the schema’s words', () => {
		expect(messages(rows(501))).toEqual(['The file has 501 rows (one power-curve point each); a scenario takes at most 500 power-curve points.']);
	});
});
