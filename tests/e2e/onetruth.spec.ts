import { expect, test, type Page } from '@playwright/test';
import ICAL from 'ical.js';
import { DEMO, shot, signInAs } from './fixtures';

// One computation for every date and figure: after the plan is edited (a new station through the
// API, which joins the order of work by itself, and a reorder), the overview, its legs, the
// timeline, the print page and the calendar all say the same return time and operating days.

const minute = (text: string) =>
	text.match(/\d{4}-\d{2}-\d{2}[ T]\d{2}:\d{2}/)![0].replace('T', ' ');

async function cruiseId(page: Page): Promise<string> {
	await signInAs(page, DEMO.chief);
	await page.getByRole('list', { name: 'Cruises' }).getByRole('link').first().click();
	await page.waitForURL(/\/cruises\/[^/]+$/);
	return page.url().match(/cruises\/([^/?#]+)/)![1];
}

test('after a new station and a reorder, every page agrees on the return and the operating days', async ({
	page
}) => {
	test.slow();
	const id = await cruiseId(page);
	const api = `/api/v1/cruises/${id}`;

	// A new station beside an existing one: it joins the order of work on its own.
	const plan = await (await page.request.get(`${api}/plan`)).json();
	const near = plan.features.find(
		(f: { properties: { kind: string } }) => f.properties.kind === 'station'
	);
	const [lon, lat] = near.geometry.coordinates;
	const created = await page.request.post(`${api}/plan/features`, {
		data: {
			kind: 'station',
			name: 'CTD-NEW',
			geometry: { type: 'Point', coordinates: [lon + 0.05, lat + 0.05] },
			properties: { stationKind: 'ctd', params: {} }
		}
	});
	expect(created.status(), await created.text()).toBe(201);
	expect((await created.json()).fit.operatingDays).toBeGreaterThan(0);
	let order = (await (await page.request.get(`${api}/timeline/order`)).json()).items as {
		id: string;
		name: string;
		reversed: boolean;
	}[];
	const at = order.findIndex((o) => o.name === 'CTD-NEW');
	expect(at, 'the new station is in the order of work').toBeGreaterThanOrEqual(0);
	// A reorder: the first two items swap.
	order = [order[1], order[0], ...order.slice(2)];
	const put = await page.request.put(`${api}/timeline/order`, {
		data: { items: order.map((o) => ({ id: o.id, reversed: o.reversed })) }
	});
	expect(put.status()).toBe(200);

	const t = await (await page.request.get(`${api}/timeline`)).json();
	const margin = t.events.find((e: { kind: string }) => e.kind === 'margin');
	const back = minute(margin.end);
	const days = String(t.totals.operatingDays);

	// Overview: "Back in port", the planned return, the last leg's end, operating days.
	await page.goto(`/cruises/${id}`);
	await expect(page.getByTestId('back-in-port')).toContainText(back);
	await expect(page.getByTestId('planned-return')).toContainText(back);
	await expect(page.getByTestId('legs').locator('li').last()).toContainText(`→ ${back}`);
	expect((await page.getByTestId('glance-operating-days').innerText()).match(/\d+/)![0]).toBe(days);
	await shot(page, 'overview-after-edit');

	// Timeline page.
	await page.getByRole('link', { name: 'Timeline', exact: true }).click();
	await expect(page.getByTestId('home')).toContainText(back);
	expect((await page.getByTestId('operating-days').innerText()).match(/\d+/)![0]).toBe(days);
	await expect(page.getByTestId('legs').locator('li').last()).toContainText(`→ ${back}`);
	await expect(page.getByTestId('order-item').filter({ hasText: 'CTD-NEW' })).toHaveCount(1);

	// Print page.
	await page.goto(`/cruises/${id}/print`);
	await expect(page.getByTestId('print-back-in-port')).toContainText(back);
	expect((await page.getByTestId('print-operating-days').innerText()).match(/\d+/)![0]).toBe(days);

	// Calendar: the weather margin ends when the ship is back in port.
	const ics = await (await page.request.get(`${api}/calendar.ics`)).text();
	const events = new ICAL.Component(ICAL.parse(ics)).getAllSubcomponents('vevent');
	const marginEvent = events.find((v) =>
		String(v.getFirstPropertyValue('summary')).includes('Weather margin')
	)!;
	const end = (marginEvent.getFirstPropertyValue('dtend') as ICAL.Time).toJSDate().toISOString();
	expect(minute(end)).toBe(back);

	// Deleting the station takes it out of the order again.
	const del = await page.request.delete(`${api}/plan/features/${(await created.json()).id}`);
	expect(del.status()).toBe(204);
	const after = (await (await page.request.get(`${api}/timeline/order`)).json()).items as {
		name: string;
	}[];
	expect(after.map((o) => o.name)).not.toContain('CTD-NEW');
});
