/**
 * Every page of the app, as the person who would open it, passes axe-core's
 * WCAG 2.0/2.1 A and AA rules with no serious or critical finding, has
 * exactly one h1 and one main landmark; and a form that opens in place takes
 * the keyboard's focus. Each persona signs in once: its browser context is
 * kept for all of its pages.
 */
import { expect, test, type APIRequestContext, type Browser, type BrowserContext, type Page } from '@playwright/test';
import { demoProjects } from '../../seeds/01_demo_workspace';
import { demoRoomName } from '../../seeds/06_demo_room';
import { METHOD_NOTES } from '../../src/lib/methods';
import { baseURL } from '../../playwright.config';
import { graveAxeFindings } from './helpers/axe';
import { firstLinkIn, latestMailTo } from './helpers/mail';
import { openPage } from './helpers/page';
import { signInPage, workspaceIdOf } from './helpers/session';
import { forgetSignUpsFromThisMachine } from './helpers/sign-up-allowance';
import { DEMO_WORKSPACE } from './helpers/workbench';

const UUID = '[0-9a-f-]{36}';

/** A room guest before the room's terms (`newGuest`), and one who has accepted them (`guest`). */
type Persona = 'anonymous' | 'owner' | 'newGuest' | 'guest';

interface Ids {
	workspaceId: string;
	projectId: string;
	scenarioId: string;
	roomId: string;
	methodSlug: string;
	resetToken: string;
	verifyToken: string;
	inviteToken: string;
	roomJoinToken: string;
}

interface PageCase {
	name: string;
	persona: Persona;
	path: (ids: Ids) => string;
}

const team = (ids: Ids) => `/app/w/${ids.workspaceId}`;
const project = (ids: Ids) => `${team(ids)}/projects/${ids.projectId}`;
const scenario = (ids: Ids) => `${project(ids)}/scenarios/${ids.scenarioId}`;
const teamRoom = (ids: Ids) => `${team(ids)}/rooms/${ids.roomId}`;

// One row for each +page.svelte under src/routes, and the error page, but /app's own page, which shows only to someone
// in no workspace (it redirects everyone else).
const pages: PageCase[] = [
	{ name: 'home', persona: 'anonymous', path: () => '/' },
	{ name: 'sign-in', persona: 'anonymous', path: () => '/signin' },
	{ name: 'sign-up', persona: 'anonymous', path: () => '/signup' },
	{ name: 'forgot password', persona: 'anonymous', path: () => '/forgot-password' },
	{ name: 'reset password', persona: 'anonymous', path: (ids) => `/reset-password/${ids.resetToken}` },
	{ name: 'verify e-mail', persona: 'anonymous', path: (ids) => `/verify-email/${ids.verifyToken}` },
	{ name: 'workspace invitation', persona: 'anonymous', path: (ids) => `/invite/${ids.inviteToken}` },
	{ name: 'data-room sign-in', persona: 'anonymous', path: () => '/rooms/signin' },
	{ name: 'data-room link', persona: 'anonymous', path: (ids) => `/rooms/join/${ids.roomJoinToken}` },
	{ name: 'error page (not found)', persona: 'anonymous', path: () => '/no-such-page' },
	{ name: 'projects', persona: 'owner', path: team },
	{ name: 'project', persona: 'owner', path: project },
	{ name: 'scenario editor', persona: 'owner', path: scenario },
	{ name: 'sensitivity', persona: 'owner', path: (ids) => `${scenario(ids)}/sensitivity` },
	{ name: 'compare', persona: 'owner', path: (ids) => `${project(ids)}/compare` },
	{ name: 'history', persona: 'owner', path: (ids) => `${scenario(ids)}/history` },
	{ name: 'scenario runs', persona: 'owner', path: (ids) => `${scenario(ids)}/runs` },
	{ name: 'workspace runs', persona: 'owner', path: (ids) => `${team(ids)}/runs` },
	{ name: 'workspace portfolio', persona: 'owner', path: (ids) => `${team(ids)}/portfolio` },
	{ name: 'portfolio across workspaces', persona: 'owner', path: () => '/app/portfolio' },
	{ name: 'members', persona: 'owner', path: (ids) => `${team(ids)}/members` },
	{ name: 'security log', persona: 'owner', path: (ids) => `${team(ids)}/audit` },
	{ name: 'billing', persona: 'owner', path: (ids) => `${team(ids)}/billing` },
	{ name: 'workspace settings', persona: 'owner', path: (ids) => `${team(ids)}/settings` },
	{ name: 'account and API tokens', persona: 'owner', path: () => '/app/account' },
	{ name: 'API reference', persona: 'owner', path: () => '/app/api' },
	{ name: 'method notes', persona: 'owner', path: () => '/app/methods' },
	{ name: 'method note', persona: 'owner', path: (ids) => `/app/methods/${ids.methodSlug}` },
	{ name: 'project data rooms', persona: 'owner', path: (ids) => `${project(ids)}/rooms` },
	{ name: 'data room (team)', persona: 'owner', path: teamRoom },
	{ name: 'data-room access log', persona: 'owner', path: (ids) => `${teamRoom(ids)}/log` },
	{ name: 'data-room version', persona: 'owner', path: (ids) => `${teamRoom(ids)}/versions/1` },
	{ name: 'data-room version scenario', persona: 'owner', path: (ids) => `${teamRoom(ids)}/versions/1/scenarios/1` },
	{ name: 'local mail inbox', persona: 'owner', path: () => '/dev/mail' },
	{ name: 'data-room terms', persona: 'newGuest', path: (ids) => `/rooms/${ids.roomId}/terms` },
	{ name: 'data rooms list', persona: 'guest', path: () => '/rooms' },
	{ name: 'data room', persona: 'guest', path: (ids) => `/rooms/${ids.roomId}` },
	{ name: 'data-room scenario', persona: 'guest', path: (ids) => `/rooms/${ids.roomId}/scenarios/1` }
];

const contexts = {} as Record<Persona, BrowserContext>;
const ids = {} as Ids;

/** A form post as a browser's, with the signed-in context's cookies; answers the response. */
async function postForm(request: APIRequestContext, url: string, form: Record<string, string>) {
	const response = await request.post(url, { headers: { accept: 'text/html', origin: baseURL }, form, maxRedirects: 0 });
	expect(response.status(), `${url}: ${response.status()}`).toBeLessThan(400);
	return response;
}

function tokenOf(link: string, prefix: string): string {
	return new URL(link).pathname.slice(prefix.length);
}

async function signedInOwner(browser: Browser): Promise<BrowserContext> {
	const context = await browser.newContext();
	const page = await context.newPage();
	await signInPage(page, 'owner');
	await page.close();
	return context;
}

async function findIds(owner: BrowserContext, anonymous: BrowserContext) {
	const request = owner.request;
	ids.workspaceId = await workspaceIdOf(request, DEMO_WORKSPACE);
	const { projects } = await (await request.get(`/api/v1/workspaces/${ids.workspaceId}/projects?limit=500`)).json();
	ids.projectId = (projects as { id: string; name: string }[]).find((p) => p.name === demoProjects[0].name)!.id;
	const { scenarios } = await (await request.get(`/api/v1/projects/${ids.projectId}/scenarios`)).json();
	ids.scenarioId = (scenarios as { id: string; isBaseCase: boolean }[]).find((s) => s.isBaseCase)!.id;
	const roomsHtml = await (await request.get(`${project(ids)}/rooms`)).text();
	const roomId = new RegExp(`href="/app/w/${ids.workspaceId}/rooms/(${UUID})">${demoRoomName}<`).exec(roomsHtml)?.[1];
	if (!roomId) throw new Error(`${demoRoomName} is not listed on the project's rooms page`);
	ids.roomId = roomId;
	ids.methodSlug = METHOD_NOTES[0].slug;

	// Real tokens, so the token pages show their forms rather than "this link cannot be used".
	const tag = `${Date.now().toString(36)}${Math.floor(Math.random() * 1e4)}`;
	const newcomer = `a11y.newcomer.${tag}@example.org`;
	await forgetSignUpsFromThisMachine();
	await postForm(anonymous.request, '/signup', { name: 'Nell Accessa', email: newcomer, password: 'undertow quay lantern 58', workspaceName: `A11y ${tag}` });
	ids.verifyToken = tokenOf(firstLinkIn((await latestMailTo(newcomer, 'Confirm your e-mail')).text, '/verify-email/'), '/verify-email/');
	await postForm(anonymous.request, '/forgot-password', { email: newcomer });
	ids.resetToken = tokenOf(firstLinkIn((await latestMailTo(newcomer, 'Choose a new Tidewright password')).text, '/reset-password/'), '/reset-password/');
	const invitee = `a11y.invitee.${tag}@example.org`;
	await postForm(request, `${team(ids)}/members?/invite`, { email: invitee, role: 'viewer' });
	ids.inviteToken = tokenOf(firstLinkIn((await latestMailTo(invitee, 'invited you to')).text, '/invite/'), '/invite/');
	// Three room guests: one whose link stays unused for its page, one left before the terms, one who accepts them.
	const accessUntil = new Date(Date.now() + 30 * 86_400_000).toISOString().slice(0, 10);
	const guests = ['link', 'new', 'in'].map((who) => `a11y.${who}.${tag}@corriemoor-capital.example`);
	for (const email of guests) await postForm(request, `${teamRoom(ids)}?/invite`, { email, name: 'Ada Lenning', accessUntil });
	const [linkOnly, ...links] = await Promise.all(guests.map(async (email) => firstLinkIn((await latestMailTo(email, demoRoomName)).text, '/rooms/join/')));
	ids.roomJoinToken = tokenOf(linkOnly, '/rooms/join/');
	return links as [string, string];
}

/** The guest opens the mailed link and chooses a password, as an invited investor does; then accepts the terms, if asked to. */
async function signedInGuest(browser: Browser, link: string, acceptTerms: boolean): Promise<BrowserContext> {
	const context = await browser.newContext();
	const page = await context.newPage();
	await openPage(page, link);
	await page.getByLabel('Password').fill('corriemoor-tide-a11y-26');
	await page.getByRole('button', { name: 'Set the password and open' }).click();
	await expect(page.getByRole('heading', { name: /Confidentiality terms/ })).toBeVisible();
	if (acceptTerms) {
		await page.getByRole('button', { name: 'I accept these terms' }).click();
		await expect(page.getByRole('heading', { level: 1, name: demoRoomName })).toBeVisible();
	}
	await page.close();
	return context;
}

/** Loads settle first: pages that fetch or draw after hydration are checked as a person sees them. */
async function settled(page: Page, path: string) {
	await openPage(page, path);
	await page.waitForLoadState('networkidle');
	await expect(page.getByText(/^Loading/)).toHaveCount(0);
}

test.describe('accessibility of every page', () => {
	test.beforeAll(async ({ browser }) => {
		test.setTimeout(120_000);
		contexts.anonymous = await browser.newContext();
		contexts.owner = await signedInOwner(browser);
		const [newGuestLink, guestLink] = await findIds(contexts.owner, contexts.anonymous);
		[contexts.newGuest, contexts.guest] = await Promise.all([signedInGuest(browser, newGuestLink, false), signedInGuest(browser, guestLink, true)]);
	});

	test.afterAll(async () => {
		await Promise.all(Object.values(contexts).map((c) => c?.close()));
	});

	for (const pageCase of pages) {
		test(`${pageCase.name} (${pageCase.persona})`, async () => {
			const page = await contexts[pageCase.persona].newPage();
			const path = pageCase.path(ids);
			await settled(page, path);
			expect(new URL(page.url()).pathname, 'the page opened where it was asked, not a redirect').toBe(path);

			expect.soft(await graveAxeFindings(page), `serious or critical axe findings on ${path}`).toEqual([]);
			expect.soft(await page.locator('h1').count(), 'exactly one h1').toBe(1);
			expect.soft(await page.getByRole('main').count(), 'exactly one main landmark').toBe(1);
			await page.close();
		});
	}

	test('a form that opens in place takes the focus, the keyboard alone opens it, and Cancel gives the focus back', async () => {
		const page = await contexts.owner.newPage();
		await settled(page, team(ids));
		const opener = page.getByRole('button', { name: 'New project' });
		await opener.focus();
		await page.keyboard.press('Enter');
		const form = page.getByRole('form', { name: 'New project' });
		await expect(form).toBeVisible();
		await expect(page.getByLabel('Project name')).toBeFocused();
		expect(await form.evaluate((el) => el.contains(document.activeElement))).toBe(true);
		await form.getByRole('button', { name: 'Cancel' }).press('Enter');
		await expect(form).toHaveCount(0);
		await expect(opener).toBeFocused();
		await page.close();
	});
});
