// The cruise timeline on the server: the order of work as stored (plan items), assembled into the
// engine's input (engine/timeline.ts does all the timing), with station durations from plancompute.
// Reading functions take a database handle so the demo seed can use them inside its own connection.
import { and, asc, eq, inArray } from 'drizzle-orm';
import {
	buildTimeline,
	cheapestInsertion,
	type OrderableItem,
	type Timeline,
	type TimelineInput,
	type TimelineItem
} from '../engine/timeline';
import * as schedule from '../schedule';
import type { LegSpan } from '../schedule';
import { ApiError } from './api';
import { audit } from './audit';
import { db as appDb } from './db';
import type { Db } from './db/client';
import {
	clockChange,
	cruise,
	leg,
	planItem,
	port,
	ridgeSegment,
	station,
	surveyLine,
	vessel,
	type Cruise,
	type PlanItem,
	type Port,
	type Station,
	type SurveyLine
} from './db/schema';
import { deepFreeze } from '../freeze';
import { RevisionMemo } from './db/revision';
import { newId } from './ids';
import * as plancache from './plancache';
import type { planSettings } from './plancompute';

type LonLatRO = import('../engine/geodesy').LonLat;

type PlanRows = Parameters<typeof planSettings>[0] & {
	lines: SurveyLine[];
	stations: Station[];
};

export const DEFAULT_PORT_CALL_H = 36;

/** One entry of the order of work, as the order editor shows it. */
export interface OrderEntry {
	id: string;
	kind: PlanItem['kind'];
	refId: string;
	name: string;
	reversed: boolean;
	/** Line ends or the point, [lon, lat]. */
	ends: [number, number][];
	durationH: number | null;
	lengthNm: number | null;
	legSeq: number;
}

export interface Unordered {
	kind: 'line' | 'station';
	refId: string;
	name: string;
}

export interface TimelineData {
	cruise: Cruise;
	departurePort: Port | null;
	returnPort: Port | null;
	/** Null, with the reason in `missing`, until vessel, ports and sailing time are set. */
	input: TimelineInput | null;
	missing: string[];
	/** Things the timing could not account for. */
	notes: string[];
	order: OrderEntry[];
	unordered: Unordered[];
	ports: Port[];
	clockChanges: { id: string; at: number; utcOffsetMinutes: number; note: string | null }[];
}

type Reader = Pick<Db, 'select'>;

function planRows(d: Reader, c: Cruise): PlanRows {
	const v = c.vesselId
		? (d.select().from(vessel).where(eq(vessel.id, c.vesselId)).get() ?? null)
		: null;
	return {
		cruise: c,
		vessel: v,
		ridges: d.select().from(ridgeSegment).where(eq(ridgeSegment.cruiseId, c.id)).all(),
		lines: d
			.select()
			.from(surveyLine)
			.where(eq(surveyLine.cruiseId, c.id))
			.orderBy(asc(surveyLine.name))
			.all(),
		stations: d
			.select()
			.from(station)
			.where(eq(station.cruiseId, c.id))
			.orderBy(asc(station.name))
			.all()
	};
}

/** Everything the timeline needs, read once. */
export function load(cruiseId: string, d: Reader = appDb): TimelineData {
	const c = d.select().from(cruise).where(eq(cruise.id, cruiseId)).get();
	if (!c) throw new ApiError(404, 'No such cruise.');
	const rows = planRows(d, c);
	// Station durations per plan revision, shared with the plan endpoint's cache.
	const values = plancache.valuesSync(rows);
	const ports = d.select().from(port).orderBy(asc(port.name)).all();
	const portById = new Map(ports.map((p) => [p.id, p]));
	const lineById = new Map(rows.lines.map((l) => [l.id, l]));
	const stationById = new Map(rows.stations.map((s) => [s.id, s]));
	const items = d
		.select()
		.from(planItem)
		.where(eq(planItem.cruiseId, cruiseId))
		.orderBy(asc(planItem.seq))
		.all();

	const order: OrderEntry[] = [];
	const notes: string[] = [];
	const engineItems: TimelineItem[] = [];
	let legSeq = 1;
	for (const it of items) {
		if (it.kind === 'line' && it.lineId && lineById.has(it.lineId)) {
			const l = lineById.get(it.lineId)!;
			const ends = [l.coords[0], l.coords[l.coords.length - 1]];
			order.push({
				id: it.id,
				kind: 'line',
				refId: l.id,
				name: l.name,
				reversed: it.reversed,
				ends,
				durationH: null,
				lengthNm: null,
				legSeq
			});
			engineItems.push({
				kind: 'line',
				id: it.id,
				name: l.name,
				coords: l.coords,
				reversed: it.reversed,
				surveySpeedKn: l.surveySpeedKn
			});
		} else if (it.kind === 'station' && it.stationId && stationById.has(it.stationId)) {
			const s = stationById.get(it.stationId)!;
			const computed = values.stations[s.id]?.durationH ?? null;
			const durationH = computed ?? 0;
			if (computed == null)
				notes.push(`${s.name} has no predicted depth (no ridge segment), so it is timed at 0 h.`);
			order.push({
				id: it.id,
				kind: 'station',
				refId: s.id,
				name: s.name,
				reversed: false,
				ends: [[s.lon, s.lat]],
				durationH,
				lengthNm: null,
				legSeq
			});
			engineItems.push({
				kind: 'station',
				id: it.id,
				name: s.name,
				position: [s.lon, s.lat],
				durationH
			});
		} else if (it.kind === 'port_call' && it.portId && portById.has(it.portId)) {
			const p = portById.get(it.portId)!;
			const durationH = it.portCallHours ?? DEFAULT_PORT_CALL_H;
			order.push({
				id: it.id,
				kind: 'port_call',
				refId: p.id,
				name: `Port call, ${p.name}`,
				reversed: false,
				ends: [[p.lon, p.lat]],
				durationH,
				lengthNm: null,
				legSeq
			});
			engineItems.push({
				kind: 'port_call',
				id: it.id,
				name: `Port call, ${p.name}`,
				position: [p.lon, p.lat],
				durationH
			});
			legSeq++;
		}
	}
	const inOrder = new Set(items.map((i) => i.lineId ?? i.stationId));
	const unordered: Unordered[] = [
		...rows.lines
			.filter((l) => !inOrder.has(l.id))
			.map((l) => ({ kind: 'line' as const, refId: l.id, name: l.name })),
		...rows.stations
			.filter((s) => !inOrder.has(s.id))
			.map((s) => ({ kind: 'station' as const, refId: s.id, name: s.name }))
	];

	const changes = d
		.select()
		.from(clockChange)
		.where(eq(clockChange.cruiseId, cruiseId))
		.orderBy(asc(clockChange.at))
		.all()
		.map((x) => ({
			id: x.id,
			at: x.at.getTime(),
			utcOffsetMinutes: x.utcOffsetMinutes,
			note: x.note
		}));

	const dep = c.departurePortId ? (portById.get(c.departurePortId) ?? null) : null;
	const ret = c.returnPortId ? (portById.get(c.returnPortId) ?? null) : null;
	const missing: string[] = [];
	if (!rows.vessel) missing.push('a vessel');
	if (!dep) missing.push('a departure port');
	if (!ret) missing.push('a return port');
	if (!c.departureAt) missing.push('a departure time');

	const input: TimelineInput | null =
		missing.length === 0
			? {
					departure: {
						name: dep!.name,
						position: [dep!.lon, dep!.lat],
						at: c.departureAt!.getTime(),
						utcOffsetMinutes: dep!.utcOffsetMinutes
					},
					arrival: { name: ret!.name, position: [ret!.lon, ret!.lat] },
					items: engineItems,
					transitSpeedKn: rows.vessel!.transitSpeedKn,
					turnH: c.turnH,
					mobilisationH: c.mobilisationH,
					demobilisationH: c.demobilisationH,
					margin:
						c.weatherMarginDays != null
							? { days: c.weatherMarginDays }
							: { pct: c.weatherMarginPct },
					allocatedDays: c.allocatedDays,
					dayRateMinor: rows.vessel!.dayRateMinor,
					currency: rows.vessel!.currency,
					clockChanges: changes.map((x) => ({ at: x.at, utcOffsetMinutes: x.utcOffsetMinutes }))
				}
			: null;

	// Lengths and times of lines as the engine runs them, for the order editor.
	if (input) {
		const t = buildTimeline(input);
		for (const e of t.events) {
			const o = order.find((x) => x.id === e.refId);
			if (o && (e.kind === 'line' || e.kind === 'station' || e.kind === 'port')) {
				o.durationH = e.durationH;
				o.lengthNm = e.distanceNm ?? null;
			}
		}
	}

	return {
		cruise: c,
		departurePort: dep,
		returnPort: ret,
		input,
		missing,
		notes,
		order,
		unordered,
		ports,
		clockChanges: changes
	};
}

export interface Built {
	data: TimelineData;
	timeline: Timeline | null;
}

function compute(cruiseId: string, d: Reader): Built {
	const data = load(cruiseId, d);
	return { data, timeline: data.input ? buildTimeline(data.input) : null };
}

/**
 * Builds of the app's database, one per cruise and database revision: every page, export and API
 * answer of an unchanged plan shares one build (read-only: frozen, so a caller that would change it
 * fails loudly instead of changing it for the others).
 */
const builds = new RevisionMemo<Built>(64);

/** The cruise's timeline: its data as stored and the engine's timing of it. */
export function build(cruiseId: string, d: Reader = appDb): Built {
	if (d !== appDb) return compute(cruiseId, d);
	return builds.get(appDb, cruiseId, () => deepFreeze(compute(cruiseId, appDb)));
}

/**
 * The same, for request handlers: when the plan's station durations are not cached yet they are
 * computed in the engine pool (within its time budget) rather than on the event loop.
 */
export async function buildOffLoop(cruiseId: string): Promise<Built> {
	if (!builds.has(appDb, cruiseId)) {
		const c = appDb.select().from(cruise).where(eq(cruise.id, cruiseId)).get();
		if (!c) throw new ApiError(404, 'No such cruise.');
		await plancache.values(planRows(appDb, c));
	}
	return build(cruiseId);
}

export { eventKeys, returnAt } from '../schedule';

/** How the plan sits in its allocation: the figures every page and the plan API show. */
export interface Fit {
	operatingDays: number;
	allocatedDays: number;
	overrunDays: number;
	marginDays: number;
	departureAt: number;
	/** Back in port with the weather margin (before demobilisation). */
	backInPortAt: number;
	/** The allocated window from the cruise form; null where not set. */
	window: { departureAt: number | null; returnAt: number | null };
	/** Hours the plan runs past the allocated return (0 when it ends in time or none is set). */
	pastWindowH: number;
	/** True when the plan needs more days than allocated or ends after the allocated return. */
	pastAllocation: boolean;
	warnings: string[];
}

export function fit(built: { data: TimelineData; timeline: Timeline | null }): Fit | null {
	const { data, timeline: t } = built;
	if (!t || !data.input) return null;
	const back = schedule.returnAt(t);
	const windowEnd = data.cruise.returnAt?.getTime() ?? null;
	const pastWindowH = windowEnd != null && back > windowEnd ? (back - windowEnd) / 3_600_000 : 0;
	const late = schedule.windowWarning(back, windowEnd);
	const warnings = late ? [...t.warnings, late] : [...t.warnings];
	return {
		operatingDays: t.totals.operatingDays,
		allocatedDays: t.totals.allocatedDays,
		overrunDays: t.totals.overrunDays,
		marginDays: t.totals.marginDays,
		departureAt: data.input.departure.at,
		backInPortAt: back,
		window: { departureAt: data.cruise.departureAt?.getTime() ?? null, returnAt: windowEnd },
		pastWindowH,
		pastAllocation: t.totals.overrunDays > 0 || pastWindowH > 0,
		warnings
	};
}

/** The fit for the JSON API (UTC ISO times). */
export function fitToApi(f: Fit | null) {
	if (!f) return null;
	const iso = (ms: number | null) => (ms == null ? null : new Date(ms).toISOString());
	return {
		operatingDays: f.operatingDays,
		allocatedDays: f.allocatedDays,
		overrunDays: f.overrunDays,
		marginDays: Math.round(f.marginDays * 1000) / 1000,
		departureAt: iso(f.departureAt),
		backInPortAt: iso(f.backInPortAt),
		allocatedWindow: { departureAt: iso(f.window.departureAt), returnAt: iso(f.window.returnAt) },
		pastWindowHours: Math.round(f.pastWindowH * 100) / 100,
		pastAllocation: f.pastAllocation,
		warnings: f.warnings
	};
}

export function legSpans(t: Timeline, data: TimelineData): LegSpan[] {
	return data.input ? schedule.legSpans(t, data.input) : [];
}

/** The API shape (DESIGN issue 5): UTC ISO 8601 times, events in time order. */
export function toApi(t: Timeline) {
	const iso = (ms: number) => new Date(ms).toISOString();
	const round = (x: number, n: number) => Math.round(x * 10 ** n) / 10 ** n;
	return {
		events: [...t.events]
			.sort((a, b) => a.start - b.start)
			.map((e) => ({
				kind: e.kind,
				name: e.name,
				start: iso(e.start),
				end: iso(e.end),
				...(e.distanceNm != null ? { distanceNm: round(e.distanceNm, 2) } : {}),
				durationH: round(e.durationH, 3),
				localUtcOffsetMinutes: e.localOffsetMinutes
			})),
		totals: {
			operatingDays: t.totals.operatingDays,
			allocatedDays: t.totals.allocatedDays,
			marginDays: round(t.totals.marginDays, 3),
			scienceHours: round(t.totals.scienceH, 2),
			transitHours: round(t.totals.transitH, 2),
			portHours: round(t.totals.portH, 2),
			overrunDays: t.totals.overrunDays,
			cost: t.totals.cost
		},
		warnings: t.warnings,
		cuts: t.cuts.map((c) => ({ ...c, hours: round(c.hours, 2) }))
	};
}

// ---------------------------------------------------------------- editing the order

type Writer = Pick<Db, 'select' | 'insert' | 'update' | 'delete' | 'transaction'>;

function touch(d: Pick<Db, 'update'>, cruiseId: string) {
	d.update(cruise).set({ updatedAt: new Date() }).where(eq(cruise.id, cruiseId)).run();
}

function currentItems(d: Reader, cruiseId: string) {
	return d
		.select()
		.from(planItem)
		.where(eq(planItem.cruiseId, cruiseId))
		.orderBy(asc(planItem.seq))
		.all();
}

/** Legs follow the port calls: items before the first port call are leg 1, and so on. */
function legIds(d: Reader, cruiseId: string): string[] {
	return d
		.select({ id: leg.id })
		.from(leg)
		.where(eq(leg.cruiseId, cruiseId))
		.orderBy(asc(leg.seq))
		.all()
		.map((l) => l.id);
}

function renumber(d: Writer, cruiseId: string, ordered: { id: string; reversed: boolean }[]) {
	const legs = legIds(d, cruiseId);
	let legIndex = 0;
	// Two passes so the (cruise, seq) order never collides midway.
	ordered.forEach((o, i) =>
		d
			.update(planItem)
			.set({ seq: -1 - i })
			.where(eq(planItem.id, o.id))
			.run()
	);
	const kinds = new Map(currentItems(d, cruiseId).map((x) => [x.id, x.kind]));
	ordered.forEach((o, i) => {
		const isPort = kinds.get(o.id) === 'port_call';
		d.update(planItem)
			.set({
				seq: i + 1,
				reversed: isPort ? false : o.reversed,
				legId: legs[Math.min(legIndex, legs.length - 1)] ?? null
			})
			.where(eq(planItem.id, o.id))
			.run();
		if (isPort) legIndex++;
	});
}

/** Sets the whole order at once: the same items, each once, in a new order and direction. */
export function setOrder(
	actorId: string,
	cruiseId: string,
	items: { id: string; reversed: boolean }[],
	d: Writer = appDb
) {
	d.transaction((tx) => {
		const have = currentItems(tx, cruiseId);
		const ids = new Set(have.map((x) => x.id));
		const given = new Set(items.map((x) => x.id));
		if (given.size !== items.length) throw new ApiError(422, 'An item appears twice in the order.');
		if (given.size !== ids.size || [...given].some((id) => !ids.has(id)))
			throw new ApiError(
				409,
				'The order does not match the plan items of this cruise (it changed meanwhile?). Reload and try again.'
			);
		renumber(tx, cruiseId, items);
		touch(tx, cruiseId);
		audit(tx, {
			userId: actorId,
			cruiseId,
			action: 'timeline.order',
			detail: { count: items.length }
		});
	});
}

/**
 * New lines and stations join the order of work at their cheapest place (engine cheapestInsertion),
 * whichever door they came in by (chart, API, import, area generation): every creating function of
 * the plan calls this inside its own transaction. Lines of one survey area given together form one
 * block; a line whose area already has lines in the order is placed next to them. Items already in
 * the order are left where they are. Returns the new plan item ids.
 */
export function joinOrder(
	d: Writer,
	cruiseId: string,
	refs: { kind: 'line' | 'station'; id: string }[]
): string[] {
	if (!refs.length) return [];
	const c = d.select().from(cruise).where(eq(cruise.id, cruiseId)).get();
	if (!c) throw new ApiError(404, 'No such cruise.');
	const have = currentItems(d, cruiseId);
	const lineRows = d.select().from(surveyLine).where(eq(surveyLine.cruiseId, cruiseId)).all();
	const stationRows = d.select().from(station).where(eq(station.cruiseId, cruiseId)).all();
	const portRows = d.select().from(port).all();
	const lines = new Map(lineRows.map((l) => [l.id, l]));
	const stations = new Map(stationRows.map((x) => [x.id, x]));
	const ports = new Map(portRows.map((p) => [p.id, p]));

	const orderable = (it: PlanItem): OrderableItem | null => {
		if (it.kind === 'line' && it.lineId && lines.has(it.lineId)) {
			const co = lines.get(it.lineId)!.coords;
			return { id: it.id, ends: [co[0], co[co.length - 1]] };
		}
		if (it.kind === 'station' && it.stationId && stations.has(it.stationId)) {
			const st = stations.get(it.stationId)!;
			return { id: it.id, ends: [[st.lon, st.lat]] };
		}
		if (it.kind === 'port_call' && it.portId && ports.has(it.portId)) {
			const pt = ports.get(it.portId)!;
			return { id: it.id, ends: [[pt.lon, pt.lat]], fixed: true };
		}
		return null;
	};
	const route = have.flatMap((it) => {
		const o = orderable(it);
		return o
			? [
					{
						item: o,
						reversed: it.reversed,
						areaId: it.lineId ? lines.get(it.lineId)?.areaId : null
					}
				]
			: [];
	});
	const inOrder = new Set(have.map((i) => i.lineId ?? i.stationId));
	const fresh = refs.filter(
		(r) => !inOrder.has(r.id) && (r.kind === 'line' ? lines.has(r.id) : stations.has(r.id))
	);

	// Lines of one area given together make one block; everything else goes alone.
	const blocks: {
		areaId: string | null;
		items: { ref: (typeof fresh)[number]; item: OrderableItem }[];
	}[] = [];
	for (const r of fresh) {
		const id = newId();
		const areaId = r.kind === 'line' ? (lines.get(r.id)!.areaId ?? null) : null;
		const item: OrderableItem =
			r.kind === 'line'
				? (() => {
						const co = lines.get(r.id)!.coords;
						return { id, ends: [co[0], co[co.length - 1]] as [[number, number], [number, number]] };
					})()
				: { id, ends: [[stations.get(r.id)!.lon, stations.get(r.id)!.lat]] as [[number, number]] };
		const block = areaId ? blocks.find((b) => b.areaId === areaId) : undefined;
		if (block) block.items.push({ ref: r, item });
		else blocks.push({ areaId, items: [{ ref: r, item }] });
	}
	if (!blocks.length) return [];

	const dep = c.departurePortId ? ports.get(c.departurePortId) : undefined;
	const ret = c.returnPortId ? ports.get(c.returnPortId) : undefined;
	const added: string[] = [];
	let seq = Math.max(0, ...have.map((x) => x.seq)) + 1;
	for (const b of blocks) {
		const first = b.items[0].item.ends[0];
		const start: LonLatRO = dep ? [dep.lon, dep.lat] : (route[0]?.item.ends[0] ?? first);
		const end: LonLatRO = ret ? [ret.lon, ret.lat] : start;
		// Next to the lines of the same area, when some are already in the order.
		const sib = route.flatMap((r, i) => (b.areaId && r.areaId === b.areaId ? [i] : []));
		const within: [number, number] = sib.length
			? [sib[0], sib[sib.length - 1] + 1]
			: [0, route.length];
		const ins = cheapestInsertion(
			start,
			end,
			route,
			b.items.map((x) => x.item),
			within
		);
		const byId = new Map(b.items.map((x) => [x.item.id, x]));
		for (const o of ins.items) {
			const { ref } = byId.get(o.id)!;
			d.insert(planItem)
				.values({
					id: o.id,
					cruiseId,
					seq: seq++,
					kind: ref.kind,
					reversed: o.reversed,
					...(ref.kind === 'line' ? { lineId: ref.id } : { stationId: ref.id })
				})
				.run();
			added.push(o.id);
		}
		route.splice(
			ins.index,
			0,
			...ins.items.map((o) => ({
				item: byId.get(o.id)!.item,
				reversed: o.reversed,
				areaId: b.areaId
			}))
		);
	}
	renumber(
		d,
		cruiseId,
		route.map((r) => ({ id: r.item.id, reversed: r.reversed }))
	);
	return added;
}

/** Where addItem puts a line or station: at the end, or at its cheapest place (joinOrder). */
export type Placement = 'end' | 'cheapest';

export function addItem(
	actorId: string,
	cruiseId: string,
	item:
		| { kind: 'line' | 'station'; refId: string }
		| { kind: 'port_call'; portId: string; hours: number },
	d: Writer = appDb,
	placement: Placement = 'end'
): string {
	let id = newId();
	d.transaction((tx) => {
		if (item.kind !== 'port_call' && placement === 'cheapest') {
			const have = currentItems(tx, cruiseId);
			const table = item.kind === 'line' ? surveyLine : station;
			const found = tx
				.select({ id: table.id })
				.from(table)
				.where(and(eq(table.id, item.refId), eq(table.cruiseId, cruiseId)))
				.get();
			if (!found) throw new ApiError(404, `No such ${item.kind} on this cruise.`);
			if (have.some((x) => x.lineId === item.refId || x.stationId === item.refId))
				throw new ApiError(409, `That ${item.kind} is already in the order.`);
			id = joinOrder(tx, cruiseId, [{ kind: item.kind, id: item.refId }])[0];
			touch(tx, cruiseId);
			audit(tx, {
				userId: actorId,
				cruiseId,
				action: 'timeline.item.added',
				detail: { id, kind: item.kind, placement }
			});
			return;
		}
		const have = currentItems(tx, cruiseId);
		const seq = (have.at(-1)?.seq ?? 0) + 1;
		if (item.kind === 'port_call') {
			if (!tx.select({ id: port.id }).from(port).where(eq(port.id, item.portId)).get())
				throw new ApiError(404, 'No such port.');
			tx.insert(planItem)
				.values({
					id,
					cruiseId,
					seq,
					kind: 'port_call',
					portId: item.portId,
					portCallHours: item.hours
				})
				.run();
		} else {
			const table = item.kind === 'line' ? surveyLine : station;
			const found = tx
				.select({ id: table.id })
				.from(table)
				.where(and(eq(table.id, item.refId), eq(table.cruiseId, cruiseId)))
				.get();
			if (!found) throw new ApiError(404, `No such ${item.kind} on this cruise.`);
			if (have.some((x) => x.lineId === item.refId || x.stationId === item.refId))
				throw new ApiError(409, `That ${item.kind} is already in the order.`);
			tx.insert(planItem)
				.values({
					id,
					cruiseId,
					seq,
					kind: item.kind,
					...(item.kind === 'line' ? { lineId: item.refId } : { stationId: item.refId })
				})
				.run();
		}
		renumber(tx, cruiseId, [...have, { id, reversed: false }]);
		touch(tx, cruiseId);
		audit(tx, {
			userId: actorId,
			cruiseId,
			action: 'timeline.item.added',
			detail: { id, kind: item.kind }
		});
	});
	return id;
}

export function removeItem(actorId: string, cruiseId: string, itemId: string, d: Writer = appDb) {
	d.transaction((tx) => {
		const res = tx
			.delete(planItem)
			.where(and(eq(planItem.id, itemId), eq(planItem.cruiseId, cruiseId)))
			.run();
		if (res.changes === 0) throw new ApiError(404, 'No such item in the order.');
		renumber(tx, cruiseId, currentItems(tx, cruiseId));
		touch(tx, cruiseId);
		audit(tx, {
			userId: actorId,
			cruiseId,
			action: 'timeline.item.removed',
			detail: { id: itemId }
		});
	});
}

export function setPortCallHours(
	actorId: string,
	cruiseId: string,
	itemId: string,
	hours: number,
	d: Writer = appDb
) {
	const res = d
		.update(planItem)
		.set({ portCallHours: hours })
		.where(
			and(eq(planItem.id, itemId), eq(planItem.cruiseId, cruiseId), eq(planItem.kind, 'port_call'))
		)
		.run();
	if (res.changes === 0) throw new ApiError(404, 'No such port call in the order.');
	touch(d, cruiseId);
	audit(d, {
		userId: actorId,
		cruiseId,
		action: 'timeline.port_call',
		detail: { id: itemId, hours }
	});
}

// ---------------------------------------------------------------- settings and clock changes

export interface TimingSettings {
	turnH: number;
	mobilisationH: number;
	demobilisationH: number;
	marginMode: 'pct' | 'days';
	weatherMarginPct: number;
	weatherMarginDays: number;
}

export function settingsOf(c: Cruise): TimingSettings {
	return {
		turnH: c.turnH,
		mobilisationH: c.mobilisationH,
		demobilisationH: c.demobilisationH,
		marginMode: c.weatherMarginDays != null ? 'days' : 'pct',
		weatherMarginPct: c.weatherMarginPct,
		weatherMarginDays: c.weatherMarginDays ?? 0
	};
}

export function saveSettings(
	actorId: string,
	cruiseId: string,
	s: TimingSettings,
	d: Writer = appDb
) {
	d.transaction((tx) => {
		tx.update(cruise)
			.set({
				turnH: s.turnH,
				mobilisationH: s.mobilisationH,
				demobilisationH: s.demobilisationH,
				weatherMarginPct: s.weatherMarginPct,
				weatherMarginDays: s.marginMode === 'days' ? s.weatherMarginDays : null,
				updatedAt: new Date()
			})
			.where(eq(cruise.id, cruiseId))
			.run();
		audit(tx, { userId: actorId, cruiseId, action: 'timeline.settings', detail: s });
	});
}

export function addClockChange(
	actorId: string,
	cruiseId: string,
	c: { at: Date; utcOffsetMinutes: number; note?: string },
	d: Writer = appDb
) {
	const id = newId();
	d.transaction((tx) => {
		tx.insert(clockChange)
			.values({
				id,
				cruiseId,
				at: c.at,
				utcOffsetMinutes: c.utcOffsetMinutes,
				note: c.note || null
			})
			.run();
		touch(tx, cruiseId);
		audit(tx, { userId: actorId, cruiseId, action: 'timeline.clock.added', detail: { id } });
	});
	return id;
}

export function removeClockChange(
	actorId: string,
	cruiseId: string,
	id: string,
	d: Writer = appDb
) {
	const res = d
		.delete(clockChange)
		.where(and(eq(clockChange.id, id), eq(clockChange.cruiseId, cruiseId)))
		.run();
	if (res.changes === 0) throw new ApiError(404, 'No such clock change.');
	audit(d, { userId: actorId, cruiseId, action: 'timeline.clock.removed', detail: { id } });
}

/** Plan items by id, for naming the cuts and clearance items. */
export function itemsById(cruiseId: string, ids: string[], d: Reader = appDb) {
	if (!ids.length) return [];
	return d
		.select()
		.from(planItem)
		.where(and(eq(planItem.cruiseId, cruiseId), inArray(planItem.id, ids)))
		.all();
}
