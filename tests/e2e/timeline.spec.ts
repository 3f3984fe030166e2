import { expect, test, type Page } from '@playwright/test';
import ICAL from 'ical.js';
import { DEMO, shot, signInAs } from './fixtures';

async function openTimeline(page: Page): Promise<string> {
	await signInAs(page, DEMO.chief);
	await page.getByRole('list', { name: 'Cruises' }).getByRole('link').first().click();
	await page.getByRole('link', { name: 'Timeline', exact: true }).click();
	await expect(page.getByRole('heading', { name: 'Ship time and budget' })).toBeVisible();
	return page.url().match(/cruises\/([^/]+)\/timeline/)![1];
}

const transitHours = async (page: Page) =>
	Number((await page.getByTestId('transit-hours').innerText()).match(/\(([\d.]+) h\)/)![1]);

function vevents(text: string) {
	return new ICAL.Component(ICAL.parse(text)).getAllSubcomponents('vevent').map((v) => ({
		uid: String(v.getFirstPropertyValue('uid')),
		sequence: Number(v.getFirstPropertyValue('sequence') ?? 0),
		summary: String(v.getFirstPropertyValue('summary')),
		start: (v.getFirstPropertyValue('dtstart') as ICAL.Time).toString()
	}));
}

test('the demo timeline fits its allocation; dragging an item changes the totals', async ({
	page
}) => {
	// Drag, reload, suggestion, apply and undo: five round trips on a shared 2-core machine.
	test.slow();
	await openTimeline(page);
	const days = page.getByTestId('operating-days');
	const [used, allocated] = (await days.innerText()).match(/\d+/g)!.map(Number);
	expect(used).toBeLessThanOrEqual(allocated);
	await expect(page.getByText('The plan fits the allocation')).toBeVisible();
	await expect(page.getByTestId('timeline-chart').locator('svg')).toBeVisible();
	await expect(page.getByTestId('days').locator('tbody tr')).not.toHaveCount(0);
	await shot(page, 'timeline-demo');

	const before = await transitHours(page);
	const items = page.getByTestId('order-item');
	const first = await items.first().getAttribute('data-name');
	// Drag the first item (MAG-1) down below the northern cross-axis lines.
	// Both ends in view first, so the drag needs no scrolling.
	await items.nth(7).scrollIntoViewIfNeeded();
	await items.first().dragTo(items.nth(6));
	await expect(page.getByText(/Moved .*Order saved/)).toBeVisible();
	await expect(items.first()).not.toHaveAttribute('data-name', first!);
	await expect.poll(() => transitHours(page)).not.toBe(before);

	// The order is stored: after a reload it is the same.
	const moved = await items.evaluateAll((els) => els.map((e) => e.getAttribute('data-name')));
	await page.reload();
	expect(await items.evaluateAll((els) => els.map((e) => e.getAttribute('data-name')))).toEqual(
		moved
	);

	// The shortest-transit suggestion shows transit hours before and after and asks first.
	const hand = await transitHours(page);
	await page.getByRole('button', { name: 'Suggest shortest transit' }).click();
	const offer = page.getByTestId('suggestion');
	await expect(offer).toContainText(`yours needs ${hand.toFixed(1)} h`);
	const offered = Number((await offer.innerText()).match(/needs ([\d.]+) h of transit/)![1]);
	expect(offered).toBeLessThanOrEqual(hand + 0.05);
	// Keeping the hand-made order changes nothing.
	await page.getByRole('button', { name: 'Keep my order' }).click();
	await expect(offer).toHaveCount(0);
	expect(await transitHours(page)).toBe(hand);
	await page.getByRole('button', { name: 'Suggest shortest transit' }).click();
	await page.getByRole('button', { name: 'Use the suggested order' }).click();
	await expect(page.getByText(/Shortest-transit order applied/)).toBeVisible();
	await expect.poll(() => transitHours(page)).toBeCloseTo(offered, 1);
	await shot(page, 'timeline-reordered');
	// Undo brings the hand-made order back.
	await page.getByRole('button', { name: 'Undo' }).click();
	await expect(page.getByText('The previous order is back.')).toBeVisible();
	await expect.poll(() => transitHours(page)).toBe(hand);
	expect(await items.evaluateAll((els) => els.map((e) => e.getAttribute('data-name')))).toEqual(
		moved
	);
});

test('pushing the plan over its allocation shows the warning and what to cut', async ({ page }) => {
	await openTimeline(page);
	await page.getByLabel('Weather margin, days').fill('20');
	await page.getByRole('radio').nth(1).check();
	await page.getByRole('button', { name: 'Save timing' }).click();
	const warning = page.getByTestId('overrun');
	await expect(warning).toBeVisible();
	await expect(warning).toContainText('more than the');
	await expect(warning).toContainText('consider leaving out');
	await shot(page, 'timeline-overrun');

	// Back to 12 % of the sea time.
	await page.getByRole('radio').nth(0).check();
	await page.getByLabel('Weather margin, % of sea time').fill('12');
	await page.getByRole('button', { name: 'Save timing' }).click();
	await expect(page.getByText('The plan fits the allocation')).toBeVisible();
});

test('the calendar parses as iCalendar; after a change UIDs stay and SEQUENCE goes up once', async ({
	page
}) => {
	const id = await openTimeline(page);
	// Publish first, so the export's numbers are the published ones (reading writes nothing).
	const pub = await page.request.post(`/api/v1/cruises/${id}/schedule/publish`);
	expect(pub.status()).toBe(200);
	const url = `/api/v1/cruises/${id}/calendar.ics`;
	const res = await page.request.get(url);
	expect(res.headers()['content-type']).toContain('text/calendar');
	const first = vevents(await res.text());
	expect(first.length).toBeGreaterThan(40);

	// Run the first line the other way.
	await page
		.getByRole('button', { name: /^Run .* the other way$/ })
		.first()
		.click();
	await expect(page.getByText(/runs the other way\. Order saved/)).toBeVisible();

	const second = vevents(await (await page.request.get(url)).text());
	const third = vevents(await (await page.request.get(url)).text());
	expect(third.map((e) => [e.uid, e.sequence])).toEqual(second.map((e) => [e.uid, e.sequence]));
	expect(second.map((e) => e.uid).sort()).toEqual(first.map((e) => e.uid).sort());
	const was = new Map(first.map((e) => [e.uid, e]));
	const changed = second.filter((e) => e.start !== was.get(e.uid)!.start);
	expect(changed.length).toBeGreaterThan(0);
	for (const e of changed) expect(e.sequence, e.summary).toBe(was.get(e.uid)!.sequence + 1);
	const same = second.filter(
		(e) => e.start === was.get(e.uid)!.start && e.summary.includes('Mobilisation')
	);
	for (const e of same) expect(e.sequence).toBe(was.get(e.uid)!.sequence);
});

test('clearance with its due date, the checklist, and the printable plan', async ({ page }) => {
	const id = await openTimeline(page);
	await page.getByRole('link', { name: 'Deadlines' }).click();
	const clearance = page.getByTestId('clearance');
	await expect(clearance).toHaveCount(1);
	await expect(clearance).toContainText('Republic of Xandera (invented)');
	await expect(clearance.getByTestId('clearance-due')).toHaveText(/\d{4}-\d\d-\d\d/);
	// The earlier tests changed the order, so the submitted copy no longer matches.
	await expect(clearance.getByTestId('plan-changed')).toBeVisible();
	await expect(page.getByTestId('deadline').first()).toBeVisible();
	await expect(page.getByText('general rule of the law of the sea')).toBeVisible();
	await shot(page, 'clearances');

	await page.goto(`/cruises/${id}/print`);
	await expect(page.getByRole('heading', { name: 'Line book' })).toBeVisible();
	await expect(page.getByTestId('print-map').locator('svg')).toBeVisible();
	await page.emulateMedia({ media: 'print' });
	await expect(page.getByRole('button', { name: 'Print or save as PDF' })).toBeHidden();
	await shot(page, 'print-plan');
});
