/**
 * A save that met someone else's save, made readable: what they changed
 * since the revision the user started from (field, was, now, who and when),
 * where both changed the same field differently (a clash, to settle field by
 * field), and the user's draft put on top of the latest revision
 * (three-way-merge.ts). The scenario's name and notes merge with its
 * document. Pure: the page fetches, this only compares.
 */
import type { Scenario } from '../schemas/scenario';
import { valueDifferences, valueWords, type ValueDifference } from './change-words';
import { pathKey } from './field-issues';
import { fieldWords, sectionWords, type WordsSources } from './field-words';
import type { FieldPath } from './schema-fields';
import { stableJson } from './stable-json';
import { mergeKey, threeWayMerge, valueAtPath, type JsonObject, type JsonPath } from './three-way-merge';

/** What a save writes: the name and notes beside the document. */
export interface ScenarioSide {
	name: string;
	notes: string;
	document: Scenario;
}

/** A revision saved after the one the user started from. */
export interface SavedRevision {
	revision: number;
	by: string | null;
	at: string;
	/** Its name and document; null when not fetched. Its notes are not kept per revision. */
	side: Pick<ScenarioSide, 'name' | 'document'> | null;
}

export interface ValueRow {
	key: string;
	section: string;
	field: string;
	before: string;
	after: string;
}

export interface TheirChange {
	key: string;
	rows: ValueRow[];
	/** Differing fields past the rows shown. */
	more: number;
	/** The revision that made the change, or every revision since the base when that cannot be told. */
	revisions: SavedRevision[];
	/** The user's draft made the same change. */
	sameAsMine: boolean;
}

export interface ClashRow {
	key: string;
	field: string;
	theirs: string;
	mine: string;
}

export interface ClashChoice {
	key: string;
	section: string;
	field: string;
	rows: ClashRow[];
	more: number;
	theirsChosen: boolean;
}

export interface SaveConflict {
	theirs: TheirChange[];
	clashes: ClashChoice[];
	/** The user's changes that go on top as typed (no clash, not made alike by them), field by field. */
	mine: ValueRow[];
	/** Fields of those changes past the rows shown. */
	moreOfMine: number;
	/** The latest revision with the user's changes on top and the clashes settled as chosen. */
	merged: ScenarioSide;
}

/** A change of a list is shown as this many single fields at most. */
export const MAX_ROWS = 6;

/** The document's `name` follows the scenario's name on save, so it is compared as the name alone. */
function parts(side: Pick<ScenarioSide, 'name' | 'document'> & { notes?: string }): JsonObject {
	const { name: _ignored, ...document } = side.document as Scenario & JsonObject;
	return side.notes === undefined ? { name: side.name, document } : { name: side.name, notes: side.notes, document };
}

/** A merge path as a document field path, or null for the name and notes beside the document. */
function documentPath(path: JsonPath): FieldPath | null {
	return path[0] === 'document' ? path.slice(1) : null;
}

const besideWords: Record<string, string> = { name: 'Scenario name', notes: 'Notes' };

interface Words extends WordsSources {
	sectionOf?: (id: string) => string | null;
}

function nameOf(path: FieldPath, document: unknown, words: Words) {
	const key = pathKey(path);
	return { key, field: fieldWords(key, { ...words, document }), section: sectionWords(key, words.sectionOf) };
}

/** The single fields behind one merged path, with words for each: the name and notes are one field each. */
function differencesAt(path: JsonPath, before: unknown, after: unknown): ValueDifference[] {
	const inDocument = documentPath(path);
	return inDocument === null ? [{ path: [path[0]], before, after }] : valueDifferences(before, after, inDocument);
}

function rowWords(difference: ValueDifference, beside: boolean, documents: { before: Scenario; after: Scenario }, words: Words) {
	const { path } = difference;
	const named = beside
		? { key: String(path[0]), field: besideWords[String(path[0])] ?? String(path[0]), section: 'Scenario' }
		: nameOf(path, difference.after === undefined ? documents.before : documents.after, words);
	const say = (value: unknown, document: Scenario) => valueWords(value, path, document, document.currency);
	return { ...named, before: say(difference.before, documents.before), after: say(difference.after, documents.after) };
}

/** The revisions that changed `path` last: one when the fetched documents tell, else all of them. */
function changedIn(path: JsonPath, base: JsonObject, revisions: readonly SavedRevision[]): SavedRevision[] {
	if (revisions.length <= 1 || path[0] === 'notes') return [...revisions];
	for (let i = revisions.length - 1; i >= 0; i--) {
		const after = revisions[i].side;
		const before = i === 0 ? base : revisions[i - 1].side ? parts(revisions[i - 1].side!) : null;
		if (!after || !before) return [...revisions];
		if (stableJson(valueAtPath(parts(after), path)) !== stableJson(valueAtPath(before, path))) return [revisions[i]];
	}
	return [...revisions];
}

/**
 * Compares the base (what the user opened), the latest (what is saved now,
 * `revisions` leading to it, oldest first) and the user's draft. Clashes
 * take the draft's value unless their key is in `takeTheirs`.
 */
export function saveConflict(
	base: ScenarioSide,
	latest: ScenarioSide,
	mine: ScenarioSide,
	revisions: readonly SavedRevision[],
	takeTheirs: ReadonlySet<string> = new Set(),
	words: Words = {}
): SaveConflict {
	const baseParts = parts(base);
	const outcome = threeWayMerge(baseParts, parts(latest), parts(mine), takeTheirs);
	const agreed = new Set(outcome.agreed.map((change) => mergeKey(change.path)));

	const theirs = outcome.theirs.map((change): TheirChange => {
		const differences = differencesAt(change.path, change.before, change.after);
		const rows = differences.slice(0, MAX_ROWS).map((d) => rowWords(d, documentPath(change.path) === null, { before: base.document, after: latest.document }, words));
		return {
			key: mergeKey(change.path),
			rows,
			more: differences.length - rows.length,
			revisions: changedIn(change.path, baseParts, revisions),
			sameAsMine: agreed.has(mergeKey(change.path))
		};
	});

	const clashes = outcome.clashes.map((clash): ClashChoice => {
		const key = mergeKey(clash.path);
		const inDocument = documentPath(clash.path);
		const heading = inDocument === null ? { field: besideWords[key] ?? key, section: 'Scenario' } : nameOf(inDocument, latest.document, words);
		const differences = differencesAt(clash.path, clash.theirs, clash.mine);
		const rows = differences.slice(0, MAX_ROWS).map((d) => {
			const row = rowWords(d, inDocument === null, { before: latest.document, after: mine.document }, words);
			return { key: row.key, field: row.field, theirs: row.before, mine: row.after };
		});
		return { key, section: heading.section, field: heading.field, rows, more: differences.length - rows.length, theirsChosen: takeTheirs.has(key) };
	});

	const myDifferences = outcome.clean.flatMap((change) =>
		differencesAt(change.path, change.before, change.after).map((d) => ({ difference: d, beside: documentPath(change.path) === null }))
	);
	const mineRows = myDifferences.slice(0, MAX_ROWS).map(({ difference, beside }) => rowWords(difference, beside, { before: base.document, after: mine.document }, words));

	const merged = outcome.merged as { name: string; notes?: string; document: JsonObject };
	return {
		theirs,
		clashes,
		mine: mineRows,
		moreOfMine: myDifferences.length - mineRows.length,
		merged: { name: merged.name, notes: merged.notes ?? '', document: { ...merged.document, name: latest.document.name } as Scenario }
	};
}
