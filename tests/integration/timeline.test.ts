// The timeline API, the order of work, clearances after a change and the ICS export, against the
// built server with the demo cruise MT27-03.
import ICAL from 'ical.js';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDb } from '../../src/lib/server/db/client';
import { cruise } from '../../src/lib/server/db/schema';
import { DEMO, formPost, signIn, startServer, type TestServer } from '../support/server';

let srv: TestServer;
let cruiseId: string;
let chief: string;
let participant: string;

beforeAll(async () => {
	srv = await startServer();
	const db = openDb(srv.dbPath);
	cruiseId = db.select().from(cruise).where(eq(cruise.code, 'MT27-03')).get()!.id;
	db.$client.close();
	chief = (await signIn(srv.url, DEMO.chief, DEMO.password, '10.5.0.1')).cookie!;
	participant = (await signIn(srv.url, DEMO.participant, DEMO.password, '10.5.0.2')).cookie!;
});
afterAll(async () => srv?.stop());

const get = (path: string, cookie: string) => fetch(srv.url + path, { headers: { cookie } });
const putOrder = (cookie: string, body: unknown) =>
	fetch(`${srv.url}/api/v1/cruises/${cruiseId}/timeline/order`, {
		method: 'PUT',
		headers: { cookie, 'content-type': 'application/json', origin: srv.url },
		body: JSON.stringify(body)
	});

interface ApiEvent {
	kind: string;
	name: string;
	start: string;
	end: string;
	distanceNm?: number;
	durationH: number;
}

describe('GET /api/v1/cruises/{id}/timeline', () => {
	it('gives events in time order with UTC times and totals within the 21 allocated days', async () => {
		const res = await get(`/api/v1/cruises/${cruiseId}/timeline`, participant);
		expect(res.status).toBe(200);
		const body = await res.json();
		const events: ApiEvent[] = body.events;
		const kinds = new Set(events.map((e) => e.kind));
		for (const k of ['transit', 'line', 'station', 'turn', 'port', 'margin'])
			expect(kinds, k).toContain(k);
		for (const e of events) {
			expect(e.start).toMatch(/^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.\d{3}Z$/);
			expect(Date.parse(e.end)).toBeGreaterThanOrEqual(Date.parse(e.start));
			// durationH is the span of the event (to the millisecond rounding of the API).
			expect((Date.parse(e.end) - Date.parse(e.start)) / 3_600_000).toBeCloseTo(e.durationH, 2);
		}
		for (let i = 1; i < events.length; i++)
			expect(Date.parse(events[i].start)).toBeGreaterThanOrEqual(Date.parse(events[i - 1].start));
		for (const e of events.filter((x) => x.kind === 'transit' || x.kind === 'line'))
			expect(e.distanceNm).toBeGreaterThan(0);

		const { totals } = body;
		expect(totals.allocatedDays).toBe(21);
		expect(totals.operatingDays).toBeGreaterThan(0);
		expect(totals.operatingDays).toBeLessThanOrEqual(21);
		expect(totals.marginDays).toBeGreaterThan(0);
		// Ship-time cost = operating days × the RV Marram Tern's day rate (EUR 38,500).
		expect(totals.cost).toEqual({
			amountMinor: totals.operatingDays * 3_850_000,
			currency: 'EUR'
		});
		// The first event is sailing from Port Ardent at the cruise's departure time.
		const sea = events.filter((e) => e.kind !== 'mobilisation');
		expect(sea[0].start).toBe('2027-05-03T08:00:00.000Z');
		expect(body.warnings).toEqual([]);
	});

	it('answers 401 without credentials', async () => {
		const res = await fetch(`${srv.url}/api/v1/cruises/${cruiseId}/timeline`);
		expect(res.status).toBe(401);
	});
});

describe('the order of work', () => {
	it('only the chief scientist may reorder; a bad order is refused with the reason', async () => {
		const { items } = await (await get(`/api/v1/cruises/${cruiseId}/timeline/order`, chief)).json();
		expect(items.length).toBeGreaterThan(20);
		const same = items.map((i: { id: string; reversed: boolean }) => ({
			id: i.id,
			reversed: i.reversed
		}));

		expect((await putOrder(participant, { items: same })).status).toBe(403);
		const missing = await putOrder(chief, { items: same.slice(1) });
		expect(missing.status).toBe(409);
		expect((await missing.json()).error.code).toBe('conflict');
		const invalid = await putOrder(chief, { items: 'everything' });
		expect(invalid.status).toBe(422);
	});

	it('reordering and reversing a line change the timeline; the clearance then warns', async () => {
		const before = await (await get(`/api/v1/cruises/${cruiseId}/timeline`, chief)).json();
		const { items } = await (await get(`/api/v1/cruises/${cruiseId}/timeline/order`, chief)).json();
		// Run the first line the other way and swap the first two items.
		const next = items.map((i: { id: string; kind: string; reversed: boolean }, k: number) => ({
			id: i.id,
			reversed: k === 0 && i.kind === 'line' ? !i.reversed : i.reversed
		}));
		[next[0], next[1]] = [next[1], next[0]];
		const res = await putOrder(chief, { items: next });
		expect(res.status).toBe(200);
		const after = await res.json();
		expect(after.totals.transitHours).not.toBeCloseTo(before.totals.transitHours, 1);

		const page = await (await get(`/cruises/${cruiseId}/clearances`, chief)).text();
		expect(page).toContain('The plan has changed since this request was submitted');
	});

	it('a participant sees the timeline and clearances pages but cannot post to them', async () => {
		expect((await get(`/cruises/${cruiseId}/timeline`, participant)).status).toBe(200);
		expect((await get(`/cruises/${cruiseId}/clearances`, participant)).status).toBe(200);
		expect((await get(`/cruises/${cruiseId}/print`, participant)).status).toBe(200);
		const res = await formPost(
			srv.url,
			`/cruises/${cruiseId}/timeline?/clock`,
			{ at: '2027-05-06T12:00', offsetHours: '-9' },
			{ cookie: participant }
		);
		expect(res.status).toBe(403);
	});
});

describe('the calendar export', () => {
	const vevents = (text: string) =>
		new ICAL.Component(ICAL.parse(text)).getAllSubcomponents('vevent').map((v) => ({
			uid: String(v.getFirstPropertyValue('uid')),
			sequence: Number(v.getFirstPropertyValue('sequence') ?? 0),
			summary: String(v.getFirstPropertyValue('summary')),
			start: v.getFirstPropertyValue('dtstart') as ICAL.Time,
			end: v.getFirstPropertyValue('dtend') as ICAL.Time
		}));

	it('is valid iCalendar with UTC times, and all-day items end the day after', async () => {
		const res = await get(`/api/v1/cruises/${cruiseId}/calendar.ics`, participant);
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toContain('text/calendar');
		const text = await res.text();
		expect(text).toMatch(/^BEGIN:VCALENDAR\r\n/);
		const events = vevents(text);
		expect(events.length).toBeGreaterThan(40);
		expect(new Set(events.map((e) => e.uid)).size).toBe(events.length);
		for (const e of events) {
			if (e.start.isDate) {
				expect(e.end.isDate).toBe(true);
				expect(e.end.compare(e.start)).toBe(1);
			} else {
				expect(e.start.zone?.tzid).toBe('UTC');
				expect(e.end.compare(e.start)).toBeGreaterThanOrEqual(0);
			}
		}
		expect(events.some((e) => e.summary.includes('leg 1'))).toBe(true);
		expect(events.some((e) => e.summary.includes('Clearance request'))).toBe(true);
	});

	it('keeps UIDs and shows SEQUENCE raised only for the events moved since publication', async () => {
		const first = vevents(
			await (await get(`/api/v1/cruises/${cruiseId}/calendar.ics`, chief)).text()
		);
		const again = vevents(
			await (await get(`/api/v1/cruises/${cruiseId}/calendar.ics`, chief)).text()
		);
		expect(again.map((e) => [e.uid, e.sequence])).toEqual(first.map((e) => [e.uid, e.sequence]));

		// Add two hours to the turn time: every line after the first turn moves.
		const res = await formPost(
			srv.url,
			`/cruises/${cruiseId}/timeline?/timing`,
			{
				turnH: '2.75',
				mobilisationH: '48',
				demobilisationH: '24',
				marginMode: 'pct',
				weatherMarginPct: '12',
				weatherMarginDays: '0'
			},
			{ cookie: chief }
		);
		expect(res.status).toBeLessThan(400);
		const changed = vevents(
			await (await get(`/api/v1/cruises/${cruiseId}/calendar.ics`, chief)).text()
		);
		expect(changed.map((e) => e.uid).sort()).toEqual(first.map((e) => e.uid).sort());
		const was = new Map(first.map((e) => [e.uid, e]));
		let raised = 0;
		for (const e of changed) {
			const old = was.get(e.uid)!;
			const moved = e.start.compare(old.start) !== 0 || e.end.compare(old.end) !== 0;
			if (moved) {
				// The demo published version 1 with every item at SEQUENCE 0; the export shows an
				// item moved since then one above that, however often it is read (it writes nothing).
				expect(e.sequence, e.summary).toBe(1);
				raised++;
			}
		}
		expect(raised).toBeGreaterThan(10);
		// The mobilisation did not move and keeps its number.
		const mob = changed.find((e) => e.summary.includes('Mobilisation'))!;
		expect(mob.sequence).toBe(was.get(mob.uid)!.sequence);
	});
});
