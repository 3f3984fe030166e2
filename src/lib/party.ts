// Words of the science party shared by the database schema, the forms and the pages (no imports,
// so the browser, the server and drizzle-kit can all read it).
export const ROLES_ON_BOARD = ['scientist', 'technician', 'student', 'observer'] as const;
export type RoleOnBoard = (typeof ROLES_ON_BOARD)[number];

export const ROLE_ON_BOARD_LABELS: Record<RoleOnBoard, string> = {
	scientist: 'Scientist',
	technician: 'Technician',
	student: 'Student',
	observer: 'Observer'
};

// 'medical' is confidential: its owner, the chief scientist and the master of the cruise only.
export const DOCUMENT_KINDS = [
	'personnel',
	'medical',
	'passport',
	'sea_survival',
	'emergency_contact',
	'visa'
] as const;
export type DocumentKind = (typeof DOCUMENT_KINDS)[number];

export const DOCUMENT_KIND_LABELS: Record<DocumentKind, string> = {
	personnel: 'Personnel form',
	medical: 'Medical fitness certificate',
	passport: 'Passport page',
	sea_survival: 'Sea-survival (basic safety) training certificate',
	emergency_contact: 'Emergency contact form',
	visa: 'Visa'
};

export const BERTH_STATUS_LABELS = {
	applied: 'Applied',
	confirmed: 'Confirmed',
	waitlisted: 'Waiting',
	declined: 'Declined',
	withdrawn: 'Withdrawn'
} as const;

/** What the chief scientist's documents matrix shows in each person × document cell. */
export const CELL_LABELS = {
	missing: 'Missing',
	uploaded: 'Uploaded',
	accepted: 'Accepted',
	rejected: 'Rejected',
	expires_before_return: 'Expires before return'
} as const;
export type CellState = keyof typeof CELL_LABELS;

export interface ApplicationView {
	id: string;
	name: string;
	legId: string;
	status: keyof typeof BERTH_STATUS_LABELS;
	roleOnBoard: RoleOnBoard | null;
	institution: string | null;
	waitlistPosition: number | null;
	createdAt: Date | string;
}

export interface ApplicationQuery {
	legId: string;
	status: string;
	text: string;
	sort: 'applied' | 'name' | 'status' | 'waitlist';
}

const STATUS_ORDER = ['applied', 'waitlisted', 'confirmed', 'declined', 'withdrawn'];

/** The chief scientist's filter and sort over the applications (leg, status, words, order). */
export function viewApplications<T extends ApplicationView>(rows: T[], q: ApplicationQuery): T[] {
	const words = q.text.trim().toLowerCase().split(/\s+/).filter(Boolean);
	const kept = rows.filter(
		(r) =>
			(!q.legId || r.legId === q.legId) &&
			(!q.status || r.status === q.status) &&
			words.every((w) =>
				[r.name, r.institution ?? '', r.roleOnBoard ?? ''].some((f) => f.toLowerCase().includes(w))
			)
	);
	const time = (d: Date | string) => new Date(d).getTime();
	const by: Record<ApplicationQuery['sort'], (a: T, b: T) => number> = {
		applied: (a, b) => time(a.createdAt) - time(b.createdAt),
		name: (a, b) => a.name.localeCompare(b.name),
		status: (a, b) => STATUS_ORDER.indexOf(a.status) - STATUS_ORDER.indexOf(b.status),
		waitlist: (a, b) => (a.waitlistPosition ?? Infinity) - (b.waitlistPosition ?? Infinity)
	};
	return [...kept].sort((a, b) => by[q.sort](a, b) || a.name.localeCompare(b.name));
}

/** Share of a leg's berths taken, 0..1, for the used/free bar. */
export function usedShare(confirmed: number, berths: number): number {
	return berths <= 0 ? 1 : Math.min(1, confirmed / berths);
}
