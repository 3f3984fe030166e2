// Cruises, their members and legs.
import { and, asc, count, eq, inArray, ne, sql } from 'drizzle-orm';
import type { SQLiteColumn, SQLiteTable } from 'drizzle-orm/sqlite-core';
import { toUtc, type CruiseInput } from '$lib/schemas/cruise';
import { audit } from './audit';
import { config } from './config';
import { db } from './db';
import {
	berthApplication,
	clearance,
	cruise,
	cruiseMember,
	deadline,
	document,
	invitation,
	invoice,
	leg,
	port,
	ridgeSegment,
	station,
	surveyArea,
	surveyLine,
	user,
	vessel,
	type Cruise,
	type CruiseRole
} from './db/schema';
import { roleLabel } from './guards';
import { hashSecret, newId, newSecret } from './ids';
import * as outbox from './mail/outbox';
import * as templates from './mail/templates';
import * as uploads from './storage/uploads';
import * as timelines from './timeline';
import { DomainError, INVITATION_LIFETIME_DAYS, normaliseEmail, openInvitation } from './users';

export interface CruiseListItem {
	id: string;
	code: string;
	title: string;
	status: Cruise['status'];
	departureAt: Date | null;
	returnAt: Date | null;
	vesselName: string | null;
	role: CruiseRole | null;
}

/** What this user may see: cruises they hold a role on; admins see all. */
export function listFor(u: { id: string; role: 'admin' | 'member' }): CruiseListItem[] {
	const rows = db
		.select({
			id: cruise.id,
			code: cruise.code,
			title: cruise.title,
			status: cruise.status,
			departureAt: cruise.departureAt,
			returnAt: cruise.returnAt,
			vesselName: vessel.name
		})
		.from(cruise)
		.leftJoin(vessel, eq(cruise.vesselId, vessel.id))
		.orderBy(asc(cruise.departureAt), asc(cruise.code))
		.all();
	const mine = new Map(
		db
			.select({ cruiseId: cruiseMember.cruiseId, role: cruiseMember.role })
			.from(cruiseMember)
			.where(eq(cruiseMember.userId, u.id))
			.all()
			.map((m) => [m.cruiseId, m.role])
	);
	return rows
		.filter((r) => u.role === 'admin' || mine.has(r.id))
		.map((r) => ({ ...r, role: mine.get(r.id) ?? null }));
}

export function detail(cruiseId: string) {
	const c = db.select().from(cruise).where(eq(cruise.id, cruiseId)).get();
	if (!c) return null;
	const v = c.vesselId ? db.select().from(vessel).where(eq(vessel.id, c.vesselId)).get() : null;
	const portIds = [c.departurePortId, c.returnPortId].filter((x): x is string => !!x);
	const ports = portIds.length ? db.select().from(port).where(inArray(port.id, portIds)).all() : [];
	const legs = db.select().from(leg).where(eq(leg.cruiseId, cruiseId)).orderBy(asc(leg.seq)).all();
	return {
		cruise: c,
		vessel: v ?? null,
		departurePort: ports.find((p) => p.id === c.departurePortId) ?? null,
		returnPort: ports.find((p) => p.id === c.returnPortId) ?? null,
		legs
	};
}

function values(input: CruiseInput) {
	return {
		code: input.code,
		title: input.title,
		status: input.status,
		vesselId: input.vesselId || null,
		departurePortId: input.departurePortId || null,
		returnPortId: input.returnPortId || null,
		departureAt: toUtc(input.departureAt),
		returnAt: toUtc(input.returnAt),
		allocatedDays: input.allocatedDays,
		weatherMarginPct: input.weatherMarginPct,
		depthModel: input.depthModel
	};
}

// Codes are unique regardless of case (the index cruise_code_ci_idx holds it in the database too).
const sameCode = (code: string) => sql`lower(${cruise.code}) = lower(${code})`;

const takenMessage = (code: string) =>
	`Cruise code: ${code} is taken — another cruise uses it (capitals and small letters count as the same).`;

function codeTaken(code: string): never {
	throw new DomainError(takenMessage(code), 'code', 409);
}

/** The plain message when another cruise holds this code in any case, else null. */
export function codeClash(code: string, exceptId?: string): string | null {
	if (!code) return null;
	const clash = db
		.select({ id: cruise.id, code: cruise.code })
		.from(cruise)
		.where(exceptId ? and(sameCode(code), ne(cruise.id, exceptId)) : sameCode(code))
		.get();
	return clash ? takenMessage(clash.code) : null;
}

function assertCodeFree(code: string, exceptId?: string) {
	const clash = codeClash(code, exceptId);
	if (clash) throw new DomainError(clash, 'code', 409);
}

/** Two requests racing past assertCodeFree meet the unique index; answer them the same way. */
function onCodeClash<T>(code: string, write: () => T): T {
	try {
		return write();
	} catch (e) {
		const err = e as { code?: string; message?: string };
		if (err.code === 'SQLITE_CONSTRAINT_UNIQUE' && /cruise/.test(err.message ?? ''))
			codeTaken(code);
		throw e;
	}
}

/** An unknown vessel or port id is the caller's mistake (4xx naming the field), not a 500. */
function assertRefs(input: CruiseInput) {
	if (
		input.vesselId &&
		!db.select({ id: vessel.id }).from(vessel).where(eq(vessel.id, input.vesselId)).get()
	)
		throw new DomainError('Choose a vessel from the list.', 'vesselId', 422);
	for (const f of ['departurePortId', 'returnPortId'] as const) {
		const id = input[f];
		if (id && !db.select({ id: port.id }).from(port).where(eq(port.id, id)).get())
			throw new DomainError('Choose a port from the list.', f, 422);
	}
}

/** Creates a cruise; its creator becomes its chief scientist. */
export function create(creatorId: string, input: CruiseInput): string {
	assertCodeFree(input.code);
	assertRefs(input);
	const id = newId();
	onCodeClash(input.code, () =>
		db.transaction((tx) => {
			tx.insert(cruise)
				.values({ id, ...values(input), createdById: creatorId })
				.run();
			tx.insert(cruiseMember)
				.values({ cruiseId: id, userId: creatorId, role: 'chief_scientist' })
				.run();
			audit(tx, { userId: creatorId, cruiseId: id, action: 'cruise.created' });
		})
	);
	return id;
}

export function update(userId: string, cruiseId: string, input: CruiseInput) {
	assertCodeFree(input.code, cruiseId);
	assertRefs(input);
	onCodeClash(input.code, () =>
		db.transaction((tx) => {
			tx.update(cruise)
				.set({ ...values(input), updatedAt: new Date() })
				.where(eq(cruise.id, cruiseId))
				.run();
			audit(tx, { userId, cruiseId, action: 'cruise.updated' });
		})
	);
}

/**
 * Who may see the e-mail addresses of the people on a cruise: its chief scientist and master, and
 * the marine office. Participants and port agents see names and cruise roles only.
 */
export function seesEmails(access: { role: CruiseRole | null; isAdmin: boolean }): boolean {
	return access.isAdmin || access.role === 'chief_scientist' || access.role === 'master';
}

export interface Member {
	userId: string;
	name: string;
	role: CruiseRole;
	/** Only for callers who see e-mail addresses (see seesEmails); absent otherwise. */
	email?: string;
}

/** The people on a cruise as `access` may see them: e-mail addresses only where seesEmails. */
export function members(
	cruiseId: string,
	access: { role: CruiseRole | null; isAdmin: boolean }
): Member[] {
	const rows = db
		.select({ userId: user.id, name: user.name, email: user.email, role: cruiseMember.role })
		.from(cruiseMember)
		.innerJoin(user, eq(cruiseMember.userId, user.id))
		.where(eq(cruiseMember.cruiseId, cruiseId))
		.orderBy(asc(cruiseMember.role), asc(user.name))
		.all();
	if (seesEmails(access)) return rows;
	return rows.map(({ email: _hidden, ...rest }) => rest);
}

export function pendingInvitations(cruiseId: string) {
	return db
		.select({
			id: invitation.id,
			email: invitation.email,
			role: invitation.cruiseRole,
			expiresAt: invitation.expiresAt,
			acceptedAt: invitation.acceptedAt,
			revokedAt: invitation.revokedAt
		})
		.from(invitation)
		.where(eq(invitation.cruiseId, cruiseId))
		.all()
		.filter((i) => !i.acceptedAt && !i.revokedAt && i.expiresAt.getTime() > Date.now());
}

/**
 * A chief scientist (or admin) invites someone to the cruise with a role. An existing account is
 * added at once and told by e-mail; a new address gets an invitation link. Duplicates are refused.
 */
export function invite(
	inviter: { id: string; name: string },
	c: Cruise,
	email: string,
	role: CruiseRole
): { added: boolean } {
	const e = normaliseEmail(email);
	const existing = db.select().from(user).where(eq(user.email, e)).get();
	if (existing) {
		const current = db
			.select({ role: cruiseMember.role })
			.from(cruiseMember)
			.where(and(eq(cruiseMember.cruiseId, c.id), eq(cruiseMember.userId, existing.id)))
			.get();
		if (current)
			throw new DomainError(
				`${e} is already on this cruise as ${roleLabel(current.role)}.`,
				'email',
				409
			);
		db.transaction((tx) => {
			tx.insert(cruiseMember).values({ cruiseId: c.id, userId: existing.id, role }).run();
			const mail = templates.addedToCruise({
				inviterName: inviter.name,
				cruiseCode: c.code,
				cruiseTitle: c.title,
				roleLabel: roleLabel(role),
				link: `${config.origin}/cruises/${c.id}`
			});
			outbox.enqueue(tx, { ...mail, to: e, kind: 'member_added', cruiseId: c.id });
			audit(tx, {
				userId: inviter.id,
				cruiseId: c.id,
				action: 'member.added',
				detail: { email: e, role }
			});
		});
		return { added: true };
	}
	if (openInvitation(e, c.id))
		throw new DomainError(`${e} already has an open invitation to this cruise.`, 'email', 409);
	db.transaction((tx) => {
		const token = newSecret();
		tx.insert(invitation)
			.values({
				id: newId(),
				email: e,
				cruiseId: c.id,
				cruiseRole: role,
				tokenHash: hashSecret(token),
				invitedById: inviter.id,
				expiresAt: new Date(Date.now() + INVITATION_LIFETIME_DAYS * 86_400_000)
			})
			.run();
		const mail = templates.cruiseInvitation({
			inviterName: inviter.name,
			cruiseCode: c.code,
			cruiseTitle: c.title,
			roleLabel: roleLabel(role),
			link: `${config.origin}/invite/${token}`,
			expiresDays: INVITATION_LIFETIME_DAYS
		});
		outbox.enqueue(tx, { ...mail, to: e, kind: 'invitation', cruiseId: c.id });
		audit(tx, {
			userId: inviter.id,
			cruiseId: c.id,
			action: 'invitation.cruise',
			detail: { email: e, role }
		});
	});
	return { added: false };
}

function chiefCount(cruiseId: string) {
	return db
		.select({ userId: cruiseMember.userId })
		.from(cruiseMember)
		.where(and(eq(cruiseMember.cruiseId, cruiseId), eq(cruiseMember.role, 'chief_scientist')))
		.all().length;
}

export function changeRole(actorId: string, cruiseId: string, userId: string, role: CruiseRole) {
	const current = db
		.select()
		.from(cruiseMember)
		.where(and(eq(cruiseMember.cruiseId, cruiseId), eq(cruiseMember.userId, userId)))
		.get();
	if (!current) throw new DomainError('That person is not on this cruise.', 'userId', 404);
	if (current.role === 'chief_scientist' && role !== 'chief_scientist' && chiefCount(cruiseId) <= 1)
		throw new DomainError('A cruise keeps at least one chief scientist.', 'role', 409);
	db.transaction((tx) => {
		tx.update(cruiseMember)
			.set({ role })
			.where(and(eq(cruiseMember.cruiseId, cruiseId), eq(cruiseMember.userId, userId)))
			.run();
		audit(tx, { userId: actorId, cruiseId, action: 'member.role', detail: { userId, role } });
	});
}

export function removeMember(actorId: string, cruiseId: string, userId: string) {
	const current = db
		.select()
		.from(cruiseMember)
		.where(and(eq(cruiseMember.cruiseId, cruiseId), eq(cruiseMember.userId, userId)))
		.get();
	if (!current) throw new DomainError('That person is not on this cruise.', 'userId', 404);
	if (current.role === 'chief_scientist' && chiefCount(cruiseId) <= 1)
		throw new DomainError('A cruise keeps at least one chief scientist.', 'userId', 409);
	db.transaction((tx) => {
		tx.delete(cruiseMember)
			.where(and(eq(cruiseMember.cruiseId, cruiseId), eq(cruiseMember.userId, userId)))
			.run();
		audit(tx, { userId: actorId, cruiseId, action: 'member.removed', detail: { userId } });
	});
}

export function revokeInvitation(actorId: string, cruiseId: string, invitationId: string) {
	const res = db
		.update(invitation)
		.set({ revokedAt: new Date() })
		.where(and(eq(invitation.id, invitationId), eq(invitation.cruiseId, cruiseId)))
		.run();
	if (res.changes === 0) throw new DomainError('No such invitation.', undefined, 404);
	audit(db, { userId: actorId, cruiseId, action: 'invitation.revoked', detail: { invitationId } });
}

/** The JSON shape of a cruise in the API. */
export function toApi(d: NonNullable<ReturnType<typeof detail>>, role: CruiseRole | null) {
	const c = d.cruise;
	const built = timelines.build(c.id);
	const planned = built.timeline
		? { legs: timelines.legSpans(built.timeline, built.data), fit: timelines.fit(built) }
		: null;
	return {
		id: c.id,
		code: c.code,
		title: c.title,
		status: c.status,
		role,
		departureAt: c.departureAt?.toISOString() ?? null,
		returnAt: c.returnAt?.toISOString() ?? null,
		departurePort: d.departurePort && {
			id: d.departurePort.id,
			name: d.departurePort.name,
			lon: d.departurePort.lon,
			lat: d.departurePort.lat
		},
		returnPort: d.returnPort && {
			id: d.returnPort.id,
			name: d.returnPort.name,
			lon: d.returnPort.lon,
			lat: d.returnPort.lat
		},
		allocatedDays: c.allocatedDays,
		weatherMarginPct: c.weatherMarginPct,
		depthModel: c.depthModel,
		vessel: d.vessel && {
			id: d.vessel.id,
			name: d.vessel.name,
			callSign: d.vessel.callSign,
			scienceBerths: d.vessel.scienceBerths,
			transitSpeedKn: d.vessel.transitSpeedKn,
			surveySpeedKn: d.vessel.surveySpeedKn,
			dayRate: { amountMinor: d.vessel.dayRateMinor, currency: d.vessel.currency }
		},
		// Leg times from the one timeline build when it can be made (port to port, margin in the
		// last leg); the stored times otherwise.
		legs: d.legs.map((l) => {
			const span = planned?.legs.find((x) => x.seq === l.seq);
			return {
				id: l.id,
				seq: l.seq,
				name: l.name,
				startAt: span ? new Date(span.start).toISOString() : (l.startAt?.toISOString() ?? null),
				endAt: span ? new Date(span.end).toISOString() : (l.endAt?.toISOString() ?? null)
			};
		}),
		/** The plan against the allocated window (departureAt/returnAt above). */
		plan: timelines.fitToApi(planned?.fit ?? null)
	};
}

/** What deleting a cruise takes with it, counted for the confirmation. */
export interface DeleteImpact {
	legs: number;
	lines: number;
	stations: number;
	areas: number;
	ridges: number;
	members: number;
	applications: number;
	documents: number;
	invoices: number;
	clearances: number;
	deadlines: number;
}

function countOf(table: SQLiteTable & { cruiseId: SQLiteColumn }, cruiseId: string): number {
	return (
		db
			.select({ n: count() })
			.from(table as SQLiteTable)
			.where(eq(table.cruiseId, cruiseId))
			.get()?.n ?? 0
	);
}

/**
 * Uploads are stored by content hash under UPLOAD_DIR (README); a file goes when the last document
 * naming it does. A missing file is not an error (it may never have been written).
 */
function discardUpload(sha256: string) {
	if (/^[0-9a-f]{64}$/.test(sha256)) uploads.remove(sha256);
}

export function deleteImpact(cruiseId: string): DeleteImpact {
	return {
		legs: countOf(leg, cruiseId),
		lines: countOf(surveyLine, cruiseId),
		stations: countOf(station, cruiseId),
		areas: countOf(surveyArea, cruiseId),
		ridges: countOf(ridgeSegment, cruiseId),
		members: countOf(cruiseMember, cruiseId),
		applications: countOf(berthApplication, cruiseId),
		documents: countOf(document, cruiseId),
		invoices: countOf(invoice, cruiseId),
		clearances: countOf(clearance, cruiseId),
		deadlines: countOf(deadline, cruiseId)
	};
}

/**
 * Who may delete a cruise: the marine office any cruise; its chief scientist only while it is a
 * draft (a planned or published cruise has a ship, a port agent and people counting on it).
 */
export function canDelete(access: {
	role: CruiseRole | null;
	isAdmin: boolean;
	cruise: Pick<Cruise, 'status'>;
}): boolean {
	return access.isAdmin || (access.role === 'chief_scientist' && access.cruise.status === 'draft');
}

/**
 * Deletes a cruise and, through the foreign keys' ON DELETE CASCADE, its legs, plan, people's
 * roles, applications, documents, invoices and payments, clearances, deadlines and audit entries.
 * The deletion itself is audited without a cruise id, so the record outlives the cruise. Uploaded
 * files no other document refers to are removed after the commit. Returns what went with it.
 */
export function remove(
	actorId: string,
	c: Pick<Cruise, 'id' | 'code' | 'title'>
): { impact: DeleteImpact; orphanedUploads: string[] } {
	const impact = deleteImpact(c.id);
	const hashes = db
		.selectDistinct({ sha256: document.sha256 })
		.from(document)
		.where(eq(document.cruiseId, c.id))
		.all()
		.map((d) => d.sha256);
	db.transaction((tx) => {
		tx.delete(cruise).where(eq(cruise.id, c.id)).run();
		audit(tx, {
			userId: actorId,
			cruiseId: null,
			action: 'cruise.deleted',
			detail: { cruiseId: c.id, code: c.code, title: c.title, ...impact }
		});
	});
	const stillUsed = new Set(
		hashes.length
			? db
					.selectDistinct({ sha256: document.sha256 })
					.from(document)
					.where(inArray(document.sha256, hashes))
					.all()
					.map((d) => d.sha256)
			: []
	);
	const orphanedUploads = hashes.filter((h) => !stillUsed.has(h));
	for (const h of orphanedUploads) discardUpload(h);
	return { impact, orphanedUploads };
}
