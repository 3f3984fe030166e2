// The whole domain of a Wakeline cruise (DESIGN.md §3). Singular table names, camelCase keys mapped
// to snake_case columns (drizzle `casing: 'snake_case'`). Times are stored as epoch milliseconds,
// money in minor units with an ISO 4217 currency, geometry as GeoJSON-order [lon, lat] JSON arrays.
import { sql } from 'drizzle-orm';
import {
	blob,
	index,
	integer,
	real,
	sqliteTable,
	text,
	uniqueIndex,
	type AnySQLiteColumn
} from 'drizzle-orm/sqlite-core';

import { DOCUMENT_KINDS, ROLES_ON_BOARD, type DocumentKind, type RoleOnBoard } from '../../party';

export type LonLat = [number, number];

const id = () => text().primaryKey();
const createdAt = () =>
	integer({ mode: 'timestamp_ms' })
		.notNull()
		.default(sql`(cast(unixepoch('subsec') * 1000 as integer))`);

export const GLOBAL_ROLES = ['admin', 'member'] as const;
export type GlobalRole = (typeof GLOBAL_ROLES)[number];

export const CRUISE_ROLES = ['chief_scientist', 'participant', 'port_agent', 'master'] as const;
export type CruiseRole = (typeof CRUISE_ROLES)[number];

export const CRUISE_STATUSES = ['draft', 'planned', 'published', 'at_sea', 'completed'] as const;
export type CruiseStatus = (typeof CRUISE_STATUSES)[number];

export const DEPTH_MODELS = ['stein-stein-1992', 'parsons-sclater-1977', 'half-space'] as const;
export type DepthModelId = (typeof DEPTH_MODELS)[number];

// ---------------------------------------------------------------- people and access

export const user = sqliteTable('user', {
	id: id(),
	email: text().notNull().unique(),
	name: text().notNull(),
	passwordHash: text(),
	role: text({ enum: GLOBAL_ROLES }).notNull().default('member'),
	createdAt: createdAt(),
	// Set by the marine office: this member may create cruises (and so lead them). Admins always may.
	canLeadCruises: integer({ mode: 'boolean' }).notNull().default(false)
});

export const session = sqliteTable(
	'session',
	{
		// SHA-256 of the token held in the cookie (hex); the token itself is never stored.
		id: text().primaryKey(),
		userId: text()
			.notNull()
			.references(() => user.id, { onDelete: 'cascade' }),
		expiresAt: integer({ mode: 'timestamp_ms' }).notNull(),
		createdAt: createdAt()
	},
	(t) => [index('session_user_idx').on(t.userId)]
);

export const apiToken = sqliteTable(
	'api_token',
	{
		id: id(),
		userId: text()
			.notNull()
			.references(() => user.id, { onDelete: 'cascade' }),
		name: text().notNull(),
		tokenHash: text().notNull().unique(),
		// First characters of the token, shown in lists so a user can tell tokens apart.
		prefix: text().notNull(),
		createdAt: createdAt(),
		lastUsedAt: integer({ mode: 'timestamp_ms' }),
		revokedAt: integer({ mode: 'timestamp_ms' })
	},
	(t) => [index('api_token_user_idx').on(t.userId)]
);

export const passwordReset = sqliteTable('password_reset', {
	id: id(),
	userId: text()
		.notNull()
		.references(() => user.id, { onDelete: 'cascade' }),
	tokenHash: text().notNull().unique(),
	expiresAt: integer({ mode: 'timestamp_ms' }).notNull(),
	usedAt: integer({ mode: 'timestamp_ms' }),
	createdAt: createdAt()
});

export const invitation = sqliteTable(
	'invitation',
	{
		id: id(),
		email: text().notNull(),
		name: text(),
		globalRole: text({ enum: GLOBAL_ROLES }).notNull().default('member'),
		cruiseId: text().references((): AnySQLiteColumn => cruise.id, { onDelete: 'cascade' }),
		cruiseRole: text({ enum: CRUISE_ROLES }),
		tokenHash: text().notNull().unique(),
		invitedById: text().references(() => user.id, { onDelete: 'set null' }),
		expiresAt: integer({ mode: 'timestamp_ms' }).notNull(),
		acceptedAt: integer({ mode: 'timestamp_ms' }),
		revokedAt: integer({ mode: 'timestamp_ms' }),
		createdAt: createdAt()
	},
	(t) => [index('invitation_email_idx').on(t.email)]
);

// Failed sign-ins counted per key ("account:<email>" or "address:<ip>") in a sliding window.
export const signInThrottle = sqliteTable('sign_in_throttle', {
	key: text().primaryKey(),
	failures: integer().notNull().default(0),
	windowStartedAt: integer({ mode: 'timestamp_ms' }).notNull(),
	lockedUntil: integer({ mode: 'timestamp_ms' })
});

// ---------------------------------------------------------------- ships, ports, cruises

export const vessel = sqliteTable('vessel', {
	id: id(),
	name: text().notNull(),
	callSign: text().notNull().unique(),
	scienceBerths: integer().notNull(),
	transitSpeedKn: real().notNull(),
	surveySpeedKn: real().notNull(),
	dayRateMinor: integer().notNull(),
	currency: text().notNull().default('EUR'),
	swathAngleDeg: real().notNull().default(130),
	// Effective swath is capped at this multiple of depth, as outer beams are lost in deep water.
	swathDepthFactor: real().notNull().default(4),
	winchSpeedMPerMin: real().notNull().default(60),
	enduranceDays: integer().notNull(),
	createdAt: createdAt()
});

export const port = sqliteTable('port', {
	id: id(),
	name: text().notNull().unique(),
	countryCode: text(),
	lon: real().notNull(),
	lat: real().notNull(),
	// Standard offset of local civil time from UTC, in minutes (ship's local time is shown beside UTC).
	utcOffsetMinutes: integer().notNull().default(0)
});

export const cruise = sqliteTable(
	'cruise',
	{
		id: id(),
		code: text().notNull().unique(),
		title: text().notNull(),
		status: text({ enum: CRUISE_STATUSES }).notNull().default('draft'),
		vesselId: text().references(() => vessel.id, { onDelete: 'set null' }),
		departurePortId: text().references(() => port.id),
		returnPortId: text().references(() => port.id),
		departureAt: integer({ mode: 'timestamp_ms' }),
		returnAt: integer({ mode: 'timestamp_ms' }),
		allocatedDays: real().notNull().default(0),
		weatherMarginPct: real().notNull().default(10),
		// When set, the weather margin is this many days instead of a share of the sea time.
		weatherMarginDays: real(),
		// Timeline settings (hours): turning between consecutive survey lines, alongside before sailing
		// and after returning.
		turnH: real().notNull().default(0.5),
		mobilisationH: real().notNull().default(24),
		demobilisationH: real().notNull().default(12),
		depthModel: text({ enum: DEPTH_MODELS }).notNull().default('stein-stein-1992'),
		createdById: text().references(() => user.id, { onDelete: 'set null' }),
		createdAt: createdAt(),
		updatedAt: createdAt()
	},
	// Codes are unique regardless of case: MT27-03 and mt27-03 name the same cruise.
	(t) => [uniqueIndex('cruise_code_ci_idx').on(sql`lower(${t.code})`)]
);

export const cruiseMember = sqliteTable(
	'cruise_member',
	{
		cruiseId: text()
			.notNull()
			.references(() => cruise.id, { onDelete: 'cascade' }),
		userId: text()
			.notNull()
			.references(() => user.id, { onDelete: 'cascade' }),
		role: text({ enum: CRUISE_ROLES }).notNull(),
		createdAt: createdAt()
	},
	(t) => [uniqueIndex('cruise_member_pk').on(t.cruiseId, t.userId)]
);

export const leg = sqliteTable(
	'leg',
	{
		id: id(),
		cruiseId: text()
			.notNull()
			.references(() => cruise.id, { onDelete: 'cascade' }),
		seq: integer().notNull(),
		name: text().notNull(),
		fromPortId: text().references(() => port.id),
		toPortId: text().references(() => port.id),
		startAt: integer({ mode: 'timestamp_ms' }),
		endAt: integer({ mode: 'timestamp_ms' }),
		// Science berths on this leg when fewer than the vessel's (null: the vessel's number).
		scienceBerths: integer()
	},
	(t) => [uniqueIndex('leg_seq_idx').on(t.cruiseId, t.seq)]
);

// ---------------------------------------------------------------- the plan

export const ridgeSegment = sqliteTable('ridge_segment', {
	id: id(),
	cruiseId: text()
		.notNull()
		.references(() => cruise.id, { onDelete: 'cascade' }),
	name: text().notNull(),
	axis: text({ mode: 'json' }).$type<LonLat[]>().notNull(),
	fullRateMmYr: real().notNull(),
	// Share of the full rate on the left flank, walking along the axis trace.
	asymmetry: real().notNull().default(0.5),
	potentialTemperatureC: real(),
	axialDepthM: real(),
	createdAt: createdAt()
});

export const LINE_PURPOSES = ['multibeam', 'magnetics', 'gravity', 'seismic'] as const;
export const IHO_ORDERS = ['exclusive', 'special', '1a', '1b', '2'] as const;

export const surveyArea = sqliteTable('survey_area', {
	id: id(),
	cruiseId: text()
		.notNull()
		.references(() => cruise.id, { onDelete: 'cascade' }),
	name: text().notNull(),
	ring: text({ mode: 'json' }).$type<LonLat[]>().notNull(),
	overlapPct: real().notNull().default(30),
	surveySpeedKn: real().notNull().default(8),
	createdAt: createdAt()
});

export const surveyLine = sqliteTable('survey_line', {
	id: id(),
	cruiseId: text()
		.notNull()
		.references(() => cruise.id, { onDelete: 'cascade' }),
	areaId: text().references(() => surveyArea.id, { onDelete: 'set null' }),
	name: text().notNull(),
	coords: text({ mode: 'json' }).$type<LonLat[]>().notNull(),
	purpose: text({ enum: LINE_PURPOSES }).notNull().default('multibeam'),
	surveySpeedKn: real().notNull().default(8),
	overlapPct: real().notNull().default(30),
	ihoOrder: text({ enum: IHO_ORDERS }).notNull().default('2'),
	createdAt: createdAt()
});

export const STATION_KINDS = ['ctd', 'dredge', 'core', 'dive'] as const;
export type StationKind = (typeof STATION_KINDS)[number];

export const station = sqliteTable('station', {
	id: id(),
	cruiseId: text()
		.notNull()
		.references(() => cruise.id, { onDelete: 'cascade' }),
	name: text().notNull(),
	kind: text({ enum: STATION_KINDS }).notNull(),
	lon: real().notNull(),
	lat: real().notNull(),
	params: text({ mode: 'json' }).$type<Record<string, number | string>>().notNull().default({}),
	createdAt: createdAt()
});

export const PLAN_ITEM_KINDS = ['line', 'station', 'port_call'] as const;

// The order of work: port → lines and stations → port.
export const planItem = sqliteTable(
	'plan_item',
	{
		id: id(),
		cruiseId: text()
			.notNull()
			.references(() => cruise.id, { onDelete: 'cascade' }),
		legId: text().references(() => leg.id, { onDelete: 'set null' }),
		seq: integer().notNull(),
		kind: text({ enum: PLAN_ITEM_KINDS }).notNull(),
		lineId: text().references(() => surveyLine.id, { onDelete: 'cascade' }),
		stationId: text().references(() => station.id, { onDelete: 'cascade' }),
		portId: text().references(() => port.id),
		reversed: integer({ mode: 'boolean' }).notNull().default(false),
		portCallHours: real()
	},
	(t) => [index('plan_item_cruise_idx').on(t.cruiseId, t.seq)]
);

// ---------------------------------------------------------------- science party

export const BERTH_STATUSES = [
	'applied',
	'confirmed',
	'waitlisted',
	'declined',
	'withdrawn'
] as const;

export const berthApplication = sqliteTable(
	'berth_application',
	{
		id: id(),
		cruiseId: text()
			.notNull()
			.references(() => cruise.id, { onDelete: 'cascade' }),
		legId: text()
			.notNull()
			.references(() => leg.id, { onDelete: 'cascade' }),
		userId: text()
			.notNull()
			.references(() => user.id, { onDelete: 'cascade' }),
		status: text({ enum: BERTH_STATUSES }).notNull().default('applied'),
		roleOnBoard: text({ enum: ROLES_ON_BOARD }),
		note: text(),
		institution: text(),
		// 1, 2, … in the order waiting people are offered a freed berth; null unless waitlisted.
		waitlistPosition: integer(),
		// The chief scientist's optional message with the last decision (sent in the decision e-mail).
		decisionMessage: text(),
		decidedById: text().references(() => user.id, { onDelete: 'set null' }),
		decidedAt: integer({ mode: 'timestamp_ms' }),
		createdAt: createdAt()
	},
	(t) => [uniqueIndex('berth_application_leg_user').on(t.legId, t.userId)]
);

export { DOCUMENT_KINDS, ROLES_ON_BOARD, type DocumentKind, type RoleOnBoard };

export const DOCUMENT_STATUSES = ['uploaded', 'accepted', 'rejected'] as const;

export const document = sqliteTable(
	'document',
	{
		id: id(),
		cruiseId: text()
			.notNull()
			.references(() => cruise.id, { onDelete: 'cascade' }),
		userId: text()
			.notNull()
			.references(() => user.id, { onDelete: 'cascade' }),
		kind: text({ enum: DOCUMENT_KINDS }).notNull(),
		// The uploader's file name, used only as the download name.
		filename: text().notNull(),
		mimeType: text().notNull(),
		sizeBytes: integer().notNull(),
		sha256: text().notNull(),
		status: text({ enum: DOCUMENT_STATUSES }).notNull().default('uploaded'),
		// Calendar date YYYY-MM-DD, where the document has one (passport, certificate, visa).
		expiresOn: text(),
		reviewReason: text(),
		reviewedById: text().references(() => user.id, { onDelete: 'set null' }),
		reviewedAt: integer({ mode: 'timestamp_ms' }),
		createdAt: createdAt()
	},
	(t) => [index('document_cruise_user_idx').on(t.cruiseId, t.userId, t.kind)]
);

// Which documents a cruise requires, each due a number of days before sailing.
export const documentRequirement = sqliteTable(
	'document_requirement',
	{
		cruiseId: text()
			.notNull()
			.references(() => cruise.id, { onDelete: 'cascade' }),
		kind: text({ enum: DOCUMENT_KINDS }).notNull(),
		daysBeforeSailing: integer().notNull()
	},
	(t) => [uniqueIndex('document_requirement_pk').on(t.cruiseId, t.kind)]
);

// Travel details for the persons-on-board list; read only by the person, and by the master and
// the port agent of a cruise they sail on.
export const travelProfile = sqliteTable('travel_profile', {
	userId: text()
		.primaryKey()
		.references(() => user.id, { onDelete: 'cascade' }),
	fullName: text().notNull(),
	nationality: text().notNull(),
	dateOfBirth: text().notNull(),
	passportNumber: text().notNull(),
	passportExpiry: text().notNull(),
	updatedAt: createdAt()
});

// ---------------------------------------------------------------- money

export const INVOICE_KINDS = [
	'ship_time',
	'port_call_estimate',
	'port_call_final',
	'recharge'
] as const;
export const INVOICE_STATUSES = [
	'draft',
	'issued',
	'partly_paid',
	'paid',
	'refunded',
	'void'
] as const;
export type InvoiceStatus = (typeof INVOICE_STATUSES)[number];
export const PAYMENT_STATUSES = ['open', 'paid', 'expired', 'failed', 'refunded'] as const;

/** One invoice line as stored (amounts already rounded, see src/lib/money.ts). */
export interface InvoiceLine {
	description: string;
	/** Decimal quantity as text, up to 3 decimals. */
	quantity: string;
	unit: string;
	unitMinor: number;
	taxPct: string;
	netMinor: number;
	taxMinor: number;
	amountMinor: number;
	/** Ship time: the leg and its dates (epoch ms). */
	legSeq?: number;
	start?: number;
	end?: number;
	/** Final account: what the estimate said for this line. */
	estimateMinor?: number;
	/** Recharges: the institution billed. */
	institution?: string;
}

export const invoice = sqliteTable('invoice', {
	id: id(),
	cruiseId: text()
		.notNull()
		.references(() => cruise.id, { onDelete: 'cascade' }),
	// Given when issued, gapless per year (WL-2027-0007); drafts have none.
	number: text().unique(),
	kind: text({ enum: INVOICE_KINDS }).notNull(),
	description: text().notNull(),
	amountMinor: integer().notNull(),
	currency: text().notNull(),
	status: text({ enum: INVOICE_STATUSES }).notNull().default('draft'),
	issuedAt: integer({ mode: 'timestamp_ms' }),
	dueAt: integer({ mode: 'timestamp_ms' }),
	paidAt: integer({ mode: 'timestamp_ms' }),
	createdAt: createdAt(),
	lines: text({ mode: 'json' })
		.$type<InvoiceLine[]>()
		.notNull()
		.default(sql`'[]'`),
	// A credit note names the issued invoice it corrects; a final account names its estimate.
	correctsId: text().references((): AnySQLiteColumn => invoice.id, { onDelete: 'set null' }),
	estimateId: text().references((): AnySQLiteColumn => invoice.id, { onDelete: 'set null' }),
	isCreditNote: integer({ mode: 'boolean' }).notNull().default(false),
	/** Whom the invoice is addressed to (the operator's wording), printed on it. */
	billTo: text().notNull().default(''),
	createdById: text().references(() => user.id, { onDelete: 'set null' }),
	voidedAt: integer({ mode: 'timestamp_ms' })
});

export const payment = sqliteTable('payment', {
	id: id(),
	invoiceId: text()
		.notNull()
		.references(() => invoice.id, { onDelete: 'cascade' }),
	checkoutSessionId: text().notNull().unique(),
	status: text({ enum: PAYMENT_STATUSES }).notNull().default('open'),
	amountMinor: integer().notNull(),
	currency: text().notNull(),
	paidById: text().references(() => user.id, { onDelete: 'set null' }),
	createdAt: createdAt(),
	completedAt: integer({ mode: 'timestamp_ms' }),
	paymentIntentId: text(),
	payerEmail: text(),
	refundId: text(),
	refundedAt: integer({ mode: 'timestamp_ms' }),
	refundedMinor: integer().notNull().default(0),
	/** Why admins must look at this payment (e.g. a second payment, refunded). */
	flag: text()
});

// Webhook events already handled, so a redelivered event changes nothing.
export const webhookEvent = sqliteTable('webhook_event', {
	id: text().primaryKey(),
	type: text().notNull(),
	receivedAt: createdAt()
});

// ---------------------------------------------------------------- notices, clearances, audit

export const NOTICE_STATUSES = ['queued', 'sent', 'failed'] as const;

// The mail outbox: a message is written here in the same transaction as the change it reports,
// and a sender delivers it with retries, so a mail server that is down loses nothing.
export const notice = sqliteTable(
	'notice',
	{
		id: id(),
		cruiseId: text().references(() => cruise.id, { onDelete: 'set null' }),
		kind: text().notNull(),
		toAddress: text().notNull(),
		subject: text().notNull(),
		text: text().notNull(),
		html: text(),
		icsAttachment: text(),
		status: text({ enum: NOTICE_STATUSES }).notNull().default('queued'),
		attempts: integer().notNull().default(0),
		nextAttemptAt: integer({ mode: 'timestamp_ms' }).notNull(),
		lastError: text(),
		messageId: text(),
		sentAt: integer({ mode: 'timestamp_ms' }),
		createdAt: createdAt(),
		// The recipient's account when the mail goes to a user (notices.send); null for invitations.
		// No foreign key: SQLite cannot add one with ON DELETE to an existing table, and the log
		// should outlive the account.
		userId: text(),
		// A notice with the same key is never queued twice (reminders, one mail per publication).
		dedupeKey: text().unique(),
		// Extra mail headers, e.g. RFC 8058 List-Unsubscribe for optional kinds.
		headers: text({ mode: 'json' }).$type<Record<string, string>>()
	},
	(t) => [
		index('notice_due_idx').on(t.status, t.nextAttemptAt),
		index('notice_cruise_idx').on(t.cruiseId, t.createdAt)
	]
);

// Optional notice kinds a user has turned off (no row: on). Schedule publications always go out.
export const noticePreference = sqliteTable(
	'notice_preference',
	{
		userId: text()
			.notNull()
			.references(() => user.id, { onDelete: 'cascade' }),
		kind: text().notNull(),
		enabled: integer({ mode: 'boolean' }).notNull(),
		updatedAt: createdAt()
	},
	(t) => [uniqueIndex('notice_preference_pk').on(t.userId, t.kind)]
);

// One-click unsubscribe links (RFC 8058): single use, one preference each; only the hash is kept.
export const unsubscribeToken = sqliteTable('unsubscribe_token', {
	id: id(),
	tokenHash: text().notNull().unique(),
	userId: text()
		.notNull()
		.references(() => user.id, { onDelete: 'cascade' }),
	kind: text().notNull(),
	createdAt: createdAt(),
	usedAt: integer({ mode: 'timestamp_ms' })
});

// A published schedule: a numbered, frozen copy of the calendar items with their SEQUENCE numbers
// (RFC 5545 §3.8.7.4), who published it, when, and what changed since the version before.
export const scheduleVersion = sqliteTable(
	'schedule_version',
	{
		id: id(),
		cruiseId: text()
			.notNull()
			.references(() => cruise.id, { onDelete: 'cascade' }),
		version: integer().notNull(),
		publishedById: text().references(() => user.id, { onDelete: 'set null' }),
		publishedAt: integer({ mode: 'timestamp_ms' }).notNull(),
		snapshot: text({ mode: 'json' }).notNull(),
		changes: text({ mode: 'json' }).notNull(),
		recipientCount: integer().notNull().default(0)
	},
	(t) => [uniqueIndex('schedule_version_pk').on(t.cruiseId, t.version)]
);

export const CLEARANCE_STATUSES = [
	'not_started',
	'preparing',
	'submitted',
	'granted',
	'refused'
] as const;

export const clearance = sqliteTable('clearance', {
	id: id(),
	cruiseId: text()
		.notNull()
		.references(() => cruise.id, { onDelete: 'cascade' }),
	coastalState: text().notNull(),
	leadMonths: integer().notNull().default(6),
	status: text({ enum: CLEARANCE_STATUSES }).notNull().default('not_started'),
	submittedAt: integer({ mode: 'timestamp_ms' }),
	// A frozen copy of the plan at submission, to warn when the plan changes afterwards.
	submittedPlan: text({ mode: 'json' }),
	submittedPlanHash: text(),
	notes: text(),
	createdAt: createdAt()
});

// The plan items that lie in a coastal state's waters: the first of them in the timeline dates the
// first entry, from which the clearance's due date is counted back.
export const clearanceItem = sqliteTable(
	'clearance_item',
	{
		clearanceId: text()
			.notNull()
			.references(() => clearance.id, { onDelete: 'cascade' }),
		planItemId: text()
			.notNull()
			.references(() => planItem.id, { onDelete: 'cascade' })
	},
	(t) => [uniqueIndex('clearance_item_pk').on(t.clearanceId, t.planItemId)]
);

// Ship's clock changes added by the chief scientist; before the first, the departure port's offset.
export const clockChange = sqliteTable(
	'clock_change',
	{
		id: id(),
		cruiseId: text()
			.notNull()
			.references(() => cruise.id, { onDelete: 'cascade' }),
		at: integer({ mode: 'timestamp_ms' }).notNull(),
		utcOffsetMinutes: integer().notNull(),
		note: text(),
		createdAt: createdAt()
	},
	(t) => [index('clock_change_cruise_idx').on(t.cruiseId, t.at)]
);

export const DEADLINE_KINDS = [
	'clearance',
	'personnel',
	'medical',
	'cargo',
	'report',
	'other'
] as const;
export type DeadlineKind = (typeof DEADLINE_KINDS)[number];

// The cruise's checklist: each item falls a number of days before (negative) or after sailing or
// return, so it moves with the schedule.
export const deadline = sqliteTable(
	'deadline',
	{
		id: id(),
		cruiseId: text()
			.notNull()
			.references(() => cruise.id, { onDelete: 'cascade' }),
		title: text().notNull(),
		kind: text({ enum: DEADLINE_KINDS }).notNull().default('other'),
		anchor: text({ enum: ['sailing', 'return'] })
			.notNull()
			.default('sailing'),
		offsetDays: integer().notNull(),
		doneAt: integer({ mode: 'timestamp_ms' }),
		createdAt: createdAt()
	},
	(t) => [index('deadline_cruise_idx').on(t.cruiseId)]
);

export const auditLog = sqliteTable(
	'audit_log',
	{
		id: integer().primaryKey({ autoIncrement: true }),
		cruiseId: text().references(() => cruise.id, { onDelete: 'cascade' }),
		userId: text().references(() => user.id, { onDelete: 'set null' }),
		action: text().notNull(),
		detail: text({ mode: 'json' }),
		createdAt: createdAt()
	},
	(t) => [index('audit_cruise_idx').on(t.cruiseId, t.createdAt)]
);

// ---------------------------------------------------------------- observed tracks

export const TRACK_FORMATS = ['mgd77t', 'mgd77', 'csv', 'xyz'] as const;

// An observed track (underway soundings) uploaded to a cruise. The fixes are one packed BLOB of
// little-endian Float64 columns [lon × n, lat × n, depth × n, time × n] (NaN = missing), not a
// row per fix: a million fixes are 32 MB in one row.
export const observedTrack = sqliteTable(
	'observed_track',
	{
		id: id(),
		cruiseId: text()
			.notNull()
			.references(() => cruise.id, { onDelete: 'cascade' }),
		name: text().notNull(),
		format: text({ enum: TRACK_FORMATS }).notNull(),
		points: integer().notNull(),
		fixes: blob({ mode: 'buffer' }).notNull(),
		warnings: text({ mode: 'json' }).$type<
			{ code: string; message: string; row: number; count: number }[]
		>(),
		depthsFlipped: integer({ mode: 'boolean' }).notNull().default(false),
		// SHA-256 of the uploaded bytes: the same file twice on one cruise is refused (409).
		sha256: text().notNull(),
		createdById: text().references(() => user.id, { onDelete: 'set null' }),
		createdAt: createdAt()
	},
	(t) => [
		index('observed_track_cruise_idx').on(t.cruiseId, t.createdAt),
		uniqueIndex('observed_track_file_idx').on(t.cruiseId, t.sha256)
	]
);

export type User = typeof user.$inferSelect;
export type Session = typeof session.$inferSelect;
export type ApiToken = typeof apiToken.$inferSelect;
export type Invitation = typeof invitation.$inferSelect;
export type Vessel = typeof vessel.$inferSelect;
export type Port = typeof port.$inferSelect;
export type Cruise = typeof cruise.$inferSelect;
export type CruiseMember = typeof cruiseMember.$inferSelect;
export type Leg = typeof leg.$inferSelect;
export type RidgeSegment = typeof ridgeSegment.$inferSelect;
export type SurveyLine = typeof surveyLine.$inferSelect;
export type SurveyArea = typeof surveyArea.$inferSelect;
export type Station = typeof station.$inferSelect;
export type PlanItem = typeof planItem.$inferSelect;
export type BerthApplication = typeof berthApplication.$inferSelect;
export type Document = typeof document.$inferSelect;
export type DocumentRequirement = typeof documentRequirement.$inferSelect;
export type TravelProfile = typeof travelProfile.$inferSelect;
export type Invoice = typeof invoice.$inferSelect;
export type Payment = typeof payment.$inferSelect;
export type Notice = typeof notice.$inferSelect;
export type Clearance = typeof clearance.$inferSelect;
export type ClearanceItem = typeof clearanceItem.$inferSelect;
export type ClockChange = typeof clockChange.$inferSelect;
export type Deadline = typeof deadline.$inferSelect;
export type NoticePreference = typeof noticePreference.$inferSelect;
export type ScheduleVersion = typeof scheduleVersion.$inferSelect;
export type ObservedTrack = typeof observedTrack.$inferSelect;
