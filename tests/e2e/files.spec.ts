import { expect, test } from '@playwright/test';
import { DEMO, shot, signInAs } from './fixtures';

const plan = (features: unknown[]) =>
	Buffer.from(JSON.stringify({ type: 'FeatureCollection', features }));
const station = (name: string, coordinates: number[]) => ({
	type: 'Feature',
	geometry: { type: 'Point', coordinates },
	properties: { kind: 'station', name, stationKind: 'ctd' }
});

test('the chief scientist imports a plan file: problems named, nothing partial unless accepted', async ({
	page
}) => {
	await signInAs(page, DEMO.chief);
	await page.getByRole('list', { name: 'Cruises' }).getByRole('link').first().click();
	await page.getByRole('link', { name: 'Files' }).click();
	// The route for the bridge and the plan layers for GIS are two separate, named sets of files.
	await expect(page.getByRole('link', { name: 'Route as RTZ' })).toHaveAttribute(
		'href',
		/export\/route\/rtz$/
	);
	await expect(page.getByRole('link', { name: 'Layers as GeoJSON' })).toHaveAttribute(
		'href',
		/export\/layers\/geojson$/
	);
	await expect(page.getByRole('heading', { name: 'Route for the bridge' })).toBeVisible();
	await expect(page.getByRole('heading', { name: 'Plan layers for GIS' })).toBeVisible();
	await expect(page.getByText('A proposal, not a passage plan')).toBeVisible();

	await page.getByLabel('Plan file').setInputFiles({
		name: 'extra.geojson',
		mimeType: 'application/geo+json',
		buffer: plan([station('NEW-CTD', [-146.2, -30.1]), station('SWAPPED', [-30.1, -146.2])])
	});
	await page.getByRole('button', { name: 'Import', exact: true }).click();
	await expect(page.getByRole('alert')).toContainText('nothing was imported');
	const report = page.getByTestId('import-report');
	await expect(report).toContainText('feature 2');
	await shot(page, 'files-import-problems');

	await page.getByRole('button', { name: /Import the 1 valid items only/ }).click();
	await expect(page.getByRole('status')).toContainText('Imported 0 lines, 1 stations');
});

test('a participant sees exports but no import', async ({ page }) => {
	await signInAs(page, DEMO.participant);
	await page.getByRole('list', { name: 'Cruises' }).getByRole('link').first().click();
	await page.getByRole('link', { name: 'Files' }).click();
	await expect(page.getByRole('link', { name: 'Route as GPX' })).toBeVisible();
	await expect(page.getByRole('link', { name: 'Layers as GPX' })).toBeVisible();
	await expect(page.getByLabel('Plan file')).toHaveCount(0);
});
