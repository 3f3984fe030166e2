import { describe, expect, it } from 'vitest';
import * as templates from './templates';

describe('mail templates', () => {
	it('a reset mail carries the link and says how long it works', () => {
		const m = templates.passwordReset({ link: 'http://x/reset/abc', expiresMinutes: 60 });
		expect(m.subject).toMatch(/reset/i);
		expect(m.text).toContain('http://x/reset/abc');
		expect(m.text).toContain('60 minutes');
	});

	it('a cruise invitation names the cruise and the role', () => {
		const m = templates.cruiseInvitation({
			inviterName: 'Ana',
			cruiseCode: 'WL-1',
			cruiseTitle: 'Ridge',
			roleLabel: 'port agent',
			link: 'http://x/invite/t',
			expiresDays: 14
		});
		expect(m.subject).toBe('Invitation to cruise WL-1 as port agent');
		expect(m.text).toContain('http://x/invite/t');
		expect(m.text).toContain('14 days');
	});

	it('a berth decision names the leg, the decision, the waitlist place and the message', () => {
		const base = {
			name: 'Rafael',
			cruiseCode: 'WL-1',
			cruiseTitle: 'Ridge',
			legName: 'Leg 2',
			waitlistPosition: null,
			message: null,
			link: 'http://x/my-cruises'
		};
		const ok = templates.berthDecision({
			...base,
			status: 'confirmed',
			message: 'Welcome aboard.'
		});
		expect(ok.subject).toBe('WL-1: Your berth is confirmed — Leg 2');
		expect(ok.text).toContain('Message from the chief scientist:\nWelcome aboard.');
		expect(ok.text).toContain('http://x/my-cruises');
		const wait = templates.berthDecision({ ...base, status: 'waitlisted', waitlistPosition: 3 });
		expect(wait.text).toContain('waiting list for Leg 2, position 3');
		const no = templates.berthDecision({ ...base, status: 'declined' });
		expect(no.subject).toContain('declined');
		expect(no.text).not.toContain('Message from');
		// Never a word about health in a berth e-mail.
		for (const m of [ok, wait, no]) expect(m.text).not.toMatch(/medic|health|fitness/i);
	});
});

describe('payment mail', () => {
	it('a receipt names the amount, the invoice, the receipt number and the printable link', () => {
		const m = templates.paymentReceipt({
			number: 'WL-2027-0002',
			cruiseCode: 'MT27-03',
			description: 'Ship time, leg 1',
			amount: 'EUR 308,000.00',
			paidAt: new Date(Date.UTC(2027, 2, 28, 9, 5)),
			receiptNo: 'R-ABCDEFGH',
			status: 'partly_paid',
			link: 'http://example.org/cruises/c/invoices/i/receipt'
		});
		expect(m.subject).toBe('Receipt R-ABCDEFGH: EUR 308,000.00 received for invoice WL-2027-0002');
		expect(m.text).toContain('2027-03-28 09:05 UTC');
		expect(m.text).toContain('Invoice status: partly paid');
		expect(m.text).toContain('http://example.org/cruises/c/invoices/i/receipt');
	});
	it('a flag says which invoice needs a look', () => {
		const m = templates.paymentFlag({ number: 'WL-2027-0900', text: 'Second payment.', link: 'x' });
		expect(m.subject).toBe('Payment needs a look: invoice WL-2027-0900');
	});
});
