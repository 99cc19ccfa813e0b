/** What the HTTP benches share: waiting for a server to answer, and signing in as a demo person through the real form. */
import { demoUsers, type DemoPersona } from '../seeds/02_demo_users';

export async function waitFor(url: string, timeoutMs = 300_000): Promise<void> {
	const until = Date.now() + timeoutMs;
	while (Date.now() < until) {
		try {
			if ((await fetch(url)).ok) return;
		} catch {
			// not up yet
		}
		await new Promise((r) => setTimeout(r, 500));
	}
	throw new Error(`${url} did not answer within ${timeoutMs / 1000} s`);
}

/** The session cookie of a demo person signed in at `origin`. */
export async function signIn(origin: string, persona: DemoPersona = 'analyst'): Promise<string> {
	const user = demoUsers[persona];
	const response = await fetch(`${origin}/signin`, {
		method: 'POST',
		redirect: 'manual',
		headers: { origin, accept: 'text/html', 'content-type': 'application/x-www-form-urlencoded' },
		body: new URLSearchParams({ email: user.email, password: user.password, next: '/app' })
	});
	const cookie = response.headers.get('set-cookie')?.split(';')[0];
	if (response.status !== 303 || !cookie) throw new Error(`sign-in failed (${response.status})`);
	return cookie;
}
