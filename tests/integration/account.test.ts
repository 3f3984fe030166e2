import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDb, type Db } from '../../src/lib/server/db/client';
import { apiToken } from '../../src/lib/server/db/schema';
import { DEMO, signIn, startServer, type TestServer } from '../support/server';

let srv: TestServer;
let db: Db;
let cookie: string;

beforeAll(async () => {
	srv = await startServer();
	db = openDb(srv.dbPath);
	cookie = (await signIn(srv.url, DEMO.participant)).cookie!;
});
afterAll(async () => {
	db?.$client.close();
	await srv?.stop();
});

const action = (name: string, fields: Record<string, string>) =>
	fetch(`${srv.url}/account?/${name}`, {
		method: 'POST',
		body: new URLSearchParams(fields),
		headers: { cookie, origin: srv.url, accept: 'application/json', 'x-sveltekit-action': 'true' }
	});

describe('personal API tokens', () => {
	it('are created on the account page, stored hashed, work as Bearer and stop working when revoked', async () => {
		const created = await (await action('createToken', { name: 'field laptop' })).json();
		expect(created.type).toBe('success');
		const token = JSON.stringify(created.data).match(/wlt_[a-z2-7]+/)![0];

		const rows = db.select().from(apiToken).all();
		expect(rows.some((r) => r.tokenHash === token)).toBe(false);
		const row = rows.find((r) => r.name === 'field laptop')!;
		expect(row.tokenHash).toMatch(/^[0-9a-f]{64}$/);
		expect(token.startsWith(row.prefix)).toBe(true);

		const me = await fetch(`${srv.url}/api/v1/me`, {
			headers: { authorization: `Bearer ${token}` }
		});
		expect(me.status).toBe(200);
		expect((await me.json()).email).toBe(DEMO.participant);

		const revoked = await (await action('revokeToken', { tokenId: row.id })).json();
		expect(revoked.type).toBe('success');
		const after = await fetch(`${srv.url}/api/v1/me`, {
			headers: { authorization: `Bearer ${token}` }
		});
		expect(after.status).toBe(401);
	});

	it("cannot revoke someone else's token", async () => {
		const chief = (await signIn(srv.url, DEMO.chief)).cookie!;
		const made = await fetch(`${srv.url}/account?/createToken`, {
			method: 'POST',
			body: new URLSearchParams({ name: 'chief script' }),
			headers: {
				cookie: chief,
				origin: srv.url,
				accept: 'application/json',
				'x-sveltekit-action': 'true'
			}
		});
		expect((await made.json()).type).toBe('success');
		const chiefRow = db
			.select()
			.from(apiToken)
			.all()
			.find((r) => r.name === 'chief script')!;
		const res = await (await action('revokeToken', { tokenId: chiefRow.id })).json();
		expect(res.type).toBe('failure');
		expect(
			db
				.select()
				.from(apiToken)
				.all()
				.find((r) => r.id === chiefRow.id)!.revokedAt
		).toBeNull();
	});

	it('a token name is required', async () => {
		const res = await (await action('createToken', { name: '' })).json();
		expect(res.type).toBe('failure');
	});
});

describe('sign out everywhere', () => {
	const bearerWorks = async (token: string) =>
		(await fetch(`${srv.url}/api/v1/me`, { headers: { authorization: `Bearer ${token}` } }))
			.status === 200;

	it('lists the API tokens it can revoke and, when asked, revokes them with the sessions', async () => {
		const master = (await signIn(srv.url, DEMO.master)).cookie!;
		const as = (name: string, fields: Record<string, string>, path = '/account') =>
			fetch(`${srv.url}${path}?/${name}`, {
				method: 'POST',
				body: new URLSearchParams(fields),
				headers: {
					cookie: master,
					origin: srv.url,
					accept: 'application/json',
					'x-sveltekit-action': 'true'
				}
			});
		const created = await (await as('createToken', { name: 'bridge script' })).json();
		const token = JSON.stringify(created.data).match(/wlt_[a-z2-7]+/)![0];
		expect(await bearerWorks(token)).toBe(true);

		// The account page names the token beside the choice.
		const page = await (await fetch(`${srv.url}/account`, { headers: { cookie: master } })).text();
		expect(page).toMatch(/Also revoke my API tokens:[^<]*bridge script \(wlt_/);

		// Without the box ticked the token keeps working; the session does not.
		const second = (await signIn(srv.url, DEMO.master)).cookie!;
		await as('everywhere', {}, '/signout');
		expect(await bearerWorks(token)).toBe(true);
		const me = await fetch(`${srv.url}/api/v1/me`, { headers: { cookie: second } });
		expect(me.status).toBe(401);

		// With the box ticked, the tokens go too.
		const third = (await signIn(srv.url, DEMO.master)).cookie!;
		await fetch(`${srv.url}/signout?/everywhere`, {
			method: 'POST',
			body: new URLSearchParams({ revokeTokens: 'on' }),
			headers: {
				cookie: third,
				origin: srv.url,
				accept: 'application/json',
				'x-sveltekit-action': 'true'
			}
		});
		expect(await bearerWorks(token)).toBe(false);
	});
});
