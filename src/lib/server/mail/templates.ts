// E-mail texts. Plain functions so they can be tested; links are absolute from config.origin.
// Never put medical information into a template.
import { clock, offsetLabel } from '../../schedule';
import type { PublishedItem } from '../calendar';
import type { Change, Snapshot } from '../publications';
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
export function escapeHtml(s: string): string {
	return s
		.replace(/&/g, '&amp;')
		.replace(/</g, '&lt;')
		.replace(/>/g, '&gt;')
		.replace(/"/g, '&quot;')
		.replace(/'/g, '&#39;');
}

/** The HTML part of a plain-text mail: paragraphs kept, links made clickable, nothing else added. */
export function textToHtml(text: string): string {
	const paragraphs = text.split(/\n{2,}/).map((p) =>
		escapeHtml(p)
			.replace(/https?:\/\/[^\s<]+/g, (u) => `<a href="${u}">${u}</a>`)
			.replace(/\n/g, '<br>')
	);
	return `<!doctype html><html><body style="font-family:sans-serif;line-height:1.4">${paragraphs
		.map((p) => `<p>${p}</p>`)
		.join('')}</body></html>`;
}

// ---------------------------------------------------------------- the schedule

export interface Mail extends MailText {
	html: string;
}

const utc = (ms: number) => `${clock(ms)} UTC`;
const ship = (ms: number, offset: number) => `${clock(ms, offset)} ship (${offsetLabel(offset)})`;
const utcDate = (ms: number) => new Date(ms).toISOString().slice(0, 10);

function changeLine(c: Change): string {
	const when = (x: { start: number; end: number }) =>
		c.kind === 'deadline' ? utcDate(x.start) : utc(x.start);
	switch (c.type) {
		case 'moved':
			if (when(c.before!) === when(c.after!) && utc(c.before!.end) !== utc(c.after!.end))
				return `${c.name} now ends ${utc(c.after!.end)} (was ${utc(c.before!.end)})`;
			if (when(c.before!) === when(c.after!) && c.before!.location !== c.after!.location)
				return `${c.name} moved to ${c.after!.location}`;
			return `${c.name} moved: ${when(c.before!)} → ${when(c.after!)}`;
		case 'added':
			return `Added: ${c.name}, ${when(c.after!)}`;
		case 'removed':
			return `Removed: ${c.name} (was ${when(c.before!)})`;
		case 'return':
			return `New return date: ${utc(c.before!.start)} → ${utc(c.after!.start)}`;
		case 'departure':
			return `${c.name}: ${utc(c.before!.start)} → ${utc(c.after!.start)}`;
		default:
			return `${c.name} changed.`;
	}
}

/** Port calls first, then the rest of the change summary in its order. */
export function changeLines(changes: readonly Change[]): { portCalls: string[]; other: string[] } {
	return {
		portCalls: changes.filter((c) => c.kind === 'port').map(changeLine),
		other: changes.filter((c) => c.kind !== 'port').map(changeLine)
	};
}

const WORK = new Set(['line', 'station', 'port', 'transit', 'margin']);

/**
 * The publication mail: what changed (from the second version on), departure and return, legs,
 * port calls, the work in UTC with ship's time beside, a link to the cruise. The calendar goes
 * along as an attachment (outbox). No names of people, no documents, nothing medical.
 */
export function schedulePublished(p: {
	snapshot: Snapshot;
	version: number;
	previousVersion: number | null;
	changes: readonly Change[];
	link: string;
}): Mail {
	const s = p.snapshot;
	const subject =
		p.previousVersion == null
			? `${s.code} schedule published (version ${p.version}): sails ${utc(s.departure.at)}, back ${utcDate(s.return.at)}`
			: `${s.code} schedule changed (version ${p.version}): sails ${utc(s.departure.at)}, back ${utcDate(s.return.at)}`;
	const { portCalls: changedCalls, other } = changeLines(p.changes);
	const ports = s.items.filter((i) => i.kind === 'port');
	const work = s.items.filter((i) => WORK.has(i.kind)).sort((a, b) => a.start - b.start);
	const row = (i: PublishedItem) =>
		`${utc(i.start)} · ${ship(i.start, i.offsetMinutes ?? 0)} · ${i.name}`;

	const changeText =
		p.previousVersion == null
			? []
			: [
					`What changed since version ${p.previousVersion}:`,
					...[...changedCalls, ...other].map((l) => `- ${l}`),
					''
				];
	const text = [
		...changeText,
		`${s.code} — ${s.title}: schedule version ${p.version}`,
		'',
		`Departure: ${s.departure.port}, ${utc(s.departure.at)} · ${ship(s.departure.at, s.departure.offsetMinutes)}`,
		`Return: ${s.return.port}, ${utc(s.return.at)}`,
		'',
		'Legs:',
		...s.legs.map((l) => `- Leg ${l.seq}: ${l.from} → ${l.to}, ${utc(l.start)} to ${utc(l.end)}`),
		'',
		'Port calls:',
		...(ports.length
			? ports.map((i) => `- ${i.name}: ${utc(i.start)} to ${utc(i.end)}`)
			: ['- none']),
		'',
		"The work (UTC · ship's time):",
		...work.map(row),
		'',
		`Open the cruise: ${p.link}`,
		'',
		'The attached calendar (schedule.ics) holds every item; calendars that already hold an',
		'earlier version update it in place. Times are planning estimates; the master decides.'
	].join('\n');

	const esc = escapeHtml;
	const li = (xs: string[]) => `<ul>${xs.map((x) => `<li>${esc(x)}</li>`).join('')}</ul>`;
	const html = [
		'<!doctype html><html><body style="font-family:sans-serif;line-height:1.4">',
		p.previousVersion == null
			? ''
			: `<h2>What changed since version ${p.previousVersion}</h2>${li([...changedCalls, ...other])}`,
		`<h1>${esc(s.code)} — ${esc(s.title)}</h1><p>Schedule version ${p.version}</p>`,
		`<p><strong>Departure:</strong> ${esc(s.departure.port)}, ${esc(utc(s.departure.at))} · ${esc(ship(s.departure.at, s.departure.offsetMinutes))}<br>`,
		`<strong>Return:</strong> ${esc(s.return.port)}, ${esc(utc(s.return.at))}</p>`,
		`<h2>Legs</h2>${li(s.legs.map((l) => `Leg ${l.seq}: ${l.from} → ${l.to}, ${utc(l.start)} to ${utc(l.end)}`))}`,
		`<h2>Port calls</h2>${li(ports.length ? ports.map((i) => `${i.name}: ${utc(i.start)} to ${utc(i.end)}`) : ['none'])}`,
		"<h2>The work</h2><table><thead><tr><th align=left>UTC</th><th align=left>Ship's time</th><th align=left>What</th></tr></thead><tbody>",
		...work.map(
			(i) =>
				`<tr><td>${esc(utc(i.start))}</td><td>${esc(ship(i.start, i.offsetMinutes ?? 0))}</td><td>${esc(i.name)}</td></tr>`
		),
		'</tbody></table>',
		`<p><a href="${esc(p.link)}">Open the cruise</a></p>`,
		'<p style="color:#666;font-size:12px">The attached calendar holds every item. Times are planning estimates; the master decides.</p>',
		'</body></html>'
	].join('');
	return { subject, text, html };
}

/** A reminder of something falling due. */
export function reminder(p: {
	cruiseCode: string;
	title: string;
	dueAt: number;
	daysBefore: number;
	what: string;
	link: string;
}): MailText {
	const when = p.daysBefore === 1 ? 'tomorrow' : `in ${p.daysBefore} days`;
	return {
		subject: `${p.cruiseCode}: ${p.title} due ${when} (${utcDate(p.dueAt)})`,
		text:
			`${p.title} for cruise ${p.cruiseCode} is due ${when}, on ${utcDate(p.dueAt)} (UTC).\n\n` +
			`${p.what}\n\nOpen the cruise: ${p.link}` +
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
