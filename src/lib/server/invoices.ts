// Invoices of a cruise (DESIGN.md §4 flow 7): ship time from the timeline, port-call estimate and
// final account, science-party recharges, credit notes. Drafts are edited; issuing gives a gapless
// number per year and freezes the invoice; corrections after that are credit notes.
import { error as kitError } from '@sveltejs/kit';
import { and, asc, desc, eq, inArray, like, sql } from 'drizzle-orm';
import {
	exponentOf,
	lineAmounts,
	parseMajor,
	toMajorString,
	totalMinor,
	type LineInput
} from '../money';
import { guardText, quote } from '../engine/formats/csv';
import { operatingDays } from '../engine/timeline';
import { ApiError } from './api';
import { audit } from './audit';
import { db as appDb } from './db';
import type { Db } from './db/client';
import {
	cruise,
	invoice,
	payment,
	vessel,
	type Invoice,
	type InvoiceLine,
	type InvoiceStatus,
	type Payment
} from './db/schema';
import type { CruiseAccess } from './guards';
import { newId } from './ids';
import * as timelines from './timeline';

export const KIND_LABELS: Record<Invoice['kind'], string> = {
	ship_time: 'Ship time',
	port_call_estimate: 'Port call — estimate',
	port_call_final: 'Port call — final account',
	recharge: 'Science-party recharge'
};

export const MAX_LINES = 100;
export const NUMBER_PREFIX = 'WL';

/** Who reads a cruise's invoices: the marine office, the chief scientist and the port agent. */
export function canRead(access: CruiseAccess): boolean {
	return access.isAdmin || access.role === 'chief_scientist' || access.role === 'port_agent';
}

export function requireReader(access: CruiseAccess) {
	if (!canRead(access))
		throw new ApiError(
			403,
			'Invoices are for the marine office, the chief scientist and the port agent.'
		);
}

/** Who pays: the cruise's port agent, or the marine office. */
export function canPay(access: CruiseAccess): boolean {
	return access.isAdmin || access.role === 'port_agent';
}

// ---------------------------------------------------------------- reading

export interface InvoiceView extends Invoice {
	payments: Payment[];
	/** Net received: paid payments less what was refunded. */
	paidMinor: number;
	/** Credit notes issued against this invoice (their amounts are negative). */
	creditedMinor: number;
	/** For a final account: what was paid on its estimate. */
	estimatePaidMinor: number;
	/** What is left to pay; negative means a credit owed to the payer. */
	outstandingMinor: number;
	overdue: boolean;
}

function netPaid(ps: Payment[]): number {
	return ps
		.filter((p) => p.status === 'paid' || p.status === 'refunded')
		.reduce((s, p) => s + p.amountMinor - p.refundedMinor, 0);
}

function views(rows: Invoice[], d: Pick<Db, 'select'>, now = Date.now()): InvoiceView[] {
	if (rows.length === 0) return [];
	const ids = rows.map((r) => r.id);
	const pays = d
		.select()
		.from(payment)
		.where(inArray(payment.invoiceId, ids))
		.orderBy(asc(payment.createdAt))
		.all();
	const credits = d
		.select()
		.from(invoice)
		.where(and(inArray(invoice.correctsId, ids), eq(invoice.status, 'issued')))
		.all();
	const estimateIds = rows.map((r) => r.estimateId).filter((x): x is string => !!x);
	const estimatePays = estimateIds.length
		? d.select().from(payment).where(inArray(payment.invoiceId, estimateIds)).all()
		: [];
	return rows.map((r) => {
		const ps = pays.filter((p) => p.invoiceId === r.id);
		const paidMinor = netPaid(ps);
		const creditedMinor = totalMinor(credits.filter((c) => c.correctsId === r.id));
		const estimatePaidMinor = r.estimateId
			? netPaid(estimatePays.filter((p) => p.invoiceId === r.estimateId))
			: 0;
		const open = r.status === 'issued' || r.status === 'partly_paid';
		const outstandingMinor =
			open && !r.isCreditNote ? r.amountMinor + creditedMinor - estimatePaidMinor - paidMinor : 0;
		return {
			...r,
			payments: ps,
			paidMinor,
			creditedMinor,
			estimatePaidMinor,
			outstandingMinor,
			overdue: outstandingMinor > 0 && !!r.dueAt && r.dueAt.getTime() < now
		};
	});
}

export function list(cruiseId: string, d: Pick<Db, 'select'> = appDb): InvoiceView[] {
	const rows = d
		.select()
		.from(invoice)
		.where(eq(invoice.cruiseId, cruiseId))
		.orderBy(asc(invoice.createdAt), asc(invoice.number))
		.all();
	return views(rows, d);
}

export function get(
	cruiseId: string,
	invoiceId: string,
	d: Pick<Db, 'select'> = appDb
): InvoiceView {
	const row = d
		.select()
		.from(invoice)
		.where(and(eq(invoice.id, invoiceId), eq(invoice.cruiseId, cruiseId)))
		.get();
	if (!row) throw new ApiError(404, 'No such invoice on this cruise.');
	return views([row], d)[0];
}

export function byId(invoiceId: string, d: Pick<Db, 'select'> = appDb): Invoice | undefined {
	return d.select().from(invoice).where(eq(invoice.id, invoiceId)).get();
}

/** Every open (issued or partly paid) invoice across cruises, for the marine office. */
export function receivables(now = Date.now(), d: Pick<Db, 'select'> = appDb) {
	const rows = d
		.select()
		.from(invoice)
		.where(inArray(invoice.status, ['issued', 'partly_paid']))
		.orderBy(asc(invoice.dueAt), asc(invoice.number))
		.all()
		.filter((r) => !r.isCreditNote);
	const codes = new Map(
		d
			.select({ id: cruise.id, code: cruise.code })
			.from(cruise)
			.all()
			.map((c) => [c.id, c.code])
	);
	const open = views(rows, d, now)
		.filter((v) => v.outstandingMinor !== 0)
		.map((v) => ({ ...v, cruiseCode: codes.get(v.cruiseId) ?? '' }));
	const totals = new Map<
		string,
		{ outstandingMinor: number; overdueMinor: number; count: number }
	>();
	for (const v of open) {
		const t = totals.get(v.currency) ?? { outstandingMinor: 0, overdueMinor: 0, count: 0 };
		t.outstandingMinor += v.outstandingMinor;
		if (v.overdue) t.overdueMinor += v.outstandingMinor;
		t.count++;
		totals.set(v.currency, t);
	}
	const flagged = d
		.select({ payment, number: invoice.number, cruiseId: invoice.cruiseId })
		.from(payment)
		.innerJoin(invoice, eq(invoice.id, payment.invoiceId))
		.where(sql`${payment.flag} is not null`)
		.orderBy(desc(payment.createdAt))
		.all();
	return {
		open,
		totals: [...totals.entries()]
			.sort(([a], [b]) => a.localeCompare(b))
			.map(([currency, t]) => ({ currency, ...t })),
		flagged: flagged.map((f) => ({ ...f, cruiseCode: codes.get(f.cruiseId) ?? '' }))
	};
}

/** The API shape (issue 10). Times as ISO 8601 UTC. */
export function toApi(v: InvoiceView) {
	const iso = (d: Date | null) => (d ? d.toISOString() : null);
	return {
		id: v.id,
		number: v.number,
		kind: v.kind,
		status: v.status,
		description: v.description,
		amountMinor: v.amountMinor,
		currency: v.currency,
		issuedAt: iso(v.issuedAt),
		dueAt: iso(v.dueAt),
		paidAt: iso(v.paidAt),
		outstandingMinor: v.outstandingMinor,
		isCreditNote: v.isCreditNote,
		correctsId: v.correctsId,
		estimateId: v.estimateId,
		lines: v.lines.map((l) => ({
			...l,
			start: l.start !== undefined ? new Date(l.start).toISOString() : undefined,
			end: l.end !== undefined ? new Date(l.end).toISOString() : undefined
		})),
		payments: v.payments.map((p) => ({
			id: p.id,
			status: p.status,
			amountMinor: p.amountMinor,
			currency: p.currency,
			completedAt: iso(p.completedAt),
			refundedMinor: p.refundedMinor
		}))
	};
}

// ---------------------------------------------------------------- drafting

export interface DraftInput {
	kind: Invoice['kind'];
	description: string;
	currency: string;
	billTo: string;
	lines: (LineInput & { unit?: string; institution?: string; estimateMinor?: number })[];
}

export function priceLines(currency: string, lines: DraftInput['lines']): InvoiceLine[] {
	exponentOf(currency);
	if (lines.length > MAX_LINES) throw new ApiError(422, `At most ${MAX_LINES} lines per invoice.`);
	return lines.map((l, i) => {
		try {
			return {
				description: l.description,
				quantity: l.quantity,
				unit: l.unit ?? '',
				unitMinor: l.unitMinor,
				taxPct: l.taxPct,
				...lineAmounts(l),
				...(l.institution ? { institution: l.institution } : {}),
				...(l.estimateMinor !== undefined ? { estimateMinor: l.estimateMinor } : {})
			};
		} catch (e) {
			throw new ApiError(422, `Line ${i + 1}: ${(e as Error).message}`, 'invalid', [
				{ field: `lines.${i}`, message: (e as Error).message }
			]);
		}
	});
}

export function createDraft(
	actorId: string,
	cruiseId: string,
	input: DraftInput,
	d: Db = appDb
): string {
	const currency = input.currency.toUpperCase();
	let lines: InvoiceLine[];
	try {
		lines = priceLines(currency, input.lines);
	} catch (e) {
		if (e instanceof RangeError) throw new ApiError(422, e.message);
		throw e;
	}
	const id = newId();
	d.transaction((tx) => {
		tx.insert(invoice)
			.values({
				id,
				cruiseId,
				kind: input.kind,
				description: input.description,
				currency,
				billTo: input.billTo,
				lines,
				amountMinor: totalMinor(lines),
				createdById: actorId
			})
			.run();
		audit(tx, {
			userId: actorId,
			cruiseId,
			action: 'invoice.draft',
			detail: { id, kind: input.kind }
		});
	});
	return id;
}

function draftOf(cruiseId: string, invoiceId: string, d: Pick<Db, 'select'>): Invoice {
	const row = d
		.select()
		.from(invoice)
		.where(and(eq(invoice.id, invoiceId), eq(invoice.cruiseId, cruiseId)))
		.get();
	if (!row) throw new ApiError(404, 'No such invoice on this cruise.');
	if (row.status !== 'draft')
		throw new ApiError(
			409,
			`Invoice ${row.number} is issued and cannot change; issue a credit note.`
		);
	return row;
}

export function updateDraft(
	actorId: string,
	cruiseId: string,
	invoiceId: string,
	input: Omit<DraftInput, 'kind'>,
	d: Db = appDb
) {
	const row = draftOf(cruiseId, invoiceId, d);
	const currency = input.currency.toUpperCase();
	const lines = priceLines(currency, input.lines);
	d.update(invoice)
		.set({
			description: input.description,
			billTo: input.billTo,
			currency,
			lines,
			amountMinor: totalMinor(lines)
		})
		.where(eq(invoice.id, row.id))
		.run();
}

/** Ship-time lines from the cruise timeline: one per leg, operating days × the vessel's day rate. */
export function shipTimeLines(cruiseId: string, d: Pick<Db, 'select'> = appDb) {
	const built = timelines.build(cruiseId, d);
	if (!built.timeline)
		throw new ApiError(
			409,
			`The timeline cannot be built yet: ${built.data.missing.join('; ') || 'nothing planned'}.`
		);
	const v = built.data.cruise.vesselId
		? d.select().from(vessel).where(eq(vessel.id, built.data.cruise.vesselId)).get()
		: undefined;
	if (!v) throw new ApiError(409, 'The cruise has no vessel, so there is no day rate.');
	const legs = timelines.legSpans(built.timeline, built.data);
	const currency = v.currency.toUpperCase();
	const lines: InvoiceLine[] = legs.map((l) => {
		const days = operatingDays(l.start, l.end);
		return {
			description: `Leg ${l.seq}: ${l.from} → ${l.to}`,
			quantity: String(days),
			unit: 'operating day',
			unitMinor: v.dayRateMinor,
			taxPct: '0',
			...lineAmounts({ quantity: String(days), unitMinor: v.dayRateMinor, taxPct: '0' }),
			legSeq: l.seq,
			start: l.start,
			end: l.end
		};
	});
	return { lines, currency, vessel: v };
}

export function createShipTime(actorId: string, cruiseId: string, d: Db = appDb): string {
	const { lines, currency, vessel: v } = shipTimeLines(cruiseId, d);
	const c = d.select().from(cruise).where(eq(cruise.id, cruiseId)).get()!;
	const id = newId();
	d.transaction((tx) => {
		tx.insert(invoice)
			.values({
				id,
				cruiseId,
				kind: 'ship_time',
				description: `Ship time, ${c.code} — ${v.name}`,
				currency,
				lines,
				amountMinor: totalMinor(lines),
				createdById: actorId
			})
			.run();
		audit(tx, {
			userId: actorId,
			cruiseId,
			action: 'invoice.draft',
			detail: { id, kind: 'ship_time' }
		});
	});
	return id;
}

/** A ship-time draft follows the timeline again (after the plan changed). */
export function regenerateShipTime(
	actorId: string,
	cruiseId: string,
	invoiceId: string,
	d: Db = appDb
) {
	const row = draftOf(cruiseId, invoiceId, d);
	if (row.kind !== 'ship_time')
		throw new ApiError(409, 'Only ship-time drafts follow the timeline.');
	const { lines, currency } = shipTimeLines(cruiseId, d);
	d.update(invoice)
		.set({ lines, currency, amountMinor: totalMinor(lines) })
		.where(eq(invoice.id, row.id))
		.run();
}

/** A final-account draft starting from the estimate's lines, each remembering its estimate. */
export function createFinalAccount(
	actorId: string,
	cruiseId: string,
	estimateId: string,
	d: Db = appDb
) {
	const est = get(cruiseId, estimateId, d);
	if (est.kind !== 'port_call_estimate' || est.status === 'draft' || est.status === 'void')
		throw new ApiError(409, 'A final account follows an issued port-call estimate.');
	const id = newId();
	d.insert(invoice)
		.values({
			id,
			cruiseId,
			kind: 'port_call_final',
			description: est.description.replace(/estimate/i, 'final account'),
			currency: est.currency,
			billTo: est.billTo,
			estimateId: est.id,
			lines: est.lines.map((l) => ({ ...l, estimateMinor: l.amountMinor })),
			amountMinor: est.amountMinor,
			createdById: actorId
		})
		.run();
	return id;
}

/** The next gapless number of the year, inside the issuing transaction. */
export function nextNumber(tx: Pick<Db, 'select'>, year: number): string {
	const prefix = `${NUMBER_PREFIX}-${year}-`;
	const last = tx
		.select({ n: sql<string | null>`max(${invoice.number})` })
		.from(invoice)
		.where(like(invoice.number, `${prefix}%`))
		.get()?.n;
	const seq = last ? Number(last.slice(prefix.length)) + 1 : 1;
	return `${prefix}${String(seq).padStart(4, '0')}`;
}

export function issue(
	actorId: string,
	cruiseId: string,
	invoiceId: string,
	dueInDays: number,
	d: Db = appDb,
	now = new Date()
): string {
	return d.transaction((tx) => {
		const row = draftOf(cruiseId, invoiceId, tx);
		if (row.lines.length === 0) throw new ApiError(422, 'An invoice needs at least one line.');
		const number = nextNumber(tx, now.getUTCFullYear());
		tx.update(invoice)
			.set({
				number,
				status: 'issued',
				issuedAt: now,
				dueAt: new Date(now.getTime() + dueInDays * 86_400_000)
			})
			.where(eq(invoice.id, row.id))
			.run();
		audit(tx, {
			userId: actorId,
			cruiseId,
			action: 'invoice.issue',
			detail: { id: row.id, number }
		});
		return number;
	});
}

export function voidDraft(actorId: string, cruiseId: string, invoiceId: string, d: Db = appDb) {
	const row = draftOf(cruiseId, invoiceId, d);
	d.transaction((tx) => {
		tx.update(invoice)
			.set({ status: 'void', voidedAt: new Date() })
			.where(eq(invoice.id, row.id))
			.run();
		audit(tx, { userId: actorId, cruiseId, action: 'invoice.void', detail: { id: row.id } });
	});
}

/**
 * A credit note against an issued invoice, issued at once with its own number: the given lines
 * with their signs turned (so a credit of EUR 100 is typed as 100).
 */
export function creditNote(
	actorId: string,
	cruiseId: string,
	invoiceId: string,
	input: { description: string; lines: DraftInput['lines'] },
	d: Db = appDb,
	now = new Date()
): string {
	const orig = get(cruiseId, invoiceId, d);
	if (orig.status === 'draft' || orig.status === 'void' || orig.isCreditNote)
		throw new ApiError(409, 'Credit notes correct issued invoices; edit or void a draft instead.');
	const lines = priceLines(
		orig.currency,
		input.lines.map((l) => ({ ...l, unitMinor: -Math.abs(l.unitMinor) }))
	);
	const credit = -totalMinor(lines);
	if (credit > orig.amountMinor + orig.creditedMinor)
		throw new ApiError(422, 'The credit is larger than what remains of the invoice.');
	const id = newId();
	d.transaction((tx) => {
		tx.insert(invoice)
			.values({
				id,
				cruiseId,
				kind: orig.kind,
				description: input.description,
				currency: orig.currency,
				billTo: orig.billTo,
				lines,
				amountMinor: totalMinor(lines),
				isCreditNote: true,
				correctsId: orig.id,
				status: 'issued',
				number: nextNumber(tx, now.getUTCFullYear()),
				issuedAt: now,
				createdById: actorId
			})
			.run();
		settle(tx, orig.id, now);
		audit(tx, {
			userId: actorId,
			cruiseId,
			action: 'invoice.credit',
			detail: { id, corrects: orig.id }
		});
	});
	return id;
}

/**
 * Sets an invoice's status from what was received: paid, partly paid, refunded (all money back),
 * or still issued. Returns the status before and after.
 */
export function settle(
	tx: Db | Parameters<Parameters<Db['transaction']>[0]>[0],
	invoiceId: string,
	now = new Date()
) {
	const row = tx.select().from(invoice).where(eq(invoice.id, invoiceId)).get();
	if (!row || row.status === 'draft' || row.status === 'void' || row.isCreditNote)
		return { before: row?.status, after: row?.status };
	const v = views([{ ...row, status: 'issued' }], tx)[0];
	const due = v.amountMinor + v.creditedMinor - v.estimatePaidMinor;
	const refundedAny = v.payments.some((p) => p.refundedMinor > 0);
	let status: InvoiceStatus;
	if (v.paidMinor > 0 && v.paidMinor >= due) status = 'paid';
	else if (v.paidMinor > 0) status = 'partly_paid';
	else if (refundedAny) status = 'refunded';
	else status = 'issued';
	if (status !== row.status)
		tx.update(invoice)
			.set({ status, paidAt: status === 'paid' ? (row.paidAt ?? now) : null })
			.where(eq(invoice.id, invoiceId))
			.run();
	return { before: row.status, after: status };
}

export function newAttemptId(): string {
	return newId();
}

/** Form lines (prices typed in major units) → priced input; per-line errors name the field. */
export function fromForm(
	currency: string,
	lines: {
		description: string;
		quantity: string;
		unit: string;
		unitPrice: string;
		taxPct: string;
		institution: string;
	}[]
): { lines: DraftInput['lines']; errors: { path: string; message: string }[] } {
	const errors: { path: string; message: string }[] = [];
	const out = lines.map((l, i) => {
		const unitMinor = parseMajor(l.unitPrice.replace(',', '.'), currency);
		if (unitMinor === null)
			errors.push({
				path: `lines[${i}].unitPrice`,
				message: `${currency} has ${exponentOf(currency)} decimals; ${l.unitPrice} has more.`
			});
		return {
			description: l.description,
			quantity: l.quantity,
			unit: l.unit,
			unitMinor: unitMinor ?? 0,
			taxPct: l.taxPct,
			institution: l.institution || undefined
		};
	});
	return { lines: out, errors };
}

/** For pages: the invoice as its reader may see it (drafts only for the marine office). */
export function forReader(access: CruiseAccess, invoiceId: string): InvoiceView {
	if (!canRead(access))
		kitError(403, 'Invoices are for the marine office, the chief scientist and the port agent.');
	const row = byId(invoiceId);
	if (!row || row.cruiseId !== access.cruise.id) kitError(404, 'No such invoice on this cruise.');
	const v = views([row], appDb)[0];
	if (!access.isAdmin && (v.status === 'draft' || v.status === 'void'))
		kitError(404, 'No such invoice on this cruise.');
	return v;
}

/** Open invoices as CSV (RFC 4180: CRLF line ends, a header row); amounts in major units. */
export function receivablesCsv(now = Date.now()): string {
	const { open } = receivables(now);
	// Text cells are guarded against spreadsheet formulas; amounts stay plain numbers.
	const text = (v: string | null) => guardText(v ?? '');
	const rows: string[][] = [
		[
			'cruise',
			'number',
			'kind',
			'description',
			'currency',
			'amount',
			'outstanding',
			'issued',
			'due',
			'overdue',
			'status'
		]
	];
	for (const v of open)
		rows.push([
			text(v.cruiseCode),
			text(v.number),
			v.kind,
			text(v.description),
			v.currency,
			toMajorString(v.amountMinor, v.currency),
			toMajorString(v.outstandingMinor, v.currency),
			v.issuedAt?.toISOString().slice(0, 10) ?? '',
			v.dueAt?.toISOString().slice(0, 10) ?? '',
			v.overdue ? 'yes' : 'no',
			v.status
		]);
	return rows.map((r) => r.map(quote).join(',')).join('\r\n') + '\r\n';
}
