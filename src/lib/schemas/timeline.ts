// Zod schemas for the timeline, clearances and checklist forms and the order API.
import { z } from './messages';
import { SIZES } from '$lib/engine/limits';
import { validInstant } from './cruise';
import { bounded } from './limits';

export const orderSchema = z.object({
	items: z
		.array(z.object({ id: z.string().min(1), reversed: z.boolean().default(false) }))
		.max(SIZES.planItems)
});

export const timingSchema = z.object({
	turnH: bounded('turnH').default(0.5),
	mobilisationH: bounded('mobilisationH').default(24),
	demobilisationH: bounded('mobilisationH').default(12),
	marginMode: z.enum(['pct', 'days']).default('pct'),
	weatherMarginPct: bounded('weatherMarginPct').default(10),
	weatherMarginDays: bounded('weatherMarginDays').default(0)
});

const utcInstant = z.string().trim().refine(validInstant, {
	message: 'Enter a date and time between 1950 and 2200, e.g. 2027-05-08T12:00 (UTC).'
});

export const clockChangeSchema = z.object({
	at: utcInstant,
	/** Hours from UTC, e.g. -9 or 5.5; kept to quarter hours. */
	offsetHours: z
		.number()
		.min(-12, 'At least −12 h.')
		.max(14, 'At most +14 h.')
		.refine((h) => Number.isInteger(h * 4), 'Use whole, half or quarter hours.'),
	note: z.string().trim().max(200).default('')
});

export const addItemSchema = z.object({
	ref: z.string().regex(/^(line|station):.+$/, 'Choose a line or station.')
});

export const portCallSchema = z.object({
	portId: z.string().min(1, 'Choose a port.'),
	hours: bounded('portCallH').default(36)
});

export const idSchema = z.object({ id: z.string().min(1) });

export const CLEARANCE_STATUSES = [
	'not_started',
	'preparing',
	'submitted',
	'granted',
	'refused'
] as const;

export const clearanceSchema = z.object({
	id: z.string().default(''),
	coastalState: z.string().trim().min(2, 'Name the coastal state.').max(120),
	leadMonths: z.number().int('Whole months.').min(0).max(36).default(6),
	status: z.enum(CLEARANCE_STATUSES).default('not_started'),
	notes: z.string().trim().max(2000).default(''),
	itemIds: z.array(z.string()).default([])
});

export const DEADLINE_KINDS = [
	'clearance',
	'personnel',
	'medical',
	'cargo',
	'report',
	'other'
] as const;

export const deadlineSchema = z.object({
	title: z.string().trim().min(2, 'Say what is due.').max(200),
	kind: z.enum(DEADLINE_KINDS).default('other'),
	anchor: z.enum(['sailing', 'return']).default('sailing'),
	offsetDays: z.number().int('Whole days.').min(-730).max(730).default(-30)
});

export const doneSchema = z.object({ id: z.string().min(1), done: z.boolean().default(false) });
