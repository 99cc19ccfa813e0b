/**
 * The audit log page's filters, read from its address so a filtered view can
 * be bookmarked and shared: `?group=` (a kind of event), `?person=` (a member's
 * id), `?from=` and `?to=` (days, YYYY-MM-DD, UTC, both inclusive) and
 * `?after=` (where the previous page ended). A value that does not fit is
 * left out of the filter and named in `errors`, beside its field.
 */
import { isAuditEventGroup, type AuditFilter, type AuditKey } from '../db/audit';
import { exactTimestampPattern } from '../db/keyset';

export interface AuditFilterFields {
	group: string;
	person: string;
	from: string;
	to: string;
}

export interface AuditLogQuery {
	filter: AuditFilter;
	after: AuditKey | null;
	/** What the form shows: the values as asked, so a refused one can be corrected. */
	fields: AuditFilterFields;
	errors: Partial<Record<keyof AuditFilterFields | 'after', string>>;
}

const dayPattern = /^\d{4}-\d{2}-\d{2}$/;

function isDay(text: string): boolean {
	if (!dayPattern.test(text)) return false;
	const date = new Date(`${text}T00:00:00Z`);
	return !Number.isNaN(date.getTime()) && date.toISOString().startsWith(text);
}

export function encodeAuditCursor(key: AuditKey): string {
	return Buffer.from(JSON.stringify(key), 'utf8').toString('base64url');
}

function decodeAuditCursor(text: string): AuditKey | null {
	if (!/^[A-Za-z0-9_-]{1,200}$/.test(text)) return null;
	try {
		const key = JSON.parse(Buffer.from(text, 'base64url').toString('utf8'));
		const fits = Array.isArray(key) && key.length === 2 && exactTimestampPattern.test(key[0]) && typeof key[1] === 'string' && /^\d{1,18}$/.test(key[1]);
		return fits ? [key[0], key[1]] : null;
	} catch {
		return null;
	}
}

/** The filter in the address; `people` are the ids the person filter may name (the workspace's members). */
export function readAuditLogQuery(params: URLSearchParams, people: ReadonlySet<string>): AuditLogQuery {
	const fields: AuditFilterFields = {
		group: params.get('group') ?? 'all',
		person: params.get('person') ?? '',
		from: params.get('from') ?? '',
		to: params.get('to') ?? ''
	};
	const filter: AuditFilter = {};
	const errors: AuditLogQuery['errors'] = {};
	if (isAuditEventGroup(fields.group)) filter.group = fields.group;
	else if (fields.group !== 'all' && fields.group !== '') errors.group = 'Choose a kind of event from the list.';
	if (people.has(fields.person)) filter.actorUserId = fields.person;
	else if (fields.person !== '') errors.person = 'Choose a member from the list.';
	for (const name of ['from', 'to'] as const) {
		if (fields[name] === '') continue;
		if (isDay(fields[name])) filter[name === 'from' ? 'fromDay' : 'toDay'] = fields[name];
		else errors[name] = 'Give a day as YYYY-MM-DD.';
	}
	if (filter.fromDay && filter.toDay && filter.fromDay > filter.toDay) {
		errors.to = 'The last day comes before the first.';
		delete filter.toDay;
	}
	const cursor = params.get('after');
	const after = cursor ? decodeAuditCursor(cursor) : null;
	if (cursor && !after) errors.after = 'That page link is broken: showing the newest events.';
	return { filter, after, fields, errors };
}

/** The address of the next page: the same filters, going on after `key`. */
export function nextAuditPageSearch(fields: AuditFilterFields, key: AuditKey): string {
	const params = new URLSearchParams();
	for (const [name, value] of Object.entries(fields)) if (value !== '' && !(name === 'group' && value === 'all')) params.set(name, value);
	params.set('after', encodeAuditCursor(key));
	return `?${params}`;
}
