/**
 * What the scenario schema says about one field of a document: its
 * description, bounds and whether it may be left empty. The editor shows
 * these beside each input, so the forms and the engine read one source.
 */
import { scenarioSchema } from '../schemas/scenario';

export type FieldPath = readonly (string | number)[];

export interface FieldFacts {
	description: string;
	min: number | null;
	max: number | null;
	/** The bound excludes its value (positive numbers: min 0 exclusive). */
	minExclusive: boolean;
	integer: boolean;
	/** The field may be absent (an empty input removes it). */
	optional: boolean;
	/** The value zod fills in when the field is absent, if any. */
	defaultValue: unknown;
	/** The allowed values of an enum field. */
	options: readonly string[];
}

/* zod's internal definitions, read only as far as the editor needs them. */
interface Node {
	description?: string;
	def: {
		type: string;
		innerType?: Node;
		shape?: Record<string, Node>;
		element?: Node;
		options?: Node[];
		discriminator?: string;
		defaultValue?: unknown;
		values?: readonly unknown[];
		entries?: Record<string, string>;
		checks?: { _zod: { def: { check: string; value?: number; inclusive?: boolean; format?: string } } }[];
		format?: string;
	};
	shape?: Record<string, Node>;
}

const root = scenarioSchema as unknown as Node;

/** The value at a field path in a document (undefined when the path runs out). */
export function valueAt(document: unknown, path: FieldPath): unknown {
	let current: unknown = document;
	for (const key of path) {
		if (current === null || typeof current !== 'object') return undefined;
		current = (current as Record<string | number, unknown>)[key];
	}
	return current;
}

interface Walked {
	node: Node;
	optional: boolean;
	defaultValue: unknown;
	description: string;
	/** For a union's discriminator (`basis`, `kind`, `sizing`): the value of every branch, so the choice can change branch. */
	branchValues?: string[];
}

/** Peels default/optional/nullable wrappers, noting what they say. */
function unwrap(node: Node, acc: Walked): Walked {
	let current = node;
	let { optional, defaultValue, description } = acc;
	for (;;) {
		if (!description && current.description) description = current.description;
		const type = current.def.type;
		if ((type === 'default' || type === 'prefault') && current.def.innerType) {
			if (defaultValue === undefined) defaultValue = current.def.defaultValue;
			current = current.def.innerType;
		} else if ((type === 'optional' || type === 'nullable') && current.def.innerType) {
			optional = true;
			current = current.def.innerType;
		} else break;
	}
	return { node: current, optional, defaultValue, description };
}

/** The schema node at `path`, choosing each union's branch by the document's own discriminator. */
function walk(path: FieldPath, document: unknown): Walked | null {
	let walked = unwrap(root, { node: root, optional: false, defaultValue: undefined, description: '' });
	let branchValues: string[] | undefined;
	for (let i = 0; i <= path.length; i++) {
		while (walked.node.def.type === 'union' && walked.node.def.options) {
			const key = walked.node.def.discriminator ?? '';
			const options = walked.node.def.options;
			if (i === path.length - 1 && path[i] === key) {
				branchValues = options.flatMap((option) => (option.def.shape?.[key]?.def.values ?? []).map(String));
			}
			const chosen = valueAt(document, [...path.slice(0, i), key]);
			const branch = options.find((option) => option.def.shape?.[key]?.def.values?.includes(chosen));
			if (!branch) return null;
			walked = unwrap(branch, { ...walked, node: branch });
		}
		if (i === path.length) return { ...walked, branchValues };
		const node = walked.node;
		const key = path[i];
		let next: Node | undefined;
		if (node.def.type === 'object') next = (node.def.shape ?? node.shape)?.[String(key)];
		else if (node.def.type === 'array') next = node.def.element;
		if (!next) return null;
		walked = unwrap(next, { node: next, optional: false, defaultValue: undefined, description: '' });
	}
	return walked;
}

function bounds(node: Node) {
	let min: number | null = null;
	let max: number | null = null;
	let minExclusive = false;
	let integer = node.def.format === 'safeint' || node.def.format === 'int32';
	for (const check of node.def.checks ?? []) {
		const def = check._zod.def;
		if (def.check === 'greater_than' && typeof def.value === 'number') {
			min = def.value;
			minExclusive = def.inclusive === false;
		} else if (def.check === 'less_than' && typeof def.value === 'number') max = def.value;
		else if (def.check === 'number_format' && (def.format === 'safeint' || def.format === 'int32')) integer = true;
	}
	return { min, max, minExclusive, integer };
}

/** The facts about one field, or null when the path leads nowhere in the schema. */
export function fieldFacts(path: FieldPath, document: unknown): FieldFacts | null {
	const walked = walk(path, document);
	if (!walked) return null;
	const { node } = walked;
	const options =
		walked.branchValues ??
		(node.def.type === 'enum' && node.def.entries ? Object.values(node.def.entries) : node.def.type === 'literal' ? (node.def.values ?? []).map(String) : []);
	return {
		description: walked.description,
		...bounds(node),
		optional: walked.optional,
		defaultValue: walked.defaultValue,
		options
	};
}
