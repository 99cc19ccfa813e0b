import { describe, expect, it } from 'vitest';
import { cellMessage, ErrorCollector } from './result';

describe('cellMessage', () => {
	it('names the row and the column the way the issue asks', () => {
		// Wording from the upload requirement: `Row 14, column "speed_m_s": "abc" is not a number.`
		expect(cellMessage(14, 'speed_m_s', '"abc" is not a number.')).toBe(
			'Row 14, column "speed_m_s": "abc" is not a number.'
		);
	});

	it('leaves the column out for whole-row problems', () => {
		expect(cellMessage(3, null, 'has 1 value but the header has 2 columns.')).toBe(
			'Row 3: has 1 value but the header has 2 columns.'
		);
	});
});

describe('ErrorCollector', () => {
	it('lists the first errors in full and counts the rest', () => {
		const errors = new ErrorCollector(20);
		for (let row = 2; row < 52; row++) errors.add(row, 'speed_m_s', 'bad.');
		const list = errors.toErrors();
		expect(errors.count).toBe(50);
		expect(list).toHaveLength(21);
		expect(list[0]).toEqual({ row: 2, column: 'speed_m_s', message: 'Row 2, column "speed_m_s": bad.' });
		expect(list[19].row).toBe(21);
		expect(list[20]).toEqual({
			row: null,
			column: null,
			message: '...and 30 more problems not listed. Fix the ones above and upload again.'
		});
	});

	it('adds no closing line when every error is listed', () => {
		const errors = new ErrorCollector(20);
		errors.add(2, 'hours', 'bad.');
		expect(errors.toErrors()).toHaveLength(1);
		expect(errors.toFailure()).toEqual({ ok: false, errors: errors.toErrors() });
	});

	it('starts empty', () => {
		const errors = new ErrorCollector();
		expect(errors.hasErrors).toBe(false);
		expect(errors.toErrors()).toEqual([]);
	});
});
