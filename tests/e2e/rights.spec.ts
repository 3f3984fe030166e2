// Who may do what, and plain errors at the field, in the browser (issue 13 items 7 and 8). Every
// cruise made here is deleted again, so the other browser tests find the demo as it was.
import { expect, test, type Page } from '@playwright/test';
import { DEMO, shot, signInAs } from './fixtures';

async function openDemoCruise(page: Page) {
	await page.getByRole('list', { name: 'Cruises' }).getByText('MT27-03').click();
	await expect(page.getByRole('heading', { name: /Crustal thickness/ })).toBeVisible();
}

test('a participant sees no "New cruise" and no one’s e-mail address', async ({ page }) => {
	await signInAs(page, DEMO.participant);
	await expect(page.getByRole('heading', { name: 'Cruises' })).toBeVisible();
	await expect(page.getByRole('link', { name: 'New cruise' })).toHaveCount(0);
	const refused = await page.goto('/cruises/new');
	expect(refused?.status()).toBe(403);
	await page.goto('/cruises');
	await openDemoCruise(page);
	await page.getByRole('link', { name: 'People', exact: true }).click();
	const people = page.getByRole('region', { name: 'People on this cruise' });
	await expect(people.getByRole('cell', { name: 'Dr Tove Achterberg' })).toBeVisible();
	await expect(people.getByRole('columnheader', { name: 'E-mail' })).toHaveCount(0);
	const html = await page.content();
	for (const e of [DEMO.chief, DEMO.master, DEMO.agent]) expect(html).not.toContain(e);
	await shot(page, 'participant-people-no-addresses');
});

test('the new-cruise form names each bad input at its field and saves nothing', async ({
	page
}) => {
	await signInAs(page, DEMO.chief);
	await page.getByRole('link', { name: 'New cruise' }).click();
	// The inputs carry the schema's limits: a title cannot be typed past 200 characters.
	await page.getByLabel('Title').fill('T'.repeat(300));
	await expect(page.getByLabel('Title')).toHaveValue('T'.repeat(200));
	await expect(page.getByLabel('Allocated days')).toHaveAttribute('min', '1');
	await page.getByLabel('Cruise code').fill('mt27-03');
	await page.getByLabel('Allocated days').fill('0');
	await page.getByRole('button', { name: 'Create the cruise' }).click();
	await expect(page.locator('#code-error')).toHaveText(/^Cruise code: MT27-03 is taken/);
	await expect(page.locator('#allocatedDays-error')).toHaveText('Allocated days: at least 1.');
	await expect(page.getByLabel('Cruise code')).toHaveAttribute('aria-invalid', 'true');
	await expect(page).toHaveURL(/\/cruises\/new$/);
	await shot(page, 'new-cruise-field-errors');

	// Fixed, it is created; a 200-character unbroken title wraps inside the window.
	await page.getByLabel('Cruise code').fill('WL-E2E-01');
	await page.getByLabel('Allocated days').fill('3');
	await page.getByRole('button', { name: 'Create the cruise' }).click();
	await expect(page.getByRole('heading', { level: 1, name: /^T+$/ })).toBeVisible();
	const overflow = await page.evaluate(
		() => document.documentElement.scrollWidth - document.documentElement.clientWidth
	);
	expect(overflow).toBeLessThanOrEqual(0);

	// The chief scientist deletes the draft after a confirmation naming what goes with it.
	await page.getByRole('link', { name: 'Settings' }).click();
	await page.getByText('Delete WL-E2E-01…').click();
	const goes = page.getByTestId('delete-impact');
	await expect(goes).toContainText('0 legs');
	await expect(goes).toContainText('1 person’s role on it');
	await page.getByLabel('Type WL-E2E-01 to confirm').fill('WL-E2E');
	await page.getByRole('button', { name: 'Delete the cruise and all of this' }).click();
	await expect(page.locator('#confirmCode-error')).toContainText('nothing was deleted');
	await page.getByLabel('Type WL-E2E-01 to confirm').fill('WL-E2E-01');
	await page.getByRole('button', { name: 'Delete the cruise and all of this' }).click();
	await expect(page).toHaveURL(/\/cruises\?deleted=WL-E2E-01$/);
	await expect(page.getByText('Cruise WL-E2E-01 was deleted.')).toBeVisible();
	await expect(page.getByRole('list', { name: 'Cruises' }).getByText('WL-E2E-01')).toHaveCount(0);
});

test('a chief scientist cannot delete a planned cruise; the admin is told what would go', async ({
	page
}) => {
	await signInAs(page, DEMO.chief);
	await openDemoCruise(page);
	await page.getByRole('link', { name: 'Settings' }).click();
	await expect(page.getByText('Only a draft can be deleted by its chief scientist')).toBeVisible();
	await expect(page.getByText('Delete MT27-03…')).toHaveCount(0);
	await page.getByRole('button', { name: 'Sign out' }).click();

	await signInAs(page, DEMO.admin);
	await openDemoCruise(page);
	await page.getByRole('link', { name: 'Settings' }).click();
	await page.getByText('Delete MT27-03…').click();
	const goes = page.getByTestId('delete-impact');
	await expect(goes).toContainText('2 legs');
	await expect(goes).toContainText(/\d+ survey lines/);
	await expect(goes).toContainText(/\d+ stations/);
	await expect(goes).toContainText(/\d+ invoices? \(with/);
	await shot(page, 'admin-delete-confirmation');
	await page.getByRole('button', { name: 'Keep it' }).click();
	await expect(goes).toBeHidden();

	// The admin deletes a cruise of their own making.
	await page.goto('/cruises/new');
	await page.getByLabel('Cruise code').fill('WL-E2E-02');
	await page.getByLabel('Title').fill('Made to be deleted');
	await page.getByLabel('Allocated days').fill('2');
	await page.getByLabel('Status').selectOption('planned');
	await page.getByRole('button', { name: 'Create the cruise' }).click();
	await page.getByRole('link', { name: 'Settings' }).click();
	await page.getByText('Delete WL-E2E-02…').click();
	await page.getByLabel('Type WL-E2E-02 to confirm').fill('WL-E2E-02');
	await page.getByRole('button', { name: 'Delete the cruise and all of this' }).click();
	await expect(page.getByText('Cruise WL-E2E-02 was deleted.')).toBeVisible();
});

test('the depth-profile page explains an empty submission at each field', async ({ page }) => {
	await signInAs(page, DEMO.participant);
	await page.goto('/tools/depth-profile');
	await page.getByLabel('Line positions').fill('');
	await page.getByLabel('Ridge axis positions').fill('');
	await page.getByLabel('Full spreading rate (mm/yr)').fill('');
	await page.getByRole('button', { name: 'Predict depths' }).click();
	await expect(page.locator('#line-error')).toContainText(
		'Line positions: empty — enter at least two positions'
	);
	await expect(page.locator('#axis-error')).toContainText('Ridge axis positions: empty');
	await expect(page.locator('#fullRate-error')).toContainText(
		'Full spreading rate (mm/yr): empty — enter'
	);
	await expect(page.getByTestId('profile-summary')).toHaveCount(0);
	await shot(page, 'depth-profile-empty');
});
