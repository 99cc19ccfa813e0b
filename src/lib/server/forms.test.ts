import { describe, expect, it } from 'vitest';
import { safeNextPath } from './forms';

const origin = 'http://127.0.0.1:3000';

describe('safeNextPath', () => {
	it('keeps a path of this app, with its query and fragment', () => {
		expect(safeNextPath('/app/w/abc/projects?tab=2#top', origin)).toBe('/app/w/abc/projects?tab=2#top');
		expect(safeNextPath('/app/account', origin)).toBe('/app/account');
	});

	it('refuses what a browser would read as another site', () => {
		// Browsers drop tab, LF and CR inside URLs and read "\" as "/": each of these lands on evil.example.
		for (const next of ['/\t/evil.example', '/\n/evil.example', '/\r/evil.example', '/\\evil.example', '//evil.example', '///evil.example', '/\\/evil.example']) {
			const landed = new URL(next.replace(/[\t\n\r]/g, '').replace(/\\/g, '/'), origin);
			expect(landed.origin, `${JSON.stringify(next)} is a real trap`).toBe('http://evil.example');
			expect(safeNextPath(next, origin), JSON.stringify(next)).toBe('/app');
		}
	});

	it('refuses full addresses, other schemes and control characters', () => {
		for (const next of ['https://evil.example/app', 'javascript:alert(1)', '/app\u0000', '/app\u007f', 'app/w', '']) {
			expect(safeNextPath(next, origin), JSON.stringify(next)).toBe('/app');
		}
		expect(safeNextPath(null, origin)).toBe('/app');
		expect(safeNextPath(undefined, origin, '/elsewhere')).toBe('/elsewhere');
	});

	it('answers a value that can go into a Location header (no newline reaches it)', () => {
		for (const next of ['/app%0D%0ASet-Cookie:x=1', decodeURIComponent('/app%0D%0ASet-Cookie:x=1')]) {
			expect(safeNextPath(next, origin)).not.toMatch(/[\r\n]/);
		}
	});
});
