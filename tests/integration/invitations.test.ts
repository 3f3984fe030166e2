import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDb, type Db } from '../../src/lib/server/db/client';
import { cruise, cruiseMember, invitation, user } from '../../src/lib/server/db/schema';
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
let chief: string;
let participant: string;
let admin: string;

beforeAll(async () => {
	srv = await startServer();
	db = openDb(srv.dbPath);
	cruiseId = db.select().from(cruise).where(eq(cruise.code, 'MT27-03')).get()!.id;
	chief = (await signIn(srv.url, DEMO.chief)).cookie!;
	participant = (await signIn(srv.url, DEMO.participant)).cookie!;
	admin = (await signIn(srv.url, DEMO.admin)).cookie!;
});
afterAll(async () => {
	db?.$client.close();
	await srv?.stop();
});

const post = (path: string, cookie: string, fields: Record<string, string>) =>
	fetch(srv.url + path, {
		method: 'POST',
		body: new URLSearchParams(fields),
		redirect: 'manual',
		headers: { cookie, origin: srv.url, accept: 'application/json', 'x-sveltekit-action': 'true' }
	});

describe('invitations to a cruise', () => {
	it('a chief scientist invites a new person, who accepts by the e-mailed link and joins with the role', async () => {
		const email = 'new.hydrographer@example.org';
		const res = await post(`/cruises/${cruiseId}/members?/invite`, chief, {
			email,
			role: 'master'
		});
		expect(res.status).toBe(200);
		const mail = await waitForMail(srv.mailDir, (m) => m.to.includes(email));
		expect(mail.subject).toBe('Invitation to cruise MT27-03 as master');
		const token = mail.text.match(/\/invite\/(\w+)/)![1];

		const accept = await formPost(srv.url, `/invite/${token}`, {
			name: 'Nia Hydro',
			password: 'long-enough-pw',
			confirm: 'long-enough-pw'
		});
		expect(accept.status).toBe(303);
		const u = db.select().from(user).where(eq(user.email, email)).get()!;
		const m = db
			.select()
			.from(cruiseMember)
			.where(and(eq(cruiseMember.cruiseId, cruiseId), eq(cruiseMember.userId, u.id)))
			.get();
		expect(m?.role).toBe('master');

		const reuse = await formPost(srv.url, `/invite/${token}`, {
			name: 'Someone Else',
			password: 'other-long-pw',
			confirm: 'other-long-pw'
		});
		expect(reuse.status).toBe(400);
		expect(db.select().from(user).where(eq(user.email, email)).get()!.name).toBe('Nia Hydro');
	});

	it('a duplicate invitation is refused with a clear message and creates nothing', async () => {
		const email = 'twice@example.org';
		expect(
			(await post(`/cruises/${cruiseId}/members?/invite`, chief, { email, role: 'participant' }))
				.status
		).toBe(200);
		const before = db.select().from(invitation).all().length;
		const again = await post(`/cruises/${cruiseId}/members?/invite`, chief, {
			email,
			role: 'participant'
		});
		const body = await again.json();
		expect(body.type).toBe('failure');
		expect(again.status === 409 || body.status === 409).toBe(true);
		expect(JSON.stringify(body.data)).toContain('already has an open invitation');
		expect(db.select().from(invitation).all().length).toBe(before);
	});

	it('inviting someone already on the cruise is refused', async () => {
		const res = await post(`/cruises/${cruiseId}/members?/invite`, chief, {
			email: DEMO.agent,
			role: 'participant'
		});
		const body = await res.json();
		expect(body.type).toBe('failure');
		expect(JSON.stringify(body.data)).toContain('already on this cruise as port agent');
	});

	it("a participant trying the chief scientist's invite is refused and nothing changes", async () => {
		const before = db.select().from(invitation).all().length;
		const res = await post(`/cruises/${cruiseId}/members?/invite`, participant, {
			email: 'sneaky@example.org',
			role: 'chief_scientist'
		});
		expect(res.status).toBe(403);
		expect(db.select().from(invitation).all().length).toBe(before);
	});

	it('the last chief scientist cannot be demoted', async () => {
		const chiefId = db.select().from(user).where(eq(user.email, DEMO.chief)).get()!.id;
		const res = await post(`/cruises/${cruiseId}/members?/role`, chief, {
			userId: chiefId,
			role: 'participant'
		});
		const body = await res.json();
		expect(body.type).toBe('failure');
		expect(JSON.stringify(body.data)).toContain('at least one chief scientist');
	});
});

describe('site invitations', () => {
	it('an admin invites to the site; a duplicate or an existing account is refused', async () => {
		const ok = await post('/admin/users?/invite', admin, {
			email: 'office.two@example.org',
			role: 'member'
		});
		expect((await ok.json()).type).toBe('success');
		const dup = await post('/admin/users?/invite', admin, {
			email: 'office.two@example.org',
			role: 'member'
		});
		expect(JSON.stringify(await dup.json())).toContain('already has an open invitation');
		const existing = await post('/admin/users?/invite', admin, {
			email: DEMO.chief,
			role: 'member'
		});
		expect(JSON.stringify(await existing.json())).toContain('already has an account');
	});

	it('a member cannot invite to the site', async () => {
		const res = await post('/admin/users?/invite', chief, {
			email: 'x@example.org',
			role: 'admin'
		});
		expect(res.status).toBe(403);
	});
});
