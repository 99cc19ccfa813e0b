import { describe, expect, it } from 'vitest';
import { tidalDocument } from '../../../../tests/fixtures/scenario-documents';
import { DRIVER_IDS, defaultDrivers } from '../engine/sensitivity';
import { sensitivityChoices } from './sensitivity-choices';

describe('sensitivityChoices', () => {
	const choices = sensitivityChoices(tidalDocument);

	it('offers every engine driver once, the usual screening set first with the engine ranges', () => {
		expect(choices.map((c) => c.driver).sort()).toEqual([...DRIVER_IDS].sort());
		const usual = defaultDrivers(tidalDocument);
		expect(choices.slice(0, usual.length).map(({ driver, low, high, usual }) => ({ driver, low, high, usual }))).toEqual(
			usual.map((d) => ({ ...d, usual: true }))
		);
	});

	// The page's own rule for drivers outside the usual set: +-20 % of base (common practice for screening).
	it('starts the other drivers at +-20 % of their base, whole for counts', () => {
		const others = choices.filter((c) => !c.usual);
		expect(others.length).toBe(DRIVER_IDS.length - defaultDrivers(tidalDocument).length);
		for (const c of others) {
			if (c.unit === 'devices' || c.unit === 'years') {
				expect(c.low).toBe(Math.max(1, Math.round(c.baseInput * 0.8)));
				expect(c.high).toBe(Math.max(1, Math.round(c.baseInput * 1.2)));
			} else {
				expect(c.low).toBeCloseTo(c.baseInput * 0.8, 12);
				expect(c.high).toBeCloseTo(Math.min(c.unit === 'fraction' ? 1 : Infinity, c.baseInput * 1.2), 12);
			}
		}
	});
});
