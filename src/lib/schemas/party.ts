// Zod schemas for the science party: berth applications and decisions, sea-going documents and the
// travel details of the persons-on-board list. Shared by the forms and the JSON API.
import { z } from 'zod';
import { DOCUMENT_KINDS, ROLES_ON_BOARD } from '$lib/party';

/** Kinds that carry an expiry date worth checking against the cruise's return. */
export const EXPIRING_KINDS = ['medical', 'passport', 'sea_survival', 'visa'] as const;

export const applySchema = z.object({
	legId: z.string().trim().min(1, 'Choose a leg.').max(64),
	roleOnBoard: z.enum(ROLES_ON_BOARD, {
		message: 'Role on board is one of scientist, technician, student, observer.'
	}),
	institution: z.string().trim().max(200, 'At most 200 characters.').optional(),
	note: z.string().trim().max(1000, 'At most 1000 characters.').optional()
});
export type ApplyInput = z.infer<typeof applySchema>;

export const DECISIONS = ['confirmed', 'waitlisted', 'declined'] as const;
export type Decision = (typeof DECISIONS)[number];

export const decisionSchema = z.object({
	status: z.enum([...DECISIONS, 'withdrawn'], {
		message: 'status is one of confirmed, waitlisted, declined (chief scientist) or withdrawn.'
	}),
	message: z.string().trim().max(1000, 'At most 1000 characters.').optional()
});

export const bulkDecisionSchema = z.object({
	ids: z.array(z.string().min(1).max(64)).min(1, 'Tick at least one application.').max(500),
	status: z.enum(DECISIONS, { message: 'Choose confirm, waitlist or decline.' }),
	message: z.string().trim().max(1000, 'At most 1000 characters.').optional()
});

export const legCapSchema = z.object({
	legId: z.string().min(1).max(64),
	berths: z
		.number({ message: 'Enter a whole number of berths.' })
		.int('Berths are whole people.')
		.min(0, 'Berths cannot be negative.')
		.max(500)
});

/** A calendar date YYYY-MM-DD that exists (2027-02-30 does not). */
export const isoDate = z
	.string()
	.trim()
	.regex(/^\d{4}-\d{2}-\d{2}$/, 'Give the date as YYYY-MM-DD.')
	.refine((s) => {
		const d = new Date(s + 'T00:00:00Z');
		return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === s;
	}, 'This is not a calendar date.');

export const documentMetaSchema = z.object({
	kind: z.enum(DOCUMENT_KINDS, {
		message: `kind is one of ${DOCUMENT_KINDS.join(', ')}.`
	}),
	filename: z.string().trim().min(1, 'Name the file.').max(200, 'At most 200 characters.'),
	expiresOn: isoDate.optional()
});

export const reviewSchema = z
	.object({
		status: z.enum(['accepted', 'rejected'], { message: 'status is accepted or rejected.' }),
		reason: z.string().trim().max(500, 'At most 500 characters.').optional()
	})
	.refine((r) => r.status === 'accepted' || (r.reason && r.reason.length > 0), {
		message: 'Say why the document is rejected.',
		path: ['reason']
	});

// Plain text only: names and numbers as printed in the passport. No leading = + - @ so that the
// persons-on-board CSV cannot be read as a formula by a spreadsheet.
const plain = (label: string, max: number) =>
	z
		.string()
		.trim()
		.min(1, `Enter the ${label}.`)
		.max(max, `At most ${max} characters.`)
		.regex(/^[^=+\-@\t\r\n]/, `The ${label} cannot start with = + - or @.`);

export const travelProfileSchema = z.object({
	fullName: plain('full name as in the passport', 120),
	nationality: plain('nationality', 60),
	dateOfBirth: isoDate,
	passportNumber: z
		.string()
		.trim()
		.regex(/^[A-Za-z0-9]{5,20}$/, 'A passport number is 5 to 20 letters and digits.'),
	passportExpiry: isoDate
});
export type TravelProfileInput = z.infer<typeof travelProfileSchema>;

// ---------------------------------------------------------------- page forms

export const idSchema = z.object({ id: z.string().min(1).max(64) });

export const decideFormSchema = z.object({
	id: z.string().min(1).max(64),
	status: z.enum(DECISIONS, { message: 'Choose confirm, waitlist or decline.' }),
	message: z.string().trim().max(1000, 'At most 1000 characters.').optional()
});

export const reviewFormSchema = z
	.object({
		id: z.string().min(1).max(64),
		status: z.enum(['accepted', 'rejected']),
		reason: z.string().trim().max(500, 'At most 500 characters.').optional()
	})
	.refine((r) => r.status === 'accepted' || (r.reason && r.reason.length > 0), {
		message: 'Say why the document is rejected.',
		path: ['reason']
	});

export const uploadFormSchema = z.object({
	kind: z.enum(DOCUMENT_KINDS, { message: 'Choose which document this is.' }),
	expiresOn: z.union([z.literal(''), isoDate]).default(''),
	file: z
		.instanceof(File, { message: 'Choose a file.' })
		.refine((f) => f.size > 0, 'The file is empty.')
});

const days = z
	.number({ message: 'Enter days.' })
	.int('Whole days.')
	.min(0, 'Days cannot be negative.')
	.max(365, 'At most a year before sailing.')
	.default(30);

/** One tick and one number of days before sailing per kind of document. */
export const requirementsFormSchema = z.object({
	personnel: z.boolean().default(false),
	personnelDays: days,
	medical: z.boolean().default(false),
	medicalDays: days,
	passport: z.boolean().default(false),
	passportDays: days,
	sea_survival: z.boolean().default(false),
	sea_survivalDays: days,
	emergency_contact: z.boolean().default(false),
	emergency_contactDays: days,
	visa: z.boolean().default(false),
	visaDays: days
});
