/**
 * The cruise timeline: port → lines and stations → port, in order, with transit at transit speed
 * along geodesics, turns between consecutive lines, station and port-call durations, mobilisation,
 * demobilisation and the weather margin kept apart from science time; then operating days and
 * ship-time cost against the allocation, and what to cut when it does not fit.
 *
 * Times are UTC epoch milliseconds; distances metres inside, nautical miles at the edge.
 */
import { distanceM, lineLengthM, type LonLat } from './geodesy';
import { hoursAt, kmToNm } from './time';
const H_MS = 3_600_000;
const DAY_MS = 86_400_000;

export type EventKind =
	'mobilisation' | 'transit' | 'line' | 'turn' | 'station' | 'port' | 'margin' | 'demobilisation';

export type TimelineItem =
	| {
			kind: 'line';
			id: string;
			name: string;
			/** Vertices in the planned running direction unless `reversed`. */
			coords: readonly LonLat[];
			reversed?: boolean;
			surveySpeedKn: number;
	  }
	| { kind: 'station'; id: string; name: string; position: LonLat; durationH: number }
	| {
			kind: 'port_call';
			id: string;
			name: string;
			position: LonLat;
			durationH: number;
	  };

export interface ClockChange {
	/** UTC instant at which the ship's clock changes. */
	at: number;
	/** The ship's offset from UTC from then on, in minutes. */
	utcOffsetMinutes: number;
}

export interface TimelineInput {
	departure: { name: string; position: LonLat; at: number; utcOffsetMinutes?: number };
	arrival: { name: string; position: LonLat };
	items: readonly TimelineItem[];
	transitSpeedKn: number;
	/** Time to turn between two consecutive survey lines (hours). */
	turnH?: number;
	mobilisationH?: number;
	demobilisationH?: number;
	/** Weather margin: a share of the sea time, or a fixed number of days. */
	margin?: { pct: number } | { days: number };
	allocatedDays?: number;
	dayRateMinor?: number;
	currency?: string;
	/** Ship's clock changes, in time order; before the first, the departure port's offset applies. */
	clockChanges?: readonly ClockChange[];
}

export interface TimelineEvent {
	kind: EventKind;
	name: string;
	refId?: string;
	start: number;
	end: number;
	durationH: number;
	distanceNm?: number;
	/** Ship's clock offset from UTC at the start of the event, minutes. */
	localOffsetMinutes: number;
	from?: LonLat;
	to?: LonLat;
}

export interface CutSuggestion {
	refId: string;
	name: string;
	kind: 'line' | 'station';
	hours: number;
}

export interface TimelineTotals {
	/** Calendar days (UTC), whole or part, away from the departure port: the billing unit. */
	operatingDays: number;
	allocatedDays: number;
	marginDays: number;
	scienceH: number;
	transitH: number;
	portH: number;
	seaDays: number;
	cost: { amountMinor: number; currency: string };
	/** Days over the allocation (0 when it fits). */
	overrunDays: number;
	/** True when science and transit alone already use the margin's days. */
	intoMargin: boolean;
}

export interface Timeline {
	events: TimelineEvent[];
	totals: TimelineTotals;
	warnings: string[];
	/** What to leave out, longest first, to fit the allocation (empty when it fits). */
	cuts: CutSuggestion[];
}

/**
 * The weather-margin rule, stated once and used everywhere: a share of the sea time — survey lines,
 * turns, stations, transits and port calls, from sailing to the arrival home — or a fixed number of
 * days. The margin is added after the arrival and kept apart from science.
 */
export const WEATHER_MARGIN_RULE =
	'The weather margin is a share of the sea time (lines, turns, stations, transits and port calls, from sailing to the arrival home) or a fixed number of days; it is added after the arrival and never planned for science.';

export function weatherMarginH(seaH: number, margin: TimelineInput['margin']): number {
	const m = margin ?? { pct: 0 };
	return 'pct' in m ? (seaH * m.pct) / 100 : m.days * 24;
}

/**
 * Operating days: every calendar day, whole or part, between leaving and returning (SCIENCE.md §6,
 * trade practice). Days are counted in the given clock (minutes from UTC; 0 = UTC). An arrival at
 * exactly midnight does not open a new day.
 */
export function operatingDays(startMs: number, endMs: number, utcOffsetMinutes = 0): number {
	if (!(endMs > startMs)) return 0;
	const shift = utcOffsetMinutes * 60_000;
	const firstDay = Math.floor((startMs + shift) / DAY_MS);
	const lastDay = Math.ceil((endMs + shift) / DAY_MS) - 1;
	return lastDay - firstDay + 1;
}

function offsetAt(t: number, base: number, changes: readonly ClockChange[]): number {
	let off = base;
	for (const c of changes) if (c.at <= t) off = c.utcOffsetMinutes;
	return off;
}

function lineEnds(item: Extract<TimelineItem, { kind: 'line' }>): [LonLat, LonLat] {
	const a = item.coords[0];
	const b = item.coords[item.coords.length - 1];
	return item.reversed ? [b, a] : [a, b];
}

export function buildTimeline(input: TimelineInput): Timeline {
	const changes = [...(input.clockChanges ?? [])].sort((a, b) => a.at - b.at);
	const baseOffset = input.departure.utcOffsetMinutes ?? 0;
	const events: TimelineEvent[] = [];
	let t = input.departure.at;
	const push = (e: Omit<TimelineEvent, 'localOffsetMinutes' | 'start' | 'end'>) => {
		const start = t;
		const end = start + e.durationH * H_MS;
		events.push({ ...e, start, end, localOffsetMinutes: offsetAt(start, baseOffset, changes) });
		t = end;
	};

	if (input.mobilisationH && input.mobilisationH > 0) {
		// Mobilisation happens alongside before sailing, so it ends at the departure time.
		const start = input.departure.at - input.mobilisationH * H_MS;
		events.push({
			kind: 'mobilisation',
			name: `Mobilisation, ${input.departure.name}`,
			start,
			end: input.departure.at,
			durationH: input.mobilisationH,
			localOffsetMinutes: baseOffset
		});
	}

	let here: LonLat = input.departure.position;
	let previousWasLine = false;
	const transitTo = (to: LonLat, name: string) => {
		const d = distanceM(here, to);
		if (d < 1) return;
		push({
			kind: 'transit',
			name,
			durationH: hoursAt(d / 1000, input.transitSpeedKn),
			distanceNm: kmToNm(d / 1000),
			from: here,
			to
		});
		here = to;
	};

	for (const item of input.items) {
		if (item.kind === 'line') {
			const [a, b] = lineEnds(item);
			if (previousWasLine && (input.turnH ?? 0) > 0)
				push({
					kind: 'turn',
					name: `Turn onto ${item.name}`,
					durationH: input.turnH!,
					refId: item.id
				});
			transitTo(a, `Transit to ${item.name}`);
			const coords = item.reversed ? [...item.coords].reverse() : item.coords;
			const len = lineLengthM(coords);
			push({
				kind: 'line',
				name: item.name,
				refId: item.id,
				durationH: hoursAt(len / 1000, item.surveySpeedKn),
				distanceNm: kmToNm(len / 1000),
				from: a,
				to: b
			});
			here = b;
			previousWasLine = true;
		} else {
			transitTo(item.position, `Transit to ${item.name}`);
			push({
				kind: item.kind === 'port_call' ? 'port' : 'station',
				name: item.name,
				refId: item.id,
				durationH: item.durationH,
				from: item.position,
				to: item.position
			});
			previousWasLine = false;
		}
	}
	transitTo(input.arrival.position, `Transit to ${input.arrival.name}`);

	const sum = (k: EventKind[]) =>
		events.filter((e) => k.includes(e.kind)).reduce((s, e) => s + e.durationH, 0);
	const scienceH = sum(['line', 'station', 'turn']);
	const transitH = sum(['transit']);
	const portH = sum(['port']);
	const seaH = scienceH + transitH + portH;

	const marginH = weatherMarginH(seaH, input.margin);
	if (marginH > 0) push({ kind: 'margin', name: 'Weather margin', durationH: marginH });
	const returnAt = t;
	if (input.demobilisationH && input.demobilisationH > 0)
		push({
			kind: 'demobilisation',
			name: `Demobilisation, ${input.arrival.name}`,
			durationH: input.demobilisationH
		});

	const opDays = operatingDays(input.departure.at, returnAt);
	const allocated = input.allocatedDays ?? 0;
	const currency = input.currency ?? 'EUR';
	const overrunDays = allocated > 0 ? Math.max(0, opDays - allocated) : 0;
	const withoutMarginDays = operatingDays(input.departure.at, returnAt - marginH * H_MS);
	const intoMargin =
		allocated > 0 && withoutMarginDays + marginH / 24 > allocated && withoutMarginDays <= allocated;

	const warnings: string[] = [];
	if (allocated > 0 && withoutMarginDays > allocated)
		warnings.push(
			`Science and transit alone need ${withoutMarginDays} operating days, more than the ${allocated} allocated, before any weather margin.`
		);
	else if (overrunDays > 0)
		warnings.push(
			`The plan needs ${opDays} operating days with its weather margin, ${overrunDays} more than the ${allocated} allocated: science is eating into the margin.`
		);

	const cuts = overrunDays > 0 ? suggestCuts(events, overrunDays * 24) : [];
	return {
		events,
		warnings,
		cuts,
		totals: {
			operatingDays: opDays,
			allocatedDays: allocated,
			marginDays: marginH / 24,
			scienceH,
			transitH,
			portH,
			seaDays: seaH / 24,
			cost: { amountMinor: Math.round(opDays * (input.dayRateMinor ?? 0)), currency },
			overrunDays,
			intoMargin
		}
	};
}

/** Longest science items first until their hours cover the overrun. A suggestion, not a plan. */
export function suggestCuts(events: readonly TimelineEvent[], overrunH: number): CutSuggestion[] {
	const candidates = events
		.filter((e) => (e.kind === 'line' || e.kind === 'station') && e.refId)
		.map((e) => ({
			refId: e.refId!,
			name: e.name,
			kind: e.kind as 'line' | 'station',
			hours: e.durationH
		}))
		.sort((a, b) => b.hours - a.hours);
	const out: CutSuggestion[] = [];
	let saved = 0;
	for (const c of candidates) {
		if (saved >= overrunH) break;
		out.push(c);
		saved += c.hours;
	}
	return out;
}

// ---------------------------------------------------------------- shortest transit

export interface OrderableItem {
	id: string;
	/** Lines have two ends and may be run either way; points have one. */
	ends: [LonLat, LonLat] | [LonLat];
	/** Port calls keep their place: items are only reordered between fixed ones. */
	fixed?: boolean;
}

export interface OrderedItem {
	id: string;
	reversed: boolean;
}

/**
 * An order (and line directions) with short total transit: nearest neighbour from the start, then
 * 2-opt moves with direction flips, within each stretch between fixed items. Heuristic, not optimal.
 */
export function shortestTransitOrder(
	start: LonLat,
	end: LonLat,
	items: readonly OrderableItem[]
): OrderedItem[] {
	const out: OrderedItem[] = [];
	let from = start;
	let stretch: OrderableItem[] = [];
	const flush = (to: LonLat) => {
		const ordered = orderStretch(from, to, stretch);
		out.push(...ordered);
		if (ordered.length) {
			const last = ordered[ordered.length - 1];
			const item = stretch.find((s) => s.id === last.id)!;
			from = exitOf(item, last.reversed);
		}
		stretch = [];
	};
	for (const item of items) {
		if (item.fixed) {
			flush(item.ends[0]);
			out.push({ id: item.id, reversed: false });
			from = item.ends[item.ends.length - 1];
		} else stretch.push(item);
	}
	flush(end);
	return out;
}

const entryOf = (it: OrderableItem, reversed: boolean): LonLat =>
	it.ends.length === 2 && reversed ? it.ends[1] : it.ends[0];
const exitOf = (it: OrderableItem, reversed: boolean): LonLat =>
	it.ends.length === 2 ? (reversed ? it.ends[0] : it.ends[1]) : it.ends[0];

/** Total transit (m) of a route through the items in this order and direction. */
export function transitLengthM(
	start: LonLat,
	end: LonLat,
	items: readonly OrderableItem[],
	order: readonly OrderedItem[]
): number {
	const byId = new Map(items.map((i) => [i.id, i]));
	let here = start;
	let total = 0;
	for (const o of order) {
		const it = byId.get(o.id)!;
		total += distanceM(here, entryOf(it, o.reversed));
		here = exitOf(it, o.reversed);
	}
	return total + distanceM(here, end);
}

function orderStretch(start: LonLat, end: LonLat, items: OrderableItem[]): OrderedItem[] {
	if (items.length === 0) return [];
	// Nearest neighbour, choosing each line's nearer end as its entry.
	const left = new Set(items.map((_, i) => i));
	const route: OrderedItem[] = [];
	let here = start;
	while (left.size) {
		let best = -1;
		let bestRev = false;
		let bestD = Infinity;
		for (const i of left) {
			for (const rev of items[i].ends.length === 2 ? [false, true] : [false]) {
				const d = distanceM(here, entryOf(items[i], rev));
				if (d < bestD) [best, bestRev, bestD] = [i, rev, d];
			}
		}
		left.delete(best);
		route.push({ id: items[best].id, reversed: bestRev });
		here = exitOf(items[best], bestRev);
	}
	// 2-opt: reverse a run of the route (which also flips each line in it) while that shortens it.
	let bestLen = transitLengthM(start, end, items, route);
	for (let improved = true, rounds = 0; improved && rounds < 50; rounds++) {
		improved = false;
		for (let i = 0; i < route.length - 1; i++) {
			for (let j = i + 1; j < route.length; j++) {
				const candidate = [
					...route.slice(0, i),
					...route
						.slice(i, j + 1)
						.reverse()
						.map((o) => ({ id: o.id, reversed: !o.reversed })),
					...route.slice(j + 1)
				];
				const len = transitLengthM(start, end, items, candidate);
				if (len < bestLen - 1e-6) {
					route.splice(0, route.length, ...candidate);
					bestLen = len;
					improved = true;
				}
			}
		}
		// Single flips of a line's direction.
		for (let i = 0; i < route.length; i++) {
			const it = items.find((x) => x.id === route[i].id)!;
			if (it.ends.length !== 2) continue;
			const candidate = route.map((o, k) => (k === i ? { ...o, reversed: !o.reversed } : o));
			const len = transitLengthM(start, end, items, candidate);
			if (len < bestLen - 1e-6) {
				route.splice(0, route.length, ...candidate);
				bestLen = len;
				improved = true;
			}
		}
	}
	// Points have no direction: report them unreversed.
	return route.map((o) => ({
		id: o.id,
		reversed: items.find((x) => x.id === o.id)!.ends.length === 2 ? o.reversed : false
	}));
}

// ---------------------------------------------------------------- joining the order

export interface Insertion {
	/** Insert before this index of the route (route.length: at the end). */
	index: number;
	/** The block in the order and directions it should run. */
	items: OrderedItem[];
	/** Transit added by the insertion, metres. */
	addedM: number;
}

/** A block's inner directions: each line entered at the end nearer to where the last one left. */
function blockDirections(block: readonly OrderableItem[]): OrderedItem[] {
	const out: OrderedItem[] = [];
	let here: LonLat | null = null;
	for (const it of block) {
		let reversed = false;
		if (here && it.ends.length === 2)
			reversed = distanceM(here, it.ends[1]) < distanceM(here, it.ends[0]);
		out.push({ id: it.id, reversed });
		here = exitOf(it, reversed);
	}
	return out;
}

/**
 * Cheapest insertion (Rosenkrantz, Stearns & Lewis 1977, SIAM J. Comput. 6, 563): the place in the
 * route where a new item — or a block of items made together, kept together — lengthens the
 * transit least. The block may run either way round; `within` limits the places (e.g. next to
 * lines of the same survey area). Heuristic: it does not reorder what is already there.
 */
export function cheapestInsertion(
	start: LonLat,
	end: LonLat,
	route: readonly { item: OrderableItem; reversed: boolean }[],
	block: readonly OrderableItem[],
	within: [number, number] = [0, route.length]
): Insertion {
	const forward = blockDirections(block);
	const byId = new Map(block.map((b) => [b.id, b]));
	const backward = [...forward].reverse().map((o) => ({
		id: o.id,
		reversed: byId.get(o.id)!.ends.length === 2 ? !o.reversed : false
	}));
	const entry = (o: OrderedItem) => entryOf(byId.get(o.id)!, o.reversed);
	const exit = (o: OrderedItem) => exitOf(byId.get(o.id)!, o.reversed);
	let best: Insertion = { index: within[1], items: forward, addedM: Infinity };
	const lo = Math.max(0, within[0]);
	const hi = Math.min(route.length, within[1]);
	for (let i = lo; i <= hi; i++) {
		const prev = i === 0 ? start : exitOf(route[i - 1].item, route[i - 1].reversed);
		const next = i === route.length ? end : entryOf(route[i].item, route[i].reversed);
		const direct = distanceM(prev, next);
		for (const variant of [forward, backward]) {
			const added =
				distanceM(prev, entry(variant[0])) +
				distanceM(exit(variant[variant.length - 1]), next) -
				direct;
			if (added < best.addedM - 1e-6) best = { index: i, items: variant, addedM: added };
		}
	}
	return best;
}
