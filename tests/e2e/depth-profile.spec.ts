import { expect, test } from '@playwright/test';
import { DEMO, shot, signInAs } from './fixtures';

test('any member predicts a depth profile from a typed line and ridge axis', async ({ page }) => {
	await signInAs(page, DEMO.participant);
	await page
		.getByRole('navigation', { name: 'Main' })
		.getByRole('link', { name: 'Depth profile' })
		.click();
	await page.getByRole('button', { name: 'Predict depths' }).click();
	const summary = page.getByTestId('profile-summary');
	await expect(summary).toContainText('km');
	await expect(summary).toContainText(/\d,?\d{3}–\d,?\d{3} m/);
	await expect(page.getByTestId('profile-chart').locator('svg').first()).toBeVisible();
	await expect(page.getByText('Planning estimates only')).toBeVisible();
	await shot(page, 'depth-profile');
});

test('a bad position is refused with the row named, and nothing is lost', async ({ page }) => {
	await signInAs(page, DEMO.participant);
	await page.goto('/tools/depth-profile');
	await page.getByLabel('Line positions').fill('30°00.0′S 146°45.0′W\n95°00.0′S 145°15.0′W');
	await page.getByRole('button', { name: 'Predict depths' }).click();
	await expect(page.locator('#line-error')).toContainText('row 2');
	await expect(page.getByLabel('Line positions')).toHaveValue(/95°00.0′S/);
});
