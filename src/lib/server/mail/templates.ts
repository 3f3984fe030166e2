// E-mail texts. Plain functions so they can be tested; links are absolute from config.origin.
// Never put medical information into a template.
export interface MailText {
	subject: string;
	text: string;
}

const SIGNATURE = '\n\n— Wakeline, cruise planning for ridge expeditions';

export function siteInvitation(p: {
	inviterName: string;
	link: string;
	expiresDays: number;
}): MailText {
	return {
		subject: 'You are invited to Wakeline',
		text:
			`${p.inviterName} has invited you to Wakeline.\n\n` +
			`Choose your name and password here (the link works once, for ${p.expiresDays} days):\n${p.link}` +
			SIGNATURE
	};
}

export function cruiseInvitation(p: {
	inviterName: string;
	cruiseCode: string;
	cruiseTitle: string;
	roleLabel: string;
	link: string;
	expiresDays: number;
}): MailText {
	return {
		subject: `Invitation to cruise ${p.cruiseCode} as ${p.roleLabel}`,
		text:
			`${p.inviterName} has invited you to join cruise ${p.cruiseCode} — ${p.cruiseTitle} — ` +
			`as ${p.roleLabel}.\n\n` +
			`Accept and set your password here (the link works once, for ${p.expiresDays} days):\n${p.link}` +
			SIGNATURE
	};
}

export function addedToCruise(p: {
	inviterName: string;
	cruiseCode: string;
	cruiseTitle: string;
	roleLabel: string;
	link: string;
}): MailText {
	return {
		subject: `You were added to cruise ${p.cruiseCode} as ${p.roleLabel}`,
		text:
			`${p.inviterName} added you to cruise ${p.cruiseCode} — ${p.cruiseTitle} — as ${p.roleLabel}.\n\n` +
			`Open the cruise: ${p.link}` +
			SIGNATURE
	};
}

export function passwordReset(p: { link: string; expiresMinutes: number }): MailText {
	return {
		subject: 'Reset your Wakeline password',
		text:
			`Someone (we hope you) asked to reset the password of this Wakeline account.\n\n` +
			`Choose a new password here; the link works once and for ${p.expiresMinutes} minutes:\n${p.link}\n\n` +
			`If you did not ask for this, ignore this message: your password stays as it is.` +
			SIGNATURE
	};
}

export function paymentReceipt(p: {
	number: string;
	cruiseCode: string;
	description: string;
	amount: string;
	paidAt: Date;
	receiptNo: string;
	status: string;
	link: string;
}): MailText {
	return {
		subject: `Receipt ${p.receiptNo}: ${p.amount} received for invoice ${p.number}`,
		text:
			`We received ${p.amount} for invoice ${p.number} (cruise ${p.cruiseCode}: ${p.description}) ` +
			`on ${p.paidAt.toISOString().slice(0, 16).replace('T', ' ')} UTC.\n\n` +
			`Receipt number: ${p.receiptNo}\nInvoice status: ${p.status.replace('_', ' ')}\n\n` +
			`Printable receipt:\n${p.link}` +
			SIGNATURE
	};
}

export function paymentFlag(p: { number: string; text: string; link: string }): MailText {
	return {
		subject: `Payment needs a look: invoice ${p.number}`,
		text: `${p.text}\n\nInvoice:\n${p.link}` + SIGNATURE
	};
}
