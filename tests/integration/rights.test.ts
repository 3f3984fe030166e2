// Who may do what (issue 13 item 8) and plain errors at the field (item 7), over real HTTP against
// the built server: creating cruises, e-mail visibility, unique codes, deleting cruises with what
// goes with them, and the plain messages forms and the API share.
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDb } from '../../src/lib/server/db/client';
import { auditLog, cruise, deadline, document, user } from '../../src/lib/server/db/schema';
import { DEMO, formPost, signIn, startServer, type TestServer } from '../support/server';

let srv: TestServer;
let db: ReturnType<typeof openDb>;
const cookies: Record<string, string> = {};
let demoId: string;
let otherId: string;

beforeAll(async () => {
	srv = await startServer();
	db = openDb(srv.dbPath);
	demoId = db.select().from(cruise).where(eq(cruise.code, 'MT27-03')).get()!.id;
	otherId = db.select().from(cruise).where(eq(cruise.code, 'SL27-01')).get()!.id;
	for (const [k, email] of Object.entries(DEMO)) {
		if (k === 'password') continue;
		cookies[k] = (await signIn(srv.url, email, DEMO.password, `10.13.0.${k.length}`)).cookie!;
	}
});
afterAll(async () => {
	db?.$client.close();
	await srv?.stop();
});

const get = (path: string, who: string) =>
	fetch(srv.url + path, { redirect: 'manual', headers: { cookie: cookies[who] } });
const post = (path: string, who: string, fields: Record<string, string>) =>
	formPost(srv.url, path, fields, { cookie: cookies[who] });

/** The text of the error shown beside a field (`<p id="<name>-error">`), or null. */
function fieldError(html: string, name: string): string | null {
	const m = new RegExp(`<p id="${name}-error"[^>]*>([^<]*)</p>`).exec(html);
	return m ? m[1].replace(/&amp;/g, '&').replace(/&#39;|&apos;/g, "'") : null;
}

const cruiseCount = () =>
	db
		.select({ n: sql<number>`count(*)` })
		.from(cruise)
		.get()!.n;

const newCruise = (over: Record<string, string> = {}) => ({
	code: 'WL-T-01',
	title: 'A short test cruise',
	status: 'draft',
	vesselId: '',
	departurePortId: '',
	returnPortId: '',
	departureAt: '',
	returnAt: '',
	allocatedDays: '5',
	weatherMarginPct: '10',
	depthModel: 'stein-stein-1992',
	...over
});

describe('creating a cruise is for admins and members allowed to lead cruises', () => {
	it('a participant sees no "New cruise" and is refused the page and the action', async () => {
		const list = await (await get('/cruises', 'participant')).text();
		expect(list).not.toContain('href="/cruises/new"');
		expect((await get('/cruises/new', 'participant')).status).toBe(403);
		const before = cruiseCount();
		const res = await post('/cruises/new', 'participant', newCruise());
		expect(res.status).toBe(403);
		expect(cruiseCount()).toBe(before);
	});

	it('the chief (allowed in the demo) and the admin see "New cruise"', async () => {
		for (const who of ['chief', 'admin']) {
			expect(await (await get('/cruises', who)).text()).toContain('href="/cruises/new"');
			expect((await get('/cruises/new', who)).status).toBe(200);
		}
	});

	it('the marine office allows a member to lead cruises, and stops it again', async () => {
		const participant = db.select().from(user).where(eq(user.email, DEMO.participant)).get()!;
		const people = await (await get('/admin/users', 'admin')).text();
		expect(people).toContain('May lead cruises');
		// Only admins may set the flag.
		const refused = await post('/admin/users?/lead', 'chief', {
			userId: participant.id,
			allowed: 'true'
		});
		expect(refused.status).toBe(403);
		expect(
			(await post('/admin/users?/lead', 'admin', { userId: participant.id, allowed: 'true' }))
				.status
		).toBe(200);
		expect((await get('/cruises/new', 'participant')).status).toBe(200);
		expect(await (await get('/cruises', 'participant')).text()).toContain('href="/cruises/new"');
		await post('/admin/users?/lead', 'admin', { userId: participant.id, allowed: 'false' });
		expect((await get('/cruises/new', 'participant')).status).toBe(403);
	});
});

describe('e-mail addresses: names and roles for everyone, addresses for the chief and master', () => {
	const others = [DEMO.chief, DEMO.master, DEMO.agent];

	it('the participant’s people page and overview show names and roles, no addresses', async () => {
		for (const path of [`/cruises/${demoId}/members`, `/cruises/${demoId}`]) {
			const html = await (await get(path, 'participant')).text();
			expect(html).toContain('Dr Tove Achterberg');
			expect(html).toContain('Chief scientist');
			for (const e of others) expect(html, path).not.toContain(e);
			// The only address on the page is the participant's own (in the account menu).
			const addresses = new Set(html.match(/[\w.+-]+@example\.org/g) ?? []);
			expect([...addresses], path).toEqual([DEMO.participant]);
		}
		const agent = await (await get(`/cruises/${demoId}/members`, 'agent')).text();
		expect(agent).not.toContain(DEMO.chief);
	});

	it('the cruise API lists people without addresses for a participant, with them for the master', async () => {
		const mine = await (await get(`/api/v1/cruises/${demoId}`, 'participant')).json();
		expect(mine.people.length).toBeGreaterThan(3);
		expect(mine.people.find((p: { role: string }) => p.role === 'chief_scientist').name).toBe(
			'Dr Tove Achterberg'
		);
		expect(JSON.stringify(mine)).not.toContain('@');
		for (const who of ['master', 'chief']) {
			const full = await (await get(`/api/v1/cruises/${demoId}`, who)).json();
			expect(full.people.map((p: { email: string }) => p.email)).toContain(DEMO.participant);
		}
		const html = await (await get(`/cruises/${demoId}/members`, 'master')).text();
		expect(html).toContain(DEMO.participant);
	});
});

describe('plain errors at the field, nothing saved', () => {
	it('a 300-character title and 0 allocated days are named at their fields', async () => {
		const before = cruiseCount();
		const res = await post(
			'/cruises/new',
			'chief',
			newCruise({ title: 'T'.repeat(300), allocatedDays: '0' })
		);
		expect(res.status).toBe(400);
		const html = await res.text();
		expect(fieldError(html, 'title')).toBe('Title: at most 200 characters.');
		expect(fieldError(html, 'allocatedDays')).toBe('Allocated days: at least 1.');
		expect(html).not.toMatch(/Too big|Too small|expected string/);
		// What the person typed is kept.
		expect(html).toContain('T'.repeat(300));
		expect(cruiseCount()).toBe(before);
	});

	it('the inputs carry the schema’s limits', async () => {
		const html = await (await get('/cruises/new', 'chief')).text();
		expect(html).toMatch(/<input[^>]*id="title"[^>]*maxlength="200"/);
		expect(html).toMatch(/<input[^>]*id="code"[^>]*maxlength="20"/);
		expect(html).toMatch(/<input[^>]*id="allocatedDays"[^>]*min="1"[^>]*max="400"/);
		expect(html).toMatch(/<input[^>]*id="weatherMarginPct"[^>]*min="0"[^>]*max="100"/);
	});

	it('a code differing only by case is refused at the code field, on create and on edit', async () => {
		const before = cruiseCount();
		const res = await post('/cruises/new', 'chief', newCruise({ code: 'mt27-03' }));
		expect(res.status).toBe(409);
		expect(fieldError(await res.text(), 'code')).toMatch(/^Cruise code: MT27-03 is taken/);
		// Said at once, beside any other problem of the same submission.
		const both = await (
			await post('/cruises/new', 'chief', newCruise({ code: 'Mt27-03', allocatedDays: '0' }))
		).text();
		expect(fieldError(both, 'code')).toMatch(/^Cruise code: MT27-03 is taken/);
		expect(fieldError(both, 'allocatedDays')).toBe('Allocated days: at least 1.');
		expect(cruiseCount()).toBe(before);

		const edit = await post(`/cruises/${demoId}/edit?/save`, 'admin', {
			...newCruise({ code: 'sl27-01', status: 'planned' })
		});
		expect(edit.status).toBe(409);
		expect(fieldError(await edit.text(), 'code')).toMatch(/^Cruise code: SL27-01 is taken/);
		expect(db.select().from(cruise).where(eq(cruise.id, demoId)).get()!.code).toBe('MT27-03');
	});

	it('the database itself refuses a code differing only by case', () => {
		expect(() =>
			db.insert(cruise).values({ id: 'x-case', code: 'Mt27-03', title: 'Clash' }).run()
		).toThrow(/UNIQUE/);
	});

	it('the vessel form: limits read from the schema, plain messages, nothing saved', async () => {
		const page = await (await get('/admin/vessels/new', 'admin')).text();
		expect(page).toMatch(/<input[^>]*id="transitSpeedKn"[^>]*min="2"[^>]*max="25"/);
		expect(page).toMatch(/<input[^>]*id="scienceBerths"[^>]*min="1"[^>]*max="200"/);
		expect(page).toMatch(/<input[^>]*id="name"[^>]*maxlength="120"/);
		const res = await post('/admin/vessels/new', 'admin', {
			name: 'RV Long Test',
			callSign: 'XTEST1',
			scienceBerths: '0',
			transitSpeedKn: '10',
			surveySpeedKn: '8',
			dayRate: '1000',
			currency: 'EUR',
			swathAngleDeg: '130',
			swathDepthFactor: '4',
			winchSpeedMPerMin: '60',
			enduranceDays: '5000'
		});
		expect(res.status).toBe(400);
		const html = await res.text();
		expect(fieldError(html, 'scienceBerths')).toBe('Science berths: at least 1.');
		expect(fieldError(html, 'enduranceDays')).toMatch(/^Endurance \(days\): at most \d+\.$/);
		expect(html).not.toMatch(/Too big|Too small/);
		expect(html).not.toContain('RV Long Test</td>');
	});

	it('the checklist form: limits on its inputs, plain messages at its fields', async () => {
		const before = db
			.select({ n: sql<number>`count(*)` })
			.from(deadline)
			.get()!.n;
		const page = await (await get(`/cruises/${demoId}/clearances`, 'chief')).text();
		expect(page).toMatch(/<input[^>]*id="offsetDays"[^>]*min="-730"[^>]*max="730"/);
		const res = await post(`/cruises/${demoId}/clearances?/addDeadline`, 'chief', {
			title: 'D'.repeat(201),
			kind: 'other',
			anchor: 'sailing',
			offsetDays: '9999'
		});
		expect(res.status).toBe(400);
		const html = await res.text();
		expect(fieldError(html, 'title')).toBe('Title: at most 200 characters.');
		expect(fieldError(html, 'offsetDays')).toBe('Days (− before): at most 730.');
		expect(
			db
				.select({ n: sql<number>`count(*)` })
				.from(deadline)
				.get()!.n
		).toBe(before);
	});

	it('the API’s 422 details carry the same plain messages', async () => {
		const res = await fetch(`${srv.url}/api/v1/cruises/${demoId}/plan/features`, {
			method: 'POST',
			headers: { cookie: cookies.chief, 'content-type': 'application/json', origin: srv.url },
			body: JSON.stringify({
				kind: 'line',
				name: 'n'.repeat(81),
				geometry: {
					type: 'LineString',
					coordinates: [
						[-30, 10],
						[-29, 10]
					]
				}
			})
		});
		expect(res.status).toBe(422);
		const body = await res.json();
		expect(body.error.details).toContainEqual({
			field: 'name',
			message: 'Name: at most 80 characters.'
		});
		expect(body.error.message).toBe('Name: at most 80 characters. (name)');
	});
});

describe('deleting a cruise', () => {
	it('a chief scientist may not delete a planned cruise, by form or API', async () => {
		expect(
			(await post(`/cruises/${demoId}/edit?/delete`, 'chief', { confirmCode: 'MT27-03' })).status
		).toBe(403);
		const api = await fetch(`${srv.url}/api/v1/cruises/${demoId}`, {
			method: 'DELETE',
			headers: { cookie: cookies.chief, origin: srv.url }
		});
		expect(api.status).toBe(403);
		expect((await api.json()).error.code).toBe('forbidden');
		const page = await (await get(`/cruises/${demoId}/edit`, 'chief')).text();
		expect(page).toContain('Only a draft can be deleted by its chief scientist');
		expect(db.select().from(cruise).where(eq(cruise.id, demoId)).get()).toBeDefined();
	});

	it('a participant may not delete, even a draft', async () => {
		expect(
			(await post(`/cruises/${otherId}/edit?/delete`, 'participant', { confirmCode: 'SL27-01' }))
				.status
		).toBe(403);
	});

	it('a chief scientist deletes their own draft after typing its code', async () => {
		const made = await post('/cruises/new', 'chief', newCruise({ code: 'WL-DRAFT-1' }));
		expect(made.status).toBe(303);
		const id = made.headers.get('location')!.split('/').pop()!;
		const page = await (await get(`/cruises/${id}/edit`, 'chief')).text();
		expect(page).toContain('Deleting WL-DRAFT-1 also deletes, for good:');
		expect(page).toContain('1 person’s role on it');

		const wrong = await post(`/cruises/${id}/edit?/delete`, 'chief', { confirmCode: 'WL-DRAFT' });
		expect(wrong.status).toBe(400);
		expect(fieldError(await wrong.text(), 'confirmCode')).toMatch(
			/type WL-DRAFT-1 to confirm; nothing was deleted/
		);
		expect(db.select().from(cruise).where(eq(cruise.id, id)).get()).toBeDefined();

		const ok = await post(`/cruises/${id}/edit?/delete`, 'chief', { confirmCode: 'wl-draft-1' });
		expect(ok.status).toBe(303);
		expect(ok.headers.get('location')).toBe('/cruises?deleted=WL-DRAFT-1');
		expect(db.select().from(cruise).where(eq(cruise.id, id)).get()).toBeUndefined();
		expect(await (await get('/cruises?deleted=WL-DRAFT-1', 'chief')).text()).toContain(
			'Cruise WL-DRAFT-1 was deleted.'
		);
	});

	it('the admin deletes the demo cruise: the confirmation counts what goes, everything goes, uploads too', async () => {
		// Two uploaded documents: one only this cruise names, one another cruise also names.
		// Stored as the upload store lays them out: UPLOAD_DIR/<first two hex digits>/<sha256>.
		const uploads = join(srv.dir, 'uploads');
		const stored = (sha: string) => join(uploads, sha.slice(0, 2), sha);
		const mk = (text: string) => {
			const sha = createHash('sha256').update(text).digest('hex');
			mkdirSync(join(uploads, sha.slice(0, 2)), { recursive: true });
			writeFileSync(stored(sha), text);
			return sha;
		};
		const only = mk('medical form of one participant');
		const shared = mk('a certificate used on two cruises');
		const participant = db.select().from(user).where(eq(user.email, DEMO.participant)).get()!;
		const doc = (cruiseId: string, sha256: string) =>
			db
				.insert(document)
				.values({
					id: `doc-${cruiseId}-${sha256.slice(0, 6)}`,
					cruiseId,
					userId: participant.id,
					kind: 'sea_survival',
					filename: 'x.pdf',
					mimeType: 'application/pdf',
					sizeBytes: 10,
					sha256
				})
				.run();
		doc(demoId, only);
		doc(demoId, shared);
		doc(otherId, shared);

		const docsBefore = db.select().from(document).where(eq(document.cruiseId, demoId)).all().length;
		expect(docsBefore).toBeGreaterThanOrEqual(2);
		const page = await (await get(`/cruises/${demoId}/edit`, 'admin')).text();
		const impact = /data-testid="delete-impact"[^>]*>([\s\S]*?)<\/ul>/.exec(page)![1];
		expect(impact).toMatch(/2 legs/);
		expect(impact).toMatch(/\d+ survey lines/);
		expect(impact).toMatch(/\d+ stations/);
		expect(impact).toMatch(/\d+ documents/);
		expect(impact).toMatch(/\d+ invoices? \(with/);
		expect(impact).toMatch(/\d+ deadlines/);

		const res = await fetch(`${srv.url}/api/v1/cruises/${demoId}`, {
			method: 'DELETE',
			headers: { cookie: cookies.admin, origin: srv.url }
		});
		expect(res.status).toBe(200);
		const { deleted } = await res.json();
		expect(deleted.code).toBe('MT27-03');
		expect(deleted.legs).toBe(2);
		// The two made here and the demo's own science-party documents.
		expect(deleted.documents).toBe(docsBefore);
		expect(deleted.lines).toBeGreaterThan(0);

		// Nothing in any table still names the cruise, and every foreign key still holds.
		const tables = db.$client
			.prepare(
				`select name from sqlite_master where type = 'table' and name not like '\\_\\_%' escape '\\'`
			)
			.all() as { name: string }[];
		let checked = 0;
		for (const { name } of tables) {
			const cols = db.$client.prepare(`pragma table_info("${name}")`).all() as { name: string }[];
			if (!cols.some((c) => c.name === 'cruise_id')) continue;
			checked++;
			const n = db.$client
				.prepare(`select count(*) as n from "${name}" where cruise_id = ?`)
				.get(demoId) as { n: number };
			expect(n.n, name).toBe(0);
		}
		expect(checked).toBeGreaterThan(10);
		expect(db.$client.prepare('pragma foreign_key_check').all()).toEqual([]);
		// The deletion is recorded apart from the cruise, so the record outlives it.
		const entry = db
			.select()
			.from(auditLog)
			.where(eq(auditLog.action, 'cruise.deleted'))
			.all()
			.at(-1)!;
		expect(entry.cruiseId).toBeNull();
		expect(entry.detail).toMatchObject({ cruiseId: demoId, code: 'MT27-03' });
		// The upload only this cruise named is gone; the shared one stays.
		expect(existsSync(stored(only))).toBe(false);
		expect(existsSync(stored(shared))).toBe(true);
		expect((await get(`/cruises/${demoId}`, 'admin')).status).toBe(404);
	});
});
