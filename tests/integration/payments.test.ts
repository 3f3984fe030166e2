// Invoices and payments over real HTTP: the app, its local payment service (a separate process
// speaking Stripe's HTTP API), signed webhooks, the outbox and the mail catcher.
import { and, eq } from 'drizzle-orm';
import { rmSync } from 'node:fs';
import Papa from 'papaparse';
import Stripe from 'stripe';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startFakePayments } from '../../scripts/fake-payments';
import { openDb } from '../../src/lib/server/db/client';
import { cruise, invoice, payment, webhookEvent } from '../../src/lib/server/db/schema';
import { newId } from '../../src/lib/server/ids';
import {
	caughtMail,
	DEMO,
	freePort,
	signIn,
	startServer,
	waitForMail,
	type TestServer
} from '../support/server';

const SECRET = 'whsec_integration_' + newId();
const sdk = new Stripe('sk_test_unused');

interface ApiInvoice {
	id: string;
	number: string | null;
	kind: string;
	status: string;
	amountMinor: number;
	currency: string;
	outstandingMinor: number;
	paidAt: string | null;
	lines: { amountMinor: number }[];
	payments: {
		id: string;
		status: string;
		amountMinor: number;
		currency: string;
		completedAt: string | null;
		refundedMinor: number;
	}[];
}

async function until<T>(
	fn: () => Promise<T | undefined> | T | undefined,
	what: string,
	ms = 15_000
): Promise<T> {
	const deadline = Date.now() + ms;
	for (;;) {
		const v = await fn();
		if (v !== undefined && v !== false) return v as T;
		if (Date.now() > deadline) throw new Error(`Timed out waiting for ${what}`);
		await new Promise((r) => setTimeout(r, 150));
	}
}

function signed(payload: string) {
	return sdk.webhooks.generateTestHeaderString({ payload, secret: SECRET });
}

/** Fills in the hosted payment page like a browser without JavaScript. */
function payOnPage(url: string, card: string) {
	return fetch(url, {
		method: 'POST',
		redirect: 'manual',
		body: new URLSearchParams({ email: DEMO.agent, card, exp: '12/34', cvc: '123' })
	});
}

describe('invoices and payments', () => {
	let srv: TestServer;
	let cruiseId: string;
	let otherCruiseId: string;
	const cookies: Record<string, string> = {};

	const invoicesOf = async (id: string, who = 'agent'): Promise<ApiInvoice[]> => {
		const res = await fetch(`${srv.url}/api/v1/cruises/${id}/invoices`, {
			headers: { cookie: cookies[who] }
		});
		expect(res.status).toBe(200);
		return (await res.json()).invoices;
	};
	const byNumber = async (n: string, id = cruiseId, who = 'agent') =>
		(await invoicesOf(id, who)).find((i) => i.number === n)!;
	const checkout = (invoiceId: string, who: string, body?: unknown) =>
		fetch(`${srv.url}/api/v1/invoices/${invoiceId}/checkout`, {
			method: 'POST',
			headers: { cookie: cookies[who], ...(body ? { 'content-type': 'application/json' } : {}) },
			body: body ? JSON.stringify(body) : undefined
		});
	const webhook = (payload: string, signature?: string) =>
		fetch(`${srv.url}/api/v1/payments/webhook`, {
			method: 'POST',
			headers: {
				'content-type': 'application/json; charset=utf-8',
				...(signature ? { 'stripe-signature': signature } : {})
			},
			body: payload
		});
	const dbState = () => {
		const db = openDb(srv.dbPath);
		try {
			return {
				events: db.select().from(webhookEvent).all().length,
				payments: db
					.select()
					.from(payment)
					.all()
					.map((p) => `${p.id}:${p.status}:${p.refundedMinor}`)
					.sort(),
				invoices: db
					.select()
					.from(invoice)
					.all()
					.map((i) => `${i.id}:${i.status}:${i.paidAt?.getTime()}`)
					.sort()
			};
		} finally {
			db.$client.close();
		}
	};

	beforeAll(async () => {
		srv = await startServer({ STRIPE_WEBHOOK_SECRET: SECRET });
		const db = openDb(srv.dbPath);
		cruiseId = db.select().from(cruise).where(eq(cruise.code, 'MT27-03')).get()!.id;
		otherCruiseId = db.select().from(cruise).where(eq(cruise.code, 'SL27-01')).get()!.id;
		db.$client.close();
		for (const [who, email] of Object.entries({
			agent: DEMO.agent,
			admin: DEMO.admin,
			chief: DEMO.chief,
			participant: DEMO.participant
		}))
			cookies[who] = (
				await signIn(srv.url, email, DEMO.password, `10.9.0.${Object.keys(cookies).length + 1}`)
			).cookie!;
	}, 90_000);
	afterAll(async () => srv?.stop());

	it('lists the cruise invoices in the documented shape, drafts only for the marine office', async () => {
		const agentView = await invoicesOf(cruiseId);
		expect(agentView.map((i) => i.status)).not.toContain('draft');
		const ship = agentView.find((i) => i.kind === 'ship_time')!;
		expect(Object.keys(ship)).toEqual(
			expect.arrayContaining([
				'id',
				'number',
				'kind',
				'status',
				'description',
				'amountMinor',
				'currency',
				'issuedAt',
				'dueAt',
				'paidAt',
				'lines',
				'payments'
			])
		);
		expect(ship.number).toMatch(/^WL-2027-\d{4}$/);
		expect(ship.amountMinor).toBe(ship.lines.reduce((s, l) => s + l.amountMinor, 0));
		const adminView = await invoicesOf(cruiseId, 'admin');
		expect(adminView.map((i) => i.status)).toEqual(
			expect.arrayContaining(['draft', 'issued', 'partly_paid', 'paid', 'refunded', 'void'])
		);
		const paid = adminView.find((i) => i.status === 'paid')!;
		expect(paid.payments[0]).toMatchObject({ status: 'paid', currency: 'EUR' });
		const res = await fetch(`${srv.url}/api/v1/cruises/${cruiseId}/invoices`, {
			headers: { cookie: cookies.participant }
		});
		expect(res.status).toBe(403);
		expect((await res.json()).error.code).toBe('forbidden');
	});

	it("refuses a participant's and the chief scientist's checkout (403), and a paid invoice (409)", async () => {
		const ship = await byNumber('WL-2027-0002');
		for (const who of ['participant', 'chief']) {
			const res = await checkout(ship.id, who);
			expect(res.status, who).toBe(403);
			expect((await res.json()).error.code).toBe('forbidden');
		}
		const paid = await byNumber('WL-2027-0001');
		const res = await checkout(paid.id, 'agent');
		expect(res.status).toBe(409);
		expect((await byNumber('WL-2027-0002')).payments).toHaveLength(0);
	});

	it('refuses forged and missing signatures with 400 and changes nothing', async () => {
		const ship = await byNumber('WL-2027-0002');
		const before = dbState();
		const payload = JSON.stringify({
			id: 'evt_forged_1',
			object: 'event',
			type: 'checkout.session.completed',
			data: {
				object: {
					id: 'cs_forged',
					payment_status: 'paid',
					amount_total: ship.amountMinor,
					currency: 'eur',
					client_reference_id: ship.id,
					metadata: { invoiceId: ship.id },
					payment_intent: 'pi_forged'
				}
			}
		});
		const forged = sdk.webhooks.generateTestHeaderString({ payload, secret: 'whsec_not_ours' });
		for (const sig of [
			forged,
			undefined,
			't=1,v1=deadbeef',
			signed(payload.replace('eur', 'usd'))
		]) {
			const res = await webhook(payload, sig);
			expect(res.status).toBe(400);
			expect((await res.json()).error.code).toBe('bad_signature');
		}
		// A valid signature over other bytes does not verify either.
		const res = await webhook(payload + ' ', signed(payload));
		expect(res.status).toBe(400);
		expect(dbState()).toEqual(before);
	});

	it('pays through the hosted page: a declined card changes nothing, the good card pays; the webhook lands before the return', async () => {
		const ship = await byNumber('WL-2027-0002');
		const res = await checkout(ship.id, 'agent');
		expect(res.status).toBe(201);
		const { url, sessionId } = await res.json();
		expect(sessionId).toMatch(/^cs_/);
		const page = await (await fetch(url)).text();
		expect(page).toContain('Card number');
		expect(page).toContain((ship.amountMinor / 100).toFixed(2));

		const declined = await payOnPage(url, '4000 0000 0000 0002');
		expect(declined.status).toBe(402);
		expect(await declined.text()).toContain('Your card was declined');
		await new Promise((r) => setTimeout(r, 500));
		expect((await byNumber('WL-2027-0002')).status).toBe('issued');

		const ok = await payOnPage(url, '4242 4242 4242 4242');
		expect(ok.status).toBe(303);
		const back = ok.headers.get('location')!;
		expect(back).toBe(
			`${srv.url}/cruises/${cruiseId}/invoices/${ship.id}/return?session_id=${sessionId}`
		);
		// The webhook arrives first; the return then finds it recorded.
		const paid = await until(async () => {
			const i = await byNumber('WL-2027-0002');
			return i.status === 'paid' ? i : undefined;
		}, 'the webhook');
		expect(paid.payments.filter((p) => p.status === 'paid')).toHaveLength(1);
		expect(paid.payments[0].amountMinor).toBe(ship.amountMinor);
		const ret = await fetch(back, { redirect: 'manual', headers: { cookie: cookies.agent } });
		expect(ret.status).toBe(303);
		expect(ret.headers.get('location')).toBe(
			`/cruises/${cruiseId}/invoices/${ship.id}?checkout=paid`
		);
		expect((await byNumber('WL-2027-0002')).payments).toHaveLength(1);

		const receipt = await waitForMail(
			srv.mailDir,
			(m) => m.to.includes(DEMO.agent) && m.subject.includes('WL-2027-0002')
		);
		expect(receipt.subject).toMatch(/^Receipt R-/);
		await waitForMail(
			srv.mailDir,
			(m) => m.to.includes(DEMO.admin) && m.subject.includes('WL-2027-0002')
		);
		// Paying again is refused.
		expect((await checkout(ship.id, 'agent')).status).toBe(409);
	});

	it('handles the same event twice once: one payment, one receipt', async () => {
		const inv = await byNumber('WL-2027-0003');
		expect(inv.status).toBe('partly_paid');
		const res = await checkout(inv.id, 'agent');
		const { sessionId } = await res.json();
		const payload = JSON.stringify({
			id: 'evt_twice_' + newId(),
			object: 'event',
			type: 'checkout.session.completed',
			data: {
				object: {
					id: sessionId,
					object: 'checkout.session',
					payment_status: 'paid',
					amount_total: inv.outstandingMinor,
					currency: 'eur',
					client_reference_id: inv.id,
					metadata: { invoiceId: inv.id },
					payment_intent: 'pi_twice_' + newId()
				}
			}
		});
		const first = await webhook(payload, signed(payload));
		expect(first.status).toBe(200);
		expect(await first.json()).toMatchObject({ received: true, duplicate: false });
		const second = await webhook(payload, signed(payload));
		expect(second.status).toBe(200);
		expect(await second.json()).toMatchObject({ received: true, duplicate: true });
		const after = await byNumber('WL-2027-0003');
		expect(after.status).toBe('paid');
		expect(after.payments.filter((p) => p.status === 'paid')).toHaveLength(2); // the demo's part payment and this one
		expect(
			after.payments.filter((p) => p.amountMinor === inv.outstandingMinor && p.status === 'paid')
		).toHaveLength(1);
		await waitForMail(
			srv.mailDir,
			(m) => m.to.includes(DEMO.agent) && m.subject.includes('WL-2027-0003')
		);
		await new Promise((r) => setTimeout(r, 800));
		const receipts = (await caughtMail(srv.mailDir)).filter(
			(m) => m.to.includes(DEMO.agent) && m.subject.includes('WL-2027-0003')
		);
		expect(receipts).toHaveLength(1);
	});

	it('refunds a second completed session for a paid invoice and flags it; the invoice is paid once', async () => {
		const db = openDb(srv.dbPath);
		const id = newId();
		db.insert(invoice)
			.values({
				id,
				cruiseId,
				number: 'WL-2027-0900',
				kind: 'recharge',
				description: 'Extra berth-days',
				amountMinor: 12_345,
				currency: 'EUR',
				status: 'issued',
				issuedAt: new Date(),
				dueAt: new Date(Date.now() + 86_400_000),
				lines: [
					{
						description: 'Berth-day',
						quantity: '1',
						unit: '',
						unitMinor: 12_345,
						taxPct: '0',
						netMinor: 12_345,
						taxMinor: 0,
						amountMinor: 12_345
					}
				]
			})
			.run();
		db.$client.close();
		const a = await (await checkout(id, 'agent')).json();
		const b = await (await checkout(id, 'agent')).json();
		expect(a.sessionId).not.toBe(b.sessionId);
		expect((await payOnPage(a.url, '4242424242424242')).status).toBe(303);
		await until(
			async () => ((await byNumber('WL-2027-0900')).status === 'paid' ? true : undefined),
			'the first payment'
		);
		expect((await payOnPage(b.url, '4242424242424242')).status).toBe(303);
		const settled = await until(async () => {
			const i = await byNumber('WL-2027-0900');
			return i.payments.some((p) => p.status === 'refunded') ? i : undefined;
		}, 'the refund of the second payment');
		expect(settled.status).toBe('paid');
		expect(settled.payments.filter((p) => p.status === 'paid')).toHaveLength(1);
		const refunded = settled.payments.find((p) => p.status === 'refunded')!;
		expect(refunded.refundedMinor).toBe(12_345);
		await waitForMail(
			srv.mailDir,
			(m) =>
				m.to.includes(DEMO.admin) &&
				m.subject.startsWith('Payment needs a look') &&
				m.subject.includes('WL-2027-0900')
		);
		// The return page of the refunded session still does not make a second "paid".
		await fetch(`${srv.url}/cruises/${cruiseId}/invoices/${id}/return?session_id=${b.sessionId}`, {
			redirect: 'manual',
			headers: { cookie: cookies.agent }
		});
		expect(
			(await byNumber('WL-2027-0900')).payments.filter((p) => p.status === 'paid')
		).toHaveLength(1);
	});

	it('keeps zero-decimal amounts exact: JPY 52,800 charged and recorded as 52800', async () => {
		const jpy = (await invoicesOf(otherCruiseId, 'admin')).find((i) => i.currency === 'JPY')!;
		// [derived] 2 days × JPY 24,000 = 48,000; 10 % tax = 4,800; total 52,800 (no decimals in yen).
		expect(jpy.amountMinor).toBe(52_800);
		const { url } = await (await checkout(jpy.id, 'admin')).json();
		expect(await (await fetch(url)).text()).toContain('JPY 52800');
		expect((await payOnPage(url, '4242424242424242')).status).toBe(303);
		const paid = await until(async () => {
			const i = (await invoicesOf(otherCruiseId, 'admin')).find((x) => x.id === jpy.id)!;
			return i.status === 'paid' ? i : undefined;
		}, 'the JPY payment');
		expect(paid.payments[0]).toMatchObject({
			amountMinor: 52_800,
			currency: 'JPY',
			status: 'paid'
		});
	});
});

describe('receivables', () => {
	let srv: TestServer;
	beforeAll(async () => {
		srv = await startServer();
	}, 90_000);
	afterAll(async () => srv?.stop());

	it('exports open invoices as RFC 4180 CSV that a CSV reader reads back, for admins only', async () => {
		const db = openDb(srv.dbPath);
		const cId = db.select().from(cruise).where(eq(cruise.code, 'MT27-03')).get()!.id;
		const awkward = 'Berths, "leg 2"\nand =SUM(A1) in the text';
		db.insert(invoice)
			.values({
				id: newId(),
				cruiseId: cId,
				number: 'WL-2027-0901',
				kind: 'recharge',
				description: awkward,
				amountMinor: 1_000,
				currency: 'KWD',
				status: 'issued',
				issuedAt: new Date(),
				dueAt: new Date(Date.now() - 86_400_000),
				lines: []
			})
			.run();
		db.insert(invoice)
			.values({
				id: newId(),
				cruiseId: cId,
				number: 'WL-2027-0902',
				kind: 'recharge',
				description: '=HYPERLINK("x")',
				amountMinor: 1_234,
				currency: 'KWD',
				status: 'issued',
				issuedAt: new Date(),
				dueAt: new Date(Date.now() + 86_400_000),
				lines: []
			})
			.run();
		db.$client.close();
		const admin = (await signIn(srv.url, DEMO.admin, DEMO.password, '10.9.2.1')).cookie!;
		const agent = (await signIn(srv.url, DEMO.agent, DEMO.password, '10.9.2.2')).cookie!;
		const refused = await fetch(`${srv.url}/admin/receivables/receivables.csv`, {
			headers: { cookie: agent }
		});
		expect(refused.status).toBe(403);
		const res = await fetch(`${srv.url}/admin/receivables/receivables.csv`, {
			headers: { cookie: admin }
		});
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toMatch(/^text\/csv/);
		const body = await res.text();
		expect(body.endsWith('\r\n')).toBe(true);
		const parsed = Papa.parse<Record<string, string>>(body.trimEnd(), { header: true });
		expect(parsed.errors).toEqual([]);
		const rows = parsed.data;
		const one = rows.find((r) => r.number === 'WL-2027-0901')!;
		expect(one.description).toBe(awkward);
		// [published] ISO 4217: KWD has 3 decimals, so 1000 fils are 1.000 dinar.
		expect(one).toMatchObject({
			currency: 'KWD',
			amount: '1.000',
			outstanding: '1.000',
			overdue: 'yes'
		});
		const two = rows.find((r) => r.number === 'WL-2027-0902')!;
		expect(two.description).toBe(`'=HYPERLINK("x")`);
		expect(two.overdue).toBe('no');
		// Issued demo invoices in EUR and JPY are listed with what is left to pay.
		expect(rows.find((r) => r.number === 'WL-2027-0002')).toMatchObject({
			currency: 'EUR',
			status: 'issued'
		});
		expect(rows.find((r) => r.number === 'WL-2027-0005')).toMatchObject({
			currency: 'JPY',
			outstanding: '52800'
		});
		expect(rows.some((r) => r.number === 'WL-2027-0001')).toBe(false); // paid
		const page = await (
			await fetch(`${srv.url}/admin/receivables`, { headers: { cookie: admin } })
		).text();
		expect(page).toContain('KWD 2.234');
	});
});

describe('the payment service retries while the app is down', () => {
	it('delivers the completed payment once the app is back', async () => {
		const port = await freePort();
		const key = 'sk_test_retry_' + newId();
		const fake = await startFakePayments({
			port: 0,
			secretKey: key,
			webhookSecret: SECRET,
			webhookUrl: `http://127.0.0.1:${port}/api/v1/payments/webhook`,
			retryMs: 300
		});
		const env = {
			PORT: String(port),
			ORIGIN: `http://127.0.0.1:${port}`,
			STRIPE_SECRET_KEY: key,
			STRIPE_WEBHOOK_SECRET: SECRET,
			STRIPE_API_HOST: '127.0.0.1',
			STRIPE_API_PORT: String(fake.port),
			STRIPE_API_PROTOCOL: 'http'
		};
		let app = await startServer(env);
		const dbPath = app.dbPath;
		const dirs = [app.dir];
		try {
			const cookie = (await signIn(app.url, DEMO.agent, DEMO.password, '10.9.1.1')).cookie!;
			const db = openDb(dbPath);
			const cId = db.select().from(cruise).where(eq(cruise.code, 'MT27-03')).get()!.id;
			const inv = db
				.select()
				.from(invoice)
				.where(and(eq(invoice.cruiseId, cId), eq(invoice.number, 'WL-2027-0002')))
				.get()!;
			db.$client.close();
			const res = await fetch(`${app.url}/api/v1/invoices/${inv.id}/checkout`, {
				method: 'POST',
				headers: { cookie }
			});
			expect(res.status).toBe(201);
			const { url, sessionId } = await res.json();
			await app.stop({ keep: true });

			// The app is down: the payer pays, the event cannot be delivered yet.
			expect((await payOnPage(url, '4242424242424242')).status).toBe(303);
			await new Promise((r) => setTimeout(r, 1500));

			app = await startServer({ ...env, DATABASE_PATH: dbPath });
			dirs.push(app.dir);
			await until(
				() => {
					const d = openDb(dbPath);
					try {
						const p = d
							.select()
							.from(payment)
							.where(eq(payment.checkoutSessionId, sessionId))
							.get();
						return p?.status === 'paid' ? p : undefined;
					} finally {
						d.$client.close();
					}
				},
				'the retried webhook',
				30_000
			);
			const d = openDb(dbPath);
			expect(d.select().from(invoice).where(eq(invoice.id, inv.id)).get()!.status).toBe('paid');
			d.$client.close();
		} finally {
			await app.stop({ keep: true });
			fake.close();
			for (const dir of dirs) rmSync(dir, { recursive: true, force: true });
		}
	}, 120_000);
});
