/**
 * Cross-site request forgery, refused in one place for every state-changing
 * request (pages, form actions and API routes alike, bodies or none).
 * SvelteKit's own check covers form content types only; an empty POST to
 * archive or restore would pass it.
 *
 * A browser says where a request comes from: `Sec-Fetch-Site` (all current
 * browsers) and `Origin` (on every POST, PUT, PATCH, DELETE). A request that
 * carries either and does not come from the app's own origin is refused. A
 * request with neither did not come from a browser page, so it cannot be a
 * forgery riding on a victim's cookie (scripts and API tokens).
 */
const stateChanging = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

export function crossSiteRefusal(request: Request, appOrigin: string): string | null {
	if (!stateChanging.has(request.method)) return null;
	const site = request.headers.get('sec-fetch-site');
	if (site !== null && site !== 'same-origin' && site !== 'none') {
		return `Refused: this ${request.method} came from another site (${site}).`;
	}
	const origin = request.headers.get('origin');
	if (origin !== null && origin !== appOrigin) {
		return `Refused: this ${request.method} came from ${origin === 'null' ? 'a page with no origin' : origin}, not from Tidewright.`;
	}
	return null;
}
