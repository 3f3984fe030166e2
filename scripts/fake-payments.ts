// The local payment service for `npm start` without STRIPE_SECRET_KEY: its own process on
// loopback, speaking the subset of Stripe's HTTP API that Wakeline calls (checkout sessions,
// refunds), with a hosted checkout page and signed webhooks delivered with retries. The app's
// Stripe SDK is pointed here by host/port/protocol and cannot tell the difference.
//
// Run: node --import tsx scripts/fake-payments.ts   (env below); it prints one JSON line
// {"port": …} when listening.
//   FAKE_PAYMENTS_PORT      port on 127.0.0.1 (0: any free port)
//   STRIPE_SECRET_KEY       the Bearer key callers must send
//   STRIPE_WEBHOOK_SECRET   the signing secret (whsec_…)
//   FAKE_PAYMENTS_WEBHOOK_URL  where events are posted (the app's /api/v1/payments/webhook)
//   FAKE_PAYMENTS_RETRY_MS  first retry delay (doubles each time, at most 5 minutes)
import { randomBytes } from 'node:crypto';
import { createServer, type IncomingMessage, type ServerResponse } from 'node:http';
import { pathToFileURL } from 'node:url';
import qs from 'qs';
import Stripe from 'stripe';

const MAX_BODY = 256 * 1024;
const MAX_ATTEMPTS = 12;
const MAX_BACKOFF_MS = 300_000;
// [trade] Stripe's documented test cards: 4242 4242 4242 4242 succeeds, 4000 0000 0000 0002 is
// declined with the generic decline code.
const GOOD_CARD = '4242424242424242';
const DECLINED_CARD = '4000000000000002';

type Obj = Record<string, unknown>;

export interface FakeOptions {
	port: number;
	secretKey: string;
	webhookSecret: string;
	webhookUrl: string;
	retryMs?: number;
	log?: (line: string) => void;
}

interface Session extends Obj {
	id: string;
	object: 'checkout.session';
	status: 'open' | 'complete' | 'expired';
	payment_status: 'unpaid' | 'paid';
	amount_total: number;
	currency: string;
	client_reference_id: string | null;
	metadata: Record<string, string>;
	success_url: string;
	cancel_url: string | null;
	payment_intent: string | null;
	url: string | null;
	customer_details: { email: string | null } | null;
	customer_email: string | null;
	created: number;
	expires_at: number;
	livemode: false;
	mode: string;
}

interface Charge extends Obj {
	id: string;
	object: 'charge';
	amount: number;
	amount_refunded: number;
	currency: string;
	payment_intent: string;
	refunded: boolean;
	refunds: { object: 'list'; data: Obj[] };
	metadata: Record<string, string>;
}

export function id(prefix: string): string {
	return `${prefix}_test_${randomBytes(12).toString('base64url').replace(/[-_]/g, 'x')}`;
}

const now = () => Math.floor(Date.now() / 1000);

class StripeError extends Error {
	constructor(
		public status: number,
		message: string,
		public type = 'invalid_request_error',
		public extra: Obj = {}
	) {
		super(message);
	}
}

function escapeHtml(s: string) {
	return s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

function money(amount: number, currency: string) {
	const e = ['jpy', 'krw', 'isk', 'clp'].includes(currency)
		? 0
		: ['kwd', 'bhd', 'omr', 'jod', 'tnd'].includes(currency)
			? 3
			: 2;
	return `${currency.toUpperCase()} ${(amount / 10 ** e).toFixed(e)}`;
}

export function startFakePayments(opts: FakeOptions) {
	const log = opts.log ?? (() => {});
	const signer = new Stripe(opts.secretKey);
	const sessions = new Map<string, Session>();
	const charges = new Map<string, Charge>();
	const chargeByIntent = new Map<string, string>();
	const idempotent = new Map<string, { params: string; status: number; body: string }>();
	const declines = new Map<string, string>();
	let base = '';
	const pending = new Set<ReturnType<typeof setTimeout>>();

	function emit(type: string, object: Obj) {
		const event = {
			id: id('evt'),
			object: 'event',
			api_version: '2025-09-30',
			created: now(),
			type,
			livemode: false,
			pending_webhooks: 1,
			data: { object }
		};
		deliver(JSON.stringify(event), 1);
	}

	function deliver(payload: string, attempt: number) {
		const header = signer.webhooks.generateTestHeaderString({
			payload,
			secret: opts.webhookSecret
		});
		fetch(opts.webhookUrl, {
			method: 'POST',
			headers: { 'content-type': 'application/json; charset=utf-8', 'stripe-signature': header },
			body: payload,
			signal: AbortSignal.timeout(10_000)
		})
			.then(async (res) => {
				await res.text();
				if (res.status >= 200 && res.status < 300) return;
				throw new Error(`HTTP ${res.status}`);
			})
			.catch((e: Error) => {
				if (attempt >= MAX_ATTEMPTS) {
					log(`webhook given up after ${attempt} attempts: ${e.message}`);
					return;
				}
				const delay = Math.min(MAX_BACKOFF_MS, (opts.retryMs ?? 2000) * 2 ** (attempt - 1));
				log(`webhook attempt ${attempt} failed (${e.message}); retrying in ${delay} ms`);
				const t = setTimeout(() => {
					pending.delete(t);
					deliver(payload, attempt + 1);
				}, delay);
				pending.add(t);
			});
	}

	function requireKey(req: IncomingMessage) {
		const auth = req.headers.authorization ?? '';
		if (auth !== `Bearer ${opts.secretKey}`)
			throw new StripeError(401, 'Invalid API Key provided.', 'invalid_request_error');
	}

	function str(v: unknown, name: string, required = true): string | null {
		if (v === undefined || v === '') {
			if (required)
				throw new StripeError(400, `Missing required param: ${name}.`, 'invalid_request_error', {
					param: name
				});
			return null;
		}
		if (typeof v !== 'string')
			throw new StripeError(400, `Invalid string: ${name}`, 'invalid_request_error', {
				param: name
			});
		return v;
	}

	function createSession(p: Obj): Session {
		if (str(p.mode, 'mode') !== 'payment')
			throw new StripeError(400, 'Only mode=payment is supported here.', 'invalid_request_error', {
				param: 'mode'
			});
		const items = Array.isArray(p.line_items) ? (p.line_items as Obj[]) : [];
		if (items.length === 0)
			throw new StripeError(400, 'Missing required param: line_items.', 'invalid_request_error', {
				param: 'line_items'
			});
		let total = 0;
		let currency = '';
		items.forEach((it, i) => {
			const pd = (it.price_data ?? {}) as Obj;
			const unit = Number(str(pd.unit_amount, `line_items[${i}][price_data][unit_amount]`));
			const qty = Number(it.quantity ?? 1);
			if (!Number.isInteger(unit) || unit < 0 || !Number.isInteger(qty) || qty < 1)
				throw new StripeError(400, `Invalid integer: line_items[${i}]`, 'invalid_request_error', {
					param: `line_items[${i}][price_data][unit_amount]`
				});
			currency = str(pd.currency, `line_items[${i}][price_data][currency]`)!.toLowerCase();
			total += unit * qty;
		});
		if (total < 1)
			throw new StripeError(400, 'The amount must be at least 1.', 'invalid_request_error', {
				param: 'line_items'
			});
		const sid = id('cs');
		const s: Session = {
			id: sid,
			object: 'checkout.session',
			status: 'open',
			payment_status: 'unpaid',
			amount_total: total,
			currency,
			client_reference_id: str(p.client_reference_id, 'client_reference_id', false),
			metadata: (p.metadata ?? {}) as Record<string, string>,
			success_url: str(p.success_url, 'success_url')!,
			cancel_url: str(p.cancel_url, 'cancel_url', false),
			payment_intent: null,
			url: `${base}/pay/${sid}`,
			customer_details: null,
			customer_email: str(p.customer_email, 'customer_email', false),
			created: now(),
			expires_at: now() + 24 * 3600,
			livemode: false,
			mode: 'payment'
		};
		sessions.set(sid, s);
		return s;
	}

	function refund(p: Obj) {
		const piId = str(p.payment_intent, 'payment_intent', false);
		const chId = str(p.charge, 'charge', false) ?? (piId ? chargeByIntent.get(piId) : undefined);
		const ch = chId ? charges.get(chId) : undefined;
		if (!ch)
			throw new StripeError(
				404,
				`No such payment_intent: '${piId ?? ''}'`,
				'invalid_request_error',
				{ code: 'resource_missing', param: 'payment_intent' }
			);
		const left = ch.amount - ch.amount_refunded;
		const amount = p.amount !== undefined ? Number(p.amount) : left;
		if (!Number.isInteger(amount) || amount < 1 || amount > left)
			throw new StripeError(
				400,
				`Refund amount (${amount}) is greater than the unrefunded amount on the charge (${left}).`,
				'invalid_request_error',
				{ code: 'amount_too_large', param: 'amount' }
			);
		const re = {
			id: id('re'),
			object: 'refund',
			amount,
			currency: ch.currency,
			charge: ch.id,
			payment_intent: ch.payment_intent,
			status: 'succeeded',
			created: now(),
			metadata: (p.metadata ?? {}) as Obj
		};
		ch.amount_refunded += amount;
		ch.refunded = ch.amount_refunded === ch.amount;
		ch.refunds.data.unshift(re);
		setTimeout(() => emit('charge.refunded', structuredClone(ch)), 10);
		return re;
	}

	function pay(s: Session, email: string | null) {
		const pi = id('pi');
		const ch: Charge = {
			id: id('ch'),
			object: 'charge',
			amount: s.amount_total,
			amount_refunded: 0,
			currency: s.currency,
			payment_intent: pi,
			refunded: false,
			refunds: { object: 'list', data: [] },
			metadata: s.metadata
		};
		charges.set(ch.id, ch);
		chargeByIntent.set(pi, ch.id);
		s.status = 'complete';
		s.payment_status = 'paid';
		s.payment_intent = pi;
		s.url = null;
		s.customer_details = { email: email ?? s.customer_email };
		emit('checkout.session.completed', structuredClone(s));
	}

	async function readBody(req: IncomingMessage): Promise<string> {
		let size = 0;
		const chunks: Buffer[] = [];
		for await (const c of req) {
			size += (c as Buffer).length;
			if (size > MAX_BODY) throw new StripeError(413, 'Request body too large.');
			chunks.push(c as Buffer);
		}
		return Buffer.concat(chunks).toString('utf8');
	}

	function send(
		res: ServerResponse,
		status: number,
		body: unknown,
		headers: Record<string, string> = {}
	) {
		res.writeHead(status, {
			'content-type': 'application/json',
			'request-id': id('req'),
			...headers
		});
		res.end(typeof body === 'string' ? body : JSON.stringify(body));
	}

	function page(res: ServerResponse, status: number, s: Session, problem = '') {
		const amount = money(s.amount_total, s.currency);
		res.writeHead(status, { 'content-type': 'text/html; charset=utf-8' });
		res.end(`<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Pay ${escapeHtml(amount)}</title>
<meta name="viewport" content="width=device-width, initial-scale=1">
<style>body{font:16px system-ui,sans-serif;max-width:26rem;margin:3rem auto;padding:0 1rem;color:#1c2530}
label{display:block;margin:.8rem 0 .2rem;font-weight:600}input{width:100%;padding:.5rem;font:inherit;box-sizing:border-box}
.row{display:flex;gap:1rem}.row>div{flex:1}button{margin-top:1.2rem;width:100%;padding:.7rem;font:inherit;font-weight:600;background:#0c4a6e;color:#fff;border:0;border-radius:4px}
.problem{background:#fde8e8;border:1px solid #e0a0a0;padding:.7rem;border-radius:4px}.note{color:#555;font-size:.85rem}</style></head>
<body><h1>Card payment</h1><p>Amount due: <strong>${escapeHtml(amount)}</strong></p>
${problem ? `<p class="problem" role="alert">${escapeHtml(problem)}</p>` : ''}
${
	s.status !== 'open'
		? `<p>This payment page is ${s.status === 'complete' ? 'already paid' : 'expired'}.</p>`
		: `<form method="post" action="/pay/${s.id}">
<label for="email">E-mail</label><input id="email" name="email" type="email" value="${escapeHtml(s.customer_email ?? '')}">
<label for="card">Card number</label><input id="card" name="card" inputmode="numeric" autocomplete="cc-number" required>
<div class="row"><div><label for="exp">Expiry (MM/YY)</label><input id="exp" name="exp" autocomplete="cc-exp" required></div>
<div><label for="cvc">CVC</label><input id="cvc" name="cvc" inputmode="numeric" autocomplete="cc-csc" required></div></div>
<button type="submit">Pay</button></form>
${s.cancel_url ? `<p><a href="${escapeHtml(s.cancel_url)}">Cancel and go back</a></p>` : ''}`
}
<p class="note">Local test payment service: no real money moves. Test cards: 4242 4242 4242 4242 pays, 4000 0000 0000 0002 is declined.</p>
</body></html>`);
	}

	async function handlePay(req: IncomingMessage, res: ServerResponse, s: Session) {
		const form = new URLSearchParams(await readBody(req));
		if (s.status !== 'open') return page(res, 409, s);
		const card = (form.get('card') ?? '').replace(/[\s-]/g, '');
		const exp = (form.get('exp') ?? '').trim();
		const cvc = (form.get('cvc') ?? '').trim();
		const m = /^(\d{2})\s*\/\s*(\d{2}|\d{4})$/.exec(exp);
		if (!/^\d{12,19}$/.test(card)) return page(res, 400, s, 'The card number is incomplete.');
		if (!m || Number(m[1]) < 1 || Number(m[1]) > 12)
			return page(res, 400, s, 'Give the expiry as MM/YY.');
		const year = m[2].length === 2 ? 2000 + Number(m[2]) : Number(m[2]);
		const d = new Date();
		if (
			year < d.getUTCFullYear() ||
			(year === d.getUTCFullYear() && Number(m[1]) < d.getUTCMonth() + 1)
		)
			return page(res, 400, s, 'The card has expired.');
		if (!/^\d{3,4}$/.test(cvc))
			return page(res, 400, s, 'The CVC is the 3 or 4 digits on the card.');
		if (card === DECLINED_CARD) {
			declines.set(s.id, 'Your card was declined.');
			return page(res, 402, s, 'Your card was declined. Nothing was charged; try another card.');
		}
		if (card !== GOOD_CARD)
			return page(res, 402, s, 'This test service accepts only the test cards listed below.');
		pay(s, form.get('email') || null);
		res.writeHead(303, { location: s.success_url.replace('{CHECKOUT_SESSION_ID}', s.id) });
		res.end();
	}

	async function api(req: IncomingMessage, res: ServerResponse, path: string) {
		requireKey(req);
		const raw = req.method === 'POST' ? await readBody(req) : '';
		const params = qs.parse(raw, { depth: 5, arrayLimit: 100, parameterLimit: 1000 }) as Obj;
		const key = req.method === 'POST' ? req.headers['idempotency-key'] : undefined;
		const idemKey = typeof key === 'string' ? `${path} ${key}` : null;
		if (idemKey) {
			const seen = idempotent.get(idemKey);
			if (seen) {
				if (seen.params !== raw)
					throw new StripeError(
						400,
						`Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than '${String(key)}' if you meant to execute a different request.`,
						'idempotency_error'
					);
				return send(res, seen.status, seen.body, { 'idempotent-replayed': 'true' });
			}
		}
		const status = 200;
		let body: unknown;
		let m: RegExpExecArray | null;
		if (req.method === 'POST' && path === '/v1/checkout/sessions') body = createSession(params);
		else if (req.method === 'GET' && (m = /^\/v1\/checkout\/sessions\/([\w]+)$/.exec(path))) {
			const s = sessions.get(m[1]);
			if (!s)
				throw new StripeError(404, `No such checkout.session: '${m[1]}'`, 'invalid_request_error', {
					code: 'resource_missing',
					param: 'session'
				});
			body = s;
		} else if (
			req.method === 'POST' &&
			(m = /^\/v1\/checkout\/sessions\/([\w]+)\/expire$/.exec(path))
		) {
			const s = sessions.get(m[1]);
			if (!s)
				throw new StripeError(404, `No such checkout.session: '${m[1]}'`, 'invalid_request_error', {
					code: 'resource_missing'
				});
			if (s.status !== 'open')
				throw new StripeError(400, `Only open sessions can be expired (this one is ${s.status}).`);
			s.status = 'expired';
			s.url = null;
			emit('checkout.session.expired', structuredClone(s));
			body = s;
		} else if (req.method === 'POST' && path === '/v1/refunds') body = refund(params);
		else throw new StripeError(404, `Unrecognized request URL (${req.method}: ${path}).`);
		const text = JSON.stringify(body);
		if (idemKey) idempotent.set(idemKey, { params: raw, status, body: text });
		send(res, status, text);
	}

	const server = createServer((req, res) => {
		const url = new URL(req.url ?? '/', 'http://x');
		const path = url.pathname;
		void (async () => {
			try {
				const pm = /^\/pay\/(cs_\w+)$/.exec(path);
				if (pm) {
					const s = sessions.get(pm[1]);
					if (!s) {
						res.writeHead(404, { 'content-type': 'text/plain' });
						return res.end('No such payment page.');
					}
					if (req.method === 'POST') return await handlePay(req, res, s);
					return page(
						res,
						200,
						s,
						declines.get(s.id) && url.searchParams.has('declined') ? 'Your card was declined.' : ''
					);
				}
				if (path.startsWith('/v1/')) return await api(req, res, path);
				res.writeHead(404, { 'content-type': 'text/plain' });
				res.end('Not found.');
			} catch (e) {
				if (e instanceof StripeError)
					return send(res, e.status, { error: { type: e.type, message: e.message, ...e.extra } });
				log(`error: ${(e as Error).stack}`);
				send(res, 500, { error: { type: 'api_error', message: 'An unexpected error occurred.' } });
			}
		})();
	});

	return new Promise<{ port: number; close: () => void }>((resolve, reject) => {
		server.once('error', reject);
		server.listen(opts.port, '127.0.0.1', () => {
			const addr = server.address();
			const port = typeof addr === 'object' && addr ? addr.port : opts.port;
			base = `http://127.0.0.1:${port}`;
			resolve({
				port,
				close: () => {
					for (const t of pending) clearTimeout(t);
					server.close();
					server.closeAllConnections();
				}
			});
		});
	});
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
	const e = process.env;
	const { port, close } = await startFakePayments({
		port: Number(e.FAKE_PAYMENTS_PORT || 0),
		secretKey: e.STRIPE_SECRET_KEY || '',
		webhookSecret: e.STRIPE_WEBHOOK_SECRET || '',
		webhookUrl: e.FAKE_PAYMENTS_WEBHOOK_URL || '',
		retryMs: Number(e.FAKE_PAYMENTS_RETRY_MS || 2000),
		log: (line) => console.error(`[payments] ${line}`)
	});
	console.log(JSON.stringify({ port }));
	for (const signal of ['SIGTERM', 'SIGINT'] as const)
		process.once(signal, () => {
			close();
			process.exit(0);
		});
	// The parent (npm start) going away takes this process with it.
	process.stdin.on('end', () => process.exit(0));
	process.stdin.resume();
}
