import { expect, test } from '@playwright/test';
import { DEMO, shot, signInAs } from './fixtures';

/** A CSV crossing of the demo ridge with heights (negative down), as some loggers write them. */
function heightsCsv(n = 200) {
	const rows = ['Longitude,Latitude,Depth (m),Time'];
	for (let i = 0; i < n; i++) {
		const lon = -146.9 + (1.8 * i) / (n - 1);
		const depth = 2700 + 12 * Math.abs(lon + 145.95) * 96;
		const time = new Date(Date.UTC(2024, 2, 1, 0, i)).toISOString();
		rows.push(`${lon.toFixed(5)},-29.6,${(-depth).toFixed(1)},${time}`);
	}
	return Buffer.from(rows.join('\n') + '\n');
}

test('a participant uploads a track, flips its depths when asked, and sees the residual profile and statistics', async ({
	page
}) => {
	await signInAs(page, DEMO.participant);
	await page.getByRole('list', { name: 'Cruises' }).getByRole('link').first().click();
	await page
		.getByRole('navigation', { name: 'Cruise' })
		.getByRole('link', { name: 'Tracks' })
		.click();
	// the demo's earlier crossing is already there
	await expect(page.getByRole('link', { name: 'Earlier crossing, May 2019' })).toBeVisible();

	await page.getByLabel('Track file').setInputFiles({
		name: 'heights.csv',
		mimeType: 'text/csv',
		buffer: heightsCsv()
	});
	await page.getByRole('button', { name: 'Upload', exact: true }).click();
	await expect(page.getByRole('alert')).toContainText('depths are negative');
	await page.getByRole('button', { name: 'Flip the depths and upload' }).click();
	await expect(page.getByRole('status')).toContainText('Read 200 fixes from heights.csv');
	await expect(page.getByLabel('Upload progress')).toHaveAttribute('value', '1');
	await expect(page.getByRole('link', { name: 'heights' }).first()).toBeVisible();

	await page.getByRole('link', { name: 'Compare “heights” with the model' }).click();
	await expect(page.getByRole('heading', { name: 'heights' })).toBeVisible();
	const stats = page.getByTestId('residual-stats');
	await expect(stats).toContainText('200');
	await expect(stats).toContainText('RMS');
	const profile = page.getByTestId('residual-profile');
	await expect(profile.locator('svg').first()).toBeVisible();
	await expect(profile.getByRole('img', { name: 'Residual depth along the track' })).toBeVisible();
	await expect(page.getByTestId('residual-map')).toContainText('deeper than the model');
	await expect(page.getByTestId('residual-histogram').locator('svg rect').first()).toBeAttached();
	await expect(page.getByTestId('implied')).toContainText('°C');
	await expect(page.getByText('Residuals are not all crust')).toBeVisible();
	// participants may fit but not apply
	await page.getByRole('button', { name: 'Fit to this track' }).click();
	await expect(page.getByTestId('calibration')).toContainText('Fitted');
	await expect(page.getByText('The chief scientist may apply it to the segment.')).toBeVisible();
	await shot(page, 'track-residuals');
});

test('the chief scientist calibrates the northern segment from the demo crossing', async ({
	page
}) => {
	await signInAs(page, DEMO.chief);
	await page.getByRole('list', { name: 'Cruises' }).getByRole('link').first().click();
	await page
		.getByRole('navigation', { name: 'Cruise' })
		.getByRole('link', { name: 'Tracks' })
		.click();
	await page.getByRole('link', { name: 'Earlier crossing, May 2019' }).click();
	// the demo writes the model + 180 m, a seamount and noise
	const mean = page.getByTestId('residual-stats').locator('dd').nth(1);
	await expect(mean).toHaveText(/^\+1[5-9]\d m$/);
	await page
		.getByLabel('Ridge segment', { exact: true })
		.selectOption({ label: 'Sallow Ridge north' });
	await page.getByRole('button', { name: 'Fit to this track' }).click();
	await expect(page.getByTestId('calibration')).toContainText('Fitted');
	await page.getByRole('button', { name: 'Apply to Sallow Ridge north' }).click();
	await expect(page.getByRole('status')).toContainText('every prediction in the plan now uses it');
	// the prediction followed: the mean residual is now small
	await expect(mean).toHaveText(/^[+−]?\d{1,2} m$/);
});
