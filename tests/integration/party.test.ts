// The science party over real HTTP against the built server: berth applications and the cap under
// 50 simultaneous confirmations, bad input refused with nothing stored, uploads checked from their
// bytes, and medical documents read only by their owner, the chief scientist and the master.
import { and, count, eq, like } from 'drizzle-orm';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDb, type Db } from '../../src/lib/server/db/client';
import {
	auditLog,
	berthApplication,
	cruise,
	cruiseMember,
	document,
	leg,
	notice,
	user
} from '../../src/lib/server/db/schema';
import Papa from 'papaparse';
import {
	DEMO,
	formPost,
	signIn,
	startServer,
	waitForMail,
	type TestServer
} from '../support/server';

let srv: TestServer;
let db: Db;
let cruiseId: string;
let otherLegId: string;
let legs: { id: string; seq: number }[];
const cookies: Record<string, string> = {};
let addr = 1;

async function cookieFor(email: string) {
	cookies[email] ??= (await signIn(srv.url, email, DEMO.password, `10.9.0.${addr++}`)).cookie!;
	return cookies[email];
}

async function call(email: string, method: string, path: string, body?: unknown) {
	return fetch(srv.url + path, {
		method,
		headers: {
			cookie: await cookieFor(email),
			...(body !== undefined ? { 'content-type': 'application/json' } : {})
		},
		body: body === undefined ? undefined : JSON.stringify(body)
	});
}

async function uploadAs(email: string, query: string, bytes: Uint8Array) {
	return fetch(`${srv.url}/api/v1/cruises/${cruiseId}/documents?${query}`, {
		method: 'POST',
		headers: { cookie: await cookieFor(email), 'content-type': 'application/octet-stream' },
		body: new Blob([bytes as Uint8Array<ArrayBuffer>])
	});
}

/** A small but well-formed PDF (ISO 32000-1: header, one empty page, xref, trailer). */
function pdf(text = 'berth'): Uint8Array {
	return new TextEncoder().encode(
		`%PDF-1.4\n1 0 obj<</Type/Catalog/Pages 2 0 R>>endobj\n2 0 obj<</Type/Pages/Kids[3 0 R]/Count 1>>endobj\n` +
			`3 0 obj<</Type/Page/Parent 2 0 R/MediaBox[0 0 200 200]>>endobj\n% ${text}\ntrailer<</Root 1 0 R>>\n%%EOF\n`
	);
}

const docCount = () => db.select({ n: count() }).from(document).get()!.n;
const appCount = () => db.select({ n: count() }).from(berthApplication).get()!.n;

beforeAll(async () => {
	srv = await startServer();
	db = openDb(srv.dbPath);
	cruiseId = db.select().from(cruise).where(eq(cruise.code, 'MT27-03')).get()!.id;
	legs = db.select({ id: leg.id, seq: leg.seq }).from(leg).where(eq(leg.cruiseId, cruiseId)).all();
	legs.sort((a, b) => a.seq - b.seq);
	// The other demo cruise gets a leg, so that applying to it through this cruise can be tried.
	const other = db.select().from(cruise).where(eq(cruise.code, 'SL27-01')).get()!;
	otherLegId = 'otherleg1';
	db.insert(leg).values({ id: otherLegId, cruiseId: other.id, seq: 1, name: 'Only leg' }).run();
}, 90_000);
afterAll(async () => {
	db?.$client.close();
	await srv?.stop();
});

describe('the berth cap under simultaneous confirmations', () => {
	it('50 confirmations at a leg with 2 free berths: exactly 2 succeed, 48 get 409 berths_full', async () => {
		const target = legs[1].id;
		const hash = db.select().from(user).where(eq(user.email, DEMO.participant)).get()!.passwordHash;
		const ids: string[] = [];
		db.transaction((tx) => {
			for (let i = 0; i < 50; i++) {
				const uid = `rush${i}`;
				tx.insert(user)
					.values({ id: uid, email: `rush${i}@example.org`, name: `Rush ${i}`, passwordHash: hash })
					.run();
				tx.insert(cruiseMember).values({ cruiseId, userId: uid, role: 'participant' }).run();
				const id = `rushapp${i}`;
				tx.insert(berthApplication)
					.values({ id, cruiseId, legId: target, userId: uid, roleOnBoard: 'scientist' })
					.run();
				ids.push(id);
			}
			const confirmed = tx
				.select({ n: count() })
				.from(berthApplication)
				.where(and(eq(berthApplication.legId, target), eq(berthApplication.status, 'confirmed')))
				.get()!.n;
			tx.update(leg)
				.set({ scienceBerths: confirmed + 2 })
				.where(eq(leg.id, target))
				.run();
		});
		const chief = await cookieFor(DEMO.chief);
		const answers = await Promise.all(
			ids.map((id) =>
				fetch(`${srv.url}/api/v1/cruises/${cruiseId}/berths/${id}`, {
					method: 'PATCH',
					headers: { cookie: chief, 'content-type': 'application/json' },
					body: JSON.stringify({ status: 'confirmed' })
				})
			)
		);
		const statuses = answers.map((r) => r.status);
		expect(statuses.filter((s) => s === 200)).toHaveLength(2);
		expect(statuses.filter((s) => s === 409)).toHaveLength(48);
		const refused = await Promise.all(answers.filter((r) => r.status === 409).map((r) => r.json()));
		for (const r of refused) {
			expect(r.error.code).toBe('berths_full');
			expect(r.error.message).toMatch(/is full: all \d+ science berths are confirmed/);
		}

		const totals = await (
			await call(DEMO.chief, 'GET', `/api/v1/cruises/${cruiseId}/berths`)
		).json();
		const l = totals.legs.find((x: { id: string }) => x.id === target);
		expect(l.confirmed).toBe(l.berths);
		// Exactly two decision e-mails were queued, in the winners' transactions.
		const mails = db
			.select({ n: count() })
			.from(notice)
			.where(and(eq(notice.kind, 'berth_decision'), like(notice.toAddress, 'rush%')))
			.get()!.n;
		expect(mails).toBe(2);
	});
});

describe('applications', () => {
	it('apply, see only one’s own, refuse applying twice and a leg of another cruise', async () => {
		const me = 'rush10@example.org';
		const path = `/api/v1/cruises/${cruiseId}/berths`;
		const res = await call(me, 'POST', path, {
			legId: legs[0].id,
			roleOnBoard: 'student',
			institution: 'Institute of Ocean Floors (invented)',
			note: 'Magnetics watch.'
		});
		expect(res.status).toBe(201);
		const created = await res.json();
		expect(created).toMatchObject({ legId: legs[0].id, status: 'applied', roleOnBoard: 'student' });

		const before = appCount();
		const twice = await call(me, 'POST', path, { legId: legs[0].id, roleOnBoard: 'student' });
		expect(twice.status).toBe(409);
		expect((await twice.json()).error.message).toMatch(/already applied/);
		const elsewhere = await call(me, 'POST', path, { legId: otherLegId, roleOnBoard: 'student' });
		expect(elsewhere.status).toBe(422);
		const e = await elsewhere.json();
		expect(e.error.details).toEqual([
			{ field: 'legId', message: 'There is no such leg on this cruise.' }
		]);
		const badRole = await call(me, 'POST', path, { legId: legs[0].id, roleOnBoard: 'captain' });
		expect(badRole.status).toBe(422);
		expect((await badRole.json()).error.message).toMatch(/^roleOnBoard: /);
		expect(appCount()).toBe(before);

		const mine = await (await call(me, 'GET', path)).json();
		expect(mine.applications.every((a: { userId: string }) => a.userId === 'rush10')).toBe(true);
		expect(mine.applications).toHaveLength(2);
		expect(mine.legs).toHaveLength(2);
		const all = await (await call(DEMO.admin, 'GET', path)).json();
		expect(all.applications.length).toBeGreaterThan(50);
	});

	it('a participant cannot decide (403, nothing changes) but withdraws their own', async () => {
		const me = 'rush11@example.org';
		const own = await call(me, 'PATCH', `/api/v1/cruises/${cruiseId}/berths/rushapp11`, {
			status: 'confirmed'
		});
		expect(own.status).toBe(403);
		expect((await own.json()).error.message).toBe(
			'Only the chief scientist decides on berth applications.'
		);
		const other = await call(me, 'PATCH', `/api/v1/cruises/${cruiseId}/berths/rushapp12`, {
			status: 'withdrawn'
		});
		expect(other.status).toBe(403);
		const agent = await call(DEMO.agent, 'PATCH', `/api/v1/cruises/${cruiseId}/berths/rushapp12`, {
			status: 'declined'
		});
		expect(agent.status).toBe(403);
		const row = db
			.select()
			.from(berthApplication)
			.where(eq(berthApplication.id, 'rushapp11'))
			.get()!;
		expect(row.status).toBe('applied');

		const out = await call(me, 'PATCH', `/api/v1/cruises/${cruiseId}/berths/rushapp11`, {
			status: 'withdrawn'
		});
		expect(out.status).toBe(200);
		expect((await out.json()).status).toBe('withdrawn');
	});

	it('the waitlist keeps its order and closes gaps; the decision mail reaches the applicant', async () => {
		const base = `/api/v1/cruises/${cruiseId}/berths`;
		for (const n of [20, 21, 22]) {
			const r = await call(DEMO.chief, 'PATCH', `${base}/rushapp${n}`, {
				status: 'waitlisted',
				message: 'We will know more after the port call.'
			});
			expect(r.status).toBe(200);
		}
		const pos = () =>
			[20, 21, 22].map(
				(n) =>
					db
						.select()
						.from(berthApplication)
						.where(eq(berthApplication.id, `rushapp${n}`))
						.get()!.waitlistPosition
			);
		const [a, b, c] = pos();
		expect(b).toBe(a! + 1);
		expect(c).toBe(a! + 2);
		expect(
			(await call(DEMO.chief, 'PATCH', `${base}/rushapp20`, { status: 'declined' })).status
		).toBe(200);
		expect(pos()).toEqual([null, a, a! + 1]);
		const mail = await waitForMail(
			srv.mailDir,
			(m) => m.to.includes('rush21@example.org') && /waiting list/.test(m.subject)
		);
		expect(mail.text).toContain('We will know more after the port call.');
		expect(mail.text).not.toMatch(/medic/i);
		expect(mail.attachments).toEqual([]);
	});
});

describe('documents', () => {
	const me = 'rush30@example.org';

	it('stores a PDF by its SHA-256 and refuses bad files with nothing stored', async () => {
		const ok = await uploadAs(me, 'kind=personnel&filename=personnel%20form.pdf', pdf());
		expect(ok.status).toBe(201);
		const doc = await ok.json();
		expect(doc).toMatchObject({
			kind: 'personnel',
			mimeType: 'application/pdf',
			status: 'uploaded'
		});
		expect(existsSync(join(srv.dir, 'uploads', doc.sha256.slice(0, 2), doc.sha256))).toBe(true);

		const before = docCount();
		// An ELF executable header (e_ident, System V ABI) under a .pdf name.
		const elf = new Uint8Array(4096);
		elf.set([0x7f, 0x45, 0x4c, 0x46, 2, 1, 1, 0]);
		const exe = await uploadAs(me, 'kind=passport&filename=passport.pdf', elf);
		expect(exe.status).toBe(415);
		expect((await exe.json()).error.message).toMatch(/upload a PDF, JPEG or PNG/);

		const big = new Uint8Array(11 * 1024 * 1024);
		big.set(pdf());
		const tooBig = await uploadAs(me, 'kind=passport&filename=big.pdf', big);
		expect(tooBig.status).toBe(413);
		expect((await tooBig.json()).error.message).toMatch(
			/11\.0 MB; the largest accepted is 10\.0 MB/
		);

		const empty = await uploadAs(me, 'kind=passport&filename=empty.pdf', new Uint8Array(0));
		expect(empty.status).toBe(400);
		expect((await empty.json()).error).toMatchObject({
			code: 'empty_file',
			message: 'The file is empty.'
		});

		for (const bad of ['2027-02-30', 'next-year', '31/12/2027']) {
			const r = await uploadAs(me, `kind=passport&filename=p.pdf&expiresOn=${bad}`, pdf());
			expect(r.status, bad).toBe(422);
			expect((await r.json()).error.details[0].field).toBe('expiresOn');
		}
		const kind = await uploadAs(me, 'kind=horoscope&filename=p.pdf', pdf());
		expect(kind.status).toBe(422);
		expect(docCount()).toBe(before);
	});

	it('a medical document: owner, chief scientist and master read it; admin and port agent get 403', async () => {
		const bytes = pdf('fit for sea');
		const up = await uploadAs(me, 'kind=medical&filename=medical.pdf&expiresOn=2028-01-31', bytes);
		expect(up.status).toBe(201);
		const { id } = await up.json();
		const path = `/api/v1/cruises/${cruiseId}/documents/${id}`;
		for (const who of [DEMO.admin, DEMO.agent, DEMO.participant]) {
			const r = await call(who, 'GET', path);
			expect(r.status, who).toBe(403);
			expect((await r.json()).error.message).toMatch(/^Medical documents are read only by/);
		}
		for (const who of [me, DEMO.chief, DEMO.master]) {
			const r = await call(who, 'GET', path);
			expect(r.status, who).toBe(200);
			expect(r.headers.get('content-disposition')).toContain('filename="medical.pdf"');
			expect(new Uint8Array(await r.arrayBuffer())).toEqual(bytes);
		}
		const reads = db
			.select()
			.from(auditLog)
			.where(eq(auditLog.action, 'document.medical_read'))
			.all()
			.filter((a) => (a.detail as { documentId: string }).documentId === id);
		expect(reads.map((r) => r.userId).sort()).toEqual(
			[
				'rush30',
				db.select().from(user).where(eq(user.email, DEMO.chief)).get()!.id,
				db.select().from(user).where(eq(user.email, DEMO.master)).get()!.id
			].sort()
		);
	});

	it('only the chief scientist reviews, and a rejection needs a reason', async () => {
		const up = await uploadAs(me, 'kind=visa&filename=visa.png', pdf('visa'));
		const { id } = await up.json();
		const path = `/api/v1/cruises/${cruiseId}/documents/${id}`;
		expect((await call(me, 'PATCH', path, { status: 'accepted' })).status).toBe(403);
		const noReason = await call(DEMO.chief, 'PATCH', path, { status: 'rejected' });
		expect(noReason.status).toBe(422);
		expect((await noReason.json()).error.message).toBe('reason: Say why the document is rejected.');
		const ok = await call(DEMO.chief, 'PATCH', path, {
			status: 'rejected',
			reason: 'Page is cut off.'
		});
		expect(ok.status).toBe(200);
		expect(await ok.json()).toMatchObject({ status: 'rejected', reviewReason: 'Page is cut off.' });
	});
});

describe('persons on board', () => {
	it('CSV (RFC 4180, header first) for the master and the port agent; nobody else', async () => {
		const path = `/api/v1/cruises/${cruiseId}/pob.csv`;
		for (const who of [DEMO.chief, DEMO.admin, DEMO.participant]) {
			const r = await call(who, 'GET', path);
			expect(r.status, who).toBe(403);
			expect((await r.json()).error.message).toMatch(/master (or|and the) port agent/);
		}
		const printed = await fetch(`${srv.url}/cruises/${cruiseId}/pob`, {
			headers: { cookie: await cookieFor(DEMO.admin) },
			redirect: 'manual'
		});
		expect(printed.status).toBe(403);
		for (const who of [DEMO.master, DEMO.agent]) {
			const r = await call(who, 'GET', path);
			expect(r.status, who).toBe(200);
			expect(r.headers.get('content-type')).toBe('text/csv; charset=utf-8; header=present');
			const text = await r.text();
			// Nothing before the header row; every line ends in CRLF (RFC 4180 §2.1–2.3).
			expect(text.startsWith('leg,full_name,nationality,date_of_birth,passport_number,')).toBe(
				true
			);
			expect(text.replace(/\r\n/g, '')).not.toMatch(/[\r\n]/);
			// Read back by papaparse, a reader that is not ours.
			const parsed = Papa.parse<Record<string, string>>(text.trimEnd(), { header: true });
			expect(parsed.errors).toEqual([]);
			const confirmed = db
				.select({ n: count() })
				.from(berthApplication)
				.where(
					and(eq(berthApplication.cruiseId, cruiseId), eq(berthApplication.status, 'confirmed'))
				)
				.get()!.n;
			expect(parsed.data).toHaveLength(confirmed);
			const rafael = parsed.data.find((row) => row.full_name === 'RAFAEL QUENBY')!;
			expect(rafael).toMatchObject({
				leg: 'Leg 1 — northern segment',
				joining_port: 'Port Ardent',
				leaving_port: 'Bellmoor Harbour'
			});
			expect(rafael.passport_number).toMatch(/^XP\d{7}$/);
		}
	});

	it('travel details refuse an impossible date and a formula-looking name, keeping nothing', async () => {
		const me = 'rush40@example.org';
		const bad = await formPost(
			srv.url,
			'/account/travel',
			{
				fullName: '=HYPERLINK("x")',
				nationality: 'Xanderan',
				dateOfBirth: '1990-02-30',
				passportNumber: 'XP1234567',
				passportExpiry: '2031-01-01'
			},
			{ cookie: await cookieFor(me) }
		);
		expect(bad.status).toBe(400);
		const html = await bad.text();
		expect(html).toContain('The full name as in the passport cannot start with = + - or @.');
		expect(html).toContain('This is not a calendar date.');
	});
});

describe('retention', () => {
	it('lists, then deletes, the documents of a cruise completed more than 90 days ago', async () => {
		const other = db.select().from(cruise).where(eq(cruise.code, 'SL27-01')).get()!;
		const up = await uploadAs(
			DEMO.participant,
			'kind=personnel&filename=old.pdf',
			pdf('old cruise')
		);
		const { sha256 } = await up.json();
		const hash = db.select().from(document).where(eq(document.sha256, sha256)).get()!;
		db.insert(document)
			.values({ ...hash, id: 'olddoc', cruiseId: other.id, sha256: 'f'.repeat(64) })
			.run();
		db.update(cruise)
			.set({ status: 'completed', returnAt: new Date(Date.now() - 91 * 86_400_000) })
			.where(eq(cruise.id, other.id))
			.run();
		const admin = await cookieFor(DEMO.admin);
		const page = await (
			await fetch(`${srv.url}/admin/retention`, { headers: { cookie: admin } })
		).text();
		expect(page).toContain('SL27-01');
		const chief = await fetch(`${srv.url}/admin/retention`, {
			headers: { cookie: await cookieFor(DEMO.chief) },
			redirect: 'manual'
		});
		expect(chief.status).toBe(403);
		const run = await formPost(srv.url, '/admin/retention?/run', {}, { cookie: admin });
		expect(run.status).toBe(200);
		expect(db.select().from(document).where(eq(document.cruiseId, other.id)).all()).toEqual([]);
		// The demo cruise's documents are untouched.
		expect(db.select().from(document).where(eq(document.sha256, sha256)).get()).toBeTruthy();
	});
});
