import { describe, expect, it } from 'vitest';
import { stampText, utcMinute } from './layout';

describe('utcMinute', () => {
	it('writes the time in UTC to the minute, whatever the server zone', () => {
		expect(utcMinute(new Date('2026-03-14T23:59:59+02:00'))).toBe('2026-03-14 21:59 UTC');
	});
});

describe('stampText', () => {
	it("names the investor and when the copy was made", () => {
		expect(stampText({ email: 'ines.marlowe@corvane.example', at: new Date('2026-03-14T09:05:00Z') })).toBe('Prepared for ines.marlowe@corvane.example on 2026-03-14 09:05 UTC');
	});
});
