import { describe, expect, it } from 'vitest';
import { resourceSchema } from '../../schemas/scenario';
import { parseSeaStateTableCsv } from './sea-state-table';

const csv = (...lines: string[]) => new TextEncoder().encode(lines.join('\n') + '\n');

function parsed(bytes: Uint8Array, options = {}) {
	const result = parseSeaStateTableCsv(bytes, options);
	if (!result.ok) throw new Error(JSON.stringify(result.errors));
	return result;
}
function messages(bytes: Uint8Array, options = {}): string[] {
	const result = parseSeaStateTableCsv(bytes, options);
	if (result.ok) throw new Error('expected the upload to be refused');
	return result.errors.map((e) => e.message);
}

describe('parseSeaStateTableCsv: good files', () => {
	it('reads a long-format table of hours', () => {
		const { data, summary, warnings } = parsed(
			csv('hs_m,te_s,hours', '0.5,5,1200', '1.0,6,3000', '1.0,7,2500', '2.0,8,2060')
		);
		expect(data).toEqual({
			kind: 'sea-state-table',
			periodType: 'energy-period',
			teOverTp: 0.9,
			occurrenceBasis: 'hours',
			states: [
				{ hsM: 0.5, periodS: 5, occurrence: 1200 },
				{ hsM: 1, periodS: 6, occurrence: 3000 },
				{ hsM: 1, periodS: 7, occurrence: 2500 },
				{ hsM: 2, periodS: 8, occurrence: 2060 }
			]
		});
		// Hand calculation: total 8760 h; the largest share is 3000 / 8760 = 0.342465753...
		expect(summary).toEqual({
			stateCount: 4,
			periodType: 'energy-period',
			occurrenceBasis: 'hours',
			occurrenceTotal: '8760',
			hsValues: 3,
			periodValues: 4,
			minHsM: '0.5',
			maxHsM: '2',
			minPeriodS: '5',
			maxPeriodS: '8',
			mostFrequent: { hsM: '1', periodS: '6', share: '0.342465753424657534246575342466' }
		});
		expect(warnings).toEqual([]);
	});

	it('reads peak periods Tp and says how they are converted', () => {
		// Te = 0.9 Tp is the usual rule (the scenario's default teOverTp); the engine converts.
		const { data, warnings } = parsed(csv('hs_m,tp_s,probability', '1.0,8,0.6', '2.0,10,0.4'));
		expect(data.periodType).toBe('peak-period');
		expect(warnings).toEqual([
			'Periods are peak periods Tp; energy is computed with Te = 0.9 x Tp unless the scenario sets another ratio.'
		]);
	});

	it('reads semicolons with decimal commas', () => {
		const { data } = parsed(csv('hs_m;te_s;probability', '0,5;5,5;0,25', '1,5;7,5;0,75'));
		expect(data.states).toEqual([
			{ hsM: 0.5, periodS: 5.5, occurrence: 0.25 },
			{ hsM: 1.5, periodS: 7.5, occurrence: 0.75 }
		]);
	});

	it('produces a resource the scenario schema accepts unchanged', () => {
		const { data } = parsed(csv('hs_m,te_s,hours', '0.5,5,1200', '1.0,6,3000'));
		expect(resourceSchema.parse(data)).toEqual(data);
	});
});

describe('parseSeaStateTableCsv: bad files', () => {
	it('a sea state given twice', () => {
		expect(messages(csv('hs_m,te_s,hours', '0.5,5,1', '1.0,6,2', '1.00,6.0,3'))).toEqual([
			'Row 4, column "hs_m": the sea state Hs 1.00 m, Te 6.0 s already appears on row 3.'
		]);
	});

	it('probabilities not summing to 1', () => {
		expect(messages(csv('hs_m,te_s,probability', '0.5,5,0.5', '1.0,6,0.6'))).toEqual([
			'Column "probability": the probabilities add up to 1.1, not 1 (allowed difference 0.01). Check for a missing or doubled row, or give hours instead.'
		]);
	});

	it('a zero or negative period, a negative height, text', () => {
		expect(messages(csv('hs_m,te_s,hours', '0.5,0,1', '-1.0,6,2', '1.5,7,many'))).toEqual([
			'Row 2, column "te_s": "0" is too small; a wave period must be above 0.',
			'Row 3, column "hs_m": "-1.0" is negative; a wave height cannot be below 0.',
			'Row 4, column "hours": "many" is not a number.'
		]);
	});

	it('both Te and Tp, or a missing period column', () => {
		expect(messages(csv('hs_m,te_s,tp_s,hours', '1,6,7,2'))[0]).toMatch(/has both "te_s", "tp_s"; keep only one of them/);
		expect(messages(csv('hs_m,period,hours', '1,6,2'))[0]).toBe(
			'Row 1 (the header) needs one of the columns "te_s", "tp_s". It reads "hs_m", "period", "hours"; the expected header is "hs_m", "te_s", "hours".'
		);
	});

	it('empty file, header only, ragged rows', () => {
		expect(messages(new Uint8Array(0))).toEqual(['The file is empty.']);
		expect(messages(csv('hs_m,te_s,hours'))).toEqual(['The file has a header (row 1) but no data rows below it.']);
		expect(messages(csv('hs_m,te_s,hours', '1,6'))).toEqual(['Row 2: has 2 values but the header has 3 columns.']);
	});
});

describe('parseSeaStateTableCsv: the scenario’s bound on sea states', () => {
	const rows = (n: number) =>
		csv('hs_m,te_s,probability', ...Array.from({ length: n }, (_, i) => `${(i % 40) * 0.25},${1 + Math.floor(i / 40) * 0.5},0.0005`));

	it('takes as many sea states as a scenario does, and the result fits the schema', () => {
		const result = parsed(rows(2000));
		expect(result.data.states).toHaveLength(2000);
		expect(resourceSchema.safeParse(result.data).success).toBe(true);
	});

	it('refuses one state more, in the schema’s words', () => {
		expect(messages(rows(2001))).toEqual(['The file has 2,001 rows (one sea state each); a scenario takes at most 2000 sea states.']);
	});
});
