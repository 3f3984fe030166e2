// Research clearances per coastal state (DESIGN.md §4 flow 6). The chief scientist names the states
// and the plan items in each one's waters; the first entry is read off the timeline and the due
// date counted back from it (six months by default, the general rule under the law of the sea; the
// coastal state's own rules and the operator's office decide). Submitting freezes a copy of the plan
// so that a later change to the plan is flagged.
import { createHash } from 'node:crypto';
import { and, asc, eq, inArray } from 'drizzle-orm';
import type { Timeline } from '../engine/timeline';
import { monthsBefore, utcDay } from '../schedule';
import { ApiError } from './api';
import { audit } from './audit';
import { db as appDb } from './db';
import type { Db } from './db/client';
import { clearance, clearanceItem, planItem, type Clearance } from './db/schema';
import { newId } from './ids';
import * as timelines from './timeline';

type Reader = Pick<Db, 'select'>;
type Writer = Pick<Db, 'select' | 'insert' | 'update' | 'delete' | 'transaction'>;

const DAY_MS = 86_400_000;
export const DEFAULT_LEAD_MONTHS = 6;

export { monthsBefore, utcDay };

/**
 * When the ship first enters the state's waters: the start of the transit that leads to the first
 * of its plan items (the boundary is crossed somewhere on that transit, so its start is the safe
 * side), else the item's own start.
 */
export function firstEntry(t: Timeline, itemIds: ReadonlySet<string>): number | null {
	const i = t.events.findIndex((e) => e.refId && itemIds.has(e.refId) && e.kind !== 'turn');
	if (i < 0) return null;
	const before = t.events[i - 1];
	return before?.kind === 'transit' ? before.start : t.events[i].start;
}

/** The plan as submitted: the order of work with its times and positions. */
export function planSnapshot(t: Timeline, data: timelines.TimelineData) {
	return {
		cruise: data.cruise.code,
		events: t.events
			.filter((e) => e.kind !== 'turn')
			.map((e) => ({
				kind: e.kind,
				name: e.name,
				start: new Date(e.start).toISOString().slice(0, 16) + 'Z',
				end: new Date(e.end).toISOString().slice(0, 16) + 'Z',
				...(e.from ? { from: e.from.map((x) => Math.round(x * 1e5) / 1e5) } : {}),
				...(e.to ? { to: e.to.map((x) => Math.round(x * 1e5) / 1e5) } : {})
			}))
	};
}

export function digest(snapshot: unknown): string {
	return createHash('sha256').update(JSON.stringify(snapshot)).digest('hex');
}

export interface ClearanceView {
	id: string;
	coastalState: string;
	leadMonths: number;
	status: Clearance['status'];
	notes: string | null;
	submittedAt: number | null;
	hasFrozenCopy: boolean;
	itemIds: string[];
	itemNames: string[];
	firstEntryAt: number | null;
	dueAt: number | null;
	overdue: boolean;
	/** The plan differs from the frozen copy submitted. */
	changedSinceSubmission: boolean;
	submittedPlan: ReturnType<typeof planSnapshot> | null;
}

export function list(
	cruiseId: string,
	built: ReturnType<typeof timelines.build>,
	now = Date.now(),
	d: Reader = appDb
): ClearanceView[] {
	const rows = d
		.select()
		.from(clearance)
		.where(eq(clearance.cruiseId, cruiseId))
		.orderBy(asc(clearance.createdAt), asc(clearance.coastalState))
		.all();
	if (!rows.length) return [];
	const links = d
		.select()
		.from(clearanceItem)
		.where(
			inArray(
				clearanceItem.clearanceId,
				rows.map((r) => r.id)
			)
		)
		.all();
	const names = new Map(built.data.order.map((o) => [o.id, o.name]));
	const orderIndex = new Map(built.data.order.map((o, i) => [o.id, i]));
	const currentDigest = built.timeline ? digest(planSnapshot(built.timeline, built.data)) : null;
	return rows.map((r) => {
		const itemIds = links
			.filter((l) => l.clearanceId === r.id)
			.map((l) => l.planItemId)
			.sort((a, b) => (orderIndex.get(a) ?? 0) - (orderIndex.get(b) ?? 0));
		const entry = built.timeline ? firstEntry(built.timeline, new Set(itemIds)) : null;
		const dueAt = entry != null ? monthsBefore(utcDay(entry), r.leadMonths) : null;
		const open = r.status === 'not_started' || r.status === 'preparing';
		return {
			id: r.id,
			coastalState: r.coastalState,
			leadMonths: r.leadMonths,
			status: r.status,
			notes: r.notes,
			submittedAt: r.submittedAt?.getTime() ?? null,
			hasFrozenCopy: r.submittedPlan != null,
			itemIds,
			itemNames: itemIds.map((id) => names.get(id) ?? '?'),
			firstEntryAt: entry,
			dueAt,
			overdue: open && dueAt != null && dueAt + DAY_MS <= now,
			changedSinceSubmission:
				r.submittedPlanHash != null &&
				currentDigest != null &&
				r.submittedPlanHash !== currentDigest,
			submittedPlan: (r.submittedPlan as ReturnType<typeof planSnapshot> | null) ?? null
		};
	});
}

function owned(d: Reader, cruiseId: string, id: string): Clearance {
	const row = d
		.select()
		.from(clearance)
		.where(and(eq(clearance.id, id), eq(clearance.cruiseId, cruiseId)))
		.get();
	if (!row) throw new ApiError(404, 'No such clearance on this cruise.');
	return row;
}

function setItems(tx: Writer, cruiseId: string, clearanceId: string, itemIds: string[]) {
	const valid = itemIds.length
		? tx
				.select({ id: planItem.id })
				.from(planItem)
				.where(and(eq(planItem.cruiseId, cruiseId), inArray(planItem.id, itemIds)))
				.all()
				.map((x) => x.id)
		: [];
	if (valid.length !== new Set(itemIds).size)
		throw new ApiError(404, 'Some of the chosen items are not in this cruise’s order of work.');
	tx.delete(clearanceItem).where(eq(clearanceItem.clearanceId, clearanceId)).run();
	for (const planItemId of valid)
		tx.insert(clearanceItem).values({ clearanceId, planItemId }).run();
}

export interface ClearanceInput {
	coastalState: string;
	leadMonths: number;
	status: Clearance['status'];
	notes: string;
	itemIds: string[];
}

export function create(
	actorId: string,
	cruiseId: string,
	input: ClearanceInput,
	d: Writer = appDb
) {
	const id = newId();
	d.transaction((tx) => {
		tx.insert(clearance)
			.values({
				id,
				cruiseId,
				coastalState: input.coastalState,
				leadMonths: input.leadMonths,
				status: input.status,
				notes: input.notes || null
			})
			.run();
		setItems(tx, cruiseId, id, input.itemIds);
		audit(tx, { userId: actorId, cruiseId, action: 'clearance.created', detail: { id } });
	});
	return id;
}

export function update(
	actorId: string,
	cruiseId: string,
	id: string,
	input: ClearanceInput,
	d: Writer = appDb
) {
	d.transaction((tx) => {
		owned(tx, cruiseId, id);
		tx.update(clearance)
			.set({
				coastalState: input.coastalState,
				leadMonths: input.leadMonths,
				status: input.status,
				notes: input.notes || null
			})
			.where(eq(clearance.id, id))
			.run();
		setItems(tx, cruiseId, id, input.itemIds);
		audit(tx, { userId: actorId, cruiseId, action: 'clearance.updated', detail: { id } });
	});
}

/** Marks the request submitted and freezes the plan as it stands now. */
export function submit(
	actorId: string,
	cruiseId: string,
	id: string,
	at = new Date(),
	d: Writer = appDb
) {
	const built = timelines.build(cruiseId, d);
	if (!built.timeline)
		throw new ApiError(
			409,
			`The plan has no timeline yet (it needs ${built.data.missing.join(', ')}), so there is nothing to submit.`
		);
	const snapshot = planSnapshot(built.timeline, built.data);
	d.transaction((tx) => {
		owned(tx, cruiseId, id);
		tx.update(clearance)
			.set({
				status: 'submitted',
				submittedAt: at,
				submittedPlan: snapshot,
				submittedPlanHash: digest(snapshot)
			})
			.where(eq(clearance.id, id))
			.run();
		audit(tx, { userId: actorId, cruiseId, action: 'clearance.submitted', detail: { id } });
	});
}

export function remove(actorId: string, cruiseId: string, id: string, d: Writer = appDb) {
	d.transaction((tx) => {
		owned(tx, cruiseId, id);
		tx.delete(clearance).where(eq(clearance.id, id)).run();
		audit(tx, { userId: actorId, cruiseId, action: 'clearance.removed', detail: { id } });
	});
}
