/**
 * The guard on ENGINE_VERSION: a fingerprint (sha256) of every number the
 * engine gives for the bundled examples (metrics and the annual table). When
 * a change moves any of them, this fails until ENGINE_VERSION is raised and
 * the new fingerprint recorded beside it, so stored results are never
 * mistaken for the current engine's (`npm run reevaluate` refreshes them).
 */
import { createHash } from 'node:crypto';
import { readFileSync, readdirSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseScenario } from '../../schemas/scenario';
import { evaluateScenario } from './evaluate';
import { ENGINE_VERSION } from './version';

/** The fingerprint of each engine version's numbers on examples/*.json. */
const FINGERPRINTS: Record<string, string> = {
	'1': '2d67c76d1b3e4a33927f98d50f72f9a8a6f9a50d893b3ed165f46ad376df688b',
	'2': 'e21a771342ad64e216996806897edf68c09a76833119f202b99bd5892857a6b5',
	// The debt-and-tax circle settled to 1e-12 of the debt (was 1e-9): figures move by up to a few 1e-9.
	'3': 'c98a0320fbfb9dc75dd799fafcfe5dae4d44a16ad35c48206280aa8b1997d610'
};

function examplesFingerprint(): string {
	const numbers: Record<string, unknown> = {};
	for (const file of readdirSync('examples').filter((f) => f.endsWith('.json')).sort()) {
		const parsed = parseScenario(JSON.parse(readFileSync(`examples/${file}`, 'utf8')));
		if (!parsed.ok) throw new Error(`${file}: ${JSON.stringify(parsed.issues)}`);
		const result = evaluateScenario(parsed.scenario);
		numbers[file] = { metrics: result.metrics, cashFlow: result.cashFlow };
	}
	return createHash('sha256').update(JSON.stringify(numbers)).digest('hex');
}

describe('ENGINE_VERSION', () => {
	it('has a recorded fingerprint, and the engine still gives exactly those numbers', () => {
		const recorded = FINGERPRINTS[ENGINE_VERSION];
		expect(recorded, `no fingerprint recorded for engine ${ENGINE_VERSION}`).toBeDefined();
		expect(
			examplesFingerprint(),
			'The engine’s numbers moved: raise ENGINE_VERSION in version.ts and record the new fingerprint here, then run `npm run reevaluate`.'
		).toBe(recorded);
	});

	it('is different for every recorded fingerprint', () => {
		expect(new Set(Object.values(FINGERPRINTS)).size).toBe(Object.keys(FINGERPRINTS).length);
	});
});
