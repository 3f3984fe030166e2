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
