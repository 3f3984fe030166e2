// The marine office drafts, issues, voids and corrects invoices through the real forms.
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDb } from '../../src/lib/server/db/client';
import { cruise, vessel } from '../../src/lib/server/db/schema';
import { DEMO, formPost, signIn, startServer, type TestServer } from '../support/server';

interface ApiInvoice {
	id: string;
	number: string | null;
	kind: string;
	status: string;
	amountMinor: number;
	outstandingMinor: number;
	isCreditNote: boolean;
	correctsId: string | null;
	lines: {
		quantity: string;
		unitMinor: number;
		amountMinor: number;
		legSeq?: number;
		start?: string;
		end?: string;
	}[];
}

describe('drafting and issuing invoices', () => {
	let srv: TestServer;
	let cruiseId: string;
	let dayRate: number;
	let sailing: number;
	let admin: string;
	let agent: string;
	const year = new Date().getUTCFullYear();

	const list = async (cookie: string): Promise<ApiInvoice[]> =>
		(
			await (
				await fetch(`${srv.url}/api/v1/cruises/${cruiseId}/invoices`, { headers: { cookie } })
			).json()
		).invoices;
	const one = async (id: string) => (await list(admin)).find((i) => i.id === id)!;
	const act = (path: string, fields: Record<string, string>, cookie = admin) =>
		formPost(srv.url, `/cruises/${cruiseId}/invoices${path}`, fields, { cookie });
	const draftShipTime = async () => {
		const res = await act('?/shipTime', {});
		expect(res.status).toBe(303);
		return res.headers.get('location')!.split('/').pop()!;
	};

	beforeAll(async () => {
		srv = await startServer();
		const db = openDb(srv.dbPath);
		const c = db.select().from(cruise).where(eq(cruise.code, 'MT27-03')).get()!;
		cruiseId = c.id;
		sailing = c.departureAt!.getTime();
		dayRate = db.select().from(vessel).where(eq(vessel.id, c.vesselId!)).get()!.dayRateMinor;
		db.$client.close();
		admin = (await signIn(srv.url, DEMO.admin, DEMO.password, '10.9.3.1')).cookie!;
		agent = (await signIn(srv.url, DEMO.agent, DEMO.password, '10.9.3.2')).cookie!;
	}, 90_000);
	afterAll(async () => srv?.stop());

	it('drafts ship time from the timeline: one line per leg, operating days × the day rate', async () => {
		const id = await draftShipTime();
		const inv = await one(id);
		expect(inv).toMatchObject({ kind: 'ship_time', status: 'draft', number: null });
		expect(inv.lines.length).toBeGreaterThanOrEqual(2);
		inv.lines.forEach((l, i) => {
			expect(l.legSeq).toBe(i + 1);
			expect(l.unitMinor).toBe(dayRate);
			// Operating days: calendar days, whole or part, between the leg's start and end (UTC).
			const start = Date.parse(l.start!);
			const end = Date.parse(l.end!);
			const days = Math.ceil(end / 86_400_000) - Math.floor(start / 86_400_000);
			expect(Number(l.quantity)).toBe(days);
			expect(l.amountMinor).toBe(days * dayRate);
		});
		expect(inv.amountMinor).toBe(inv.lines.reduce((s, l) => s + l.amountMinor, 0));
		// The first leg starts when the cruise sails.
		expect(Date.parse(inv.lines[0].start!)).toBe(sailing);
		// The port agent does not see drafts.
		expect((await list(agent)).some((i) => i.id === id)).toBe(false);
		expect((await act(`/${id}?/issue`, { dueInDays: '30' }, agent)).status).toBe(403);
	});

	it('numbers issued invoices without gaps; a voided draft takes no number; issued ones do not change', async () => {
		const first = await draftShipTime();
		expect((await act(`/${first}?/issue`, { dueInDays: '30' })).status).toBe(200);
		const issued = await one(first);
		expect(issued.status).toBe('issued');
		const n = Number(issued.number!.slice(-4));
		expect(issued.number).toMatch(new RegExp(`^WL-${year}-\\d{4}$`));

		const voided = await draftShipTime();
		expect((await act(`/${voided}?/void`, {})).status).toBe(200);
		expect((await one(voided)).status).toBe('void');
		expect((await one(voided)).number).toBeNull();

		const second = await draftShipTime();
		expect((await act(`/${second}?/issue`, { dueInDays: '14' })).status).toBe(200);
		expect((await one(second)).number).toBe(`WL-${year}-${String(n + 1).padStart(4, '0')}`);

		// Issued: no second issue, no void, no regeneration.
		expect((await act(`/${first}?/issue`, { dueInDays: '30' })).status).toBe(409);
		expect((await act(`/${first}?/void`, {})).status).toBe(409);
		expect((await act(`/${first}?/regenerate`, {})).status).toBe(409);
		expect((await one(first)).amountMinor).toBe(issued.amountMinor);

		// Corrections are credit notes with the next number; the invoice owes that much less.
		const credit = await act(`/${first}?/credit`, {
			description: 'Half a day less at sea',
			amount: '19250.00'
		});
		expect(credit.status).toBe(303);
		const noteId = credit.headers.get('location')!.split('/').pop()!;
		const note = await one(noteId);
		expect(note).toMatchObject({
			isCreditNote: true,
			correctsId: first,
			amountMinor: -1_925_000,
			status: 'issued'
		});
		expect(note.number).toBe(`WL-${year}-${String(n + 2).padStart(4, '0')}`);
		expect((await one(first)).outstandingMinor).toBe(issued.amountMinor - 1_925_000);
		// A credit larger than what is left is refused and changes nothing.
		const tooMuch = await act(`/${first}?/credit`, {
			description: 'Everything',
			amount: '99999999.00'
		});
		expect(tooMuch.status).toBe(400);
		expect((await list(admin)).filter((i) => i.correctsId === first)).toHaveLength(1);
	});
});
