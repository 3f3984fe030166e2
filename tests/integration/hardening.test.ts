// Issue 8: no request can stall or crash the server; values within one set of limits; sign-in,
// links and credentials that cannot be abused. Against the built server, real HTTP and SQLite.
import { execFileSync } from 'node:child_process';
import { and, eq, isNull } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDb, type Db } from '../../src/lib/server/db/client';
import {
	cruise,
	cruiseMember,
	passwordReset,
	session,
	surveyLine,
	user
} from '../../src/lib/server/db/schema';
import {
	caughtMail,
	DEMO,
	formPost,
	signIn,
	startServer,
	waitForMail,
	type TestServer
} from '../support/server';

const BUDGET_MS = 8000;
let srv: TestServer;
let db: Db;
let token: string;
let otherToken: string;
let cruiseId: string;

beforeAll(async () => {
	srv = await startServer({ ENGINE_BUDGET_MS: String(BUDGET_MS) });
	db = openDb(srv.dbPath);
	const mint = (email: string) =>
		execFileSync('npm', ['run', '-s', 'token', '--', email], {
			env: { ...process.env, DATABASE_PATH: srv.dbPath },
			encoding: 'utf8'
		}).trim();
	token = mint(DEMO.chief);
	otherToken = mint(DEMO.participant);
	cruiseId = db.select().from(cruise).where(eq(cruise.code, 'MT27-03')).get()!.id;
});
afterAll(async () => {
	db?.$client.close();
	await srv?.stop();
});

const call = (path: string, t: string, init: RequestInit = {}) =>
	fetch(srv.url + path, {
		...init,
		headers: {
			authorization: `Bearer ${t}`,
			'content-type': 'application/json',
			...(init.headers ?? {})
		}
	});
const postJson = (path: string, body: unknown, t = token) =>
	call(path, t, { method: 'POST', body: JSON.stringify(body) });

/** A zig-zag axis: n vertices alternating ±amp° of longitude about 30° W, stepping north. */
const zigzag = (n: number, amp: number, step: number) =>
	Array.from({ length: n }, (_, i) => [-30 + (i % 2 ? amp : -amp), i * step]);

const field = async (res: Response) =>
	((await res.json()) as { error: { code: string; details?: { field: string }[] } }).error;

describe('no request may block everyone', () => {
	it('the 2,000-vertex zig-zag axis that ran 33 s is refused at once with a 422 naming the field', async () => {
		const t0 = Date.now();
		const res = await postJson('/api/v1/depth-profile', {
			line: {
				type: 'LineString',
				coordinates: [
					[-35, 0.2],
					[-25, 5]
				]
			},
			ridge: { axis: { type: 'LineString', coordinates: zigzag(2000, 5, 0.01) }, fullRateMmYr: 30 }
		});
		expect(res.status).toBe(422);
		const e = await field(res);
		expect(e.details?.[0].field).toBe('ridge.axis.coordinates');
		expect(Date.now() - t0).toBeLessThan(2000);
	});

	it('the heaviest zig-zag within the limits answers within the budget or is refused, while another user’s /me answers in < 200 ms', async () => {
		const body = {
			line: {
				type: 'LineString',
				coordinates: [
					[-36, 0.1],
					[-24, 8.9]
				]
			},
			spacingKm: 0.1,
			ridge: {
				// 2000 vertices, ≈ 9 900 km of axis: just inside both limits
				axis: { type: 'LineString', coordinates: zigzag(2000, 0.0222, 0.00449) },
				fullRateMmYr: 30
			}
		};
		expect((await call('/api/v1/me', otherToken)).status).toBe(200); // warm connection
		const t0 = Date.now();
		let settled = false;
		const heavy = Promise.all(
			[0, 1, 2].map(() => postJson('/api/v1/depth-profile', body).then((r) => r.status))
		).finally(() => (settled = true));
		// the bodies are read and checked on the event loop; then the workers compute
		await new Promise((r) => setTimeout(r, 500));
		const me: number[] = [];
		let during = 0;
		for (let i = 0; i < 8; i++) {
			const s = performance.now();
			const res = await call('/api/v1/me', otherToken);
			expect(res.status).toBe(200);
			me.push(performance.now() - s);
			if (!settled) during++;
			await new Promise((r) => setTimeout(r, 50));
		}
		expect(during, 'the /me calls ran while the engine computed').toBeGreaterThanOrEqual(4);
		const statuses = await heavy;
		for (const s of statuses) expect([200, 422]).toContain(s);
		// three queued behind the workers: each within the budget or stopped at it
		expect(Date.now() - t0).toBeLessThan(3 * BUDGET_MS + 3000);
		// The event loop stays free: half the calls (the median) answer in < 200 ms, and none waits
		// for the computation (before the pool, /me waited the whole 33 s). The worst single call
		// is held to 1.5 s because this 2-core machine is shared (load averages above 20 seen).
		const sorted = [...me].sort((a, b) => a - b);
		const detail = me.map((t) => t.toFixed(0)).join(', ');
		expect(sorted[Math.floor(sorted.length / 2)], detail).toBeLessThan(200);
		expect(sorted[sorted.length - 1], detail).toBeLessThan(1500);
	});

	it('spacingKm 1e-9 is a 422 naming spacingKm, not a 500; a tiny spacing on a long line is refused before sampling', async () => {
		const base = {
			line: {
				type: 'LineString',
				coordinates: [
					[-40, 10],
					[-20, 10]
				]
			},
			ridge: {
				axis: {
					type: 'LineString',
					coordinates: [
						[-30, 9],
						[-30, 11]
					]
				},
				fullRateMmYr: 30
			}
		};
		for (const spacingKm of [1e-9, 0.1]) {
			const res = await postJson('/api/v1/depth-profile', { ...base, spacingKm });
			const body = await res.text();
			expect(res.status, body).toBe(422);
			expect(JSON.parse(body).error.details?.[0].field, body).toBe('spacingKm');
		}
	});

	it('a saved 1,000-vertex zig-zag ridge does not slow every plan read: values are computed once per revision', async () => {
		const res = await postJson(`/api/v1/cruises/${cruiseId}/plan/features`, {
			kind: 'ridge',
			name: 'Zig-zag test',
			geometry: { type: 'LineString', coordinates: zigzag(1000, 0.0222, 0.009) },
			properties: { fullRateMmYr: 25 }
		});
		expect(res.status).toBe(201);
		const first = await call(`/api/v1/cruises/${cruiseId}/plan`, token);
		expect(first.status).toBe(200);
		const a = await first.json();
		const times: number[] = [];
		for (let i = 0; i < 5; i++) {
			const s = performance.now();
			const r = await call(`/api/v1/cruises/${cruiseId}/plan`, otherToken);
			expect(await r.json()).toMatchObject({ features: a.features });
			times.push(performance.now() - s);
		}
		expect(Math.min(...times)).toBeLessThan(200);
		const id = (await res.json()).id;
		expect(
			(await call(`/api/v1/cruises/${cruiseId}/plan/features/${id}`, token, { method: 'DELETE' }))
				.status
		).toBeLessThan(300);
	});
});

describe('no value may explode a computation: the tiny speed is refused at every entry point', () => {
	const line = {
		kind: 'line',
		name: 'Slow line',
		geometry: {
			type: 'LineString',
			coordinates: [
				[-30, 10],
				[-29, 10]
			]
		},
		properties: { surveySpeedKn: 1e-9 }
	};

	it('API: new line, changed line, bulk edit', async () => {
		const res = await postJson(`/api/v1/cruises/${cruiseId}/plan/features`, line);
		expect(res.status).toBe(422);
		expect((await field(res)).details?.[0].field).toBe('properties.surveySpeedKn');

		const id = db.select().from(surveyLine).where(eq(surveyLine.cruiseId, cruiseId)).get()!.id;
		const patch = await call(`/api/v1/cruises/${cruiseId}/plan/features/${id}`, token, {
			method: 'PATCH',
			body: JSON.stringify({ properties: { surveySpeedKn: 1e-9 } })
		});
		expect(patch.status).toBe(422);
		const bulk = await postJson(`/api/v1/cruises/${cruiseId}/plan/features/bulk`, {
			ids: [id],
			properties: { surveySpeedKn: 1e-9 }
		});
		expect(bulk.status).toBe(422);
		expect(
			db.select().from(surveyLine).where(eq(surveyLine.id, id)).get()!.surveySpeedKn
		).toBeGreaterThanOrEqual(1);
	});

	it('import: the same bound as the API (40 kn and 1e-9 kn both refused)', async () => {
		for (const surveySpeedKn of [1e-9, 40]) {
			const geo = {
				type: 'FeatureCollection',
				features: [
					{
						type: 'Feature',
						geometry: line.geometry,
						properties: { kind: 'line', name: 'Slow line', surveySpeedKn }
					}
				]
			};
			const res = await call(`/api/v1/cruises/${cruiseId}/import?format=geojson`, token, {
				method: 'POST',
				body: JSON.stringify(geo)
			});
			expect(res.status, String(surveySpeedKn)).toBe(422);
			expect(JSON.stringify(await res.json())).toContain('surveySpeedKn');
		}
	});

	it('forms: the vessel form refuses it with the field named', async () => {
		const { cookie } = await signIn(srv.url, DEMO.admin, DEMO.password, '10.8.0.9');
		const res = await formPost(
			srv.url,
			'/admin/vessels/new',
			{
				name: 'Slow Test',
				callSign: 'SLOW1',
				scienceBerths: '10',
				transitSpeedKn: '10',
				surveySpeedKn: '0.000000001',
				dayRate: '1000',
				currency: 'EUR',
				swathAngleDeg: '120',
				swathDepthFactor: '4',
				winchSpeedMPerMin: '60',
				enduranceDays: '30'
			},
			{ cookie: cookie! }
		);
		expect(res.status).toBe(400);
		expect(await res.text()).toContain('Survey speed (kn): at least 1.');
	});
});

describe('sign-in that cannot be raced', () => {
	it('a parallel burst of 10 wrong passwords gets at most the limit (5) checked; the right one after it is locked out too', async () => {
		const burst = await Promise.all(
			Array.from({ length: 10 }, (_, i) =>
				signIn(srv.url, DEMO.agent, `wrong-password-${i}`, `10.8.1.${i}`)
			)
		);
		const checked = burst.filter((r) => r.status === 400).length;
		const locked = burst.filter((r) => r.status === 429).length;
		expect(checked).toBeLessThanOrEqual(5);
		expect(checked + locked).toBe(10);
		const right = await signIn(srv.url, DEMO.agent, DEMO.password, '10.8.1.99');
		expect(right.status).toBe(429);
		expect(right.cookie).toBeNull();
	});

	it('a burst mixing the right password with wrong ones evaluates at most the limit', async () => {
		const tries = Array.from({ length: 10 }, (_, i) => (i === 9 ? DEMO.password : `nope-${i}`));
		const burst = await Promise.all(
			tries.map((p, i) => signIn(srv.url, DEMO.master, p, `10.8.2.${i}`))
		);
		const evaluated = burst.filter((r) => r.status !== 429).length;
		expect(evaluated).toBeLessThanOrEqual(5);
	});

	it('reset mails are limited per address (3 an hour) and per client (10), and answer in the same time for known and unknown addresses', async () => {
		const ask = (email: string, address: string) =>
			formPost(srv.url, '/reset', { email }, { address });
		const before = (await caughtMail(srv.mailDir)).filter((m) =>
			m.to.includes(DEMO.participant)
		).length;
		for (let i = 0; i < 5; i++)
			expect((await ask(DEMO.participant, `10.8.3.${i}`)).status).toBe(200);
		await new Promise((r) => setTimeout(r, 1500));
		const after = (await caughtMail(srv.mailDir)).filter((m) =>
			m.to.includes(DEMO.participant)
		).length;
		expect(after - before).toBe(3);

		const statuses: number[] = [];
		for (let i = 0; i < 11; i++)
			statuses.push((await ask(`nobody${i}@example.org`, '10.8.4.1')).status);
		expect(statuses.slice(0, 10).every((s) => s === 200)).toBe(true);
		expect(statuses[10]).toBe(429);

		const time = async (email: string, address: string) => {
			const s = performance.now();
			await ask(email, address);
			return performance.now() - s;
		};
		const known = await time(DEMO.chief, '10.8.5.1');
		const unknown = await time('no.such.person@example.org', '10.8.5.2');
		expect(known).toBeGreaterThanOrEqual(290);
		expect(unknown).toBeGreaterThanOrEqual(290);
		expect(Math.abs(known - unknown)).toBeLessThan(150);
	});
});

describe('links that cannot be abused', () => {
	it('/signin?next=/%5Cevil.example stays on the site after sign-in', async () => {
		for (const next of ['/%5Cevil.example', '//evil.example', 'https://evil.example/x']) {
			const res = await formPost(
				srv.url,
				`/signin?next=${next}`,
				{ email: DEMO.chief, password: DEMO.password },
				{ address: '10.8.6.1' }
			);
			expect(res.status, next).toBe(303);
			expect(res.headers.get('location'), next).toBe('/cruises');
		}
		const ok = await formPost(
			srv.url,
			`/signin?next=${encodeURIComponent(`/cruises/${cruiseId}/chart`)}`,
			{ email: DEMO.chief, password: DEMO.password },
			{ address: '10.8.6.1' }
		);
		expect(ok.headers.get('location')).toBe(`/cruises/${cruiseId}/chart`);
	});

	it('an invitation whose address has since got an account cannot take it over: the typed password must be that account’s', async () => {
		const email = 'late.joiner@example.org';
		const { cookie: chief } = await signIn(srv.url, DEMO.chief, DEMO.password, '10.8.7.1');
		const { cookie: admin } = await signIn(srv.url, DEMO.admin, DEMO.password, '10.8.7.1');
		const action = (path: string, cookie: string, fields: Record<string, string>) =>
			fetch(srv.url + path, {
				method: 'POST',
				body: new URLSearchParams(fields),
				redirect: 'manual',
				headers: {
					cookie,
					origin: srv.url,
					accept: 'application/json',
					'x-sveltekit-action': 'true'
				}
			});
		// a cruise invitation to a new address, then a site invitation the owner accepts first
		expect(
			(await action(`/cruises/${cruiseId}/members?/invite`, chief!, { email, role: 'participant' }))
				.status
		).toBe(200);
		const cruiseMail = await waitForMail(
			srv.mailDir,
			(m) => m.to.includes(email) && /MT27-03/.test(m.subject)
		);
		const cruiseLink = cruiseMail.text.match(/\/invite\/(\w+)/)![1];
		expect((await action('/admin/users?/invite', admin!, { email, role: 'member' })).status).toBe(
			200
		);
		const siteMail = await waitForMail(
			srv.mailDir,
			(m) => m.to.includes(email) && !/MT27-03/.test(m.subject)
		);
		const siteLink = siteMail.text.match(/\/invite\/(\w+)/)![1];
		const owner = await formPost(
			srv.url,
			`/invite/${siteLink}`,
			{ name: 'Late Joiner', password: 'owners-own-password', confirm: 'owners-own-password' },
			{ address: '10.8.7.2' }
		);
		expect(owner.status).toBe(303);
		const u = db.select().from(user).where(eq(user.email, email)).get()!;
		const member = () =>
			db
				.select()
				.from(cruiseMember)
				.where(and(eq(cruiseMember.cruiseId, cruiseId), eq(cruiseMember.userId, u.id)))
				.get();

		// the page answers the same as for a new address
		const page = await (await fetch(`${srv.url}/invite/${cruiseLink}`)).text();
		expect(page).toContain('If this address already has a Wakeline account');

		const take = await formPost(
			srv.url,
			`/invite/${cruiseLink}`,
			{ name: 'Intruder', password: 'attacker-password', confirm: 'attacker-password' },
			{ address: '10.8.7.3' }
		);
		expect(take.status).toBe(400);
		expect(take.headers.getSetCookie().some((c) => c.startsWith('wl_session='))).toBe(false);
		expect(await take.text()).not.toContain('attacker-password'); // a failed form never echoes a password
		const still = db.select().from(user).where(eq(user.id, u.id)).get()!;
		expect(still.passwordHash).toBe(u.passwordHash);
		expect(still.name).toBe('Late Joiner');
		expect(member()).toBeUndefined();

		const own = await formPost(
			srv.url,
			`/invite/${cruiseLink}`,
			{ name: 'Late Joiner', password: 'owners-own-password', confirm: 'owners-own-password' },
			{ address: '10.8.7.4' }
		);
		expect(own.status).toBe(303);
		expect(member()?.role).toBe('participant');
	});
});

describe('credentials revoked together', () => {
	it('changing the password ends the other sessions and outstanding reset links, and keeps this one', async () => {
		// a science-party member (demo password) nobody else signs in as in this file
		const demo = [DEMO.admin, DEMO.chief, DEMO.agent, DEMO.master, DEMO.participant];
		const u = db
			.select()
			.from(user)
			.all()
			.find((x) => !demo.includes(x.email) && x.passwordHash)!;
		const a = (await signIn(srv.url, u.email, DEMO.password, '10.8.8.1')).cookie!;
		const b = (await signIn(srv.url, u.email, DEMO.password, '10.8.8.2')).cookie!;
		await formPost(srv.url, '/reset', { email: u.email }, { address: '10.8.8.3' });
		await new Promise((r) => setTimeout(r, 400));
		const open = () =>
			db
				.select()
				.from(passwordReset)
				.where(and(eq(passwordReset.userId, u.id), isNull(passwordReset.usedAt)))
				.all().length;
		expect(open()).toBeGreaterThan(0);

		const res = await fetch(`${srv.url}/account?/password`, {
			method: 'POST',
			body: new URLSearchParams({
				currentPassword: DEMO.password,
				password: 'a-new-long-password',
				confirm: 'a-new-long-password'
			}),
			redirect: 'manual',
			headers: {
				cookie: a,
				origin: srv.url,
				accept: 'application/json',
				'x-sveltekit-action': 'true'
			}
		});
		expect(res.status).toBe(200);
		expect(JSON.stringify(await res.json())).not.toContain('a-new-long-password');
		const sessions = db.select().from(session).where(eq(session.userId, u.id)).all();
		expect(sessions).toHaveLength(1);
		expect(
			(await fetch(`${srv.url}/account`, { headers: { cookie: a }, redirect: 'manual' })).status
		).toBe(200);
		expect(
			(await fetch(`${srv.url}/account`, { headers: { cookie: b }, redirect: 'manual' })).status
		).toBe(303);
		expect(open()).toBe(0);
	});
});

describe('headers', () => {
	it('every page and error page carries a CSP with nonces and frame-ancestors none', async () => {
		const { cookie } = await signIn(srv.url, DEMO.chief, DEMO.password, '10.8.9.1');
		for (const path of ['/signin', '/no-such-page', `/cruises/${cruiseId}/chart`]) {
			const headers: Record<string, string> = path.includes('/chart') ? { cookie: cookie! } : {};
			const res = await fetch(srv.url + path, { redirect: 'manual', headers });
			expect(res.status, path).not.toBe(303);
			const csp = res.headers.get('content-security-policy');
			expect(csp, path).toContain("frame-ancestors 'none'");
			expect(csp, path).toContain("worker-src 'self' blob:");
			expect(csp, path).toMatch(/script-src 'self' 'nonce-[\w+/=]+'/);
		}
	});

	it('a cross-site form post to the API is refused in the JSON error shape', async () => {
		const res = await fetch(srv.url + '/api/v1/cruises', {
			method: 'POST',
			body: new URLSearchParams({ code: 'X' }),
			headers: { origin: 'https://evil.example', authorization: `Bearer ${token}` }
		});
		expect(res.status).toBe(403);
		expect(res.headers.get('content-type')).toContain('application/json');
		expect((await res.json()).error.code).toBe('cross_site');
		const page = await fetch(srv.url + '/signin', {
			method: 'POST',
			body: new URLSearchParams({ email: DEMO.chief, password: DEMO.password }),
			headers: { origin: 'https://evil.example' },
			redirect: 'manual'
		});
		expect(page.status).toBe(403);
	});
});

describe('unknown references', () => {
	it('an unknown vessel or port id on the cruise form is a 4xx naming the field, not a 500', async () => {
		const { cookie } = await signIn(srv.url, DEMO.admin, DEMO.password, '10.8.10.1');
		for (const [f, v] of [
			['vesselId', 'no-such-vessel'],
			['departurePortId', 'no-such-port']
		]) {
			const res = await formPost(
				srv.url,
				'/cruises/new',
				{ code: `UNK-${f.length}`, title: 'Unknown refs', [f]: v },
				{ cookie: cookie! }
			);
			expect(res.status, f).toBe(400);
			expect(await res.text()).toContain('from the list');
		}
	});
});
