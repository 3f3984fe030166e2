import { expect, test } from '@playwright/test';
import { caughtMail, waitForMail } from '../support/server';
import { E2E_MAIL_DIR } from './env';
import { DEMO, shot, signInAs } from './fixtures';

test('the admin sees every cruise and the marine-office screens', async ({ page }) => {
	await signInAs(page, DEMO.admin);
	const nav = page.getByRole('navigation', { name: 'Main' });
	for (const label of ['Cruises', 'Vessels', 'People', 'Mail'])
		await expect(nav.getByRole('link', { name: label, exact: true })).toBeVisible();
	const list = page.getByRole('list', { name: 'Cruises' });
	await expect(list.getByText('MT27-03')).toBeVisible();
	await expect(list.getByText('SL27-01')).toBeVisible();
	await shot(page, 'admin-cruises');
	await nav.getByRole('link', { name: 'Vessels' }).click();
	await expect(page.getByRole('cell', { name: 'RV Marram Tern' })).toBeVisible();
	await shot(page, 'admin-vessels');
	await nav.getByRole('link', { name: 'Mail' }).click();
	await expect(page.getByRole('heading', { name: 'Outbox' })).toBeVisible();
});

test('the chief scientist runs the demo cruise: settings and invitations', async ({ page }) => {
	await signInAs(page, DEMO.chief);
	const list = page.getByRole('list', { name: 'Cruises' });
	await expect(list.getByText('MT27-03')).toBeVisible();
	await expect(list.getByText('SL27-01')).toHaveCount(0);
	await expect(page.getByRole('link', { name: 'Vessels' })).toHaveCount(0);
	await list.getByRole('link').first().click();
	await expect(page.getByRole('heading', { name: /Crustal thickness/ })).toBeVisible();
	// The overview sums up ship time from the same timeline the Timeline tab shows.
	await expect(page.getByTestId('glance')).toContainText(/\d+ of 21 allocated/);
	await expect(page.getByTestId('glance')).toContainText('€');
	await shot(page, 'chief-cruise');

	await page.getByRole('link', { name: 'Settings' }).click();
	await page.getByLabel('Allocated days').fill('-3');
	await page.getByRole('button', { name: 'Save' }).click();
	await expect(page.locator('#allocatedDays-error')).toHaveText('Allocated days: at least 1.');
	await page.getByLabel('Allocated days').fill('29');
	await page.getByRole('button', { name: 'Save' }).click();
	await expect(page.getByText('Saved.')).toBeVisible();

	await page.getByRole('link', { name: 'People' }).click();
	await page.getByLabel('E-mail').fill('deckhand.scientist@example.org');
	await page.getByLabel('Role', { exact: true }).selectOption('participant');
	await page.getByRole('button', { name: 'Invite' }).click();
	await expect(
		page.getByText('An invitation is on its way to deckhand.scientist@example.org.')
	).toBeVisible();
	await page.getByLabel('E-mail').fill('deckhand.scientist@example.org');
	await page.getByRole('button', { name: 'Invite' }).click();
	await expect(page.getByText('already has an open invitation')).toBeVisible();
	await shot(page, 'chief-people');
	const mail = await waitForMail(E2E_MAIL_DIR, (m) =>
		m.to.includes('deckhand.scientist@example.org')
	);
	expect(mail.subject).toBe('Invitation to cruise MT27-03 as participant');
});

test('a participant sees the cruise but is refused the chief scientist’s settings', async ({
	page
}) => {
	await signInAs(page, DEMO.participant);
	await page.getByRole('list', { name: 'Cruises' }).getByRole('link').first().click();
	await expect(page.getByText('You: Participant')).toBeVisible();
	await expect(page.getByRole('link', { name: 'Settings' })).toHaveCount(0);
	const url = page.url();
	const res = await page.goto(url + '/edit');
	expect(res?.status()).toBe(403);
	await expect(page.getByRole('heading', { name: 'Not yours to open' })).toBeVisible();
	await page.goto(url + '/members');
	await expect(page.getByRole('heading', { name: 'Invite someone' })).toHaveCount(0);
	await shot(page, 'participant-refused');
});

test('the port agent and the master see the cruise with their roles', async ({ page }) => {
	for (const [email, label] of [
		[DEMO.agent, 'Port agent'],
		[DEMO.master, 'Master']
	]) {
		await signInAs(page, email);
		await page.getByRole('list', { name: 'Cruises' }).getByRole('link').first().click();
		await expect(page.getByText(`You: ${label}`)).toBeVisible();
		await page.getByRole('button', { name: 'Sign out' }).click();
		await expect(page).toHaveURL(/\/signin/);
	}
});

test('sign-out ends the session', async ({ page }) => {
	await signInAs(page, DEMO.master);
	await page.getByRole('button', { name: 'Sign out' }).click();
	await expect(page).toHaveURL(/\/signin/);
	await page.goto('/cruises');
	await expect(page).toHaveURL(/\/signin\?next=%2Fcruises/);
});

test('a wrong password gets a clear message', async ({ page }) => {
	await page.goto('/signin');
	await page.getByLabel('E-mail').fill(DEMO.chief);
	await page.getByLabel('Password').fill('wrong-password');
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByText('That e-mail and password do not match an account.')).toBeVisible();
	await shot(page, 'signin-wrong');
});

test('a reset link works once', async ({ page }) => {
	const email = 'hana.petrakis@example.org';
	const before = (await caughtMail(E2E_MAIL_DIR)).length;
	await page.goto('/reset');
	await page.getByLabel('E-mail').fill(email);
	await page.getByRole('button', { name: 'Send the link' }).click();
	await expect(page.getByText(`If ${email} has an account`)).toBeVisible();
	const mail = await waitForMail(
		E2E_MAIL_DIR,
		(m) => m.to.includes(email) && /reset/i.test(m.subject)
	);
	expect((await caughtMail(E2E_MAIL_DIR)).length).toBeGreaterThan(before);
	const link = mail.text.match(/http:\/\/\S+\/reset\/\w+/)![0];

	await page.goto(link);
	await page.getByLabel('New password').fill('seafloor-spreading-9');
	await page.getByLabel('The same again').fill('seafloor-spreading-9');
	await page.getByRole('button', { name: 'Set the password' }).click();
	await expect(page.getByText('Your password is set. Sign in with it.')).toBeVisible();
	await signInAs(page, email, 'seafloor-spreading-9');
	await page.getByRole('button', { name: 'Sign out' }).click();

	await page.goto(link);
	await expect(page.getByText('This reset link has already been used')).toBeVisible();
	await shot(page, 'reset-reused');
});
