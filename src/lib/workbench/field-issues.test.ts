import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { formatIssuePath } from '../schemas/scenario';
import { fieldIdOfKey, fieldId, indexIssues, issueFor, pathKey, plainIssue } from './field-issues';

describe('pathKey', () => {
	it('writes a path the way the schema names issue paths', () => {
		const path = ['capex', 'lines', 2, 'amount'] as const;
		expect(pathKey(path)).toBe(formatIssuePath(path));
	});
});

describe('fieldIdOfKey', () => {
	it('leads from an issue path to the id of its input', () => {
		expect(fieldIdOfKey('capex.lines[2].amount')).toBe(fieldId(['capex', 'lines', 2, 'amount']));
		expect(fieldIdOfKey('device.powerKW[1][3]')).toBe(fieldId(['device', 'powerKW', 1, 3]));
	});
});

describe('indexIssues', () => {
	it('files the API’s document issues under their field, in plain words', () => {
		const index = indexIssues([
			{ path: 'document.array.availability', message: 'Too big: expected number to be <=1' },
			{ path: 'document.capex.lines[0].amount', message: 'Invalid input: expected number, received undefined' }
		]);
		expect(issueFor(index, ['array', 'availability'])).toBe('At most 1.');
		expect(issueFor(index, ['capex', 'lines', 0, 'amount'])).toBe('Enter a number.');
		expect(issueFor(index, ['capex', 'lines', 1, 'amount'])).toBeNull();
	});
});

describe('plainIssue', () => {
	const messageOf = (schema: z.ZodType, value: unknown) => schema.safeParse(value).error!.issues[0].message;

	it('rewords zod’s bound messages, whatever the bound', () => {
		expect(plainIssue(messageOf(z.number().max(1), 2))).toBe('At most 1.');
		expect(plainIssue(messageOf(z.number().lt(100), 100))).toBe('Less than 100.');
		expect(plainIssue(messageOf(z.number().min(1), 0))).toBe('At least 1.');
		expect(plainIssue(messageOf(z.number().positive(), 0))).toBe('More than 0.');
		expect(plainIssue(messageOf(z.number().int(), 1.5))).toBe('Enter a whole number.');
	});

	it('keeps the schema’s own sentences as they are', () => {
		const own = 'cut-out speed must be above cut-in speed';
		expect(plainIssue(own)).toBe(own);
	});
});
