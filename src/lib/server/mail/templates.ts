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
