/**
 * The scenario format's versions and the steps between them. A document
 * names the version it was written in (`schemaVersion`); one written in an
 * older version is brought up to the current one by the steps below, in
 * order, before it is checked against the current schema (parseScenario).
 *
 * Each step takes a raw document of version N and returns version N + 1. It
 * is pure, keeps every value the old reader would have used, and invents no
 * value that reader would not have applied. Stored documents are never
 * rewritten: a stored version-1 document is upgraded in memory each time it
 * is read, and the next save writes the current version.
 *
 * Adding a version: raise SCHEMA_VERSION, append a step from the previous
 * version with its own test, and say what changed in docs/scenario-format.md.
 */

/** The version this code writes. */
export const SCHEMA_VERSION = 3 as const;
/** The oldest version this code still reads. */
export const OLDEST_SCHEMA_VERSION = 1;

export type RawDocument = Record<string, unknown>;

export interface UpgradeStep {
	/** Reads version `from`, writes `from + 1`. */
	from: number;
	/** What the step changes, for docs/scenario-format.md and the step's test. */
	summary: string;
	upgrade(document: RawDocument): { document: RawDocument; notes: string[] };
}

function isObject(value: unknown): value is RawDocument {
	return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/** `{ amount }` -> `{ fraction }` on a share-of-capex entry, keeping the other keys in place. */
function amountToFraction(entry: RawDocument): RawDocument {
	return Object.fromEntries(Object.entries(entry).map(([key, value]) => (key === 'amount' ? ['fraction', value] : [key, value])));
}

/** A share of capex given as `amount` (version 1), with no `fraction` beside it. */
function holdsShareAsAmount(entry: unknown): entry is RawDocument {
	return isObject(entry) && entry.basis === 'percent-of-capex' && 'amount' in entry && !('fraction' in entry);
}

/**
 * Version 1 -> 2: a share of capex is a `fraction`, never an `amount`.
 * In version 1 `decommissioning.amount` and `revenue.grants[].amount` meant
 * money for most bases but a fraction for `percent-of-capex`; version 2 gives
 * the share its own field, as opex lines always did. A decommissioning object
 * without a basis gets the basis version 1 read it with (`lump-sum`), since
 * version 2 chooses the fields by the basis.
 */
export const upgradeV1ToV2: UpgradeStep = {
	from: 1,
	summary:
		'decommissioning and revenue.grants[] on basis percent-of-capex take their share as `fraction` instead of `amount`; decommissioning.basis is written out',
	upgrade(document) {
		const notes: string[] = [];
		const next: RawDocument = { ...document, schemaVersion: 2 };

		let decommissioning = document.decommissioning;
		if (isObject(decommissioning) && decommissioning.basis === undefined) {
			decommissioning = { basis: 'lump-sum', ...decommissioning };
			notes.push('decommissioning.basis set to "lump-sum", the version 1 default');
		}
		if (holdsShareAsAmount(decommissioning)) {
			decommissioning = amountToFraction(decommissioning);
			notes.push('decommissioning.amount moved to decommissioning.fraction (percent-of-capex)');
		}
		if (decommissioning !== undefined) next.decommissioning = decommissioning;

		const revenue = document.revenue;
		if (isObject(revenue) && Array.isArray(revenue.grants)) {
			const grants = revenue.grants.map((grant: unknown, i) => {
				if (!holdsShareAsAmount(grant)) return grant;
				notes.push(`revenue.grants[${i}].amount moved to revenue.grants[${i}].fraction (percent-of-capex)`);
				return amountToFraction(grant);
			});
			next.revenue = { ...revenue, grants };
		}
		return { document: next, notes };
	}
};

/**
 * Version 2 -> 3: two choices version 2 made silently are written out, so a
 * version 2 document reads as it always did while version 3 defaults differ.
 * - Debt was funded in step with equity (pro rata); version 3 defaults to
 *   equity first: `finance.debt.fundingOrder: "pro-rata"` on any debt.
 * - A tariff indexed to a share s of inflation grew at (1 + s i); version 3
 *   defaults to indexing a share s of the price: for 0 < s < 1 the two differ,
 *   so `revenue.indexationMethod: "scaled-inflation"` is set (at 0 and 1 they
 *   agree and nothing is written).
 * Construction timing is not kept: booking a year's spend at its end was a
 * flaw of the engine, not a choice of the document, and version 3 evaluates
 * every document with the spend spread through the year (mid-year unless the
 * document says otherwise).
 */
export const upgradeV2ToV3: UpgradeStep = {
	from: 2,
	summary:
		'finance.debt.fundingOrder "pro-rata" written on debt; revenue.indexationMethod "scaled-inflation" written when 0 < revenue.tariffIndexation < 1',
	upgrade(document) {
		const notes: string[] = [];
		const next: RawDocument = { ...document, schemaVersion: 3 };
		const finance = document.finance;
		if (isObject(finance) && isObject(finance.debt) && finance.debt.sizing !== undefined && finance.debt.sizing !== 'none' && !('fundingOrder' in finance.debt)) {
			next.finance = { ...finance, debt: { ...finance.debt, fundingOrder: 'pro-rata' } };
			notes.push('finance.debt.fundingOrder set to "pro-rata", how version 2 funded construction');
		}
		const revenue = document.revenue;
		if (isObject(revenue) && !('indexationMethod' in revenue)) {
			const share = revenue.tariffIndexation;
			if (typeof share === 'number' && share > 0 && share < 1) {
				next.revenue = { ...revenue, indexationMethod: 'scaled-inflation' };
				notes.push(`revenue.indexationMethod set to "scaled-inflation": version 2 grew the tariff at ${share} x inflation`);
			}
		}
		return { document: next, notes };
	}
};

/** Every step, oldest first: step i reads version OLDEST_SCHEMA_VERSION + i. */
export const upgradeSteps: readonly UpgradeStep[] = [upgradeV1ToV2, upgradeV2ToV3];

export type UpgradeOutcome =
	| { ok: true; document: RawDocument; upgradedFrom: number | null; notes: string[] }
	| { ok: false; path: 'schemaVersion' | null; message: string };

const readable = `versions ${OLDEST_SCHEMA_VERSION} to ${SCHEMA_VERSION}`;

/** The document's version, or why it has none this code can read. */
function versionOf(document: RawDocument): { ok: true; version: number } | { ok: false; message: string } {
	const version = document.schemaVersion;
	if (version === undefined) {
		return { ok: false, message: `schemaVersion is missing: give the version the document is written in (this Tidewright reads ${readable}; ${SCHEMA_VERSION} is current)` };
	}
	if (typeof version !== 'number' || !Number.isInteger(version) || version < OLDEST_SCHEMA_VERSION) {
		return { ok: false, message: `schemaVersion must be a whole number from ${OLDEST_SCHEMA_VERSION} to ${SCHEMA_VERSION}, not ${JSON.stringify(version)}` };
	}
	if (version > SCHEMA_VERSION) {
		return {
			ok: false,
			message: `schemaVersion ${version} is newer than this Tidewright reads (${readable}): it was written by a later version, so it is not read rather than misread`
		};
	}
	return { ok: true, version };
}

/**
 * Brings a raw document up to SCHEMA_VERSION: the steps from its own version
 * on, in order, with the notes of what each moved. A document in the current
 * version comes back as it is (`upgradedFrom: null`). A missing, malformed or
 * newer `schemaVersion` is refused.
 */
export function upgradeScenarioDocument(input: unknown): UpgradeOutcome {
	if (!isObject(input)) return { ok: false, path: null, message: 'a scenario document must be a JSON object' };
	const version = versionOf(input);
	if (!version.ok) return { ok: false, path: 'schemaVersion', message: version.message };
	let document = input;
	const notes: string[] = [];
	for (const step of upgradeSteps.filter((s) => s.from >= version.version)) {
		const upgraded = step.upgrade(document);
		document = upgraded.document;
		notes.push(...upgraded.notes);
	}
	return { ok: true, document, upgradedFrom: version.version === SCHEMA_VERSION ? null : version.version, notes };
}
