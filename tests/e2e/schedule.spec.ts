import { expect, test } from '@playwright/test';
import { DEMO, shot, signInAs } from './fixtures';

test('the chief scientist reorders two stations, previews, publishes; an admin reads the mail', async ({
	page
}) => {
	// A long walk on a shared machine: two sign-ins, a reorder, a publication to 27 people.
	test.setTimeout(180_000);
	await signInAs(page, DEMO.chief);
	await page.getByRole('list', { name: 'Cruises' }).getByRole('link').first().click();
	await page.getByRole('link', { name: 'Timeline', exact: true }).click();
	await expect(page.getByRole('heading', { name: 'Ship time and budget' })).toBeVisible();

	// DIVE-01 before CTD-01: the two stations trade places.
	const names = () =>
		page
			.getByTestId('order-item')
			.evaluateAll((els) => els.map((e) => e.getAttribute('data-name')));
	const before = await names();
	await page.getByRole('button', { name: 'Move DIVE-01 up' }).click();
	await expect(page.getByText(/Order saved/)).toBeVisible();
	const after = await names();
	expect(after.indexOf('DIVE-01')).toBe(before.indexOf('CTD-01'));
	expect(after.indexOf('CTD-01')).toBe(before.indexOf('DIVE-01'));

	await page.getByRole('link', { name: 'Schedule', exact: true }).click();
	await expect(page.getByRole('heading', { name: 'Publish the schedule' })).toBeVisible();
	const summary = page.getByTestId('change-summary');
	await expect(summary.locator('[data-type="moved"][data-name="CTD-01"]')).toBeVisible();
	await expect(summary.locator('[data-type="moved"][data-name="DIVE-01"]')).toBeVisible();
	// The demo's own change since version 1 is there too: the longer port call and the return.
	await expect(summary.locator('[data-name="Port call, Bellmoor Harbour"]')).toBeVisible();
	await expect(summary.locator('[data-type="return"]')).toBeVisible();

	await page.getByText(/^Recipients \(\d+\)/).click();
	await expect(page.getByTestId('recipients')).toContainText(DEMO.master);
	await page.getByText('The mail', { exact: true }).click();
	await expect(page.getByTestId('mail-preview')).toContainText('What changed since version 1:');
	await expect(page.getByTestId('mail-preview')).toContainText(/DIVE-01 moved: /);
	// The demo's notice log has delivered, failed and retrying entries.
	await expect(page.locator('[data-testid="notice"][data-status="sent"]').first()).toBeVisible();
	await expect(page.locator('[data-testid="notice"][data-status="failed"]')).toHaveCount(1);
	await expect(page.locator('[data-testid="notice"][data-status="queued"]').first()).toContainText(
		/try 4 at/
	);
	await shot(page, 'schedule-preview');

	await page.getByRole('button', { name: 'Publish version 2' }).click();
	await expect(page.getByTestId('publish-outcome')).toContainText(
		/Version 2 published: one mail to each of \d+ people/
	);
	await expect(page.getByTestId('nothing-changed')).toBeVisible();
	await expect(page.getByTestId('version')).toHaveCount(2);
	await shot(page, 'schedule-published');

	// Publishing again with nothing changed sends nothing and says so.
	await page.getByRole('button', { name: 'Publish anyway' }).click();
	await expect(page.getByTestId('publish-outcome')).toContainText(
		'Nothing changed since version 2, so nothing was sent.'
	);

	await page.getByRole('button', { name: 'Sign out' }).click();
	await signInAs(page, DEMO.admin);
	await page.getByRole('link', { name: 'Mail', exact: true }).click();
	await expect(page).toHaveURL(/\/admin\/mail$/);
	await expect(
		page.getByRole('heading', { name: 'Caught by the local mail catcher' })
	).toBeVisible();
	const caught = page.locator('li', { hasText: 'MT27-03 schedule changed (version 2)' });
	await expect
		.poll(
			async () => {
				await page.reload();
				return caught.count();
			},
			{ timeout: 20_000 }
		)
		.toBeGreaterThan(0);
	const mine = page
		.locator('li', {
			hasText: `MT27-03 schedule changed (version 2)`
		})
		.filter({ hasText: DEMO.participant });
	await mine.locator('summary').click();
	await expect(mine).toContainText('What changed since version 1:');
	await expect(mine).toContainText(/CTD-01 moved: /);
	await expect(mine).toContainText(/Attached: .*schedule\.ics/);
	await shot(page, 'schedule-mail');
});

test('notice settings: reminders can be turned off, schedule mails cannot', async ({ page }) => {
	await signInAs(page, DEMO.participant);
	await page.goto('/account');
	const reminders = page.getByRole('checkbox', { name: /Reminders/ });
	await expect(reminders).toBeChecked();
	await reminders.uncheck();
	await page.getByRole('button', { name: 'Save notice settings' }).click();
	await expect(page.getByText('Notice settings saved.')).toBeVisible();
	await page.reload();
	await expect(page.getByRole('checkbox', { name: /Reminders/ })).not.toBeChecked();
	await expect(page.getByRole('checkbox', { name: /Digests/ })).toBeChecked();
	await expect(page.getByText('Schedule mails always come.')).toBeVisible();
});
