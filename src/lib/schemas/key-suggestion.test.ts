import { describe, expect, it } from 'vitest';
import { editDistance, suggestKey, unknownKeyMessage } from './key-suggestion';

const arrayKeys = ['deviceCount', 'arrayLoss', 'availability', 'electricalLoss', 'otherLoss', 'degradationPerYear'];

describe('editDistance', () => {
	// Known values: kitten -> sitting is 3 (Levenshtein 1966's usual example); an adjacent swap is one edit.
	it('counts insertions, deletions, substitutions and adjacent swaps as one edit each', () => {
		expect(editDistance('kitten', 'sitting')).toBe(3);
		expect(editDistance('availabilty', 'availability')).toBe(1);
		expect(editDistance('ab', 'ba')).toBe(1);
		expect(editDistance('ca', 'abc')).toBe(3);
		expect(editDistance('', 'abc')).toBe(3);
		expect(editDistance('same', 'same')).toBe(0);
	});
});

describe('suggestKey', () => {
	it('suggests the nearest key within two edits, ignoring case', () => {
		expect(suggestKey('availabilty', arrayKeys)).toBe('availability');
		expect(suggestKey('Availability', arrayKeys)).toBe('availability');
		expect(suggestKey('devicecount', arrayKeys)).toBe('deviceCount');
		expect(suggestKey('arayLos', arrayKeys)).toBe('arrayLoss');
	});

	it('suggests the key a clear prefix leads to, either way round', () => {
		expect(suggestKey('degradation', arrayKeys)).toBe('degradationPerYear');
		expect(suggestKey('tariff', ['tariffPerMWh', 'supportYears'])).toBe('tariffPerMWh');
		expect(suggestKey('availabilityFraction', arrayKeys)).toBe('availability');
	});

	it('suggests nothing when no key is near, when two are equally near, or for a short prefix', () => {
		expect(suggestKey('colour', arrayKeys)).toBeNull();
		expect(suggestKey('loss', ['lossA', 'lossB'])).toBeNull();
		expect(suggestKey('ab', ['abc', 'abd'])).toBeNull();
		expect(suggestKey('de', arrayKeys)).toBeNull();
	});

	it('allows one edit only on short keys', () => {
		expect(suggestKey('knd', ['kind'])).toBe('kind');
		expect(suggestKey('kd', ['kind'])).toBeNull();
	});
});

describe('unknownKeyMessage', () => {
	it('names the key and the one probably meant', () => {
		expect(unknownKeyMessage('availabilty', arrayKeys)).toBe('"availabilty" is not a field here; did you mean "availability"?');
	});

	it('lists the fields of a small object when none is near, and says so when it takes none', () => {
		expect(unknownKeyMessage('colour', ['name', 'sigma'])).toBe('"colour" is not a field here; the fields here are name, sigma');
		expect(unknownKeyMessage('colour', [])).toBe('"colour" is not a field here; this object takes no fields');
		expect(unknownKeyMessage('colour', Array.from({ length: 11 }, (_, i) => `field${i}`))).toBe('"colour" is not a field here');
	});
});
