import { z } from './messages';
import { SIZES } from '$lib/engine/limits';
import { bounded } from './limits';

const DEPTH_MODELS = ['stein-stein-1992', 'parsons-sclater-1977', 'half-space'] as const;
const STATUSES = ['draft', 'planned', 'published', 'at_sea', 'completed'] as const;

/** A datetime-local field read as UTC ("2027-03-01T08:00"). Empty means not set yet. */
const utcDateTime = z
	.string()
	.trim()
	.refine((s) => s === '' || validInstant(s), {
		message: 'Enter a date and time between 1950 and 2200, e.g. 2027-03-01T08:00 (UTC).'
	})
	.default('');

export const cruiseSchema = z
	.object({
		code: z
			.string()
			.trim()
			.min(2)
			.max(20)
			.regex(
				/^[A-Za-z0-9][A-Za-z0-9._-]*$/,
				'Cruise code: letters, digits, dots, dashes or underscores, starting with a letter or digit.'
			),
		title: z.string().trim().min(3).max(200),
		status: z.enum(STATUSES).default('draft'),
		vesselId: z.string().default(''),
		departurePortId: z.string().default(''),
		returnPortId: z.string().default(''),
		departureAt: utcDateTime,
		returnAt: utcDateTime,
		// Ship time granted; at least one day (a cruise of no days cannot be planned or billed).
		allocatedDays: bounded('allocatedDays').default(1),
		weatherMarginPct: bounded('weatherMarginPct').default(10),
		depthModel: z.enum(DEPTH_MODELS).default('stein-stein-1992')
	})
	.refine((c) => !c.departureAt || !c.returnAt || toUtc(c.returnAt)! > toUtc(c.departureAt)!, {
		message: 'Return: must come after the departure.',
		path: ['returnAt']
	})
	.refine(
		(c) =>
			!c.departureAt ||
			!c.returnAt ||
			toUtc(c.returnAt)!.getTime() - toUtc(c.departureAt)!.getTime() <=
				SIZES.timelineDays * 86_400_000,
		{ message: `A cruise may last at most ${SIZES.timelineDays} days.`, path: ['returnAt'] }
	);

export type CruiseInput = z.infer<typeof cruiseSchema>;

/** A parseable instant within 1950–2200 (a planning tool has no business outside it). */
export function validInstant(s: string): boolean {
	const t = toUtc(s)?.getTime();
	return (
		t !== undefined && Number.isFinite(t) && t >= Date.UTC(1950, 0, 1) && t < Date.UTC(2200, 0, 1)
	);
}

export function toUtc(s: string): Date | null {
	if (!s) return null;
	return new Date(s.length === 16 ? s + ':00Z' : s.endsWith('Z') ? s : s + 'Z');
}

export function toLocalInput(d: Date | null | undefined): string {
	return d ? d.toISOString().slice(0, 16) : '';
}

export const memberInviteSchema = z.object({
	email: z.email().max(254).trim().toLowerCase(),
	role: z.enum(['chief_scientist', 'participant', 'port_agent', 'master']).default('participant')
});

export const memberRoleSchema = z.object({
	userId: z.string().min(1),
	role: z.enum(['chief_scientist', 'participant', 'port_agent', 'master'])
});

/** Deleting a cruise: the code typed again, as the confirmation. */
export const deleteCruiseSchema = z.object({
	confirmCode: z.string().trim().min(1, 'Type the cruise code to confirm.').max(20)
});
