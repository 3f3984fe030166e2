// Zod schemas for the invoice forms (the marine office drafts, issues and corrects invoices).
import { z } from 'zod';
import { CURRENCIES } from '$lib/money';

export const lineSchema = z.object({
	description: z.string().trim().min(1, 'Describe the line.').max(200),
	quantity: z
		.string()
		.trim()
		.regex(/^\d{1,9}(\.\d{1,3})?$/, 'A quantity like 3 or 2.5 (up to 3 decimals).'),
	unit: z.string().trim().max(40).default(''),
	unitPrice: z
		.string()
		.trim()
		.regex(/^\d{1,13}([.,]\d{1,3})?$/, 'A price like 1250.00 in the invoice currency.'),
	taxPct: z
		.string()
		.trim()
		.regex(/^\d{1,3}(\.\d{1,2})?$/, 'A rate in percent like 0, 12.5 or 25.')
		.default('0'),
	institution: z.string().trim().max(120).default('')
});

export const draftSchema = z.object({
	kind: z.enum(['port_call_estimate', 'recharge']).default('port_call_estimate'),
	description: z.string().trim().min(1, 'Say what the invoice is for.').max(200),
	currency: z.enum(CURRENCIES as [string, ...string[]]).default('EUR'),
	billTo: z.string().trim().max(300).default(''),
	lines: z.array(lineSchema).min(1, 'Add at least one line.').max(100, 'At most 100 lines.')
});

export const issueSchema = z.object({
	dueInDays: z.number({ message: 'Give the days until due.' }).int().min(0).max(365).default(30)
});

export const creditSchema = z.object({
	description: z.string().trim().min(1, 'Say what the credit corrects.').max(200),
	amount: z
		.string()
		.trim()
		.regex(/^\d{1,13}([.,]\d{1,3})?$/, 'An amount like 250.00 in the invoice currency.')
});

export type DraftForm = z.infer<typeof draftSchema>;
