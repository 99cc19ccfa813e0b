import { describe, expect, it } from 'vitest';
import { crossSiteRefusal } from './cross-site';

const app = 'http://127.0.0.1:3000';
const request = (method: string, headers: Record<string, string> = {}) => new Request(`${app}/api/v1/scenarios/x/archive`, { method, headers });

describe('crossSiteRefusal', () => {
	it('refuses a body-less POST, PUT, PATCH or DELETE from a foreign origin', () => {
		for (const method of ['POST', 'PUT', 'PATCH', 'DELETE']) {
			expect(crossSiteRefusal(request(method, { origin: 'https://evil.example' }), app), method).toMatch(/evil\.example/);
		}
	});

	it('refuses what the browser marks cross-site or same-site, and an opaque origin', () => {
		expect(crossSiteRefusal(request('POST', { 'sec-fetch-site': 'cross-site' }), app)).toMatch(/another site/);
		// A sibling subdomain is same-site, not same-origin: still not Tidewright's own page.
		expect(crossSiteRefusal(request('POST', { 'sec-fetch-site': 'same-site' }), app)).toMatch(/another site/);
		expect(crossSiteRefusal(request('POST', { origin: 'null' }), app)).toMatch(/no origin/);
	});

	it('lets the app’s own pages through, and requests from no browser page at all', () => {
		expect(crossSiteRefusal(request('POST', { origin: app, 'sec-fetch-site': 'same-origin' }), app)).toBeNull();
		expect(crossSiteRefusal(request('DELETE', { origin: app }), app)).toBeNull();
		expect(crossSiteRefusal(request('POST'), app)).toBeNull();
	});

	it('never refuses a read', () => {
		expect(crossSiteRefusal(request('GET', { origin: 'https://evil.example', 'sec-fetch-site': 'cross-site' }), app)).toBeNull();
	});
});
