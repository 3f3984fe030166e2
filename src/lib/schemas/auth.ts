import { z } from './messages';

export const signInSchema = z.object({
	email: z.email().max(254).trim().toLowerCase(),
	password: z.string().min(1, 'Enter your password.')
});

const newPassword = z
	.string()
	.min(10, 'Use at least 10 characters.')
	.max(200, 'Keep it under 200 characters.');

export const passwordPairSchema = z
	.object({ password: newPassword, confirm: z.string() })
	.refine((v) => v.password === v.confirm, {
		message: 'The two passwords differ.',
		path: ['confirm']
	});

/** A reset may also revoke the account's API tokens (they are listed beside the choice). */
export const resetPasswordSchema = z
	.object({ password: newPassword, confirm: z.string(), revokeTokens: z.boolean().default(false) })
	.refine((v) => v.password === v.confirm, {
		message: 'The two passwords differ.',
		path: ['confirm']
	});

/** Signing out everywhere may also revoke the account's API tokens. */
export const signOutEverywhereSchema = z.object({ revokeTokens: z.boolean().default(false) });

export const acceptInvitationSchema = z
	.object({
		name: z.string().trim().min(2, 'Enter your name.').max(120),
		password: newPassword,
		confirm: z.string()
	})
	.refine((v) => v.password === v.confirm, {
		message: 'The two passwords differ.',
		path: ['confirm']
	});

export const resetRequestSchema = z.object({
	email: z.email().max(254).trim().toLowerCase()
});

export const changePasswordSchema = z
	.object({
		currentPassword: z.string().min(1, 'Enter your current password.'),
		password: newPassword,
		confirm: z.string()
	})
	.refine((v) => v.password === v.confirm, {
		message: 'The two passwords differ.',
		path: ['confirm']
	});

export const profileSchema = z.object({
	name: z.string().trim().min(2, 'Enter your name.').max(120)
});

export const tokenSchema = z.object({
	name: z.string().trim().min(1, 'Name the token, e.g. "laptop scripts".').max(80)
});

export const siteInviteSchema = z.object({
	email: z.email().max(254).trim().toLowerCase(),
	role: z.enum(['admin', 'member']).default('member')
});

/** The marine office allows a member to create and lead cruises, or stops it. */
export const leadFlagSchema = z.object({
	userId: z.string().min(1),
	allowed: z.boolean().default(false)
});
