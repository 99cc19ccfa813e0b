import { describe, expect, it } from 'vitest';
import { addressKey, waitInWords } from './rate-limit';

describe('waitInWords', () => {
	it('counts seconds under a minute, whole minutes rounded up to an hour, then hours', () => {
		expect(waitInWords(1)).toBe('1 second');
		expect(waitInWords(0.2)).toBe('1 second');
		expect(waitInWords(42)).toBe('42 seconds');
		expect(waitInWords(60)).toBe('1 minute');
		expect(waitInWords(61)).toBe('2 minutes');
		expect(waitInWords(900)).toBe('15 minutes');
		expect(waitInWords(3600)).toBe('60 minutes');
		expect(waitInWords(3601)).toBe('2 hours');
		expect(waitInWords(7200)).toBe('2 hours');
	});
});

describe('addressKey', () => {
	it('is the same however the address is typed, and keeps the address itself out of the key', () => {
		const key = addressKey('Maren.Tidy@Test.Example');
		expect(addressKey('  maren.tidy@test.example ')).toBe(key);
		expect(key).toMatch(/^[0-9a-f]{64}$/);
		expect(addressKey('other@test.example')).not.toBe(key);
	});
});
