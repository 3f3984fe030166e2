// The schedule as an iCalendar file (RFC 5545): timed events in UTC, the legs and the checklist as
// all-day items whose DTEND is the day after the last (exclusive, RFC 5545 §3.6.1). Each item keeps
// its UID across exports; its SEQUENCE is raised whenever what it says changes (§3.8.7.4), so
// calendars that already hold it update it instead of adding a copy.
import { createHash } from 'node:crypto';
import { and, eq } from 'drizzle-orm';
import { createEvents, type DateArray, type EventAttributes } from 'ics';
import { formatLatLon } from '../engine/formats/coordinates';
import * as clearances from './clearances';
import { db as appDb } from './db';
import type { Db } from './db/client';
import { calendarEntry } from './db/schema';
import * as deadlines from './deadlines';
import * as timelines from './timeline';

type Writer = Pick<Db, 'select' | 'insert' | 'update' | 'delete' | 'transaction'>;

export interface CalendarItem {
	key: string;
	title: string;
	description: string;
	location?: string;
	/** Timed: UTC instants (ms). All-day: first and last day, inclusive, as UTC midnights. */
	start: number;
	end: number;
	allDay: boolean;
}

const DAY_MS = 86_400_000;
const KIND_WORD: Record<string, string> = {
	mobilisation: 'Mobilisation',
	transit: 'Transit',
	line: 'Survey line',
	turn: 'Turn',
	station: 'Station',
	port: 'Port call',
	margin: 'Weather margin',
	demobilisation: 'Demobilisation'
};

const at = (p?: readonly number[]) =>
	p ? formatLatLon(p[1], p[0], 'dmm', { decimals: 2 }) : undefined;

/** Everything the calendar holds for a cruise, with stable keys. Turns are left out (too small). */
export function items(
	cruiseId: string,
	now = Date.now(),
	d: Pick<Db, 'select'> = appDb
): CalendarItem[] {
	const built = timelines.build(cruiseId, d);
	const code = built.data.cruise.code;
	const out: CalendarItem[] = [];
	const t = built.timeline;
	if (t) {
		const keys = timelines.eventKeys(t.events);
		t.events.forEach((e, i) => {
			if (e.kind === 'turn') return;
			const lines = [
				`${KIND_WORD[e.kind]} · ${e.durationH.toFixed(1)} h`,
				e.distanceNm != null ? `${e.distanceNm.toFixed(1)} nm` : '',
				`Ship's clock UTC${e.localOffsetMinutes >= 0 ? '+' : '−'}${Math.abs(e.localOffsetMinutes / 60)}`
			].filter(Boolean);
			out.push({
				key: keys[i],
				title: `${code}: ${e.name}`,
				description: lines.join('\n'),
				location: e.kind === 'transit' ? undefined : at(e.from),
				start: e.start,
				end: e.end,
				allDay: false
			});
		});
		for (const l of timelines.legSpans(t, built.data))
			out.push({
				key: `leg-${l.seq}`,
				title: `${code} leg ${l.seq}: ${l.from} → ${l.to}`,
				description: `At sea from ${new Date(l.start).toISOString().slice(0, 16)} UTC to ${new Date(l.end).toISOString().slice(0, 16)} UTC`,
				start: clearances.utcDay(l.start),
				end: clearances.utcDay(l.end - 1),
				allDay: true
			});
	}
	const cl = clearances.list(cruiseId, built, now, d);
	const returnAt = t ? timelines.returnAt(t) : (built.data.cruise.returnAt?.getTime() ?? null);
	const checklist = deadlines.list(
		cruiseId,
		{ sailingAt: built.data.input?.departure.at ?? null, returnAt },
		cl,
		now,
		d
	);
	for (const x of checklist)
		if (x.dueAt != null)
			out.push({
				key: `deadline-${x.id}`,
				title: `${code} due: ${x.title}`,
				description: `${deadlines.KIND_LABELS[x.kind]} · ${x.rule}${x.done ? ' · done' : ''}`,
				start: x.dueAt,
				end: x.dueAt,
				allDay: true
			});
	return out;
}

function digest(i: CalendarItem): string {
	return createHash('sha256')
		.update(JSON.stringify([i.title, i.description, i.location ?? '', i.start, i.end, i.allDay]))
		.digest('hex');
}

/**
 * Records what is exported: a new item starts at SEQUENCE 0, a changed one goes up by one, an
 * unchanged one keeps its number. Returns the sequence per key.
 */
export function sequences(
	cruiseId: string,
	list: CalendarItem[],
	d: Writer = appDb
): Map<string, number> {
	const out = new Map<string, number>();
	d.transaction((tx) => {
		for (const i of list) {
			const dg = digest(i);
			const row = tx
				.select()
				.from(calendarEntry)
				.where(and(eq(calendarEntry.cruiseId, cruiseId), eq(calendarEntry.key, i.key)))
				.get();
			if (!row) {
				tx.insert(calendarEntry).values({ cruiseId, key: i.key, digest: dg, sequence: 0 }).run();
				out.set(i.key, 0);
			} else if (row.digest !== dg) {
				tx.update(calendarEntry)
					.set({ digest: dg, sequence: row.sequence + 1, updatedAt: new Date() })
					.where(and(eq(calendarEntry.cruiseId, cruiseId), eq(calendarEntry.key, i.key)))
					.run();
				out.set(i.key, row.sequence + 1);
			} else out.set(i.key, row.sequence);
		}
	});
	return out;
}

const dateArray = (ms: number): DateArray => {
	const d = new Date(ms);
	return [d.getUTCFullYear(), d.getUTCMonth() + 1, d.getUTCDate()];
};

export function uid(cruiseId: string, key: string) {
	return `${key}.${cruiseId}@wakeline`;
}

/** The iCalendar text for a cruise's schedule. */
export function ics(cruiseId: string, now = Date.now(), d: Writer = appDb): string {
	const list = items(cruiseId, now, d);
	const seq = sequences(cruiseId, list, d);
	const code = timelines.load(cruiseId, d).cruise.code;
	const events: EventAttributes[] = list.map((i) => {
		const common = {
			uid: uid(cruiseId, i.key),
			sequence: seq.get(i.key) ?? 0,
			title: i.title,
			description: i.description,
			...(i.location ? { location: i.location } : {}),
			productId: 'wakeline/schedule'
		};
		return i.allDay
			? { ...common, start: dateArray(i.start), end: dateArray(i.end + DAY_MS) }
			: {
					...common,
					start: Math.round(i.start / 1000) * 1000,
					startInputType: 'utc',
					startOutputType: 'utc',
					end: Math.round(i.end / 1000) * 1000,
					endInputType: 'utc',
					endOutputType: 'utc'
				};
	});
	const { error, value } = createEvents(events, {
		productId: 'wakeline/schedule',
		method: 'PUBLISH',
		calName: `${code} schedule`
	});
	if (error || !value) throw error ?? new Error('The calendar could not be written.');
	return value;
}
