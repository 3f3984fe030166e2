import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDb, type Db } from '../../src/lib/server/db/client';
import { passwordReset, session, user } from '../../src/lib/server/db/schema';
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

beforeAll(async () => {
	srv = await startServer();
	db = openDb(srv.dbPath);
});
afterAll(async () => {
	db?.$client.close();
	await srv?.stop();
});

const get = (path: string, cookie?: string) =>
	fetch(srv.url + path, { redirect: 'manual', headers: cookie ? { cookie } : {} });

describe('sign-in', () => {
	it('every demo user signs in and gets an httpOnly, SameSite=Lax session cookie', async () => {
		for (const email of [DEMO.admin, DEMO.chief, DEMO.participant, DEMO.agent, DEMO.master]) {
			const res = await formPost(
				srv.url,
				'/signin',
				{ email, password: DEMO.password },
				{ address: '10.1.0.1' }
			);
			expect(res.status, email).toBe(303);
			const cookie = res.headers.getSetCookie().find((c) => c.startsWith('wl_session='))!;
			expect(cookie).toMatch(/HttpOnly/i);
			expect(cookie).toMatch(/SameSite=Lax/i);
			expect(cookie).not.toMatch(/Secure/); // plain http in tests; Secure is set behind https
		}
	});

	it('only the hash of the session token is stored', async () => {
		const { cookie } = await signIn(srv.url, DEMO.master);
		const token = cookie!.split('=')[1];
		const rows = db.select().from(session).all();
		expect(rows.some((r) => r.id === token)).toBe(false);
		expect(rows.every((r) => /^[0-9a-f]{64}$/.test(r.id))).toBe(true);
	});

	it('a wrong password and an unknown e-mail get the same clear message and no session', async () => {
		const before = db.select().from(session).all().length;
		const wrong = await signIn(srv.url, DEMO.chief, 'not-the-password', '10.1.0.2');
		const unknown = await signIn(srv.url, 'nobody@example.org', 'whatever-it-is', '10.1.0.2');
		for (const r of [wrong, unknown]) {
			expect(r.status).toBe(400);
			expect(r.cookie).toBeNull();
			expect(r.body).toContain('That e-mail and password do not match an account.');
		}
		expect(db.select().from(session).all().length).toBe(before);
	});

	it('locks an account after 5 failures, even for the right password, from any address', async () => {
		const email = 'asha.lindqvist@example.org';
		for (let i = 0; i < 5; i++) {
			const r = await signIn(srv.url, email, 'bad-' + i, `10.2.0.${i}`);
			expect(r.status).toBe(400);
		}
		const locked = await signIn(srv.url, email, DEMO.password, '10.2.0.99');
		expect(locked.status).toBe(429);
		expect(locked.cookie).toBeNull();
		expect(locked.body).toContain('Too many failed sign-ins');
	});

	it('locks an address after 20 failures across accounts', async () => {
		for (let i = 0; i < 20; i++) await signIn(srv.url, `ghost${i}@example.org`, 'x', '10.3.0.1');
		const locked = await signIn(srv.url, DEMO.agent, DEMO.password, '10.3.0.1');
		expect(locked.status).toBe(429);
		const elsewhere = await signIn(srv.url, DEMO.agent, DEMO.password, '10.3.0.2');
		expect(elsewhere.status).toBe(303);
	});

	it('sign-out ends the session on the server', async () => {
		const { cookie } = await signIn(srv.url, DEMO.participant);
		expect((await get('/cruises', cookie!)).status).toBe(200);
		const out = await formPost(srv.url, '/signout?/here', {}, { cookie: cookie! });
		expect(out.status).toBe(303);
		const after = await get('/cruises', cookie!);
		expect(after.status).toBe(303);
		expect(after.headers.get('location')).toMatch(/^\/signin/);
	});
});

describe('password reset', () => {
	const email = 'bram.ostrowski@example.org';

	async function requestLink() {
		const res = await formPost(srv.url, '/reset', { email });
		expect(res.status).toBe(200);
		const mail = await waitForMail(
			srv.mailDir,
			(m) => m.to.includes(email) && /reset/i.test(m.subject) && !used.has(m.text)
		);
		used.add(mail.text);
		return mail.text.match(/http:\/\/\S+\/reset\/(\w+)/)![1];
	}
	const used = new Set<string>();

	const setPassword = (token: string, password: string) =>
		formPost(srv.url, `/reset/${token}`, { password, confirm: password });

	it('an e-mailed link sets a new password once, and signs out other sessions', async () => {
		const old = await signIn(srv.url, email, DEMO.password, '10.4.0.1');
		expect(old.status).toBe(303);
		const token = await requestLink();
		const res = await setPassword(token, 'a-brand-new-secret');
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe('/signin?reset=done');
		expect((await get('/cruises', old.cookie!)).status).toBe(303); // old session gone
		expect((await signIn(srv.url, email, 'a-brand-new-secret', '10.4.0.1')).status).toBe(303);

		const again = await setPassword(token, 'yet-another-secret');
		expect(again.status).toBe(400);
		expect(await again.text()).toContain('already been used');
		expect((await signIn(srv.url, email, 'yet-another-secret', '10.4.0.2')).status).toBe(400);
	});

	it('an expired link is refused and changes nothing', async () => {
		const token = await requestLink();
		db.update(passwordReset)
			.set({ expiresAt: new Date(Date.now() - 1000) })
			.run();
		const before = db.select().from(user).where(eq(user.email, email)).get()!.passwordHash;
		const page = await get(`/reset/${token}`);
		expect(await page.text()).toContain('This reset link has expired');
		const res = await setPassword(token, 'expired-link-secret');
		expect(res.status).toBe(400);
		expect(db.select().from(user).where(eq(user.email, email)).get()!.passwordHash).toBe(before);
	});

	it('asking for an unknown e-mail answers the same and sends nothing', async () => {
		const res = await formPost(srv.url, '/reset', { email: 'no-such-person@example.org' });
		expect(res.status).toBe(200);
		expect(await res.text()).toContain('If no-such-person@example.org has an account');
	});
});
