/**
 * Signed-in HTTP clients and pages for the demo personas (seeds/02_demo_users.ts).
 * Sign-in goes through the real form action, as a browser's would.
 */
import { expect, type APIRequestContext, type Browser, type Page } from '@playwright/test';
import { request as playwrightRequest } from '@playwright/test';
import { demoUsers, type DemoPersona } from '../../../seeds/02_demo_users';
import { firstLinkIn, latestMailTo } from './mail';
import { openPage } from './page';
import { forgetSignUpsFromThisMachine } from './sign-up-allowance';

export type Persona = DemoPersona | 'anonymous';

export async function signedInRequest(
	playwright: { request: typeof playwrightRequest },
	baseURL: string,
	persona: Persona
): Promise<APIRequestContext> {
	const context = await playwright.request.newContext({ baseURL, extraHTTPHeaders: { origin: baseURL } });
	if (persona === 'anonymous') return context;
	const user = demoUsers[persona];
	// Asked with Playwright's default `accept: */*`, SvelteKit answers a form action as JSON (status 200);
	// a browser's form post asks for HTML and gets the 303.
	const response = await context.post('/signin', {
		headers: { accept: 'text/html' },
		form: { email: user.email, password: user.password, next: '/app' },
		maxRedirects: 0
	});
	expect(response.status(), `sign-in of ${persona}`).toBe(303);
	expect(response.headers()['location']).toBe('/app');
	return context;
}

export async function signInPage(page: Page, persona: DemoPersona) {
	const user = demoUsers[persona];
	await openPage(page, '/signin');
	await page.getByLabel('E-mail').fill(user.email);
	await page.getByLabel('Password').fill(user.password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL(/\/app\/w\//);
}

export async function newSignedInPage(browser: Browser, persona: DemoPersona): Promise<Page> {
	const context = await browser.newContext();
	const page = await context.newPage();
	await signInPage(page, persona);
	return page;
}

export async function workspaceIdOf(request: APIRequestContext, name: string): Promise<string> {
	const response = await request.get('/api/v1/workspaces');
	expect(response.ok()).toBe(true);
	const { workspaces } = (await response.json()) as { workspaces: { id: string; name: string }[] };
	const found = workspaces.find((w) => w.name === name);
	if (!found) throw new Error(`workspace ${name} not visible`);
	return found.id;
}

/** An HTTP client signed in as a room guest (an invited investor) through the guests' own sign-in form. */
export async function signedInGuestRequest(
	playwright: { request: typeof playwrightRequest },
	baseURL: string,
	investor: { email: string; password: string }
): Promise<APIRequestContext> {
	const context = await playwright.request.newContext({ baseURL, extraHTTPHeaders: { origin: baseURL } });
	const response = await context.post('/rooms/signin?/password', {
		headers: { accept: 'text/html' },
		form: { email: investor.email, password: investor.password, next: '/rooms' },
		maxRedirects: 0
	});
	expect(response.status(), `sign-in of room guest ${investor.email}`).toBe(303);
	return context;
}

/**
 * A new account through the sign-up form, its address confirmed from the mail
 * and signed in: it lands in its own empty workspace on the Free plan. Answers
 * the workspace id.
 */
export async function signUpFreshAccount(page: Page, who: { name: string; workspace: string }): Promise<string> {
	const email = `${who.name.toLowerCase().replace(/\W+/g, '.')}.${Date.now()}.${Math.floor(Math.random() * 1e6)}@example.org`;
	const password = 'undertow quay lantern 58';
	await forgetSignUpsFromThisMachine();
	await openPage(page, '/signup');
	await page.getByLabel('Your name').fill(who.name);
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill(password);
	await page.getByLabel('Workspace name').fill(who.workspace);
	await page.getByRole('button', { name: 'Make my account' }).click();
	await expect(page.getByRole('status')).toContainText(`We sent a link to ${email}`);
	const verification = await latestMailTo(email, 'Confirm your e-mail');
	await openPage(page, firstLinkIn(verification.text, '/verify-email/'));
	await page.getByRole('button', { name: 'Confirm my address' }).click();
	await expect(page.getByText('your address is confirmed')).toBeVisible();
	await openPage(page, '/signin');
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill(password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByRole('heading', { name: who.workspace })).toBeVisible();
	const workspaceId = /\/app\/w\/([0-9a-f-]{36})/.exec(page.url())?.[1];
	if (!workspaceId) throw new Error(`not in a workspace: ${page.url()}`);
	return workspaceId;
}
