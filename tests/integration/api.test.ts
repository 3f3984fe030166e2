import { execFileSync } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO, signIn, startServer, type TestServer } from '../support/server';

let srv: TestServer;
let chiefToken: string;

beforeAll(async () => {
	srv = await startServer();
	// The operators' command, exactly as documented: npm run token -- <email>
	chiefToken = execFileSync('npm', ['run', '-s', 'token', '--', DEMO.chief], {
		env: { ...process.env, DATABASE_PATH: srv.dbPath },
		encoding: 'utf8'
	}).trim();
});
afterAll(async () => srv?.stop());

const call = (path: string, token?: string, init: RequestInit = {}) =>
	fetch(srv.url + path, {
		...init,
		headers: { ...(token ? { authorization: `Bearer ${token}` } : {}), ...(init.headers ?? {}) }
	});

describe('API v1', () => {
	it('without credentials answers 401 in the documented error shape', async () => {
		for (const path of ['/api/v1/me', '/api/v1/cruises']) {
			const res = await call(path);
			expect(res.status).toBe(401);
			expect(res.headers.get('content-type')).toContain('application/json');
			const body = await res.json();
			expect(body.error.code).toBe('unauthenticated');
			expect(typeof body.error.message).toBe('string');
		}
	});

	it('a token from `npm run token` lists the demo cruise', async () => {
		expect(chiefToken).toMatch(/^wlt_[a-z2-7]+$/);
		const res = await call('/api/v1/cruises', chiefToken);
		expect(res.status).toBe(200);
		const { cruises } = await res.json();
		expect(cruises.map((c: { code: string }) => c.code)).toEqual(['MT27-03']);
		expect(cruises[0].role).toBe('chief_scientist');
	});

	it('GET /cruises/{id}: 200 with a role, 403 without one, 404 for none', async () => {
		const admin = await signIn(srv.url, DEMO.admin);
		const all = await (
			await call('/api/v1/cruises', undefined, { headers: { cookie: admin.cookie! } })
		).json();
		const mine = all.cruises.find((c: { code: string }) => c.code === 'MT27-03');
		const other = all.cruises.find((c: { code: string }) => c.code === 'SL27-01');

		const ok = await call(`/api/v1/cruises/${mine.id}`, chiefToken);
		expect(ok.status).toBe(200);
		const detail = await ok.json();
		expect(detail.vessel.name).toBe('RV Marram Tern');
		expect(detail.legs).toHaveLength(2);

		const forbidden = await call(`/api/v1/cruises/${other.id}`, chiefToken);
		expect(forbidden.status).toBe(403);
		expect((await forbidden.json()).error.code).toBe('forbidden');

		const missing = await call('/api/v1/cruises/doesnotexist', chiefToken);
		expect(missing.status).toBe(404);
		expect((await missing.json()).error.code).toBe('not_found');
	});

	it('GET /me tells who the token belongs to and their cruise roles', async () => {
		const me = await (await call('/api/v1/me', chiefToken)).json();
		expect(me.email).toBe(DEMO.chief);
		expect(me.cruises).toEqual([
			expect.objectContaining({ code: 'MT27-03', role: 'chief_scientist' })
		]);
	});

	it('a revoked or made-up token is refused', async () => {
		const res = await call('/api/v1/me', 'wlt_madeupmadeupmadeup');
		expect(res.status).toBe(401);
	});

	it('unknown API paths answer 404 JSON', async () => {
		const res = await call('/api/v1/no-such-thing', chiefToken);
		expect(res.status).toBe(404);
		expect((await res.json()).error.code).toBe('not_found');
	});
});
