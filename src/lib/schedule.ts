// Shaping a built timeline for people: legs port to port, the day-by-day table, stable event keys
// and times in UTC beside ship's local time. Pure: the browser and the server both use it. All the
// timing itself is in engine/timeline.ts.
import { SIZES } from '$lib/engine/limits';
import type { Timeline, TimelineEvent, TimelineInput, TimelineItem } from './engine/timeline';

const DAY_MS = 86_400_000;
const H_MS = 3_600_000;

export const utcDay = (ms: number) => Math.floor(ms / DAY_MS) * DAY_MS;

/** The same day of the month `months` earlier, in UTC; clamped to that month's last day. */
export function monthsBefore(ms: number, months: number): number {
	const d = new Date(ms);
	const y = d.getUTCFullYear();
	const m = d.getUTCMonth() - months;
	const last = new Date(Date.UTC(y, m + 1, 0)).getUTCDate();
	return Date.UTC(y, m, Math.min(d.getUTCDate(), last));
}

/** Back alongside at home: the end of the weather margin, before demobilisation. */
export function returnAt(t: Timeline): number {
	const sea = t.events.filter((e) => e.kind !== 'demobilisation' && e.kind !== 'mobilisation');
	return sea.length ? sea[sea.length - 1].end : 0;
}

/**
 * A key per event that survives reordering, so calendar UIDs stay put: items by their plan item,
 * a transit by where it goes, turns by the line they lead onto.
 */
export function eventKeys(events: readonly TimelineEvent[]): string[] {
	return events.map((e, i) => {
		if (e.kind === 'transit') {
			const next = events.slice(i + 1).find((x) => x.refId && x.kind !== 'turn');
			return `transit-${next?.refId ?? 'home'}`;
		}
		if (e.refId) return `${e.kind}-${e.refId}`;
		return e.kind;
	});
}

export interface LegSpan {
	seq: number;
	from: string;
	to: string;
	start: number;
	end: number;
}

/** Legs run port to port: from sailing to each port call, and on to the return (margin included). */
export function legSpans(
	t: Timeline,
	input: Pick<TimelineInput, 'departure' | 'arrival'>
): LegSpan[] {
	const out: LegSpan[] = [];
	let from = input.departure.name;
	let start = input.departure.at;
	for (const e of t.events) {
		if (e.kind !== 'port') continue;
		const to = e.name.replace(/^Port call, /, '');
		out.push({ seq: out.length + 1, from, to, start, end: e.start });
		from = to;
		start = e.end;
	}
	out.push({ seq: out.length + 1, from, to: input.arrival.name, start, end: returnAt(t) });
	return out;
}

/** The engine's items in a new order, each line run the way the order says. */
export function arrange(
	items: readonly TimelineItem[],
	order: readonly { id: string; reversed: boolean }[]
): TimelineItem[] {
	const byId = new Map(items.map((i) => [i.id, i]));
	const out: TimelineItem[] = [];
	for (const o of order) {
		const it = byId.get(o.id);
		if (it) out.push(it.kind === 'line' ? { ...it, reversed: o.reversed } : it);
	}
	return out;
}

export type Category = 'science' | 'transit' | 'port' | 'margin' | 'alongside';

export const CATEGORY: Record<TimelineEvent['kind'], Category> = {
	line: 'science',
	station: 'science',
	turn: 'science',
	transit: 'transit',
	port: 'port',
	margin: 'margin',
	mobilisation: 'alongside',
	demobilisation: 'alongside'
};

export const CATEGORY_LABELS: Record<Category, string> = {
	science: 'Science',
	transit: 'Transit',
	port: 'Port call',
	margin: 'Weather margin',
	alongside: 'Alongside (mob./demob.)'
};

export interface DayRow {
	/** UTC midnight of the day. */
	day: number;
	/** 1-based operating day, or null for days alongside before sailing or after return. */
	operatingDay: number | null;
	hours: Record<Category, number>;
	/** Lines, stations and port calls worked on this day, in order. */
	work: string[];
	/** Ship's clock at the start of the day (minutes from UTC). */
	offsetMinutes: number;
}

/**
 * One row per UTC calendar day the timeline touches, hours per category summing to 24 at sea;
 * at most SIZES.timelineDays rows.
 */
export function dayRows(
	t: Timeline,
	input: Pick<TimelineInput, 'departure' | 'clockChanges'>
): DayRow[] {
	const departureAt = input.departure.at;
	const changes = [...(input.clockChanges ?? [])].sort((a, b) => a.at - b.at);
	if (!t.events.length) return [];
	const first = utcDay(Math.min(...t.events.map((e) => e.start)));
	const lastEnd = Math.max(...t.events.map((e) => e.end));
	const sailDay = utcDay(departureAt);
	const home = returnAt(t);
	const out: DayRow[] = [];
	// At most the shared limit of rows, however long a plan runs (its totals say how long).
	const stop = Math.min(lastEnd, first + SIZES.timelineDays * DAY_MS);
	for (let day = first; day < stop; day += DAY_MS) {
		const next = day + DAY_MS;
		const hours: Record<Category, number> = {
			science: 0,
			transit: 0,
			port: 0,
			margin: 0,
			alongside: 0
		};
		const work: string[] = [];
		let offsetMinutes = input.departure.utcOffsetMinutes ?? 0;
		for (const c of changes) if (c.at <= day) offsetMinutes = c.utcOffsetMinutes;
		for (const e of t.events) {
			const overlap = Math.min(e.end, next) - Math.max(e.start, day);
			if (overlap <= 0) continue;
			hours[CATEGORY[e.kind]] += overlap / H_MS;
			if (
				(e.kind === 'line' || e.kind === 'station' || e.kind === 'port') &&
				!work.includes(e.name)
			)
				work.push(e.name);
		}
		const atSea = next > departureAt && day < home;
		out.push({
			day,
			operatingDay: atSea ? Math.round((day - sailDay) / DAY_MS) + 1 : null,
			hours,
			work,
			offsetMinutes
		});
	}
	return out;
}

const pad = (n: number) => String(n).padStart(2, '0');

/** "2027-05-03 08:00" in the given clock. */
export function clock(ms: number, offsetMinutes = 0): string {
	const d = new Date(ms + offsetMinutes * 60_000);
	return `${d.getUTCFullYear()}-${pad(d.getUTCMonth() + 1)}-${pad(d.getUTCDate())} ${pad(d.getUTCHours())}:${pad(d.getUTCMinutes())}`;
}

/** "UTC−10", "UTC+5:30", "UTC". */
export function offsetLabel(offsetMinutes: number): string {
	if (offsetMinutes === 0) return 'UTC';
	const sign = offsetMinutes < 0 ? '−' : '+';
	const a = Math.abs(offsetMinutes);
	return `UTC${sign}${Math.floor(a / 60)}${a % 60 ? ':' + pad(a % 60) : ''}`;
}

/** The warning when the plan ends after the allocated return of the cruise settings, or null. */
export function windowWarning(
	backInPortAt: number,
	allocatedReturnAt: number | null
): string | null {
	if (allocatedReturnAt == null || backInPortAt <= allocatedReturnAt) return null;
	const h = (backInPortAt - allocatedReturnAt) / H_MS;
	return `The plan is back in port ${clock(backInPortAt)} UTC, ${h.toFixed(1)} h after the allocated return (${clock(allocatedReturnAt)} UTC, from the cruise settings).`;
}

/** "3 d 4.5 h" style durations for the budget. */
export function days(h: number): string {
	return `${(h / 24).toFixed(2)} d`;
}

export function money(minor: number, currency: string): string {
	return new Intl.NumberFormat('en', {
		style: 'currency',
		currency,
		maximumFractionDigits: 0
	}).format(minor / 100);
}
