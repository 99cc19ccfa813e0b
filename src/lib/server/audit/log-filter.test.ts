import { describe, expect, it } from 'vitest';
import { encodeAuditCursor, nextAuditPageSearch, readAuditLogQuery } from './log-filter';

const member = '3f2a9c1e-0b7d-4e5f-9a8b-1c2d3e4f5a6b';
const people = new Set([member]);
const read = (query: string) => readAuditLogQuery(new URLSearchParams(query), people);

describe('readAuditLogQuery', () => {
	it('reads no filter from a bare address', () => {
		expect(read('')).toEqual({ filter: {}, after: null, fields: { group: 'all', person: '', from: '', to: '' }, errors: {} });
	});

	it('reads a kind of event, a member and a range of days', () => {
		const query = read(`group=work&person=${member}&from=2026-12-01&to=2026-12-31`);
		expect(query.filter).toEqual({ group: 'work', actorUserId: member, fromDay: '2026-12-01', toDay: '2026-12-31' });
		expect(query.errors).toEqual({});
	});

	it('leaves out and names each value that does not fit, keeping what was typed', () => {
		const query = read('group=gossip&person=someone&from=2026-02-30&to=yesterday');
		expect(query.filter).toEqual({});
		expect(Object.keys(query.errors).sort()).toEqual(['from', 'group', 'person', 'to']);
		expect(query.fields.to).toBe('yesterday');
	});

	it('refuses a last day before the first', () => {
		const query = read('from=2026-12-10&to=2026-12-01');
		expect(query.filter).toEqual({ fromDay: '2026-12-10' });
		expect(query.errors.to).toMatch(/before the first/);
	});

	it('goes on after the key a page link carries, and says when the link is broken', () => {
		const key: [string, string] = ['2026-12-09T10:11:12.123456Z', '42'];
		expect(read(`after=${encodeAuditCursor(key)}`).after).toEqual(key);
		const broken = read(`after=${encodeAuditCursor(['yesterday', '42'] as never)}`);
		expect(broken.after).toBeNull();
		expect(broken.errors.after).toBeTruthy();
	});
});

describe('nextAuditPageSearch', () => {
	it('keeps the filters and adds where to go on from, leaving defaults out', () => {
		const search = nextAuditPageSearch({ group: 'all', person: member, from: '', to: '2026-12-31' }, ['2026-12-09T10:11:12.123456Z', '42']);
		const params = new URLSearchParams(search);
		expect(params.get('group')).toBeNull();
		expect(params.get('person')).toBe(member);
		expect(params.get('to')).toBe('2026-12-31');
		expect(read(search).after).toEqual(['2026-12-09T10:11:12.123456Z', '42']);
	});
});
