import { env } from '$env/dynamic/private';

/** Secure cookies wherever the app is served over https (production); plain http on loopback in local runs. */
export function cookiesAreSecure(url: URL): boolean {
	const origin = env.ORIGIN ?? url.origin;
	return origin.startsWith('https://');
}
