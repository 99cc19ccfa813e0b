/**
 * Typed reads from a parsed form body. Every failure names the parameter the
 * way Stripe does (`line_items[0][quantity]`), so the SDK error says which
 * field was wrong.
 */
import { StandinError } from './errors';
import type { FormObject, FormValue } from './form-body';

function invalid(param: string, what: string): StandinError {
	return new StandinError(400, `Invalid ${what}: ${param}`, param, 'parameter_invalid');
}

export function missing(param: string): StandinError {
	return new StandinError(400, `Missing required param: ${param}.`, param, 'parameter_missing');
}

export function optionalString(params: FormObject, key: string, param = key): string | undefined {
	const value = params[key];
	if (value === undefined) return undefined;
	if (typeof value !== 'string') throw invalid(param, 'string');
	return value;
}

export function requiredString(params: FormObject, key: string, param = key): string {
	const value = optionalString(params, key, param);
	if (value === undefined || value === '') throw missing(param);
	return value;
}

/** A string, or null when sent empty (the SDK's way to unset a field). */
export function optionalNullableString(params: FormObject, key: string, param = key): string | null | undefined {
	const value = optionalString(params, key, param);
	return value === '' ? null : value;
}

export function optionalInteger(
	params: FormObject,
	key: string,
	param = key,
	range: { min?: number; max?: number } = {}
): number | undefined {
	const value = optionalString(params, key, param);
	if (value === undefined) return undefined;
	if (!/^-?\d+$/.test(value)) throw invalid(param, 'integer');
	const number = Number(value);
	if (!Number.isSafeInteger(number)) throw invalid(param, 'integer');
	if (range.min !== undefined && number < range.min) {
		throw new StandinError(400, `${param} must be at least ${range.min}`, param, 'parameter_invalid_integer');
	}
	if (range.max !== undefined && number > range.max) {
		throw new StandinError(400, `${param} must be at most ${range.max}`, param, 'parameter_invalid_integer');
	}
	return number;
}

/** An absolute http(s) URL, kept as sent (Stripe fills `{CHECKOUT_SESSION_ID}` in later). */
export function optionalUrl(params: FormObject, key: string, param = key): string | undefined {
	const value = optionalString(params, key, param);
	if (value === undefined || value === '') return undefined;
	let protocol: string;
	try {
		protocol = new URL(value).protocol;
	} catch {
		throw new StandinError(400, `Not a valid URL: ${param}`, param, 'url_invalid');
	}
	if (protocol !== 'http:' && protocol !== 'https:') {
		throw new StandinError(400, `Not a valid URL: ${param} must use http or https`, param, 'url_invalid');
	}
	return value;
}

export function requiredUrl(params: FormObject, key: string, param = key): string {
	const value = optionalUrl(params, key, param);
	if (value === undefined) throw missing(param);
	return value;
}

export function optionalBoolean(params: FormObject, key: string, param = key): boolean | undefined {
	const value = optionalString(params, key, param);
	if (value === undefined) return undefined;
	if (value === 'true') return true;
	if (value === 'false') return false;
	throw invalid(param, 'boolean');
}

export function optionalEnum<T extends string>(
	params: FormObject,
	key: string,
	allowed: readonly T[],
	param = key
): T | undefined {
	const value = optionalString(params, key, param);
	if (value === undefined) return undefined;
	if (!(allowed as readonly string[]).includes(value)) {
		throw new StandinError(400, `Invalid ${param}: must be one of ${allowed.join(', ')}`, param, 'parameter_invalid');
	}
	return value as T;
}

export function optionalObject(params: FormObject, key: string, param = key): FormObject | undefined {
	const value = params[key];
	if (value === undefined || value === '') return undefined;
	if (typeof value === 'string' || Array.isArray(value)) throw invalid(param, 'object');
	return value;
}

/** A list sent as `key[0]=a&key[1]=b` (or `key[]=a`); a lone `key=a` counts as one item. */
export function optionalList(params: FormObject, key: string, param = key): FormValue[] | undefined {
	const value = params[key];
	if (value === undefined || value === '') return undefined;
	if (typeof value === 'string') return [value];
	if (!Array.isArray(value)) throw invalid(param, 'array');
	return value;
}

export function optionalStringList(params: FormObject, key: string, param = key): string[] | undefined {
	const list = optionalList(params, key, param);
	return list?.map((item, index) => {
		if (typeof item !== 'string') throw invalid(`${param}[${index}]`, 'string');
		return item;
	});
}

export function listOfObjects(params: FormObject, key: string, param = key): FormObject[] {
	const list = optionalList(params, key, param) ?? [];
	return list.map((item, index) => {
		if (typeof item === 'string' || Array.isArray(item)) throw invalid(`${param}[${index}]`, 'object');
		return item;
	});
}

export type MetadataUpdate = { clearAll: boolean; set: Record<string, string>; unset: string[] };

/**
 * Stripe's metadata rules: `metadata[k]=v` sets, `metadata[k]=` removes one key,
 * `metadata=` removes all. Up to 50 keys, keys up to 40 characters, values up to 500.
 */
export function optionalMetadata(params: FormObject, key = 'metadata', param = key): MetadataUpdate | undefined {
	const value = params[key];
	if (value === undefined) return undefined;
	if (value === '') return { clearAll: true, set: {}, unset: [] };
	if (typeof value === 'string' || Array.isArray(value)) throw invalid(param, 'object');
	const update: MetadataUpdate = { clearAll: false, set: {}, unset: [] };
	for (const [name, entry] of Object.entries(value)) {
		const entryParam = `${param}[${name}]`;
		if (typeof entry !== 'string') throw invalid(entryParam, 'string');
		if (name.length > 40) throw new StandinError(400, `Metadata keys can be up to 40 characters: ${entryParam}`, entryParam);
		if (entry.length > 500) throw new StandinError(400, `Metadata values can be up to 500 characters: ${entryParam}`, entryParam);
		if (entry === '') update.unset.push(name);
		else update.set[name] = entry;
	}
	if (Object.keys(update.set).length > 50) throw new StandinError(400, 'Metadata can have up to 50 keys', param);
	return update;
}

export function applyMetadata(current: Record<string, string>, update: MetadataUpdate | undefined): Record<string, string> {
	if (!update) return current;
	const next: Record<string, string> = update.clearAll ? {} : { ...current };
	for (const name of update.unset) delete next[name];
	Object.assign(next, update.set);
	return next;
}

export function expandPaths(params: FormObject): string[] {
	return optionalStringList(params, 'expand') ?? [];
}
