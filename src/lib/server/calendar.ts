// The schedule as an iCalendar file (RFC 5545): timed events in UTC, the legs and the checklist as
// all-day items whose DTEND is the day after the last (exclusive, RFC 5545 §3.6.1). Each item keeps
// its UID across exports and versions; its SEQUENCE (§3.8.7.4) comes from the published versions
// (publications.ts) and rises only when the item's time or place moves, so calendars that already
// hold it update it instead of adding a copy.
import { createEvents, type DateArray, type EventAttributes } from 'ics';
import { formatLatLon } from '../engine/formats/coordinates';
import * as clearances from './clearances';
import { db as appDb } from './db';
import type { Db } from './db/client';
import * as deadlines from './deadlines';
import * as timelines from './timeline';

export interface CalendarItem {
	key: string;
	/** The timeline event's kind (line, station, port, …), or 'leg' / 'deadline'. */
	kind: string;
	/** The plain name, e.g. "CTD-03" or "Port call, Bellmoor Harbour". */
	name: string;
	title: string;
	description: string;
	location?: string;
	/** Ship's clock at the start (minutes from UTC), for timed events. */
	offsetMinutes?: number;
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
				kind: e.kind,
				name: e.name,
				offsetMinutes: e.localOffsetMinutes,
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
				kind: 'leg',
				name: `Leg ${l.seq}: ${l.from} → ${l.to}`,
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
				kind: 'deadline',
				name: x.title,
				title: `${code} due: ${x.title}`,
				description: `${deadlines.KIND_LABELS[x.kind]} · ${x.rule}${x.done ? ' · done' : ''}`,
				start: x.dueAt,
				end: x.dueAt,
				allDay: true
			});
	return out;
}

/** What moves an event in a calendar: its time and its place (not its wording). */
export function whereWhen(i: Pick<CalendarItem, 'start' | 'end' | 'allDay' | 'location'>): string {
	// Whole seconds, as the calendar carries them: a shift a client cannot see is no move.
	const s = (ms: number) => Math.round(ms / 1000);
	return JSON.stringify([s(i.start), s(i.end), i.allDay, i.location ?? '']);
}

/** A calendar item as it went out in a published version, with its SEQUENCE. */
export interface PublishedItem extends CalendarItem {
	sequence: number;
}

/**
 * SEQUENCE numbers against the last published version: a new item starts at 0, one whose time or
 * place moved goes one above its published number, any other keeps it (RFC 5545 §3.8.7.4; a
 * change of wording alone is carried by the later DTSTAMP, RFC 5546 §2.1.5).
 */
export function sequencesAgainst(
	published: readonly PublishedItem[] | null,
	list: readonly CalendarItem[]
): Map<string, number> {
	const before = new Map((published ?? []).map((p) => [p.key, p]));
	const out = new Map<string, number>();
	for (const i of list) {
		const p = before.get(i.key);
		out.set(i.key, !p ? 0 : whereWhen(p) === whereWhen(i) ? p.sequence : p.sequence + 1);
	}
	return out;
}

const dateArray = (ms: number): DateArray => {
	const d = new Date(ms);
	return [d.getUTCFullYear(), d.getUTCMonth() + 1, d.getUTCDate()];
};

export function uid(cruiseId: string, key: string) {
	return `${key}.${cruiseId}@wakeline`;
}

/** The iCalendar text for the given items and SEQUENCE numbers, stamped at `stamp` (DTSTAMP). */
export function render(
	cruiseId: string,
	code: string,
	list: readonly CalendarItem[],
	seq: ReadonlyMap<string, number>,
	stamp: number
): string {
	const events: EventAttributes[] = list.map((i) => {
		const common = {
			uid: uid(cruiseId, i.key),
			sequence: seq.get(i.key) ?? 0,
			timestamp: stamp,
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

/**
 * The iCalendar text for a cruise's schedule as it stands now. Reading writes nothing: SEQUENCE
 * numbers come from the last published version (an item moved since then shows one above it).
 */
export function ics(
	cruiseId: string,
	published: readonly PublishedItem[] | null,
	now = Date.now(),
	d: Pick<Db, 'select'> = appDb
): string {
	const list = items(cruiseId, now, d);
	const code = timelines.build(cruiseId, d).data.cruise.code;
	return render(cruiseId, code, list, sequencesAgainst(published, list), now);
}
