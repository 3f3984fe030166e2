// The cruise's checklist: each item dated a number of days before or after sailing or the return,
// so it moves with the plan; clearance due dates join the list from clearances.ts.
import { and, asc, eq } from 'drizzle-orm';
import { ApiError } from './api';
import { audit } from './audit';
import type { ClearanceView } from './clearances';
import { utcDay } from './clearances';
import { db as appDb } from './db';
import type { Db } from './db/client';
import { deadline, type Deadline, type DeadlineKind } from './db/schema';
import { newId } from './ids';

type Reader = Pick<Db, 'select'>;
type Writer = Pick<Db, 'select' | 'insert' | 'update' | 'delete' | 'transaction'>;

const DAY_MS = 86_400_000;

export const KIND_LABELS: Record<DeadlineKind, string> = {
	clearance: 'Clearance',
	personnel: 'Personnel forms',
	medical: 'Medical forms',
	cargo: 'Cargo',
	report: 'Reports',
	other: 'Other'
};

/** A usual checklist for a research cruise; the chief scientist edits it to suit. */
export const USUAL_CHECKLIST: {
	title: string;
	kind: DeadlineKind;
	anchor: 'sailing' | 'return';
	offsetDays: number;
}[] = [
	{
		title: 'Personnel forms from every participant',
		kind: 'personnel',
		anchor: 'sailing',
		offsetDays: -90
	},
	{ title: 'Medical forms to the master', kind: 'medical', anchor: 'sailing', offsetDays: -60 },
	{
		title: 'Dangerous goods declared to the operator',
		kind: 'cargo',
		anchor: 'sailing',
		offsetDays: -60
	},
	{ title: 'Science cargo packed and shipped', kind: 'cargo', anchor: 'sailing', offsetDays: -42 },
	{
		title: 'Final berth list to the operator',
		kind: 'personnel',
		anchor: 'sailing',
		offsetDays: -30
	},
	{
		title: 'Short cruise summary to the operator',
		kind: 'report',
		anchor: 'return',
		offsetDays: 14
	},
	{ title: 'Cruise report', kind: 'report', anchor: 'return', offsetDays: 90 },
	{
		title: 'Copies of data and reports to each coastal state',
		kind: 'report',
		anchor: 'return',
		offsetDays: 180
	}
];

export interface DeadlineView {
	id: string;
	title: string;
	kind: DeadlineKind;
	/** Written out, e.g. "60 days before sailing". */
	rule: string;
	anchor: 'sailing' | 'return' | 'first entry';
	offsetDays: number;
	/** UTC midnight of the due day, or null while the anchor date is unknown. */
	dueAt: number | null;
	done: boolean;
	overdue: boolean;
	/** Derived from a clearance: edited on the clearances page. */
	fromClearance: boolean;
}

export function ruleText(anchor: string, offsetDays: number): string {
	if (offsetDays === 0) return `on the day of ${anchor}`;
	const n = Math.abs(offsetDays);
	return `${n} day${n === 1 ? '' : 's'} ${offsetDays < 0 ? 'before' : 'after'} ${anchor}`;
}

export function rows(cruiseId: string, d: Reader = appDb): Deadline[] {
	return d
		.select()
		.from(deadline)
		.where(eq(deadline.cruiseId, cruiseId))
		.orderBy(asc(deadline.createdAt))
		.all();
}

/**
 * The checklist in date order. `sailingAt` and `returnAt` are the planned instants (UTC); dates are
 * whole UTC days. An item is overdue once its day has passed and it is not done.
 */
export function list(
	cruiseId: string,
	anchors: { sailingAt: number | null; returnAt: number | null },
	clearanceViews: ClearanceView[],
	now = Date.now(),
	d: Reader = appDb
): DeadlineView[] {
	const own: DeadlineView[] = rows(cruiseId, d).map((r) => {
		const base = r.anchor === 'sailing' ? anchors.sailingAt : anchors.returnAt;
		const dueAt = base != null ? utcDay(base) + r.offsetDays * DAY_MS : null;
		const done = r.doneAt != null;
		return {
			id: r.id,
			title: r.title,
			kind: r.kind,
			rule: ruleText(r.anchor, r.offsetDays),
			anchor: r.anchor,
			offsetDays: r.offsetDays,
			dueAt,
			done,
			overdue: !done && dueAt != null && dueAt + DAY_MS <= now,
			fromClearance: false
		};
	});
	const fromClearances: DeadlineView[] = clearanceViews.map((c) => {
		const done = c.status === 'submitted' || c.status === 'granted' || c.status === 'refused';
		return {
			id: `clearance-${c.id}`,
			title: `Clearance request to ${c.coastalState}`,
			kind: 'clearance',
			rule: `${c.leadMonths} months before first entry`,
			anchor: 'first entry',
			offsetDays: 0,
			dueAt: c.dueAt,
			done,
			overdue: !done && c.dueAt != null && c.dueAt + DAY_MS <= now,
			fromClearance: true
		};
	});
	return [...own, ...fromClearances].sort(
		(a, b) => (a.dueAt ?? Infinity) - (b.dueAt ?? Infinity) || a.title.localeCompare(b.title)
	);
}

export interface DeadlineInput {
	title: string;
	kind: DeadlineKind;
	anchor: 'sailing' | 'return';
	offsetDays: number;
}

export function create(actorId: string, cruiseId: string, input: DeadlineInput, d: Writer = appDb) {
	const id = newId();
	d.transaction((tx) => {
		tx.insert(deadline)
			.values({ id, cruiseId, ...input })
			.run();
		audit(tx, { userId: actorId, cruiseId, action: 'deadline.created', detail: { id } });
	});
	return id;
}

/** Adds the usual checklist items that are not there yet (by title). */
export function addUsual(actorId: string, cruiseId: string, d: Writer = appDb): number {
	const have = new Set(rows(cruiseId, d).map((r) => r.title));
	const missing = USUAL_CHECKLIST.filter((x) => !have.has(x.title));
	d.transaction((tx) => {
		for (const x of missing)
			tx.insert(deadline)
				.values({ id: newId(), cruiseId, ...x })
				.run();
		audit(tx, {
			userId: actorId,
			cruiseId,
			action: 'deadline.usual',
			detail: { added: missing.length }
		});
	});
	return missing.length;
}

export function setDone(
	actorId: string,
	cruiseId: string,
	id: string,
	done: boolean,
	d: Writer = appDb
) {
	const res = d
		.update(deadline)
		.set({ doneAt: done ? new Date() : null })
		.where(and(eq(deadline.id, id), eq(deadline.cruiseId, cruiseId)))
		.run();
	if (res.changes === 0) throw new ApiError(404, 'No such checklist item.');
	audit(d, {
		userId: actorId,
		cruiseId,
		action: done ? 'deadline.done' : 'deadline.reopened',
		detail: { id }
	});
}

export function remove(actorId: string, cruiseId: string, id: string, d: Writer = appDb) {
	const res = d
		.delete(deadline)
		.where(and(eq(deadline.id, id), eq(deadline.cruiseId, cruiseId)))
		.run();
	if (res.changes === 0) throw new ApiError(404, 'No such checklist item.');
	audit(d, { userId: actorId, cruiseId, action: 'deadline.removed', detail: { id } });
}
