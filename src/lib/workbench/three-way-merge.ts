/**
 * A three-way merge of JSON documents, for a save that met someone else's
 * save: from the revision both started at (base), their latest (theirs) and
 * the unsaved draft (mine). The merge starts from theirs and puts my changed
 * fields on top. Objects are merged key by key; anything else (a number, a
 * word, an array such as a power curve or the capex lines) is one value at
 * its path, so a list is never spliced half one way and half the other.
 * Where both changed overlapping fields to different values it is a clash:
 * mine wins unless the path is named in `takeTheirs`. Pure: no I/O.
 */
import { stableJson } from './stable-json';

/** Keys from the document's root; arrays are whole values, so a path never indexes into one. */
export type JsonPath = readonly string[];

export type JsonObject = Record<string, unknown>;

export interface Change {
	path: JsonPath;
	before: unknown;
	after: unknown;
}

export interface Clash {
	/** The shorter of the two overlapping changed paths: the value chosen whole, one side or the other. */
	path: JsonPath;
	base: unknown;
	theirs: unknown;
	mine: unknown;
}

export interface MergeOutcome<T extends JsonObject = JsonObject> {
	/** Theirs with my changes on top, each clash settled mine or theirs. */
	merged: T;
	/** What they changed since the base, field by field. */
	theirs: Change[];
	/** What I changed since the base, field by field. */
	mine: Change[];
	/** Fields both changed to different values. */
	clashes: Clash[];
	/** Fields both changed to the same value: nothing to choose. */
	agreed: Change[];
	/** My changes that touch nothing they changed: they go on top as they are. */
	clean: Change[];
}

/** A path as one string (`capex.contingency`): for choices and list keys. Keys of this document hold no dots. */
export function mergeKey(path: JsonPath): string {
	return path.join('.');
}

function isPlainObject(value: unknown): value is JsonObject {
	return value !== null && typeof value === 'object' && !Array.isArray(value);
}

const same = (a: unknown, b: unknown) => stableJson(a) === stableJson(b);

/** The value at `path`, undefined where the path runs out. */
export function valueAtPath(document: unknown, path: JsonPath): unknown {
	let current = document;
	for (const key of path) {
		if (!isPlainObject(current)) return undefined;
		current = current[key];
	}
	return current;
}

/** Sets (or, for undefined, removes) the value at `path` in place, making missing objects on the way. */
function setAtPath(document: JsonObject, path: JsonPath, value: unknown) {
	let parent = document;
	for (const key of path.slice(0, -1)) {
		if (!isPlainObject(parent[key])) parent[key] = {};
		parent = parent[key] as JsonObject;
	}
	const last = path[path.length - 1];
	if (value === undefined) delete parent[last];
	else parent[last] = structuredClone(value);
}

/** Keys of both objects: the newer one's order first, then keys only the older has. */
function keysOf(before: JsonObject, after: JsonObject): string[] {
	return [...new Set([...Object.keys(after), ...Object.keys(before)])];
}

/**
 * The fields that differ from `before` to `after`: objects on both sides are
 * compared key by key, any other value (arrays included) whole. A field
 * added or removed is a change from or to undefined.
 */
export function changesBetween(before: unknown, after: unknown, path: JsonPath = []): Change[] {
	if (isPlainObject(before) && isPlainObject(after)) {
		return keysOf(before, after).flatMap((key) => changesBetween(before[key], after[key], [...path, key]));
	}
	return same(before, after) ? [] : [{ path, before, after }];
}

const isPrefix = (short: JsonPath, long: JsonPath) => short.length <= long.length && short.every((key, i) => long[i] === key);

/**
 * Theirs with my changes on top. A change of mine that overlaps one of
 * theirs (the same path, or one inside the other) is settled at the shorter
 * path: agreed when both left the same value there, else a clash, which
 * takes my value unless its key is in `takeTheirs`.
 */
export function threeWayMerge<T extends JsonObject>(base: T, theirs: T, mine: T, takeTheirs: ReadonlySet<string> = new Set()): MergeOutcome<T> {
	const theirChanges = changesBetween(base, theirs);
	const myChanges = changesBetween(base, mine);
	const clashes = new Map<string, Clash>();
	const agreed = new Map<string, Change>();
	const clean: Change[] = [];

	for (const change of myChanges) {
		const overlapping = theirChanges.filter((their) => isPrefix(their.path, change.path) || isPrefix(change.path, their.path));
		if (overlapping.length === 0) {
			clean.push(change);
			continue;
		}
		for (const their of overlapping) {
			const path = their.path.length <= change.path.length ? their.path : change.path;
			const key = mergeKey(path);
			if (clashes.has(key) || agreed.has(key)) continue;
			const theirValue = valueAtPath(theirs, path);
			const myValue = valueAtPath(mine, path);
			if (same(theirValue, myValue)) agreed.set(key, { path, before: valueAtPath(base, path), after: myValue });
			else clashes.set(key, { path, base: valueAtPath(base, path), theirs: theirValue, mine: myValue });
		}
	}

	// Each side's changed paths never overlap one another, so neither do the clashes: their order does not matter.
	const merged = structuredClone(theirs);
	for (const change of clean) setAtPath(merged, change.path, change.after);
	for (const clash of clashes.values()) setAtPath(merged, clash.path, takeTheirs.has(mergeKey(clash.path)) ? clash.theirs : clash.mine);
	return { merged, theirs: theirChanges, mine: myChanges, clashes: [...clashes.values()], agreed: [...agreed.values()], clean };
}
