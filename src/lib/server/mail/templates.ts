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

/** A berth decision for one leg. Says nothing about documents, health or anyone else. */
export function berthDecision(p: {
	name: string;
	cruiseCode: string;
	cruiseTitle: string;
	legName: string;
	status: 'confirmed' | 'waitlisted' | 'declined';
	waitlistPosition: number | null;
	message: string | null;
	link: string;
}): MailText {
	const what = {
		confirmed: 'Your berth is confirmed',
		waitlisted: 'You are on the waiting list',
		declined: 'Your berth application was declined'
	}[p.status];
	const detail = {
		confirmed: `Your berth on ${p.legName} is confirmed. Upload the sea-going documents the cruise requires before their deadlines.`,
		waitlisted:
			`You are on the waiting list for ${p.legName}` +
			(p.waitlistPosition ? `, position ${p.waitlistPosition}` : '') +
			'. When a berth frees, the first person waiting is offered it.',
		declined: `Your application for a berth on ${p.legName} was declined.`
	}[p.status];
	return {
		subject: `${p.cruiseCode}: ${what} — ${p.legName}`,
		text:
			`Dear ${p.name},\n\n${detail}\n\n` +
			(p.message ? `Message from the chief scientist:\n${p.message}\n\n` : '') +
			`Cruise ${p.cruiseCode} — ${p.cruiseTitle}\nYour applications and documents: ${p.link}` +
			SIGNATURE
	};
}
