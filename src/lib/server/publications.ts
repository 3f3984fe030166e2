// Publishing the schedule (DESIGN.md §4 flow 8): the chief scientist freezes the current timeline
// as a numbered version; everyone on the cruise (members and the confirmed science party) gets one
// mail with the schedule, what changed since the version before, and the calendar (RFC 5545,
// method PUBLISH) whose SEQUENCE numbers rise only for items whose time or place moved.
import { and, asc, desc, eq, inArray } from 'drizzle-orm';
import * as schedule from '../schedule';
import { ApiError } from './api';
import { audit } from './audit';
import * as calendar from './calendar';
import type { CalendarItem, PublishedItem } from './calendar';
import { config } from './config';
import { db as appDb } from './db';
import type { Db } from './db/client';
import { berthApplication, cruiseMember, scheduleVersion, user } from './db/schema';
import { newId } from './ids';
import * as templates from './mail/templates';
import * as notices from './notices';
import * as timelines from './timeline';

type Reader = Pick<Db, 'select'>;

export interface Snapshot {
	code: string;
	title: string;
	departure: { port: string; at: number; offsetMinutes: number };
	return: { port: string; at: number };
	legs: schedule.LegSpan[];
	items: PublishedItem[];
}

export type ChangeType = 'moved' | 'added' | 'removed' | 'return' | 'departure' | 'other';

export interface Change {
	type: ChangeType;
	/** line, station, port (a port call), deadline, or '' for the cruise's dates. */
	kind: string;
	name: string;
	before?: { start: number; end: number; location?: string };
	after?: { start: number; end: number; location?: string };
}

/** Items a change summary names one by one; transits, turns and the margin follow from them. */
const LISTED = new Set(['line', 'station', 'port', 'deadline']);

export interface Recipient {
	userId: string;
	email: string;
	name: string;
}

/** Everyone on the cruise: all members, whatever their role, and the confirmed science party. */
export function recipients(cruiseId: string, d: Reader = appDb): Recipient[] {
	const members = d
		.select({ userId: user.id, email: user.email, name: user.name })
		.from(cruiseMember)
		.innerJoin(user, eq(user.id, cruiseMember.userId))
		.where(eq(cruiseMember.cruiseId, cruiseId))
		.all();
	const party = d
		.select({ userId: user.id, email: user.email, name: user.name })
		.from(berthApplication)
		.innerJoin(user, eq(user.id, berthApplication.userId))
		.where(and(eq(berthApplication.cruiseId, cruiseId), eq(berthApplication.status, 'confirmed')))
		.all();
	const byId = new Map<string, Recipient>();
	for (const r of [...members, ...party]) byId.set(r.userId, r);
	return [...byId.values()].sort((a, b) => a.email.localeCompare(b.email));
}

function latestRow(cruiseId: string, d: Reader) {
	return (
		d
			.select()
			.from(scheduleVersion)
			.where(eq(scheduleVersion.cruiseId, cruiseId))
			.orderBy(desc(scheduleVersion.version))
			.limit(1)
			.get() ?? null
	);
}

/** The last published version's calendar items with their SEQUENCE numbers, or null. */
export function publishedItems(cruiseId: string, d: Reader = appDb): PublishedItem[] | null {
	const row = latestRow(cruiseId, d);
	return row ? (row.snapshot as Snapshot).items : null;
}

/** The schedule as it stands now, numbered against the last published version. */
export function current(
	cruiseId: string,
	previous: Snapshot | null,
	now: number,
	d: Reader = appDb
): Snapshot {
	const built = timelines.build(cruiseId, d);
	const t = built.timeline;
	const input = built.data.input;
	if (!t || !input)
		throw new ApiError(
			409,
			`The cruise has no timeline yet (it needs ${built.data.missing.join(', ')}), so there is no schedule to publish.`
		);
	const list: CalendarItem[] = calendar.items(cruiseId, now, d);
	const seq = calendar.sequencesAgainst(previous?.items ?? null, list);
	return {
		code: built.data.cruise.code,
		title: built.data.cruise.title,
		departure: {
			port: input.departure.name,
			at: input.departure.at,
			offsetMinutes: input.departure.utcOffsetMinutes ?? 0
		},
		return: { port: input.arrival.name, at: schedule.returnAt(t) },
		legs: timelines.legSpans(t, built.data),
		items: list.map((i) => ({ ...i, sequence: seq.get(i.key) ?? 0 }))
	};
}

const span = (i: CalendarItem) => ({
	start: i.start,
	end: i.end,
	...(i.location ? { location: i.location } : {})
});

/** What changed from one version to the next, and whether anything did at all. */
export function diff(
	prev: Snapshot | null,
	next: Snapshot
): { changed: boolean; changes: Change[] } {
	if (!prev) return { changed: true, changes: [] };
	const before = new Map(prev.items.map((i) => [i.key, i]));
	const after = new Map(next.items.map((i) => [i.key, i]));
	const changes: Change[] = [];
	let unlisted = false;
	if (prev.departure.at !== next.departure.at || prev.departure.port !== next.departure.port)
		changes.push({
			type: 'departure',
			kind: '',
			name: `Departure from ${next.departure.port}`,
			before: { start: prev.departure.at, end: prev.departure.at },
			after: { start: next.departure.at, end: next.departure.at }
		});
	for (const i of next.items) {
		const p = before.get(i.key);
		const listed = LISTED.has(i.kind);
		if (!p) {
			if (listed) changes.push({ type: 'added', kind: i.kind, name: i.name, after: span(i) });
			else unlisted = true;
		} else if (calendar.whereWhen(p) !== calendar.whereWhen(i)) {
			if (listed)
				changes.push({
					type: 'moved',
					kind: i.kind,
					name: i.name,
					before: span(p),
					after: span(i)
				});
			else unlisted = true;
		} else if (p.title !== i.title || p.description !== i.description) unlisted = true;
	}
	for (const p of prev.items)
		if (!after.has(p.key)) {
			if (LISTED.has(p.kind))
				changes.push({ type: 'removed', kind: p.kind, name: p.name, before: span(p) });
			else unlisted = true;
		}
	if (prev.return.at !== next.return.at || prev.return.port !== next.return.port)
		changes.push({
			type: 'return',
			kind: '',
			name: `Return to ${next.return.port}`,
			before: { start: prev.return.at, end: prev.return.at },
			after: { start: next.return.at, end: next.return.at }
		});
	if (unlisted && changes.length === 0)
		changes.push({ type: 'other', kind: '', name: 'Transits, legs or wording of the schedule' });
	return { changed: changes.length > 0, changes };
}

function cruiseLink(cruiseId: string) {
	return `${config.origin}/cruises/${cruiseId}/schedule`;
}

export interface Preview {
	/** The number this publication would get. */
	version: number;
	previousVersion: number | null;
	changed: boolean;
	changes: Change[];
	recipients: Recipient[];
	mail: templates.Mail;
}

function prepare(cruiseId: string, now: number, d: Reader) {
	const prevRow = latestRow(cruiseId, d);
	const prev = (prevRow?.snapshot as Snapshot | undefined) ?? null;
	const next = current(cruiseId, prev, now, d);
	const { changed, changes } = diff(prev, next);
	const version = (prevRow?.version ?? 0) + 1;
	const mail = templates.schedulePublished({
		snapshot: next,
		version,
		previousVersion: prevRow?.version ?? null,
		changes,
		link: cruiseLink(cruiseId)
	});
	return { prevRow, next, changed, changes, version, mail };
}

/** What publishing now would send, and to whom; writes nothing. */
export function preview(cruiseId: string, now = Date.now(), d: Reader = appDb): Preview {
	const p = prepare(cruiseId, now, d);
	return {
		version: p.version,
		previousVersion: p.prevRow?.version ?? null,
		changed: p.changed,
		changes: p.changes,
		recipients: recipients(cruiseId, d),
		mail: p.mail
	};
}

export interface Published {
	version: number;
	changed: boolean;
	recipients: string[];
	changes: Change[];
}

/**
 * Publishes the schedule as the next version and queues one mail per recipient, all in one
 * transaction (a second click or a concurrent publish finds nothing changed and sends nothing).
 */
export function publish(actorId: string, cruiseId: string, now = Date.now(), d: Db = appDb) {
	return d.transaction((tx): Published => {
		const p = prepare(cruiseId, now, tx);
		if (!p.changed)
			return { version: p.prevRow!.version, changed: false, recipients: [], changes: [] };
		const people = recipients(cruiseId, tx);
		const id = newId();
		tx.insert(scheduleVersion)
			.values({
				id,
				cruiseId,
				version: p.version,
				publishedById: actorId,
				publishedAt: new Date(now),
				snapshot: p.next,
				changes: p.changes,
				recipientCount: people.length
			})
			.run();
		const ics = calendar.render(
			cruiseId,
			p.next.code,
			p.next.items,
			new Map(p.next.items.map((i) => [i.key, i.sequence])),
			now
		);
		for (const r of people)
			notices.send(tx, {
				kind: 'schedule',
				userId: r.userId,
				cruiseId,
				subject: p.mail.subject,
				text: p.mail.text,
				html: p.mail.html,
				ics,
				dedupeKey: `schedule:${id}:${r.userId}`
			});
		audit(tx, {
			userId: actorId,
			cruiseId,
			action: 'schedule.published',
			detail: { version: p.version, recipients: people.length, changes: p.changes.length }
		});
		return {
			version: p.version,
			changed: true,
			recipients: people.map((r) => r.email),
			changes: p.changes
		};
	});
}

export interface VersionView {
	version: number;
	publishedAt: string;
	publishedBy: string | null;
	recipientCount: number;
	departureAt: string;
	returnAt: string;
	changes: Change[];
}

/** The published versions, newest first, with their times. */
export function versions(cruiseId: string, d: Reader = appDb): VersionView[] {
	const rows = d
		.select()
		.from(scheduleVersion)
		.where(eq(scheduleVersion.cruiseId, cruiseId))
		.orderBy(desc(scheduleVersion.version))
		.all();
	const ids = [...new Set(rows.map((r) => r.publishedById).filter((x): x is string => !!x))];
	const names = new Map(
		ids.length
			? d
					.select({ id: user.id, name: user.name })
					.from(user)
					.where(inArray(user.id, ids))
					.orderBy(asc(user.name))
					.all()
					.map((u) => [u.id, u.name])
			: []
	);
	return rows.map((r) => {
		const s = r.snapshot as Snapshot;
		return {
			version: r.version,
			publishedAt: r.publishedAt.toISOString(),
			publishedBy: r.publishedById ? (names.get(r.publishedById) ?? null) : null,
			recipientCount: r.recipientCount,
			departureAt: new Date(s.departure.at).toISOString(),
			returnAt: new Date(s.return.at).toISOString(),
			changes: r.changes as Change[]
		};
	});
}

/** The calendar as it stands, SEQUENCE numbers from the published versions; writes nothing. */
export function calendarText(cruiseId: string, now = Date.now(), d: Reader = appDb): string {
	return calendar.ics(cruiseId, publishedItems(cruiseId, d), now, d);
}
