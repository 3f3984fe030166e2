// Sea-going documents (DESIGN.md §4 flow 5). The chief scientist names which kinds the cruise
// requires and how many days before sailing; participants upload them (type read from the bytes,
// stored by content hash) and the chief scientist accepts or rejects them. Medical documents are
// confidential: only their owner, the chief scientist and the master of the cruise may read one —
// not an admin, not the port agent — and each read is written to the audit log. They never go into
// an e-mail, an export or a list for anyone else. Documents of a completed cruise are deleted a
// configurable number of days after its return.
import { and, asc, desc, eq, inArray, lte } from 'drizzle-orm';
import { DOCUMENT_KINDS, type CellState, type DocumentKind } from '$lib/party';
import { ApiError } from './api';
import { audit } from './audit';
import { config } from './config';
import { db as appDb } from './db';
import type { Db } from './db/client';
import {
	berthApplication,
	cruise,
	document,
	documentRequirement,
	user,
	type Document
} from './db/schema';
import type { CruiseAccess } from './guards';
import { newId } from './ids';
import * as uploads from './storage/uploads';

type Reader = Pick<Db, 'select' | 'selectDistinct'>;
const DAY_MS = 86_400_000;

export interface Requirement {
	kind: DocumentKind;
	daysBeforeSailing: number;
	/** Sailing minus the days, epoch ms; null while the cruise has no sailing date. */
	dueAt: number | null;
}

export function requirements(cruiseId: string, db: Reader = appDb): Requirement[] {
	const c = db.select().from(cruise).where(eq(cruise.id, cruiseId)).get();
	const sail = c?.departureAt?.getTime() ?? null;
	const rows = db
		.select()
		.from(documentRequirement)
		.where(eq(documentRequirement.cruiseId, cruiseId))
		.all();
	return DOCUMENT_KINDS.flatMap((kind) => {
		const r = rows.find((x) => x.kind === kind);
		if (!r) return [];
		return [
			{
				kind,
				daysBeforeSailing: r.daysBeforeSailing,
				dueAt: sail == null ? null : sail - r.daysBeforeSailing * DAY_MS
			}
		];
	});
}

/** Replaces the cruise's required documents: kind → days before sailing. */
export function setRequirements(
	actorId: string,
	cruiseId: string,
	wanted: Partial<Record<DocumentKind, number>>,
	db: Db = appDb
) {
	db.transaction((tx) => {
		tx.delete(documentRequirement).where(eq(documentRequirement.cruiseId, cruiseId)).run();
		for (const kind of DOCUMENT_KINDS) {
			const days = wanted[kind];
			if (days == null) continue;
			tx.insert(documentRequirement).values({ cruiseId, kind, daysBeforeSailing: days }).run();
		}
		audit(tx, { userId: actorId, cruiseId, action: 'documents.required', detail: wanted });
	});
}

/** Who may upload: people with a cruise role who sail (participants and the chief scientist). */
export async function upload(
	access: CruiseAccess,
	meta: { kind: DocumentKind; filename: string; expiresOn?: string },
	bytes: Uint8Array,
	db: Db = appDb
): Promise<Document> {
	if (access.role !== 'participant' && access.role !== 'chief_scientist')
		throw new ApiError(
			403,
			'Only participants and the chief scientist upload sea-going documents.'
		);
	const mimeType = await uploads.check(bytes);
	const sha256 = uploads.store(bytes);
	const id = newId();
	db.transaction((tx) => {
		tx.insert(document)
			.values({
				id,
				cruiseId: access.cruise.id,
				userId: access.user.id,
				kind: meta.kind,
				filename: safeName(meta.filename),
				mimeType,
				sizeBytes: bytes.byteLength,
				sha256,
				expiresOn: meta.expiresOn ?? null
			})
			.run();
		audit(tx, {
			userId: access.user.id,
			cruiseId: access.cruise.id,
			action: 'document.uploaded',
			detail: { documentId: id, kind: meta.kind }
		});
	});
	return db.select().from(document).where(eq(document.id, id)).get()!;
}

/** The original name, kept for the download only: no path, no control characters. */
function safeName(name: string): string {
	const base = name.split(/[\\/]/).pop() ?? 'document';
	// eslint-disable-next-line no-control-regex
	return base.replace(/[\u0000-\u001f\u007f"]/g, '').slice(0, 200) || 'document';
}

/** May this caller read this document? Medical ones: owner, chief scientist, master — no one else. */
export function mayRead(access: CruiseAccess, doc: Pick<Document, 'userId' | 'kind'>): boolean {
	if (doc.userId === access.user.id) return true;
	if (access.role === 'chief_scientist' || access.role === 'master') return true;
	if (doc.kind === 'medical') return false;
	return access.isAdmin;
}

/** Opens a document for download; every read of a medical document is audit-logged. */
export function open(access: CruiseAccess, documentId: string, db: Db = appDb) {
	const doc = db.select().from(document).where(eq(document.id, documentId)).get();
	if (!doc || doc.cruiseId !== access.cruise.id)
		throw new ApiError(404, 'There is no such document on this cruise.');
	if (!mayRead(access, doc))
		throw new ApiError(
			403,
			doc.kind === 'medical'
				? 'Medical documents are read only by their owner, the chief scientist and the master of the cruise.'
				: 'Only the owner, the chief scientist, the master and the marine office read sea-going documents.'
		);
	const bytes = uploads.read(doc.sha256);
	if (doc.kind === 'medical' || doc.userId !== access.user.id)
		audit(db, {
			userId: access.user.id,
			cruiseId: access.cruise.id,
			action: doc.kind === 'medical' ? 'document.medical_read' : 'document.read',
			detail: { documentId: doc.id, ownerId: doc.userId }
		});
	return { doc, bytes };
}

/** The chief scientist accepts or rejects (with a reason) an uploaded document. */
export function review(
	actorId: string,
	cruiseId: string,
	documentId: string,
	status: 'accepted' | 'rejected',
	reason: string | undefined,
	db: Db = appDb
): Document {
	const doc = db.select().from(document).where(eq(document.id, documentId)).get();
	if (!doc || doc.cruiseId !== cruiseId)
		throw new ApiError(404, 'There is no such document on this cruise.');
	db.transaction((tx) => {
		tx.update(document)
			.set({
				status,
				reviewReason: status === 'rejected' ? (reason ?? null) : null,
				reviewedById: actorId,
				reviewedAt: new Date()
			})
			.where(eq(document.id, doc.id))
			.run();
		audit(tx, {
			userId: actorId,
			cruiseId,
			action: `document.${status}`,
			detail: { documentId: doc.id }
		});
	});
	return db.select().from(document).where(eq(document.id, doc.id)).get()!;
}

/** The owner takes back an upload that nobody has accepted yet. */
export function removeOwn(access: CruiseAccess, documentId: string, db: Db = appDb) {
	const doc = db.select().from(document).where(eq(document.id, documentId)).get();
	if (!doc || doc.cruiseId !== access.cruise.id || doc.userId !== access.user.id)
		throw new ApiError(404, 'You have no such document on this cruise.');
	db.transaction((tx) => {
		tx.delete(document).where(eq(document.id, doc.id)).run();
		audit(tx, {
			userId: access.user.id,
			cruiseId: access.cruise.id,
			action: 'document.removed',
			detail: { documentId: doc.id }
		});
	});
	dropUnreferenced(db, [doc.sha256]);
}

function dropUnreferenced(db: Reader, hashes: string[]) {
	const still = new Set(
		hashes.length
			? db
					.select({ sha256: document.sha256 })
					.from(document)
					.where(inArray(document.sha256, hashes))
					.all()
					.map((r) => r.sha256)
			: []
	);
	for (const h of new Set(hashes)) if (!still.has(h)) uploads.remove(h);
}

/** YYYY-MM-DD of an instant, UTC. */
const dayOf = (ms: number) => new Date(ms).toISOString().slice(0, 10);

function cellOf(doc: Document | undefined, returnDay: string | null): CellState {
	if (!doc) return 'missing';
	if (doc.status !== 'rejected' && doc.expiresOn && returnDay && doc.expiresOn < returnDay)
		return 'expires_before_return';
	return doc.status;
}

export interface OwnDocument {
	id: string;
	kind: DocumentKind;
	filename: string;
	sizeBytes: number;
	status: Document['status'];
	state: CellState;
	expiresOn: string | null;
	reviewReason: string | null;
	createdAt: Date;
}

/** A person's documents on the cruise and what is still missing, with deadlines. */
export function mine(userId: string, cruiseId: string, db: Reader = appDb) {
	const c = db.select().from(cruise).where(eq(cruise.id, cruiseId)).get();
	const returnDay = c?.returnAt ? dayOf(c.returnAt.getTime()) : null;
	const docs = db
		.select()
		.from(document)
		.where(and(eq(document.cruiseId, cruiseId), eq(document.userId, userId)))
		.orderBy(desc(document.createdAt))
		.all();
	const own: OwnDocument[] = docs.map((d) => ({
		id: d.id,
		kind: d.kind,
		filename: d.filename,
		sizeBytes: d.sizeBytes,
		status: d.status,
		state: cellOf(d, returnDay),
		expiresOn: d.expiresOn,
		reviewReason: d.reviewReason,
		createdAt: d.createdAt
	}));
	const missing = requirements(cruiseId, db).filter((r) => {
		const latest = docs.find((d) => d.kind === r.kind);
		const s = cellOf(latest, returnDay);
		return s === 'missing' || s === 'rejected' || s === 'expires_before_return';
	});
	return { documents: own, missing };
}

export interface MatrixRow {
	userId: string;
	name: string;
	cells: Record<string, { state: CellState; documentId: string | null; expiresOn: string | null }>;
}

/**
 * People × required documents for the chief scientist: everyone with a live application (applied,
 * waiting or confirmed), each cell the state of their latest upload of that kind.
 */
export function matrix(cruiseId: string, db: Reader = appDb) {
	const c = db.select().from(cruise).where(eq(cruise.id, cruiseId)).get();
	const returnDay = c?.returnAt ? dayOf(c.returnAt.getTime()) : null;
	const kinds = requirements(cruiseId, db).map((r) => r.kind);
	const people = db
		.selectDistinct({ userId: user.id, name: user.name })
		.from(berthApplication)
		.innerJoin(user, eq(berthApplication.userId, user.id))
		.where(
			and(
				eq(berthApplication.cruiseId, cruiseId),
				inArray(berthApplication.status, ['applied', 'waitlisted', 'confirmed'])
			)
		)
		.orderBy(asc(user.name))
		.all();
	const docs = db
		.select()
		.from(document)
		.where(eq(document.cruiseId, cruiseId))
		.orderBy(desc(document.createdAt))
		.all();
	const rows: MatrixRow[] = people.map((p) => ({
		...p,
		cells: Object.fromEntries(
			kinds.map((k) => {
				const d = docs.find((x) => x.userId === p.userId && x.kind === k);
				return [
					k,
					{
						state: cellOf(d, returnDay),
						documentId: d?.id ?? null,
						expiresOn: d?.expiresOn ?? null
					}
				];
			})
		)
	}));
	return { kinds, rows, returnDay };
}

// ---------------------------------------------------------------- retention

export interface RetentionDue {
	cruiseId: string;
	code: string;
	returnAt: Date;
	deleteFrom: Date;
	documents: number;
	people: number;
}

/** What the next retention run deletes: documents of completed cruises past return + N days. */
export function retentionDue(
	now = Date.now(),
	days = config.documentRetentionDays,
	db: Reader = appDb
): RetentionDue[] {
	const cutoff = new Date(now - days * DAY_MS);
	const cruises = db
		.select({ id: cruise.id, code: cruise.code, returnAt: cruise.returnAt })
		.from(cruise)
		.where(and(eq(cruise.status, 'completed'), lte(cruise.returnAt, cutoff)))
		.orderBy(asc(cruise.returnAt))
		.all();
	return cruises.flatMap((c) => {
		const docs = db
			.select({ userId: document.userId })
			.from(document)
			.where(eq(document.cruiseId, c.id))
			.all();
		if (docs.length === 0) return [];
		return [
			{
				cruiseId: c.id,
				code: c.code,
				returnAt: c.returnAt!,
				deleteFrom: new Date(c.returnAt!.getTime() + days * DAY_MS),
				documents: docs.length,
				people: new Set(docs.map((d) => d.userId)).size
			}
		];
	});
}

/** Deletes what `retentionDue` lists: rows and, when no other row shares them, the stored files. */
export function runRetention(
	now = Date.now(),
	days = config.documentRetentionDays,
	db: Db = appDb
): number {
	const due = retentionDue(now, days, db);
	let removed = 0;
	for (const d of due) {
		const hashes = db
			.select({ sha256: document.sha256 })
			.from(document)
			.where(eq(document.cruiseId, d.cruiseId))
			.all()
			.map((r) => r.sha256);
		db.transaction((tx) => {
			tx.delete(document).where(eq(document.cruiseId, d.cruiseId)).run();
			audit(tx, {
				cruiseId: d.cruiseId,
				action: 'documents.retention_deleted',
				detail: { documents: d.documents, retentionDays: days }
			});
		});
		dropUnreferenced(db, hashes);
		removed += d.documents;
	}
	return removed;
}

let timer: ReturnType<typeof setInterval> | null = null;

/** Runs the retention deletion at start and then every six hours. */
export function startRetention() {
	if (timer) return;
	const run = () => {
		try {
			const n = runRetention();
			if (n > 0) console.log(`[retention] deleted ${n} documents of completed cruises`);
		} catch (e) {
			console.error('[retention] run failed', e);
		}
	};
	run();
	timer = setInterval(run, 6 * 3_600_000);
	timer.unref?.();
}
