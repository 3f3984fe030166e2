// Schedule publishing and notices against the built server: real HTTP, real SMTP (the local
// catcher), mail read back with mailparser and calendars with ical.js — readers that are not ours.
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { and, eq } from 'drizzle-orm';
import ICAL from 'ical.js';
import { simpleParser, type ParsedMail } from 'mailparser';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDb } from '../../src/lib/server/db/client';
import {
	berthApplication,
	cruise,
	cruiseMember,
	deadline,
	noticePreference,
	scheduleVersion,
	user
} from '../../src/lib/server/db/schema';
import { DEMO, signIn, startServer, type TestServer } from '../support/server';

let srv: TestServer;
let cruiseId: string;
let chief: string;
let participant: string;
const everyone = new Set<string>();

beforeAll(async () => {
	srv = await startServer();
	const db = openDb(srv.dbPath);
	cruiseId = db.select().from(cruise).where(eq(cruise.code, 'MT27-03')).get()!.id;
	for (const m of db
		.select({ email: user.email })
		.from(cruiseMember)
		.innerJoin(user, eq(user.id, cruiseMember.userId))
		.where(eq(cruiseMember.cruiseId, cruiseId))
		.all())
		everyone.add(m.email);
	for (const m of db
		.select({ email: user.email })
		.from(berthApplication)
		.innerJoin(user, eq(user.id, berthApplication.userId))
		.where(and(eq(berthApplication.cruiseId, cruiseId), eq(berthApplication.status, 'confirmed')))
		.all())
		everyone.add(m.email);
	db.$client.close();
	chief = (await signIn(srv.url, DEMO.chief, DEMO.password, '10.11.0.1')).cookie!;
	participant = (await signIn(srv.url, DEMO.participant, DEMO.password, '10.11.0.2')).cookie!;
}, 90_000);
afterAll(async () => srv?.stop());

interface Mail {
	file: string;
	raw: string;
	parsed: ParsedMail;
	to: string;
}

async function mails(dir = srv.mailDir): Promise<Mail[]> {
	let files: string[];
	try {
		files = readdirSync(dir)
			.filter((f) => f.endsWith('.eml'))
			.sort();
	} catch {
		return [];
	}
	return Promise.all(
		files.map(async (file) => {
			const raw = readFileSync(join(dir, file), 'utf8');
			const parsed = await simpleParser(raw);
			const to = Array.isArray(parsed.to)
				? parsed.to.map((a) => a.text).join(', ')
				: (parsed.to?.text ?? '');
			return { file, raw, parsed, to };
		})
	);
}

async function waitFor(match: (m: Mail) => boolean, count: number, dir = srv.mailDir) {
	const deadline = Date.now() + 30_000;
	for (;;) {
		const found = (await mails(dir)).filter(match);
		if (found.length >= count) return found;
		if (Date.now() > deadline)
			throw new Error(`Only ${found.length} of ${count} mails arrived in time.`);
		await new Promise((r) => setTimeout(r, 200));
	}
}

const pause = (ms: number) => new Promise((r) => setTimeout(r, ms));

const api = (path: string, cookie: string, init: RequestInit = {}) =>
	fetch(srv.url + path, {
		...init,
		headers: { cookie, 'content-type': 'application/json', origin: srv.url, ...init.headers }
	});

const publish = (cookie = chief) =>
	api(`/api/v1/cruises/${cruiseId}/schedule/publish`, cookie, { method: 'POST' });

/** The calendar part of a mail: its Content-Type header and text. */
function calendarPart(m: Mail): { type: string; text: string } {
	const att = m.parsed.attachments.find((a) => a.contentType === 'text/calendar');
	expect(att, 'a text/calendar part').toBeTruthy();
	const header = m.raw.match(/Content-Type: text\/calendar[^\r\n]*(\r\n[ \t][^\r\n]*)*/i)![0];
	return { type: header.replace(/\r\n[ \t]+/g, ' '), text: att!.content.toString('utf8') };
}

interface Vevent {
	uid: string;
	sequence: number;
	dtstamp: string;
	start: string;
	end: string;
	location: string;
	summary: string;
}

function vevents(text: string): Vevent[] {
	const cal = new ICAL.Component(ICAL.parse(text));
	expect(cal.getFirstPropertyValue('method')).toBe('PUBLISH');
	return cal.getAllSubcomponents('vevent').map((v) => ({
		uid: String(v.getFirstPropertyValue('uid')),
		sequence: Number(v.getFirstPropertyValue('sequence')),
		dtstamp: String(v.getFirstPropertyValue('dtstamp')),
		start: String(v.getFirstPropertyValue('dtstart')),
		end: String(v.getFirstPropertyValue('dtend')),
		location: String(v.getFirstPropertyValue('location') ?? ''),
		summary: String(v.getFirstPropertyValue('summary'))
	}));
}

/** Swaps two stations in the order of work through the API. */
async function swapStations(a: string, b: string) {
	const order = (await (await api(`/api/v1/cruises/${cruiseId}/timeline/order`, chief)).json()) as {
		items: { id: string; name: string; reversed: boolean }[];
	};
	const items = order.items.map((i) => ({ id: i.id, reversed: i.reversed, name: i.name }));
	const ia = items.findIndex((i) => i.name === a);
	const ib = items.findIndex((i) => i.name === b);
	[items[ia], items[ib]] = [items[ib], items[ia]];
	const res = await api(`/api/v1/cruises/${cruiseId}/timeline/order`, chief, {
		method: 'PUT',
		body: JSON.stringify({ items: items.map(({ id, reversed }) => ({ id, reversed })) })
	});
	expect(res.status).toBe(200);
}

const ofVersion = (v: number) => (m: Mail) =>
	(m.parsed.subject ?? '').includes(`(version ${v})`) && m.parsed.subject!.startsWith('MT27-03');

describe('publishing the schedule', () => {
	let v2: Mail[];

	it('is for the chief scientist only', async () => {
		const res = await publish(participant);
		expect(res.status).toBe(403);
		expect((await res.json()).error.code).toBe('forbidden');
		const versions = await api(`/api/v1/cruises/${cruiseId}/schedule/versions`, participant);
		expect(versions.status).toBe(200);
		expect((await versions.json()).versions.map((v: { version: number }) => v.version)).toEqual([
			1
		]);
	});

	it('mails everyone on the cruise exactly once, with the change summary, HTML, text and the calendar', async () => {
		const res = await publish();
		expect(res.status).toBe(200);
		const body = await res.json();
		expect(body.version).toBe(2);
		expect(body.changed).toBe(true);
		// The demo's change since version 1: the port call grew, so it, leg 2 and the return moved.
		expect(body.changes.map((c: { type: string }) => c.type)).toContain('return');
		expect(body.changes.some((c: { kind: string }) => c.kind === 'port')).toBe(true);
		expect(new Set(body.recipients)).toEqual(everyone);
		expect(body.recipients).toHaveLength(everyone.size);

		v2 = await waitFor(ofVersion(2), everyone.size);
		await pause(800); // anything extra would have arrived by now
		v2 = (await mails()).filter(ofVersion(2));
		expect(v2.map((m) => m.to).sort()).toEqual([...everyone].sort());

		for (const m of v2) {
			expect(m.parsed.subject).toContain('MT27-03');
			expect(m.parsed.text).toMatch(/^What changed since version 1:/);
			expect(m.parsed.text).toContain('New return date:');
			expect(m.parsed.text).toMatch(/Port call, Bellmoor Harbour now ends/);
			expect(m.parsed.text).toMatch(
				/Departure: Port Ardent, 2027-05-03 08:00 UTC · .* ship \(UTC−10\)/
			);
			expect(m.parsed.text).toContain('Leg 2: Bellmoor Harbour → Port Ardent');
			expect(m.parsed.text).toContain(`/cruises/${cruiseId}`);
			expect(m.parsed.html).toMatch(/<table>/);
			expect(m.parsed.html).toContain('What changed since version 1');
			const cal = calendarPart(m);
			expect(cal.type).toMatch(/method=PUBLISH/i);
			// Only the calendar goes along (inline and as schedule.ics): no documents, nothing medical.
			for (const a of m.parsed.attachments)
				expect(['text/calendar', 'application/ics'], a.filename).toContain(a.contentType);
			// Schedule mails cannot be turned off, so they carry no unsubscribe header.
			expect(m.parsed.headerLines.some((h) => h.key.startsWith('list-unsubscribe'))).toBe(false);
		}
		const events = vevents(calendarPart(v2[0]).text);
		expect(events.length).toBeGreaterThan(40);
		for (const e of events) {
			expect(e.uid).toMatch(new RegExp(`\\.${cruiseId}@wakeline$`));
			expect(e.dtstamp).toMatch(/^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\dZ$/);
			expect(Number.isInteger(e.sequence)).toBe(true);
		}
		// Moved since version 1 → SEQUENCE 1; unmoved (leg 1 work) → still 0.
		expect(events.find((e) => e.summary === 'MT27-03: DR-02')!.sequence).toBe(1);
		expect(events.find((e) => e.summary === 'MT27-03: MAG-1')!.sequence).toBe(0);
	});

	it('keeps UIDs across versions and raises SEQUENCE only for the events that moved', async () => {
		await swapStations('CTD-01', 'DIVE-01');
		const res = await publish();
		const body = await res.json();
		expect(body.version).toBe(3);
		const moved = body.changes.filter((c: { type: string }) => c.type === 'moved');
		const names = moved.map((c: { name: string }) => c.name);
		expect(names).toContain('CTD-01');
		expect(names).toContain('DIVE-01');
		for (const c of moved)
			expect(
				c.before.start !== c.after.start ||
					c.before.end !== c.after.end ||
					c.before.location !== c.after.location
			).toBe(true);

		const v3 = await waitFor(ofVersion(3), everyone.size);
		const mine = (list: Mail[]) => list.find((m) => m.to.includes(DEMO.master))!;
		const before = vevents(calendarPart(mine(v2)).text);
		const after = vevents(calendarPart(mine(v3)).text);
		expect(after.map((e) => e.uid).sort()).toEqual(before.map((e) => e.uid).sort());
		const was = new Map(before.map((e) => [e.uid, e]));
		let raised = 0;
		let kept = 0;
		for (const e of after) {
			const old = was.get(e.uid)!;
			const movedNow = e.start !== old.start || e.end !== old.end || e.location !== old.location;
			expect(e.sequence, e.summary).toBe(movedNow ? old.sequence + 1 : old.sequence);
			if (movedNow) raised++;
			else kept++;
		}
		expect(raised).toBeGreaterThan(2);
		expect(kept).toBeGreaterThan(2);
		expect(mine(v3).parsed.text).toMatch(
			/^What changed since version 2:\n(- .*\n)*- (CTD|DIVE)-01 moved: /
		);
	});

	it('sends nothing and says so when nothing changed', async () => {
		const count = (await mails()).length;
		const res = await publish();
		expect(res.status).toBe(200);
		expect(await res.json()).toEqual({ version: 3, changed: false, recipients: [], changes: [] });
		await pause(1000);
		expect((await mails()).length).toBe(count);
		const versions = (await (
			await api(`/api/v1/cruises/${cruiseId}/schedule/versions`, participant)
		).json()) as { versions: { version: number; publishedAt: string; returnAt: string }[] };
		expect(versions.versions.map((v) => v.version)).toEqual([3, 2, 1]);
		for (const v of versions.versions) {
			expect(Date.parse(v.publishedAt)).not.toBeNaN();
			expect(Date.parse(v.returnAt)).toBeGreaterThan(Date.parse('2027-05-03T08:00:00Z'));
		}
	});

	it('two publishes at once make one version', async () => {
		await swapStations('CTD-01', 'DIVE-01');
		const [a, b] = await Promise.all([publish(), publish()]);
		const bodies = [await a.json(), await b.json()];
		expect(bodies.filter((x) => x.changed)).toHaveLength(1);
		expect(bodies.map((x) => x.version)).toEqual([4, 4]);
		const db = openDb(srv.dbPath);
		expect(
			db.select().from(scheduleVersion).where(eq(scheduleVersion.cruiseId, cruiseId)).all()
		).toHaveLength(4);
		db.$client.close();
		await waitFor(ofVersion(4), everyone.size);
		await pause(600);
		expect((await mails()).filter(ofVersion(4))).toHaveLength(everyone.size);
	});
});

describe('the calendar export', () => {
	const ics = async () =>
		vevents(await (await api(`/api/v1/cruises/${cruiseId}/calendar.ics`, participant)).text());

	it('writes nothing when read: SEQUENCE comes from the published versions', async () => {
		const a = await ics();
		const b = await ics();
		expect(b.map((e) => [e.uid, e.sequence])).toEqual(a.map((e) => [e.uid, e.sequence]));
		// A change not yet published shows one above the published number, and reading again
		// does not raise it further.
		await swapStations('DR-01', 'CTD-01');
		const c = await ics();
		const d = await ics();
		expect(d.map((e) => [e.uid, e.sequence])).toEqual(c.map((e) => [e.uid, e.sequence]));
		const was = new Map(a.map((e) => [e.uid, e]));
		const moved = c.filter((e) => e.start !== was.get(e.uid)!.start);
		expect(moved.length).toBeGreaterThan(0);
		for (const e of moved) expect(e.sequence).toBe(was.get(e.uid)!.sequence + 1);
		// Publishing gives the same numbers the export showed.
		const res = await (await publish()).json();
		expect(res.version).toBe(5);
		const mail = (await waitFor(ofVersion(5), everyone.size)).find((m) =>
			m.to.includes(DEMO.agent)
		)!;
		const published = vevents(calendarPart(mail).text);
		expect(published.map((e) => [e.uid, e.sequence]).sort()).toEqual(
			c.map((e) => [e.uid, e.sequence]).sort()
		);
	});
});

describe('reminders and one-click unsubscribe', () => {
	it('a reminder goes out once, even across a restart; its link turns off only reminders, once, without a session', async () => {
		// A checklist item due in 7 days (whole UTC days) for the chief scientist, and a personnel
		// form due tomorrow for the science party.
		const db = openDb(srv.dbPath);
		const c = db.select().from(cruise).where(eq(cruise.id, cruiseId)).get()!;
		const day = 86_400_000;
		const today = Math.floor(Date.now() / day) * day;
		const sailDay = Math.floor(c.departureAt!.getTime() / day) * day;
		const offset = (due: number) => Math.round((due - sailDay) / day);
		db.insert(deadline)
			.values([
				{
					id: 'remindcargo000000001',
					cruiseId,
					title: 'Winch certificates to the operator',
					kind: 'cargo',
					anchor: 'sailing',
					offsetDays: offset(today + 7 * day)
				},
				{
					id: 'remindpersonnel00001',
					cruiseId,
					title: 'Sea-going personnel form',
					kind: 'personnel',
					anchor: 'sailing',
					offsetDays: offset(today + day)
				}
			])
			.run();
		// The demo participant has handed in a personnel form; take it back so one is owing.
		db.$client
			.prepare(
				"delete from document where kind = 'personnel' and user_id = (select id from user where email = ?)"
			)
			.run(DEMO.participant);
		db.$client.close();

		const dir = srv.dir;
		await srv.stop({ keep: true });
		srv = await startServer({ REMINDER_INTERVAL_MS: '300' }, dir);
		const cargo = (m: Mail) => (m.parsed.subject ?? '').includes('Winch certificates');
		const form = (m: Mail) => (m.parsed.subject ?? '').includes('Sea-going personnel form');
		const [toChief] = await waitFor(cargo, 1);
		expect(toChief.to).toContain(DEMO.chief);
		expect(toChief.parsed.subject).toContain('due in 7 days');
		await waitFor((m) => form(m) && m.to.includes(DEMO.participant), 1);
		await pause(1500); // several scheduler runs
		const firstRun = await mails();
		expect(firstRun.filter(cargo)).toHaveLength(1);
		const forms = firstRun.filter(form);
		expect(new Set(forms.map((m) => m.to)).size).toBe(forms.length);

		// Restart on the same database: nothing is sent again.
		await srv.stop({ keep: true });
		srv = await startServer({ REMINDER_INTERVAL_MS: '300' }, dir);
		await pause(2500);
		const after = await mails();
		expect(after.filter(cargo)).toHaveLength(1);
		expect(after.filter(form)).toHaveLength(forms.length);

		// The participant's reminder carries RFC 8058 headers, HTML and text.
		const mine = forms.find((m) => m.to.includes(DEMO.participant))!;
		expect(mine.parsed.html).toBeTruthy();
		expect(mine.parsed.text).toContain('personnel form');
		const header = (key: string) =>
			mine.parsed.headerLines
				.find((h) => h.key === key)
				?.line.slice(key.length + 1)
				.trim();
		expect(header('list-unsubscribe-post')).toBe('List-Unsubscribe=One-Click');
		const link = header('list-unsubscribe')!.replace(/^<|>$/g, '');
		expect(link).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/unsubscribe\/[a-z2-7]+$/);
		const path = new URL(link).pathname;

		const prefs = () => {
			const d = openDb(srv.dbPath);
			const id = d.select().from(user).where(eq(user.email, DEMO.participant)).get()!.id;
			const rows = d.select().from(noticePreference).where(eq(noticePreference.userId, id)).all();
			d.$client.close();
			return Object.fromEntries(rows.map((r) => [r.kind, r.enabled]));
		};
		// Opening the link (as a mail scanner would) changes nothing.
		const look = await fetch(srv.url + path, { headers: { accept: 'text/html' } });
		expect(look.status).toBe(200);
		expect(await look.text()).toContain('Turn off reminders');
		expect(prefs()).toEqual({});

		// The mail client's one-click POST: no session, no Origin of ours (RFC 8058 §3.2).
		const oneClick = () =>
			fetch(srv.url + path, {
				method: 'POST',
				headers: { 'content-type': 'application/x-www-form-urlencoded' },
				body: 'List-Unsubscribe=One-Click',
				redirect: 'manual'
			});
		const first = await oneClick();
		expect(first.status).toBe(200);
		expect(prefs()).toEqual({ reminder: false });
		expect(await first.json()).toEqual({ unsubscribed: 'reminder' });
		const second = await oneClick();
		expect(second.status).toBe(410);
		expect((await second.json()).error.message).toMatch(/already used/);
		expect(prefs()).toEqual({ reminder: false });

		// Other cross-site form posts are still refused.
		const forged = await fetch(`${srv.url}/signin`, {
			method: 'POST',
			headers: {
				'content-type': 'application/x-www-form-urlencoded',
				origin: 'http://evil.example'
			},
			body: 'email=a@b.c&password=x',
			redirect: 'manual'
		});
		expect(forged.status).toBe(403);
	}, 120_000);
});
