/**
 * A data room from both sides in Chromium: an analyst makes a room, publishes
 * the base case, attaches a document (a refused one first) and invites an
 * investor; the investor opens the mailed link, chooses a password, accepts
 * the terms, reads the frozen results, asks a question and downloads the PDF
 * summary (stamped with their address) and the document; the owner finds all
 * of it in the access log.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { expect, test } from '@playwright/test';
import { demoProjects } from '../../seeds/01_demo_workspace';
import { firstLinkIn, latestMailTo } from './helpers/mail';
import { openPage } from './helpers/page';
import { newSignedInPage } from './helpers/session';

// A 1x1 PNG (PNG specification: signature, IHDR, one IDAT, IEND).
const tinyPng = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==', 'base64');

test('an analyst publishes and invites; the investor accepts, reads, asks and downloads; the owner sees it in the access log', async ({ browser }) => {
	test.setTimeout(150_000);
	const tag = Date.now().toString(36);
	const investorEmail = `journey.${tag}@corriemoor-capital.example`;
	const roomName = `Journey room ${tag}`;

	// The analyst makes the room from the tidal project's page and publishes the base case.
	const analyst = await newSignedInPage(browser, 'analyst');
	await openPage(analyst, '/app');
	await analyst.getByRole('link', { name: demoProjects[0].name }).click();
	await analyst.getByRole('link', { name: 'Data rooms' }).click();
	await analyst.getByLabel('Name').fill(roomName);
	await analyst.getByRole('button', { name: 'Create the room' }).click();
	await expect(analyst.getByRole('heading', { name: roomName, level: 1 })).toBeVisible();
	const roomPath = new URL(analyst.url()).pathname;
	await analyst.getByRole('button', { name: 'Publish a new version' }).click();
	await expect(analyst.getByRole('status')).toContainText('Version 1 is published');

	// A program named .pdf is refused by name; a real PNG is attached for download.
	const dir = mkdtempSync(join(tmpdir(), 'room-journey-'));
	writeFileSync(join(dir, 'yield-report.pdf'), Buffer.concat([Buffer.from('MZ'), Buffer.alloc(200, 1)]));
	writeFileSync(join(dir, 'site-map.png'), tinyPng);
	await analyst.getByLabel(/^File/).setInputFiles(join(dir, 'yield-report.pdf'));
	await analyst.getByRole('button', { name: 'Attach' }).click();
	await expect(analyst.getByRole('alert')).toContainText('yield-report.pdf is not a PDF');
	await analyst.getByLabel(/^File/).setInputFiles(join(dir, 'site-map.png'));
	await analyst.getByLabel('Folder').fill('Maps');
	await analyst.getByLabel('Investors may').selectOption('download');
	await analyst.getByRole('button', { name: 'Attach' }).click();
	await expect(analyst.getByRole('status')).toContainText('site-map.png is attached');
	await expect(analyst.getByRole('list', { name: 'Documents' })).toContainText('site-map.png');
	await expect(analyst.getByRole('list', { name: 'Documents' })).not.toContainText('yield-report');
	const documentId = /\/documents\/([0-9a-f-]{36})/.exec((await analyst.getByRole('link', { name: 'site-map.png' }).getAttribute('href')) ?? '')?.[1];
	expect(documentId).toBeTruthy();
	const roomId = roomPath.split('/').pop()!;
	const documentUrl = `/rooms/${roomId}/documents/${documentId}`;

	await analyst.getByLabel('Investor’s e-mail').fill(investorEmail);
	await analyst.getByLabel('Name (optional)').fill('Journey Investor');
	await analyst.getByRole('button', { name: 'Invite' }).click();
	await expect(analyst.getByRole('status')).toContainText(`${investorEmail} is invited`);

	// The investor: the mailed single-use link, a password, the terms, then the room.
	const mail = await latestMailTo(investorEmail, roomName);
	const link = firstLinkIn(mail.text, '/rooms/join/');
	const investorContext = await browser.newContext({ acceptDownloads: true });
	const investor = await investorContext.newPage();
	await openPage(investor, link);
	await investor.getByLabel('Password').fill('corriemoor-tide-journey-26');
	await investor.getByRole('button', { name: 'Set the password and open' }).click();
	await expect(investor.getByRole('heading', { name: /Confidentiality terms/ })).toBeVisible();
	// Nothing of the room before the terms are accepted, not even by the document's direct address.
	const early = await investor.request.get(documentUrl, { maxRedirects: 0 });
	expect(early.status()).toBe(303);
	expect(early.headers()['location']).toContain(`/rooms/${roomId}/terms`);
	await expect(investor.getByTestId('room-terms')).toContainText('confidential');
	await investor.getByRole('button', { name: 'I accept these terms' }).click();
	await expect(investor.getByRole('heading', { name: roomName, level: 1 })).toBeVisible();
	await expect(investor.getByTestId('room-version')).toContainText('Version 1');
	const lcoeShown = (await investor.locator('dt', { hasText: 'LCOE, real' }).first().locator('xpath=following-sibling::dd[1]').textContent())!.trim().split(' ')[0];
	expect(lcoeShown).toMatch(/^\d[\d,]*\.\d+$/);
	// The link was single-use.
	const again = await investor.request.get(link);
	expect(await again.text()).toContain('This link cannot be used');

	// The team edits the published scenario afterwards: a new revision with 30 % more on every capex line.
	const workspaceId = roomPath.split('/')[3];
	const { projects } = await (await analyst.request.get(`/api/v1/workspaces/${workspaceId}/projects?limit=500`)).json();
	const projectId = (projects as { id: string; name: string }[]).find((p) => p.name === demoProjects[0].name)!.id;
	const { scenarios } = await (await analyst.request.get(`/api/v1/projects/${projectId}/scenarios`)).json();
	const baseId = (scenarios as { id: string; isBaseCase: boolean }[]).find((sc) => sc.isBaseCase)!.id;
	const { scenario: base } = await (await analyst.request.get(`/api/v1/scenarios/${baseId}`)).json();
	const dearer = { ...base.document, capex: { ...base.document.capex, lines: base.document.capex.lines.map((line: { amount?: number }) => (line.amount === undefined ? line : { ...line, amount: line.amount * 1.3 })) } };
	const edited = await analyst.request.put(`/api/v1/scenarios/${baseId}`, { data: { revision: base.revision, document: dearer } });
	expect(edited.status(), await edited.text()).toBe(200);
	await investor.reload();
	// The room still shows what was published.
	const lcoeAfterEdit = (await investor.locator('dt', { hasText: 'LCOE, real' }).first().locator('xpath=following-sibling::dd[1]').textContent())!.trim().split(' ')[0];
	expect(lcoeAfterEdit).toBe(lcoeShown);

	// The frozen results and the method, then the stamped PDF.
	await investor.getByRole('link', { name: 'Results, assumptions and method' }).first().click();
	await expect(investor.getByTestId('frozen-basis')).toContainText('as published in version 1');
	await expect(investor.getByRole('heading', { name: 'Assumptions' })).toBeVisible();
	await expect(investor.getByRole('heading', { name: 'Method notes, as published' })).toBeVisible();
	const pdfDownload = investor.waitForEvent('download');
	await investor.getByRole('link', { name: 'PDF summary' }).first().click();
	const pdfPath = join(dir, 'summary.pdf');
	await (await pdfDownload).saveAs(pdfPath);
	expect(readFileSync(pdfPath).subarray(0, 5).toString()).toBe('%PDF-');
	const pdfText = execFileSync('pdftotext', ['-layout', pdfPath, '-'], { encoding: 'utf8' });
	expect(pdfText).toContain(`Prepared for ${investorEmail}`);
	// The PDF carries the figure the room page shows.
	expect(pdfText).toContain(lcoeShown);

	// The document, and a question.
	await investor.goto(new URL(investor.url()).pathname.replace(/\/scenarios\/\d+$/, ''));
	const documentDownload = investor.waitForEvent('download');
	await investor.getByRole('link', { name: 'Download' }).first().click();
	const saved = join(dir, 'downloaded.png');
	await (await documentDownload).saveAs(saved);
	expect(readFileSync(saved).equals(tinyPng)).toBe(true);
	await investor.getByLabel('Ask the team').fill('What availability does the base case assume in the first year?');
	await investor.getByRole('button', { name: 'Send the question' }).click();
	await expect(investor.getByRole('status')).toContainText('Your question is sent');

	// The owner's access log: who opened what.
	const owner = await newSignedInPage(browser, 'owner');
	await openPage(owner, `${roomPath}/log`);
	const summary = owner.getByRole('table', { name: 'Summary by investor' });
	await expect(summary).toContainText(investorEmail);
	await expect(summary).toContainText('site-map.png');
	const events = owner.getByRole('table', { name: 'Access events' });
	await expect(events).toContainText('Downloaded a PDF summary');
	await expect(events).toContainText('Downloaded a document');
	await expect(events).toContainText('Read a scenario');
	const csv = await owner.request.get(`${roomPath}/log.csv`);
	expect(csv.status()).toBe(200);
	expect(await csv.text()).toContain(investorEmail);
	// The team sees the question.
	await openPage(owner, roomPath);
	await expect(owner.getByText('What availability does the base case assume')).toBeVisible();

	// Revoked: the document's direct address and the room answer nothing any more.
	await openPage(analyst, roomPath);
	await analyst.getByRole('button', { name: `End access of ${investorEmail}` }).click();
	await expect(analyst.getByRole('status')).toContainText('Access ended at once');
	const late = await investor.request.get(documentUrl, { maxRedirects: 0 });
	expect([303, 404]).toContain(late.status());
	if (late.status() === 303) expect(late.headers()['location']).toContain('/rooms/signin');
	expect((await investor.request.get(`/rooms/${roomId}`, { maxRedirects: 0 })).status()).not.toBe(200);

	await Promise.all([analyst.close(), owner.close(), investorContext.close()]);
});
