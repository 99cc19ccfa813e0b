/**
 * Reads the form-encoded bodies and query strings the stripe SDK sends:
 * nested brackets (`line_items[0][price]=price_x`) become nested objects,
 * runs of numeric keys become arrays, and `key[]=a&key[]=b` appends.
 */
import { StandinError } from './errors';

export type FormValue = string | FormValue[] | FormObject;
export interface FormObject {
	[key: string]: FormValue;
}

const MAX_DEPTH = 8;
const FORBIDDEN_KEYS = new Set(['__proto__', 'constructor', 'prototype']);

/** `a[b][0]` -> ['a', 'b', '0']; `a[]` -> ['a', '']. */
function keyPath(rawKey: string): string[] {
	const open = rawKey.indexOf('[');
	if (open <= 0) return [rawKey];
	const path = [rawKey.slice(0, open)];
	const rest = rawKey.slice(open);
	const segment = /\[([^\]]*)\]/gy;
	let match: RegExpExecArray | null;
	let consumed = 0;
	while ((match = segment.exec(rest)) !== null) {
		path.push(match[1]);
		consumed = segment.lastIndex;
	}
	if (consumed !== rest.length) throw new StandinError(400, `Malformed parameter name: ${rawKey}`, rawKey);
	return path;
}

function decode(text: string): string {
	try {
		return decodeURIComponent(text.replace(/\+/g, ' '));
	} catch {
		throw new StandinError(400, `Malformed percent-encoding in: ${text.slice(0, 60)}`);
	}
}

function isIndex(key: string): boolean {
	return /^(0|[1-9]\d{0,3})$/.test(key);
}

/** Objects whose keys are all small array indices become arrays, in index order. */
function arraysFromIndexedObjects(value: FormValue): FormValue {
	if (typeof value === 'string') return value;
	if (Array.isArray(value)) return value.map(arraysFromIndexedObjects);
	const keys = Object.keys(value);
	if (keys.length > 0 && keys.every(isIndex)) {
		return keys
			.map(Number)
			.sort((a, b) => a - b)
			.map((index) => arraysFromIndexedObjects(value[String(index)]));
	}
	const out: FormObject = {};
	for (const key of keys) out[key] = arraysFromIndexedObjects(value[key]);
	return out;
}

export function parseFormBody(text: string): FormObject {
	const root: FormObject = {};
	for (const pair of text.split('&')) {
		if (pair === '') continue;
		const equals = pair.indexOf('=');
		const rawKey = decode(equals === -1 ? pair : pair.slice(0, equals));
		const value = equals === -1 ? '' : decode(pair.slice(equals + 1));
		const path = keyPath(rawKey);
		if (path.length > MAX_DEPTH) throw new StandinError(400, `Parameter nested too deeply: ${rawKey}`, rawKey);
		if (path.some((segment) => FORBIDDEN_KEYS.has(segment))) {
			throw new StandinError(400, `Parameter name not allowed: ${rawKey}`, rawKey);
		}
		let node: FormObject = root;
		for (let i = 0; i < path.length; i++) {
			const last = i === path.length - 1;
			// `key[]` appends: give it the next free index in the object being built.
			const segment = path[i] === '' ? String(Object.keys(node).length) : path[i];
			const existing = node[segment];
			if (last) {
				if (existing !== undefined && typeof existing !== 'string') {
					throw new StandinError(400, `Parameter ${rawKey} is given both as a value and as a group`, rawKey);
				}
				node[segment] = value;
			} else {
				if (typeof existing === 'string') {
					throw new StandinError(400, `Parameter ${rawKey} is given both as a value and as a group`, rawKey);
				}
				if (existing === undefined) node[segment] = {};
				node = node[segment] as FormObject;
			}
		}
	}
	return arraysFromIndexedObjects(root) as FormObject;
}
