/**
 * Parsing with one issue per field: zod reports all unknown keys of an object
 * as one issue; here each becomes its own, at its own path, with the key that
 * was probably meant (see ./key-suggestion.ts). Used for scenario documents
 * and API request bodies alike, so an unknown key reads the same everywhere.
 */
import type { z } from 'zod';
import { unknownKeyMessage } from './key-suggestion';

export type FieldPath = (string | number)[];
export interface FieldIssue {
	path: FieldPath;
	message: string;
}

export type StrictParseResult<T> = { success: true; data: T } | { success: false; issues: FieldIssue[] };

function pathKey(path: readonly PropertyKey[]): string {
	return JSON.stringify(path.map((key) => (typeof key === 'number' ? key : String(key))));
}

/** The keys an object schema knows, read from the schema that raised an unrecognized_keys issue. */
function objectKeys(inst: unknown): string[] | null {
	const shape = (inst as { _zod?: { def?: { shape?: Record<string, unknown> } } } | undefined)?._zod?.def?.shape;
	return shape ? Object.keys(shape) : null;
}

/**
 * `schema.safeParse(input)`, with every unknown key reported at its own path
 * (`array.availabilty`) and its message naming the key probably meant.
 */
export function safeParseStrict<S extends z.ZodType>(schema: S, input: unknown): StrictParseResult<z.output<S>> {
	// zod hands each issue to this map once its path is complete; the schema that
	// raised an unknown-key issue is the object whose shape lists the known keys.
	const knownKeysAt = new Map<string, string[]>();
	const result = schema.safeParse(input, {
		error: (issue) => {
			if (issue.code === 'unrecognized_keys') {
				const keys = objectKeys(issue.inst);
				if (keys) knownKeysAt.set(pathKey(issue.path ?? []), keys);
			}
			return undefined;
		}
	});
	if (result.success) return { success: true, data: result.data };
	const issues = result.error.issues.flatMap((issue): FieldIssue[] => {
		const path = issue.path.map((key) => (typeof key === 'number' ? key : String(key)));
		if (issue.code === 'unrecognized_keys') {
			const known = knownKeysAt.get(pathKey(issue.path));
			return issue.keys.map((key) => ({
				path: [...path, key],
				message: known ? unknownKeyMessage(key, known) : `"${key}" is not a field here`
			}));
		}
		return [{ path, message: issue.message }];
	});
	return { success: false, issues };
}
