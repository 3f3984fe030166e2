// Berth applications (DESIGN.md §4 flow 5). A participant applies per leg; the chief scientist
// confirms, waitlists or declines. The cap — the leg's science berths, else the vessel's — is checked
// and the decision written in one SQLite write transaction begun with BEGIN IMMEDIATE
// (better-sqlite3's `.immediate()`), so two decisions at the same instant, from this process or
// another, cannot both take the last berth.
import { and, asc, count, eq, inArray, isNotNull, max, sql } from 'drizzle-orm';
import type { Decision } from '$lib/schemas/party';
import type { ApplyInput } from '$lib/schemas/party';
import { ApiError } from './api';
import { audit } from './audit';
import { config } from './config';
import { db as appDb } from './db';
import type { Db } from './db/client';
import {
	berthApplication,
	cruise,
	leg,
	user,
	vessel,
	type BerthApplication,
	type Leg
} from './db/schema';
import { newId } from './ids';
import * as outbox from './mail/outbox';
import * as templates from './mail/templates';

type Reader = Pick<Db, 'select'>;
type Writer = Pick<Db, 'select' | 'insert' | 'update' | 'delete'>;

export interface LegTotals {
	id: string;
	name: string;
	berths: number;
	confirmed: number;
	waiting: number;
}

/** Science berths on a leg: its own number when lowered, else the vessel's (0 without a vessel). */
function capOf(tx: Reader, l: Pick<Leg, 'scienceBerths' | 'cruiseId'>): number {
	if (l.scienceBerths != null) return l.scienceBerths;
	const v = tx
		.select({ berths: vessel.scienceBerths })
		.from(cruise)
		.leftJoin(vessel, eq(cruise.vesselId, vessel.id))
		.where(eq(cruise.id, l.cruiseId))
		.get();
	return v?.berths ?? 0;
}

export function vesselBerths(cruiseId: string, db: Reader = appDb): number | null {
	const v = db
		.select({ berths: vessel.scienceBerths })
		.from(cruise)
		.leftJoin(vessel, eq(cruise.vesselId, vessel.id))
		.where(eq(cruise.id, cruiseId))
		.get();
	return v?.berths ?? null;
}

function countStatus(tx: Reader, legId: string, status: BerthApplication['status']): number {
	return (
		tx
			.select({ n: count() })
			.from(berthApplication)
			.where(and(eq(berthApplication.legId, legId), eq(berthApplication.status, status)))
			.get()?.n ?? 0
	);
}

/** Berths, confirmed and waiting per leg: what everyone on the cruise may see. */
export function legTotals(cruiseId: string, db: Reader = appDb): LegTotals[] {
	const legs = db.select().from(leg).where(eq(leg.cruiseId, cruiseId)).orderBy(asc(leg.seq)).all();
	return legs.map((l) => ({
		id: l.id,
		name: l.name,
		berths: capOf(db, l),
		confirmed: countStatus(db, l.id, 'confirmed'),
		waiting: countStatus(db, l.id, 'waitlisted')
	}));
}

export interface ApplicationRow {
	id: string;
	userId: string;
	name: string;
	email: string;
	legId: string;
	status: BerthApplication['status'];
	roleOnBoard: BerthApplication['roleOnBoard'];
	institution: string | null;
	note: string | null;
	waitlistPosition: number | null;
	decisionMessage: string | null;
	createdAt: Date;
	decidedAt: Date | null;
}

/** The application as the API contract writes it (GET/POST/PATCH /cruises/{id}/berths). */
export function toApi(a: ApplicationRow) {
	return {
		id: a.id,
		userId: a.userId,
		name: a.name,
		legId: a.legId,
		status: a.status,
		roleOnBoard: a.roleOnBoard,
		waitlistPosition: a.waitlistPosition
	};
}

/** Applications on the cruise, all of them or one person's; waiting ones in waitlist order. */
export function applications(
	cruiseId: string,
	onlyUserId?: string,
	db: Reader = appDb
): ApplicationRow[] {
	return db
		.select({
			id: berthApplication.id,
			userId: berthApplication.userId,
			name: user.name,
			email: user.email,
			legId: berthApplication.legId,
			status: berthApplication.status,
			roleOnBoard: berthApplication.roleOnBoard,
			institution: berthApplication.institution,
			note: berthApplication.note,
			waitlistPosition: berthApplication.waitlistPosition,
			decisionMessage: berthApplication.decisionMessage,
			createdAt: berthApplication.createdAt,
			decidedAt: berthApplication.decidedAt
		})
		.from(berthApplication)
		.innerJoin(user, eq(berthApplication.userId, user.id))
		.innerJoin(leg, eq(berthApplication.legId, leg.id))
		.where(
			onlyUserId
				? and(eq(berthApplication.cruiseId, cruiseId), eq(berthApplication.userId, onlyUserId))
				: eq(berthApplication.cruiseId, cruiseId)
		)
		.orderBy(
			asc(leg.seq),
			sql`${berthApplication.waitlistPosition} is null`,
			asc(berthApplication.waitlistPosition),
			asc(berthApplication.createdAt)
		)
		.all();
}

/** A participant (or the chief scientist) asks for a berth on a leg of this cruise. */
export function apply(
	userId: string,
	cruiseId: string,
	input: ApplyInput,
	db: Db = appDb
): ApplicationRow {
	const id = db.transaction(
		(tx) => {
			const l = tx.select().from(leg).where(eq(leg.id, input.legId)).get();
			if (!l || l.cruiseId !== cruiseId)
				throw new ApiError(422, 'legId: there is no such leg on this cruise.', 'invalid', [
					{ field: 'legId', message: 'There is no such leg on this cruise.' }
				]);
			const existing = tx
				.select()
				.from(berthApplication)
				.where(and(eq(berthApplication.legId, l.id), eq(berthApplication.userId, userId)))
				.get();
			const values = {
				roleOnBoard: input.roleOnBoard,
				institution: input.institution || null,
				note: input.note || null
			};
			if (existing && existing.status !== 'withdrawn')
				throw new ApiError(
					409,
					`You have already applied for ${l.name} (${existing.status}).`,
					'already_applied'
				);
			let appId: string;
			if (existing) {
				// Applying again after withdrawing starts a fresh application.
				appId = existing.id;
				tx.update(berthApplication)
					.set({
						...values,
						status: 'applied',
						waitlistPosition: null,
						decisionMessage: null,
						decidedAt: null,
						decidedById: null,
						createdAt: new Date()
					})
					.where(eq(berthApplication.id, appId))
					.run();
			} else {
				appId = newId();
				tx.insert(berthApplication)
					.values({ id: appId, cruiseId, legId: l.id, userId, ...values })
					.run();
			}
			audit(tx, { userId, cruiseId, action: 'berth.applied', detail: { legId: l.id } });
			return appId;
		},
		{ behavior: 'immediate' }
	);
	return applications(cruiseId, userId, db).find((a) => a.id === id)!;
}

function nextWaitlistPosition(tx: Reader, legId: string): number {
	const row = tx
		.select({ top: max(berthApplication.waitlistPosition) })
		.from(berthApplication)
		.where(and(eq(berthApplication.legId, legId), isNotNull(berthApplication.waitlistPosition)))
		.get();
	return (row?.top ?? 0) + 1;
}

/** Closes the gap a person leaves in the waitlist: positions stay 1, 2, 3, … in the same order. */
function renumberWaitlist(tx: Writer, legId: string) {
	const waiting = tx
		.select({ id: berthApplication.id })
		.from(berthApplication)
		.where(and(eq(berthApplication.legId, legId), eq(berthApplication.status, 'waitlisted')))
		.orderBy(asc(berthApplication.waitlistPosition), asc(berthApplication.createdAt))
		.all();
	waiting.forEach((w, i) =>
		tx
			.update(berthApplication)
			.set({ waitlistPosition: i + 1 })
			.where(eq(berthApplication.id, w.id))
			.run()
	);
}

interface Actor {
	id: string;
	/** True for the chief scientist (and admins), who decide on others' applications. */
	decides: boolean;
}

/**
 * Sets an application's status. The chief scientist confirms, waitlists or declines; the applicant
 * withdraws. A confirmation that would exceed the leg's berths is refused with 409 `berths_full`.
 * The decision e-mail is queued in the same transaction.
 */
export function decide(
	actor: Actor,
	cruiseId: string,
	applicationId: string,
	status: Decision | 'withdrawn',
	message?: string,
	db: Db = appDb
): ApplicationRow {
	db.transaction(
		(tx) => {
			const app = tx
				.select()
				.from(berthApplication)
				.where(eq(berthApplication.id, applicationId))
				.get();
			if (!app || app.cruiseId !== cruiseId)
				throw new ApiError(404, 'There is no such application on this cruise.');
			const own = app.userId === actor.id;
			if (status === 'withdrawn' && !own)
				throw new ApiError(403, 'Only the applicant may withdraw an application.');
			if (status !== 'withdrawn' && !actor.decides)
				throw new ApiError(403, 'Only the chief scientist decides on berth applications.');
			if (app.status === 'withdrawn')
				throw new ApiError(409, 'This application was withdrawn.', 'withdrawn');
			if (app.status === status) return;
			const l = tx.select().from(leg).where(eq(leg.id, app.legId)).get()!;
			if (status === 'confirmed') {
				const cap = capOf(tx, l);
				const taken = countStatus(tx, l.id, 'confirmed');
				if (taken >= cap)
					throw new ApiError(
						409,
						`${l.name} is full: all ${cap} science berths are confirmed. Waitlist this person or free a berth first.`,
						'berths_full',
						{ legId: l.id, berths: cap, confirmed: taken }
					);
			}
			tx.update(berthApplication)
				.set({
					status,
					waitlistPosition: status === 'waitlisted' ? nextWaitlistPosition(tx, l.id) : null,
					decisionMessage: status === 'withdrawn' ? app.decisionMessage : message || null,
					decidedById: actor.id,
					decidedAt: new Date()
				})
				.where(eq(berthApplication.id, app.id))
				.run();
			if (app.status === 'waitlisted') renumberWaitlist(tx, l.id);
			audit(tx, {
				userId: actor.id,
				cruiseId,
				action: `berth.${status}`,
				detail: { applicationId: app.id, legId: l.id, from: app.status }
			});
			if (status !== 'withdrawn') {
				const c = tx.select().from(cruise).where(eq(cruise.id, cruiseId)).get()!;
				const to = tx.select().from(user).where(eq(user.id, app.userId)).get()!;
				const waitlistPosition =
					status === 'waitlisted'
						? tx
								.select({ p: berthApplication.waitlistPosition })
								.from(berthApplication)
								.where(eq(berthApplication.id, app.id))
								.get()!.p
						: null;
				const mail = templates.berthDecision({
					name: to.name,
					cruiseCode: c.code,
					cruiseTitle: c.title,
					legName: l.name,
					status,
					waitlistPosition,
					message: message || null,
					link: `${config.origin}/my-cruises`
				});
				outbox.enqueue(tx, { ...mail, to: to.email, kind: 'berth_decision', cruiseId });
			}
		},
		{ behavior: 'immediate' }
	);
	return applications(cruiseId, undefined, db).find((a) => a.id === applicationId)!;
}

export interface BulkResult {
	done: string[];
	refused: { id: string; name: string; message: string }[];
}

/** The same decision for many applications; each stands alone, so a full leg refuses only the rest. */
export function decideMany(
	actor: Actor,
	cruiseId: string,
	ids: string[],
	status: Decision,
	message?: string,
	db: Db = appDb
): BulkResult {
	const names = new Map(
		applications(cruiseId, undefined, db)
			.filter((a) => ids.includes(a.id))
			.map((a) => [a.id, a.name])
	);
	const out: BulkResult = { done: [], refused: [] };
	for (const id of ids) {
		try {
			decide(actor, cruiseId, id, status, message, db);
			out.done.push(id);
		} catch (e) {
			if (!(e instanceof ApiError)) throw e;
			out.refused.push({ id, name: names.get(id) ?? id, message: e.message });
		}
	}
	return out;
}

/** Lowers (or restores) a leg's science berths; never below the vessel's or the confirmed count. */
export function setLegBerths(
	actorId: string,
	cruiseId: string,
	legId: string,
	berths: number,
	db: Db = appDb
) {
	db.transaction(
		(tx) => {
			const l = tx.select().from(leg).where(eq(leg.id, legId)).get();
			if (!l || l.cruiseId !== cruiseId) throw new ApiError(404, 'No such leg on this cruise.');
			const ship = vesselBerths(cruiseId, tx);
			if (ship != null && berths > ship)
				throw new ApiError(
					422,
					`The vessel has ${ship} science berths; a leg can have fewer, not more.`,
					'invalid',
					[{ field: 'berths', message: `At most ${ship}.` }]
				);
			const taken = countStatus(tx, l.id, 'confirmed');
			if (berths < taken)
				throw new ApiError(
					409,
					`${taken} people are confirmed on ${l.name}; decline or move some before lowering to ${berths}.`,
					'berths_taken'
				);
			tx.update(leg)
				.set({ scienceBerths: ship != null && berths === ship ? null : berths })
				.where(eq(leg.id, l.id))
				.run();
			audit(tx, {
				userId: actorId,
				cruiseId,
				action: 'leg.berths',
				detail: { legId: l.id, berths }
			});
		},
		{ behavior: 'immediate' }
	);
}

/** Per leg: the first waiting person, when a berth is free for them (the chief confirms in one click). */
export function offers(cruiseId: string, db: Reader = appDb) {
	const totals = legTotals(cruiseId, db);
	const free = totals.filter((t) => t.berths > t.confirmed && t.waiting > 0);
	if (free.length === 0) return [];
	const first = db
		.select({
			id: berthApplication.id,
			legId: berthApplication.legId,
			name: user.name
		})
		.from(berthApplication)
		.innerJoin(user, eq(berthApplication.userId, user.id))
		.where(
			and(
				inArray(
					berthApplication.legId,
					free.map((f) => f.id)
				),
				eq(berthApplication.waitlistPosition, 1)
			)
		)
		.all();
	return first.map((f) => {
		const t = free.find((x) => x.id === f.legId)!;
		return { ...f, legName: t.name, free: t.berths - t.confirmed };
	});
}
