import { expect, test, type Page } from '@playwright/test';
import { DEMO, shot, signInAs } from './fixtures';

// WebGL runs on the CPU here (SwiftShader) on a shared 2-core machine: each test draws, saves and
// undoes several times, which can take longer than the suite's default minute.
test.describe.configure({ timeout: 300_000 });

async function openChart(page: Page, email: string) {
	await signInAs(page, email);
	await page.getByRole('list', { name: 'Cruises' }).getByRole('link').first().click();
	await page.getByRole('link', { name: 'Chart' }).click();
	const map = page.getByRole('application', { name: 'Cruise chart' });
	// "Drawn": MapLibre has rendered a frame with the saved plan's source loaded.
	await expect(map).toHaveAttribute('data-plan-drawn', 'true', { timeout: 30_000 });
	// The drawing tools and the predicted isobaths come after the plan.
	await expect(map).toHaveAttribute('data-ready', 'true', { timeout: 30_000 });
	await expect(map).toHaveAttribute('data-depth-drawn', 'true', { timeout: 30_000 });
}

/** Clicks at fractions of the chart's width and height, slowly enough not to double-click. */
async function clickChart(page: Page, points: [number, number][]) {
	const box = (await page.getByRole('application', { name: 'Cruise chart' }).boundingBox())!;
	for (const [fx, fy] of points) {
		await page.mouse.click(box.x + fx * box.width, box.y + fy * box.height);
		await page.waitForTimeout(400);
	}
}

test('the demo cruise shows its whole plan on the chart, with nothing fetched from outside', async ({
	page
}) => {
	const outside: string[] = [];
	// The Content-Security-Policy must let the chart draw: no violation reported in the console.
	const violations: string[] = [];
	page.on('console', (m) => {
		if (/Content Security Policy/i.test(m.text())) violations.push(m.text());
	});
	page.on('request', (r) => {
		const u = new URL(r.url());
		if (u.hostname !== '127.0.0.1' && !['data:', 'blob:'].includes(u.protocol))
			outside.push(r.url());
	});
	await openChart(page, DEMO.chief);
	const book = page.getByRole('table', { name: 'Line book' });
	await expect(book).toContainText('N-X1');
	await expect(book).toContainText('DIVE-02');
	await expect(page.getByLabel('Depth legend')).toContainText('Isobaths every');
	await expect(page.getByText('not for wire work or navigation').first()).toBeVisible();
	// The cursor position reads in decimal degrees and degrees-decimal-minutes.
	const box = (await page.getByRole('application', { name: 'Cruise chart' }).boundingBox())!;
	await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
	await expect(page.getByLabel('Cursor position')).toContainText(
		/-\d+\.\d{5}, -\d+\.\d{5} · \d+°\d+\.\d{3}′S/
	);
	await shot(page, 'chart-demo');
	await page.getByLabel('Shaded depth').check();
	await page.waitForTimeout(800);
	await shot(page, 'chart-demo-shaded');
	// The globe view for high latitudes: the graticule reaches the poles.
	await page.getByLabel('Globe').check();
	await page.getByRole('button', { name: 'Zoom out' }).click();
	await page.getByRole('button', { name: 'Zoom out' }).click();
	await page.getByRole('button', { name: 'Zoom out' }).click();
	await page.waitForTimeout(1500);
	await shot(page, 'chart-demo-globe');
	expect(outside).toEqual([]);
	expect(violations).toEqual([]);
});

test('the chief scientist draws a ridge axis and a line and sees the predicted profile', async ({
	page
}) => {
	await openChart(page, DEMO.chief);
	await page.getByRole('button', { name: 'Ridge axis' }).click();
	await clickChart(page, [
		[0.12, 0.15],
		[0.13, 0.85],
		[0.13, 0.85]
	]);
	const panel = page.getByRole('form', { name: 'New or changed feature' });
	await expect(panel.getByRole('heading', { name: 'New ridge segment' })).toBeVisible();
	await panel.getByLabel('Name').fill('West spur');
	await panel.getByLabel('Full rate (mm/yr)').fill('24');
	await panel.getByLabel('Measured axial depth (m)').fill('3100');
	await panel.getByRole('button', { name: 'Save' }).click();
	await expect(page.getByRole('status')).toHaveText('Saved West spur.');
	await page.waitForTimeout(500);
	await shot(page, 'chart-draw-ridge');

	await page.getByRole('button', { name: 'Line', exact: true }).click();
	await clickChart(page, [
		[0.04, 0.5],
		[0.24, 0.52],
		[0.24, 0.52]
	]);
	await expect(panel.getByRole('heading', { name: 'New survey line' })).toBeVisible();
	const figures = page.getByRole('region', { name: 'Live figures' });
	await expect(figures.getByLabel('Line figures')).toContainText('nm');
	await expect(figures.getByLabel('Line figures')).toContainText(/Depth\s*3,\d{3}–\d,\d{3} m/);
	const profile = page.getByRole('figure', { name: 'Predicted profile along the line' });
	await expect(profile.locator('svg').first()).toBeVisible();
	await expect(profile).toContainText('Predicted depth (m)');
	await expect(profile).toContainText('Distance along the line (km)');
	await shot(page, 'chart-draw-line');
	await panel.getByLabel('Survey speed (kn)').fill('9');
	await panel.getByRole('button', { name: 'Save' }).click();
	await expect(page.getByRole('status')).toHaveText(/^Saved L-\d+\.$/);
	const book = page.getByRole('table', { name: 'Line book' });
	await expect(book).toContainText('L-1');

	// Undo takes the edits back one at a time (and leaves the demo plan as it was).
	await page.getByRole('button', { name: 'Undo' }).click();
	await expect(page.getByRole('status')).toHaveText(/^Undone: add line L-\d+\.$/);
	await expect(book).not.toContainText('L-1');
	await page.getByRole('button', { name: 'Undo' }).click();
	await expect(page.getByRole('status')).toHaveText('Undone: add ridge segment West spur.');
});

test('a station typed in degrees and decimal minutes is shown on the chart, saved and undone', async ({
	page
}) => {
	await openChart(page, DEMO.chief);
	const place = page.getByRole('form', { name: 'Place by coordinates' });
	await place.getByLabel('Kind').selectOption('station');
	await place.getByLabel('Positions').fill('30 12.500 S 146 24.000 W');
	await place.getByRole('button', { name: 'Show on chart' }).click();
	const panel = page.getByRole('form', { name: 'New or changed feature' });
	await expect(panel.getByRole('list', { name: 'Positions' })).toHaveText(
		'30°12.500′S 146°24.000′W'
	);
	await expect(page.getByLabel('Station figures')).toContainText(/Predicted depth\s*\d,\d{3} m/);
	await shot(page, 'chart-typed-station');
	await panel.getByLabel('Station kind').selectOption('dredge');
	await expect(panel.getByLabel('Name')).toHaveValue('DR-04');
	await panel.getByRole('button', { name: 'Save' }).click();
	await expect(page.getByRole('status')).toHaveText('Saved DR-04.');
	await expect(page.getByRole('table', { name: 'Line book' })).toContainText('DR-04');
	await page.getByRole('button', { name: 'Undo' }).click();
	await expect(page.getByRole('status')).toHaveText('Undone: add station DR-04.');
	await expect(page.getByRole('table', { name: 'Line book' })).not.toContainText('DR-04');

	// A station placed by clicking on the chart.
	await page.getByRole('button', { name: 'Station', exact: true }).click();
	await clickChart(page, [[0.1, 0.1]]);
	await expect(panel.getByRole('heading', { name: 'New station' })).toBeVisible();
	await expect(page.getByLabel('Station figures')).toContainText('Predicted depth');
	await panel.getByRole('button', { name: 'Cancel' }).click();

	// A saved station is changed through its panel, and the change undone.
	await page
		.getByRole('table', { name: 'Line book' })
		.getByRole('button', { name: 'CTD-03' })
		.click();
	await page
		.getByRole('region', { name: 'Selected feature' })
		.getByRole('button', { name: 'Edit' })
		.click();
	await expect(panel.getByRole('heading', { name: 'Change station' })).toBeVisible();
	await panel.getByLabel('Bottle stops').fill('24');
	await expect(page.getByLabel('Station figures')).toContainText('Duration');
	await panel.getByRole('button', { name: 'Save' }).click();
	await expect(page.getByRole('status')).toHaveText('Saved CTD-03.');
	await page.getByRole('button', { name: 'Undo' }).click();
	await expect(page.getByRole('status')).toHaveText('Undone: change station CTD-03.');

	// A position that cannot be read is named, not guessed.
	await place.getByLabel('Positions').fill('95 12.5 N 146 W');
	await place.getByRole('button', { name: 'Show on chart' }).click();
	await expect(place.getByRole('alert')).toContainText('Row 1');
});

test('the chief scientist generates lines over a survey area and accepts them', async ({
	page
}) => {
	await openChart(page, DEMO.chief);
	await page.getByRole('button', { name: 'Area', exact: true }).click();
	await clickChart(page, [
		[0.62, 0.2],
		[0.8, 0.2],
		[0.8, 0.34],
		[0.62, 0.34],
		[0.62, 0.2]
	]);
	const panel = page.getByRole('form', { name: 'New or changed feature' });
	await expect(panel.getByRole('heading', { name: 'New survey area' })).toBeVisible();
	await panel.getByLabel('Name').fill('East box');
	await page.getByRole('button', { name: 'Generate lines' }).click();
	const stats = page.getByLabel('Generated lines');
	await expect(stats).toContainText('Total time');
	const count = Number(await stats.locator('dd').first().textContent());
	expect(count).toBeGreaterThan(1);
	await shot(page, 'chart-area-lines');
	await page.getByRole('button', { name: `Accept ${count} lines` }).click();
	await expect(page.getByRole('status')).toHaveText(`Added ${count} lines over East box.`);
	await expect(page.getByRole('table', { name: 'Line book' })).toContainText('East box-01');

	// Bulk edit in the line book.
	await page.getByRole('checkbox', { name: 'Choose East box-01' }).check();
	await page.getByRole('checkbox', { name: 'Choose East box-02' }).check();
	const bulk = page.getByRole('form', { name: 'Bulk edit' });
	await bulk.getByLabel('Speed (kn)').fill('9.5');
	await bulk.getByRole('button', { name: 'Apply to chosen' }).click();
	await expect(page.getByRole('status')).toHaveText('Changed 2 lines.');
	await shot(page, 'chart-line-book');

	// Leave the demo plan as it was for the other tests.
	await page.getByRole('button', { name: 'Undo' }).click();
	await expect(page.getByRole('status')).toHaveText('Undone: bulk edit of 2 lines.');
	await page.getByRole('button', { name: 'Undo' }).click();
	await expect(page.getByRole('status')).toHaveText(
		`Undone: add survey area East box and ${count} lines.`
	);
	await expect(page.getByRole('table', { name: 'Line book' })).not.toContainText('East box');
});

test('a participant sees the plan but cannot edit it', async ({ page }) => {
	await openChart(page, DEMO.participant);
	await expect(page.getByRole('toolbar', { name: 'Drawing tools' })).toHaveCount(0);
	await expect(page.getByText('only the chief scientist edits it')).toBeVisible();
	await expect(page.getByRole('form', { name: 'Place by coordinates' })).toHaveCount(0);
	await expect(page.getByRole('form', { name: 'Bulk edit' })).toHaveCount(0);
	await page
		.getByRole('table', { name: 'Line book' })
		.getByRole('button', { name: 'N-X3' })
		.click();
	const selectedPanel = page.getByRole('region', { name: 'Selected feature' });
	await expect(selectedPanel.getByRole('heading', { name: 'N-X3' })).toBeVisible();
	await expect(selectedPanel.getByLabel('Survey speed (kn)')).toBeDisabled();
	await expect(selectedPanel.getByRole('button', { name: 'Edit' })).toHaveCount(0);
	await expect(page.getByRole('region', { name: 'Live figures' })).toContainText('Time on line');
	await shot(page, 'chart-participant');
	const cruiseId = page.url().split('/cruises/')[1].split('/')[0];
	const res = await page.request.post(`/api/v1/cruises/${cruiseId}/plan/features`, {
		data: {
			kind: 'station',
			name: 'X',
			geometry: { type: 'Point', coordinates: [-146, -30] },
			properties: { stationKind: 'ctd', params: {} }
		}
	});
	expect(res.status()).toBe(403);
});

test('a line typed across the antimeridian stays one short line', async ({ page }) => {
	await openChart(page, DEMO.chief);
	const place = page.getByRole('form', { name: 'Place by coordinates' });
	await place.getByLabel('Kind').selectOption('line');
	await place.getByLabel('Positions').fill('30 00.000 S 179 30.000 E\n30 00.000 S 179 30.000 W');
	await place.getByRole('button', { name: 'Show on chart' }).click();
	// [derived] one degree of longitude at 30°S on WGS84 is about 96.5 km (52.1 nm): the short way.
	const figures = page.getByLabel('Line figures');
	await expect(figures).toContainText(/5[12]\.\d nm · 96\.\d km/);
	await shot(page, 'chart-antimeridian');
	const panel = page.getByRole('form', { name: 'New or changed feature' });
	await panel.getByLabel('Name').fill('DATELINE');
	await panel.getByRole('button', { name: 'Save' }).click();
	await expect(page.getByRole('status')).toHaveText('Saved DATELINE.');
	const book = page.getByRole('table', { name: 'Line book' });
	await expect(book.getByRole('row', { name: /DATELINE/ })).toContainText('96.');
	await page.getByRole('button', { name: 'Undo' }).click();
	await expect(book).not.toContainText('DATELINE');
});

test('a far typed position asks "did you mean W?"; a speed out of limits is named at its field; keys reach the tools', async ({
	page
}) => {
	await openChart(page, DEMO.chief);
	await shot(page, 'chart-workspace');
	const place = page.getByRole('form', { name: 'Place by coordinates' });
	await place.getByLabel('Kind').selectOption('station');
	await place.getByLabel('Positions').fill('30 12.500 S 146 24.000 E');
	await place.getByRole('button', { name: 'Show on chart' }).click();
	const ask = place.getByRole('alertdialog', { name: 'Far from the rest of the cruise' });
	await expect(ask).toContainText('Did you mean W: 30°12.500′S 146°24.000′W?');
	await ask.getByRole('button', { name: 'Use W' }).click();
	const panel = page.getByRole('form', { name: 'New or changed feature' });
	await expect(panel.getByRole('list', { name: 'Positions' })).toHaveText(
		'30°12.500′S 146°24.000′W'
	);
	await panel.getByRole('button', { name: 'Cancel' }).click();

	// A survey speed beyond the limit: a plain message at the field, and nothing saved.
	await place.getByLabel('Kind').selectOption('line');
	await place.getByLabel('Positions').fill('30 00.000 S 146 30.000 W\n30 00.000 S 146 00.000 W');
	await place.getByRole('button', { name: 'Show on chart' }).click();
	const speed = panel.getByLabel('Survey speed (kn)');
	await expect(speed).toHaveAttribute('max', '20');
	await expect(panel.getByLabel('Name')).toHaveAttribute('maxlength', '80');
	const name = await panel.getByLabel('Name').inputValue();
	await speed.fill('25');
	await panel.getByRole('button', { name: 'Save' }).click();
	await expect(speed).toHaveAttribute('aria-invalid', 'true');
	await expect(panel).toContainText('Survey speed must be above 0 and at most 20 kn.');
	await expect(page.getByRole('alert')).not.toContainText(/too big|expected/i);
	await expect(page.getByRole('table', { name: 'Line book' })).not.toContainText(name);
	await shot(page, 'chart-field-error');
	await panel.getByRole('button', { name: 'Cancel' }).click();

	// Tools and panels from the keyboard.
	await page.keyboard.press('l');
	await expect(page.getByRole('button', { name: 'Line', exact: true })).toHaveAttribute(
		'aria-pressed',
		'true'
	);
	await page.keyboard.press('s');
	await page.keyboard.press('p');
	await expect(page.getByRole('button', { name: 'Show panel' })).toBeVisible();
	await page.keyboard.press('b');
	await expect(page.getByRole('table', { name: 'Line book' })).toHaveCount(0);
	await page.keyboard.press('p');
	await page.keyboard.press('b');
	await expect(page.getByRole('table', { name: 'Line book' })).toBeVisible();
});
