/**
 * The Content-Security-Policy (svelte.config.js, kit.csp): every page answers
 * one, scripts only from the app's origin or SvelteKit's own marked start-up
 * script (no 'unsafe-inline', no 'unsafe-eval'), and the main pages load,
 * hydrate and draw their charts in Chromium without one violation.
 */
import { expect, test, type APIRequestContext, type Page } from '@playwright/test';
import { baseURL, stripeStandinPort } from '../../playwright.config';
import { demoProjects } from '../../seeds/01_demo_workspace';
import { openPage } from './helpers/page';
import { newSignedInPage, signedInRequest } from './helpers/session';

interface DemoPlace {
	workspaceId: string;
	projectPath: string;
	scenarioPath: string;
}

/** The demo workspace, its tidal project and that project's base case, through the API with the caller's session. */
async function demoPlace(request: APIRequestContext): Promise<DemoPlace> {
	const { workspaces } = (await (await request.get('/api/v1/workspaces')).json()) as { workspaces: { id: string; name: string }[] };
	const workspaceId = workspaces.find((w) => w.name === 'Halvard Marine Energy')!.id;
	const { projects } = (await (await request.get(`/api/v1/workspaces/${workspaceId}/projects?limit=500`)).json()) as { projects: { id: string; name: string }[] };
	const project = projects.find((p) => p.name === demoProjects[0].name)!;
	const { scenarios } = (await (await request.get(`/api/v1/projects/${project.id}/scenarios`)).json()) as { scenarios: { id: string; isBaseCase: boolean }[] };
	const base = scenarios.find((s) => s.isBaseCase)!;
	const projectPath = `/app/w/${workspaceId}/projects/${project.id}`;
	return { workspaceId, projectPath, scenarioPath: `${projectPath}/scenarios/${base.id}` };
}

/** `script-src 'self' 'nonce-…'` -> { 'script-src': ["'self'", "'nonce-…'"] }. */
function directivesOf(policy: string): Record<string, string[]> {
	return Object.fromEntries(
		policy
			.split(';')
			.map((part) => part.trim().split(/\s+/))
			.filter((words) => words[0] !== '')
			.map(([name, ...sources]) => [name.toLowerCase(), sources])
	);
}

function expectStrictPolicy(path: string, policy: string | undefined) {
	expect(policy, `${path} answers a content-security-policy header`).toBeTruthy();
	const directives = directivesOf(policy!);
	expect(policy, path).not.toContain('unsafe-eval');
	expect(directives['script-src'], `${path}: script-src`).toBeDefined();
	expect(directives['script-src'], `${path}: script-src`).toContain("'self'");
	expect(directives['script-src'], `${path}: script-src`).not.toContain("'unsafe-inline'");
	expect(directives['default-src'], path).toEqual(["'self'"]);
	expect(directives['object-src'], path).toEqual(["'none'"]);
	expect(directives['frame-ancestors'], path).toEqual(["'none'"]);
	expect(directives['base-uri'], path).toEqual(["'self'"]);
	expect(directives['form-action'], path).toEqual(["'self'"]);
}

/**
 * Every CSP violation the page meets, on every document it opens: Chromium's
 * console reports ("... violates the following Content Security Policy
 * directive ...") and the document's securitypolicyviolation events, passed
 * out by a script and a binding the browser injects itself (outside the
 * page's policy).
 */
async function watchViolations(page: Page): Promise<string[]> {
	const seen: string[] = [];
	page.on('console', (message) => {
		if (message.text().includes('Content Security Policy')) seen.push(`${page.url()}: ${message.text()}`);
	});
	await page.exposeFunction('reportCspViolation', (text: string) => seen.push(text));
	await page.addInitScript(() => {
		const report = (window as unknown as { reportCspViolation: (text: string) => void }).reportCspViolation;
		document.addEventListener('securitypolicyviolation', (e) =>
			report(`${location.pathname}: ${e.violatedDirective} blocked ${e.blockedURI || 'inline'} (${e.sourceFile}:${e.lineNumber})`)
		);
	});
	return seen;
}

async function expectChartDrawn(page: Page, name: RegExp) {
	const chart = page.getByRole('img', { name }).first();
	await expect(chart).toBeVisible();
	await expect.poll(() => chart.locator('canvas').evaluate((c: HTMLCanvasElement) => c.width)).toBeGreaterThan(0);
}

test.describe('content security policy', () => {
	test('every main page answers a content-security-policy header without unsafe-eval and with script-src free of unsafe-inline', async ({ playwright }) => {
		const anonymous = await signedInRequest(playwright, baseURL, 'anonymous');
		const owner = await signedInRequest(playwright, baseURL, 'owner');
		try {
			for (const path of ['/', '/signin', '/signup', '/forgot-password']) {
				const response = await anonymous.get(path);
				expect(response.status(), path).toBe(200);
				expectStrictPolicy(path, response.headers()['content-security-policy']);
			}
			const place = await demoPlace(owner);
			const w = `/app/w/${place.workspaceId}`;
			for (const path of [
				'/app',
				w,
				`${w}/members`,
				`${w}/audit`,
				place.projectPath,
				`${place.projectPath}/compare`,
				place.scenarioPath,
				`${place.scenarioPath}/sensitivity`,
				'/app/account',
				'/app/api',
				'/app/methods',
				'/app/methods/lcoe',
				'/dev/mail'
			]) {
				const response = await owner.get(path);
				expect(response.status(), path).toBe(200);
				expectStrictPolicy(path, response.headers()['content-security-policy']);
			}
			// SvelteKit names the page's modules only in a Link header (the head carries none): the browser fetches them at once from it.
			const editor = await owner.get(place.scenarioPath);
			expect(editor.headers()['link']).toMatch(/rel="modulepreload"/);
			// The billing page alone may send its forms on to the checkout and portal pages (here the local Stripe stand-in).
			const billing = await owner.get(`${w}/billing`);
			expect(directivesOf(billing.headers()['content-security-policy'])['form-action']).toEqual(["'self'", `http://127.0.0.1:${stripeStandinPort}`]);
			// A page that is not there answers its error page under the same policy.
			const missing = await owner.get(`${w}/projects/00000000-0000-4000-8000-000000000000`);
			expect(missing.status()).toBe(404);
			expectStrictPolicy('a missing project', missing.headers()['content-security-policy']);
		} finally {
			await anonymous.dispose();
			await owner.dispose();
		}
	});

	test('the home page and sign-in load and hydrate with no CSP violation', async ({ page }) => {
		const violations = await watchViolations(page);
		await openPage(page, '/');
		await openPage(page, '/signin');
		expect(violations).toEqual([]);
	});

	test('the project page, the scenario editor (charts drawn), the sensitivity page and the API and inbox pages load with no CSP violation', async ({ browser }) => {
		const page = await newSignedInPage(browser, 'analyst');
		try {
			const violations = await watchViolations(page);
			const place = await demoPlace(page.request);

			await openPage(page, place.projectPath);
			await expect(page.getByRole('heading', { level: 1, name: demoProjects[0].name })).toBeVisible();
			await expect(page.getByRole('list', { name: 'Scenarios' })).toBeVisible();

			await openPage(page, place.scenarioPath);
			await expectChartDrawn(page, /Gross array energy by resource bin/);
			await expectChartDrawn(page, /Annual post-tax project cash flows/);

			await openPage(page, `${place.scenarioPath}/sensitivity`);
			await expectChartDrawn(page, /Tornado chart of/);
			await expectChartDrawn(page, /Spider chart of/);

			await openPage(page, '/app/api');
			await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
			await openPage(page, '/app/methods/lcoe');
			await expect(page.locator('.method-note pre code').first()).toBeVisible();
			await openPage(page, '/dev/mail');
			await expect(page.getByRole('heading', { name: 'Dev inbox' })).toBeVisible();

			expect(violations).toEqual([]);
		} finally {
			await page.context().close();
		}
	});
});
