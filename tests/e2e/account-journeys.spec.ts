import { openPage } from './helpers/page';
import { expect, test } from '@playwright/test';
import { firstLinkIn, latestMailTo } from './helpers/mail';
import { signInPage } from './helpers/session';
import { forgetSignUpsFromThisMachine } from './helpers/sign-up-allowance';
import { demoUsers } from '../../seeds/02_demo_users';

const uniqueEmail = (label: string) => `${label}.${Date.now()}.${Math.floor(Math.random() * 1e6)}@example.org`;

test('sign up, confirm from the mail, sign in, sign out, forget the password, reset it from the mail, sign in', async ({ page }) => {
	const email = uniqueEmail('nerys');
	const firstPassword = 'brine shrimp lantern 42';
	const secondPassword = 'copper kettle drift 77';

	await forgetSignUpsFromThisMachine();
	await openPage(page, '/signup');
	await page.getByLabel('Your name').fill('Nerys Alder');
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill('short');
	await page.getByLabel('Workspace name').fill('Alder Tidal Consulting');
	// The browser's own minlength check would stop a short password; the server must refuse it too.
	await page.getByLabel('Password').evaluate((input) => input.removeAttribute('minlength'));
	await page.getByRole('button', { name: 'Make my account' }).click();
	await expect(page.getByText('Use at least 12 characters.')).toBeVisible();
	await expect(page.getByLabel('E-mail')).toHaveValue(email);

	await page.getByLabel('Password').fill(firstPassword);
	await page.getByRole('button', { name: 'Make my account' }).click();
	// The answer says only where the link went: the same words whether or not the address had an account.
	await expect(page.getByRole('status')).toContainText(`We sent a link to ${email}: open it to finish making your account`);

	const verification = await latestMailTo(email, 'Confirm your e-mail');
	await openPage(page, firstLinkIn(verification.text, '/verify-email/'));
	await page.getByRole('button', { name: 'Confirm my address' }).click();
	await expect(page.getByText('your address is confirmed')).toBeVisible();
	await page.getByRole('link', { name: 'Sign in' }).click();
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill(firstPassword);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByRole('heading', { name: 'Alder Tidal Consulting' })).toBeVisible();
	await expect(page.getByText('Welcome to Tidewright')).toBeVisible();
	await expect(page.getByText('Confirm your e-mail address')).toHaveCount(0);

	await page.getByRole('button', { name: 'Sign out' }).click();
	await expect(page.getByText('You are signed out.')).toBeVisible();

	await page.getByRole('link', { name: 'Forgot the password?' }).click();
	// The sign-in page has an E-mail field too: wait for the new page before filling it.
	await expect(page.getByRole('heading', { name: 'Forgot the password' })).toBeVisible();
	await page.getByLabel('E-mail').fill(email);
	await page.getByRole('button', { name: 'Send the link' }).click();
	await expect(page.getByRole('status')).toContainText('is on its way');

	const reset = await latestMailTo(email, 'new Tidewright password');
	const resetLink = firstLinkIn(reset.text, '/reset-password/');
	await openPage(page, resetLink);
	await page.getByLabel('New password').fill(secondPassword);
	await page.getByRole('button', { name: 'Save the new password' }).click();
	await expect(page.getByText('Your password is changed.')).toBeVisible();

	// The link works once.
	await openPage(page, resetLink);
	await expect(page.getByRole('alert')).toContainText('already been used');

	await openPage(page, '/signin');
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill(firstPassword);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByRole('alert')).toContainText('do not match a confirmed account');

	await page.getByLabel('Password').fill(secondPassword);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByRole('heading', { name: 'Alder Tidal Consulting' })).toBeVisible();
});

test('sign-up answers an address that already has an account as it answers a new one, and mails its owner instead', async ({ page }) => {
	const owner = demoUsers.viewer;
	await forgetSignUpsFromThisMachine();
	await openPage(page, '/signup');
	await page.getByLabel('Your name').fill('Someone Else');
	await page.getByLabel('E-mail').fill(owner.email);
	await page.getByLabel('Password').fill('another long pass phrase 5');
	await page.getByRole('button', { name: 'Make my account' }).click();
	await expect(page.getByRole('status')).toContainText(`We sent a link to ${owner.email}: open it to finish making your account`);

	const note = await latestMailTo(owner.email, 'already has a Tidewright account');
	expect(note.text).toContain('/forgot-password');
	// Nothing changed: the owner still signs in with their own password.
	await signInPage(page, 'viewer');
});

test('sign-in answers the same words for an unknown address and a wrong password', async ({ page }) => {
	await openPage(page, '/signin');
	await page.getByLabel('E-mail').fill(uniqueEmail('nobody'));
	await page.getByLabel('Password').fill('whatever it may be 123');
	await page.getByRole('button', { name: 'Sign in' }).click();
	const unknown = await page.getByRole('alert').textContent();

	await page.getByLabel('E-mail').fill(demoUsers.viewer.email);
	await page.getByLabel('Password').fill('whatever it may be 123');
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByRole('alert')).toHaveText(unknown!);
});

test('an owner invites an analyst, who accepts with a new account and sees the workspace', async ({ browser }) => {
	const ownerContext = await browser.newContext();
	const owner = await ownerContext.newPage();
	await signInPage(owner, 'owner');
	await owner.getByRole('link', { name: 'Members' }).click();
	const invitee = uniqueEmail('petra');
	await owner.getByLabel('E-mail').fill(invitee);
	await owner.getByLabel('Role', { exact: true }).selectOption('analyst');
	await owner.getByRole('button', { name: 'Send invitation' }).click();
	await expect(owner.getByRole('status')).toContainText(`Invitation sent to ${invitee}`);

	const mail = await latestMailTo(invitee, 'invited you to Halvard Marine Energy');
	const inviteeContext = await browser.newContext();
	const guest = await inviteeContext.newPage();
	await openPage(guest, firstLinkIn(mail.text, '/invite/'));
	await expect(guest.getByText('as an analyst')).toBeVisible();
	await guest.getByLabel('Your name').fill('Petra Lune');
	await guest.getByLabel('Password').fill('harbour seal morning 9');
	await guest.getByRole('button', { name: 'Make my account and join' }).click();
	await expect(guest.getByRole('heading', { name: 'Halvard Marine Energy' })).toBeVisible();
	await expect(guest.getByText('you are an analyst')).toBeVisible();
	await expect(guest.getByRole('heading', { name: 'Kestle Narrows Tidal Array' })).toBeVisible();

	await owner.reload();
	await expect(owner.getByRole('cell', { name: invitee, exact: true })).toBeVisible();
	await owner.getByRole('link', { name: 'Security log' }).click();
	await expect(owner.getByRole('table', { name: 'Security events' })).toContainText('Accepted an invitation');

	await ownerContext.close();
	await inviteeContext.close();
});

test('the last owner cannot demote themselves', async ({ page }) => {
	await signInPage(page, 'owner');
	await page.getByRole('link', { name: 'Members' }).click();
	const row = page.getByRole('row', { name: new RegExp(demoUsers.owner.email) });
	await row.getByRole('combobox').selectOption('viewer');
	await row.getByRole('button', { name: 'Change role' }).click();
	await expect(page.getByRole('status')).toContainText('needs at least one owner');
});
