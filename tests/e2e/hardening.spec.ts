/**
 * What an attacker tries first, over real HTTP against the built app: an open
 * redirect through sign-in's `next`, and text the database cannot store sent
 * to every endpoint that stores text (named refusals, never a 500).
 */
import { expect, test } from '@playwright/test';
import { baseURL } from '../../playwright.config';
import { demoUsers } from '../../seeds/02_demo_users';
import { openPage } from './helpers/page';
import { signedInRequest, workspaceIdOf } from './helpers/session';

test('sign-in never sends anyone to another site, whatever `next` holds', async ({ page, playwright }) => {
	const traps = ['/%09/evil.example', '/%0A/evil.example', '/%0D%0A/evil.example', '/%5Cevil.example', '//evil.example', 'https://evil.example/'];
	for (const trap of traps) {
		const anonymous = await playwright.request.newContext({ baseURL });
		const visit = await anonymous.get(`/signin?next=${encodeURIComponent(decodeURIComponent(trap))}`, { maxRedirects: 0 });
		expect(visit.status(), trap).toBe(200);
		expect(await visit.text()).not.toContain('evil.example');
		await anonymous.dispose();
	}
	// Through the form, as a browser: lands in the workbench, not elsewhere.
	await openPage(page, '/signin?next=%2F%09%2Fevil.example');
	await page.getByLabel('E-mail').fill(demoUsers.viewer.email);
	await page.getByLabel('Password').fill(demoUsers.viewer.password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL(new RegExp(`^${baseURL}/app`));
	// Signed in, a trap URL sends the visitor to the default page.
	const again = await page.request.get('/signin?next=%2F%0A%2Fevil.example', { maxRedirects: 0 });
	expect(again.status()).toBe(303);
	expect(again.headers()['location']).toBe('/app');
});

test('text the database cannot store is refused by name on every endpoint that stores text', async ({ playwright }) => {
	const analyst = await signedInRequest(playwright, baseURL, 'analyst');
	const workspaceId = await workspaceIdOf(analyst, 'Halvard Marine Energy');
	const nul = 'Ebb\u0000tide';
	const lone = 'Ebb\uD800tide';

	const project = await analyst.post(`/api/v1/workspaces/${workspaceId}/projects`, { data: { name: `Text probe ${Date.now().toString(36)}`, technology: 'tidal-stream' } });
	expect(project.status()).toBe(201);
	const projectId = (await project.json()).project.id as string;
	const scenario = await analyst.post(`/api/v1/projects/${projectId}/scenarios`, { data: { name: 'Text probe case' } });
	const { scenario: created } = await scenario.json();

	const attempts: { what: string; send: () => ReturnType<typeof analyst.post>; path: string }[] = [
		{ what: 'new project name', send: () => analyst.post(`/api/v1/workspaces/${workspaceId}/projects`, { data: { name: nul, technology: 'wave' } }), path: 'name' },
		{ what: 'project site description', send: () => analyst.patch(`/api/v1/projects/${projectId}`, { data: { siteDescription: lone } }), path: 'siteDescription' },
		{ what: 'new scenario notes', send: () => analyst.post(`/api/v1/projects/${projectId}/scenarios`, { data: { name: 'x', notes: nul } }), path: 'notes' },
		{ what: 'saved scenario notes', send: () => analyst.put(`/api/v1/scenarios/${created.id}`, { data: { revision: created.revision, notes: lone } }), path: 'notes' },
		{
			what: 'a name inside the document',
			send: () => analyst.put(`/api/v1/scenarios/${created.id}`, { data: { revision: created.revision, document: { ...created.document, description: nul } } }),
			path: 'document.description'
		},
		{ what: 'duplicate name', send: () => analyst.post(`/api/v1/scenarios/${created.id}/duplicate`, { data: { name: lone } }), path: 'name' },
		{ what: 'draft evaluation', send: () => analyst.post(`/api/v1/scenarios/${created.id}/evaluate`, { data: { document: { ...created.document, name: nul } } }), path: 'document.name' }
	];
	for (const attempt of attempts) {
		const response = await attempt.send();
		expect(response.status(), attempt.what).toBe(422);
		const body = (await response.json()) as { error: { issues: unknown[] } };
		expect(body.error.issues, attempt.what).toContainEqual({ path: attempt.path, message: expect.stringContaining('cannot be stored') });
	}
	// Nothing was written: the scenario is at the revision it was.
	expect((await (await analyst.get(`/api/v1/scenarios/${created.id}`)).json()).scenario.revision).toBe(created.revision);

	// A form action refuses by field name too, with a 400 page, not a 500.
	const renamed = await analyst.post('/app/account?/rename', { headers: { accept: 'text/html' }, form: { name: nul }, maxRedirects: 0 });
	expect(renamed.status()).toBe(400);
	expect(await renamed.text()).toContain('cannot be stored');

	await analyst.delete(`/api/v1/projects/${projectId}`);
	await analyst.dispose();
});
