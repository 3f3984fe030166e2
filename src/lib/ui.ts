// Shared class strings for form controls and buttons, so every screen looks the same.
export const input =
	'block w-full rounded-md border border-basalt-300 bg-white px-3 py-2 text-sm shadow-sm focus:border-abyss-500 focus:ring-2 focus:ring-abyss-200 focus:outline-none aria-[invalid=true]:border-red-500';
export const button =
	'inline-flex items-center justify-center gap-2 rounded-md bg-abyss-700 px-4 py-2 text-sm font-semibold text-white shadow-sm hover:bg-abyss-800 focus:ring-2 focus:ring-abyss-300 focus:outline-none disabled:opacity-50';
export const buttonQuiet =
	'inline-flex items-center justify-center gap-2 rounded-md border border-basalt-300 bg-white px-3 py-1.5 text-sm font-medium text-basalt-800 hover:bg-basalt-100 focus:ring-2 focus:ring-abyss-200 focus:outline-none';
export const buttonDanger =
	'inline-flex items-center justify-center gap-2 rounded-md border border-red-300 bg-white px-3 py-1.5 text-sm font-medium text-red-700 hover:bg-red-50';
export const card = 'rounded-lg border border-basalt-200 bg-white p-5 shadow-sm';
export const link = 'text-abyss-600 underline-offset-2 hover:underline';

export const ROLE_LABELS = {
	chief_scientist: 'Chief scientist',
	participant: 'Participant',
	port_agent: 'Port agent',
	master: 'Master'
} as const;

export const STATUS_LABELS = {
	draft: 'Draft',
	planned: 'Planned',
	published: 'Published',
	at_sea: 'At sea',
	completed: 'Completed'
} as const;

export function formatUtc(d: Date | string | null | undefined): string {
	if (!d) return '—';
	const date = typeof d === 'string' ? new Date(d) : d;
	return date.toISOString().slice(0, 16).replace('T', ' ') + ' UTC';
}

export const INVOICE_STATUS_LABELS = {
	draft: 'Draft',
	issued: 'Issued',
	partly_paid: 'Partly paid',
	paid: 'Paid',
	refunded: 'Refunded',
	void: 'Void'
} as const;

export const INVOICE_KIND_LABELS = {
	ship_time: 'Ship time',
	port_call_estimate: 'Port call — estimate',
	port_call_final: 'Port call — final account',
	recharge: 'Science-party recharge'
} as const;
