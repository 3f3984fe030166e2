// Paying an invoice: a Checkout Session for the outstanding amount, and recording what the payment
// service reports (by webhook or on the payer's return), idempotent by session. A second completed
// payment for an invoice that is already paid is refunded at once and flagged to the marine office.
import { and, eq } from 'drizzle-orm';
import type Stripe from 'stripe';
import { formatMoney } from '../../money';
import { ApiError } from '../api';
import { audit } from '../audit';
import { config } from '../config';
import { db as appDb } from '../db';
import type { Db } from '../db/client';
import { cruise, invoice, payment, user, type Invoice, type Payment } from '../db/schema';
import type { CruiseAccess } from '../guards';
import { newId } from '../ids';
import * as invoices from '../invoices';
import * as outbox from '../mail/outbox';
import * as templates from '../mail/templates';
import { stripe } from './client';

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

export function invoiceUrl(inv: Pick<Invoice, 'id' | 'cruiseId'>): string {
	return `${config.origin}/cruises/${inv.cruiseId}/invoices/${inv.id}`;
}

/**
 * Creates a Checkout Session for what is left to pay. `attemptId` names one attempt: the same
 * attempt sent twice (a double click, a retried request) reuses the idempotency key and so gets
 * the same session back.
 */
export async function startCheckout(
	access: CruiseAccess,
	invoiceId: string,
	attemptId: string = newId()
): Promise<{ url: string; sessionId: string }> {
	if (!invoices.canPay(access))
		throw new ApiError(
			403,
			'Only the port agent of this cruise or the marine office pays invoices.'
		);
	const inv = invoices.get(access.cruise.id, invoiceId);
	if (inv.status === 'paid')
		throw new ApiError(409, `Invoice ${inv.number} is already paid.`, 'already_paid');
	if (inv.isCreditNote) throw new ApiError(409, 'A credit note is not paid.');
	if (inv.status !== 'issued' && inv.status !== 'partly_paid')
		throw new ApiError(409, `Only issued invoices are paid (this one is ${inv.status}).`);
	if (inv.outstandingMinor <= 0)
		throw new ApiError(409, 'Nothing is left to pay on this invoice.', 'already_paid');
	const existing = appDb.select().from(payment).where(eq(payment.id, attemptId)).get();
	if (existing && existing.invoiceId !== inv.id)
		throw new ApiError(409, 'That attempt belongs to another invoice.');

	const back = invoiceUrl(inv);
	const session = await stripe().checkout.sessions.create(
		{
			mode: 'payment',
			line_items: [
				{
					quantity: 1,
					price_data: {
						currency: inv.currency.toLowerCase(),
						unit_amount: inv.outstandingMinor,
						product_data: { name: `Invoice ${inv.number} — ${inv.description}`.slice(0, 250) }
					}
				}
			],
			client_reference_id: inv.id,
			metadata: { invoiceId: inv.id, attemptId },
			payment_intent_data: { metadata: { invoiceId: inv.id, attemptId } },
			customer_email: access.user.email,
			success_url: `${back}/return?session_id={CHECKOUT_SESSION_ID}`,
			cancel_url: `${back}?checkout=cancelled`
		},
		{ idempotencyKey: `checkout-${inv.id}-${attemptId}` }
	);
	if (!session.url) throw new ApiError(502, 'The payment service gave no checkout page.');
	appDb
		.insert(payment)
		.values({
			id: attemptId,
			invoiceId: inv.id,
			checkoutSessionId: session.id,
			amountMinor: inv.outstandingMinor,
			currency: inv.currency,
			paidById: access.user.id,
			payerEmail: access.user.email
		})
		.onConflictDoNothing()
		.run();
	return { url: session.url, sessionId: session.id };
}

export interface CompletedSession {
	id: string;
	payment_status: string;
	amount_total: number | null;
	currency: string | null;
	client_reference_id: string | null;
	metadata: Record<string, string> | null;
	payment_intent: string | { id: string } | null;
	customer_details?: { email?: string | null } | null;
}

export type Outcome =
	| { kind: 'ignored'; reason: string }
	| { kind: 'recorded'; paymentId: string; invoiceId: string }
	| { kind: 'duplicate'; paymentId: string; invoiceId: string; paymentIntentId: string | null };

/**
 * Records a completed, paid session. Idempotent by session id: the second report of the same
 * session (webhook after return, or a redelivered event) changes nothing.
 */
export function recordCompleted(tx: Tx, s: CompletedSession, now = new Date()): Outcome {
	if (s.payment_status !== 'paid')
		return { kind: 'ignored', reason: `payment_status ${s.payment_status}` };
	const invoiceId = s.metadata?.invoiceId ?? s.client_reference_id;
	if (!invoiceId) return { kind: 'ignored', reason: 'no invoice named' };
	const inv = tx.select().from(invoice).where(eq(invoice.id, invoiceId)).get();
	if (!inv) return { kind: 'ignored', reason: `unknown invoice ${invoiceId}` };
	const pi =
		typeof s.payment_intent === 'string' ? s.payment_intent : (s.payment_intent?.id ?? null);
	let row = tx.select().from(payment).where(eq(payment.checkoutSessionId, s.id)).get();
	if (row && (row.status === 'paid' || row.status === 'refunded'))
		return { kind: 'ignored', reason: 'session already recorded' };
	const amount = s.amount_total ?? row?.amountMinor ?? 0;
	const currency = (s.currency ?? inv.currency).toUpperCase();
	const before = invoices.get(inv.cruiseId, inv.id, tx);
	// Already paid in full before this money arrived: it is a second payment.
	const duplicate = before.status === 'paid' || before.outstandingMinor <= 0;
	if (!row) {
		row = {
			id: newId(),
			invoiceId: inv.id,
			checkoutSessionId: s.id,
			status: 'open',
			amountMinor: amount,
			currency,
			paidById: null,
			createdAt: now,
			completedAt: null,
			paymentIntentId: null,
			payerEmail: s.customer_details?.email ?? null,
			refundId: null,
			refundedAt: null,
			refundedMinor: 0,
			flag: null
		} satisfies Payment;
		tx.insert(payment).values(row).run();
	}
	tx.update(payment)
		.set({
			status: 'paid',
			amountMinor: amount,
			currency,
			completedAt: now,
			paymentIntentId: pi,
			payerEmail: row.payerEmail ?? s.customer_details?.email ?? null,
			flag: duplicate
				? `Second payment for ${inv.number}, which was already paid: refunding it in full.`
				: null
		})
		.where(eq(payment.id, row.id))
		.run();
	if (duplicate) {
		audit(tx, {
			cruiseId: inv.cruiseId,
			action: 'payment.duplicate',
			detail: { paymentId: row.id, session: s.id }
		});
		notifyAdmins(
			tx,
			inv,
			`A second payment of ${formatMoney(amount, currency)} arrived for invoice ${inv.number}, which was already paid. Wakeline is refunding it in full; the refund shows on the receivables page.`
		);
		return { kind: 'duplicate', paymentId: row.id, invoiceId: inv.id, paymentIntentId: pi };
	}
	const { after } = invoices.settle(tx, inv.id, now);
	audit(tx, {
		cruiseId: inv.cruiseId,
		action: 'payment.paid',
		detail: { paymentId: row.id, session: s.id, status: after }
	});
	sendReceipt(tx, inv.id, row.id);
	return { kind: 'recorded', paymentId: row.id, invoiceId: inv.id };
}

/** After the transaction: give a second payment back through the payment service. */
export async function refundDuplicate(outcome: Outcome) {
	if (outcome.kind !== 'duplicate') return;
	try {
		if (!outcome.paymentIntentId) throw new Error('the payment service named no payment intent');
		const refund = await stripe().refunds.create(
			{
				payment_intent: outcome.paymentIntentId,
				metadata: { invoiceId: outcome.invoiceId, reason: 'duplicate' }
			},
			{ idempotencyKey: `refund-duplicate-${outcome.paymentId}` }
		);
		appDb
			.update(payment)
			.set({ refundId: refund.id })
			.where(eq(payment.id, outcome.paymentId))
			.run();
	} catch (e) {
		appDb
			.update(payment)
			.set({
				flag: `Second payment: the automatic refund failed (${(e as Error).message.slice(0, 200)}). Refund it by hand.`
			})
			.where(eq(payment.id, outcome.paymentId))
			.run();
	}
}

/** A refund reported by the payment service (ours or one made there by the marine office). */
export function recordRefund(
	tx: Tx,
	charge: {
		payment_intent: string | { id: string } | null;
		amount: number;
		amount_refunded: number;
		refunds?: { data?: { id: string }[] } | null;
	},
	now = new Date()
): Outcome {
	const pi =
		typeof charge.payment_intent === 'string' ? charge.payment_intent : charge.payment_intent?.id;
	if (!pi) return { kind: 'ignored', reason: 'no payment intent' };
	const row = tx.select().from(payment).where(eq(payment.paymentIntentId, pi)).get();
	if (!row) return { kind: 'ignored', reason: `unknown payment intent ${pi}` };
	const refunded = Math.min(charge.amount_refunded, row.amountMinor);
	if (refunded === row.refundedMinor) return { kind: 'ignored', reason: 'refund already recorded' };
	tx.update(payment)
		.set({
			refundedMinor: refunded,
			refundedAt: now,
			refundId: row.refundId ?? charge.refunds?.data?.[0]?.id ?? null,
			status: refunded >= row.amountMinor ? 'refunded' : row.status
		})
		.where(eq(payment.id, row.id))
		.run();
	const inv = tx.select().from(invoice).where(eq(invoice.id, row.invoiceId)).get()!;
	invoices.settle(tx, inv.id, now);
	audit(tx, {
		cruiseId: inv.cruiseId,
		action: 'payment.refunded',
		detail: { paymentId: row.id, refunded }
	});
	return { kind: 'recorded', paymentId: row.id, invoiceId: inv.id };
}

export function recordExpired(tx: Tx, sessionId: string): Outcome {
	const row = tx
		.select()
		.from(payment)
		.where(and(eq(payment.checkoutSessionId, sessionId), eq(payment.status, 'open')))
		.get();
	if (!row) return { kind: 'ignored', reason: 'no open payment for the session' };
	tx.update(payment).set({ status: 'expired' }).where(eq(payment.id, row.id)).run();
	return { kind: 'recorded', paymentId: row.id, invoiceId: row.invoiceId };
}

/**
 * The payer came back from the hosted page: ask the payment service about the session (the
 * webhook may not have arrived yet) and record it when paid. Answers what the page should say.
 */
export async function confirmReturn(
	cruiseId: string,
	invoiceId: string,
	sessionId: string
): Promise<'paid' | 'pending' | 'unknown'> {
	const row = appDb
		.select()
		.from(payment)
		.where(and(eq(payment.checkoutSessionId, sessionId), eq(payment.invoiceId, invoiceId)))
		.get();
	if (!row || invoices.byId(invoiceId)?.cruiseId !== cruiseId) return 'unknown';
	if (row.status === 'paid' || row.status === 'refunded') return 'paid';
	let session: Stripe.Checkout.Session;
	try {
		session = await stripe().checkout.sessions.retrieve(sessionId);
	} catch {
		return 'pending';
	}
	if (session.payment_status !== 'paid') return 'pending';
	const outcome = appDb.transaction((tx) =>
		recordCompleted(tx, session as unknown as CompletedSession)
	);
	await refundDuplicate(outcome);
	return 'paid';
}

// ---------------------------------------------------------------- mail

function adminEmails(tx: Pick<Db, 'select'>): string[] {
	return tx
		.select({ email: user.email })
		.from(user)
		.where(eq(user.role, 'admin'))
		.all()
		.map((u) => u.email);
}

function notifyAdmins(tx: Tx, inv: Invoice, text: string) {
	for (const to of adminEmails(tx))
		outbox.enqueue(tx, {
			to,
			kind: 'payment_flag',
			cruiseId: inv.cruiseId,
			...templates.paymentFlag({ number: inv.number ?? inv.id, text, link: invoiceUrl(inv) })
		});
}

function sendReceipt(tx: Tx, invoiceId: string, paymentId: string) {
	const inv = tx.select().from(invoice).where(eq(invoice.id, invoiceId)).get()!;
	const p = tx.select().from(payment).where(eq(payment.id, paymentId)).get()!;
	const c = tx.select().from(cruise).where(eq(cruise.id, inv.cruiseId)).get()!;
	const payerEmail =
		p.payerEmail ??
		(p.paidById
			? tx.select({ email: user.email }).from(user).where(eq(user.id, p.paidById)).get()?.email
			: null);
	const mail = templates.paymentReceipt({
		number: inv.number ?? inv.id,
		cruiseCode: c.code,
		description: inv.description,
		amount: formatMoney(p.amountMinor, p.currency),
		paidAt: p.completedAt ?? new Date(),
		receiptNo: receiptNumber(p),
		status: inv.status,
		link: `${invoiceUrl(inv)}/receipt`
	});
	const to = new Set([...(payerEmail ? [payerEmail] : []), ...adminEmails(tx)]);
	for (const address of to)
		outbox.enqueue(tx, { to: address, kind: 'payment_receipt', cruiseId: inv.cruiseId, ...mail });
}

export function receiptNumber(p: Pick<Payment, 'id'>): string {
	return `R-${p.id.slice(0, 8).toUpperCase()}`;
}
