// The depth-profile page's inputs: what an empty or unreadable field means, said at that field, and
// the API's 422 details (paths like "ridge.fullRateMmYr") placed back at the field they are about.
import { parsePositions } from '$lib/positions';

export type ProfileField =
	| 'line'
	| 'axis'
	| 'fullRate'
	| 'asymmetry'
	| 'potentialT'
	| 'axialDepth'
	| 'spacingKm'
	| 'swathAngle'
	| 'model';

export const LABELS: Record<ProfileField, string> = {
	line: 'Line positions',
	axis: 'Ridge axis positions',
	fullRate: 'Full spreading rate (mm/yr)',
	asymmetry: 'Left-flank share (0–1)',
	potentialT: 'Mantle potential temperature (°C)',
	axialDepth: 'Measured axial depth (m)',
	spacingKm: 'Sample every (km)',
	swathAngle: 'Swath angle (°)',
	model: 'Age–depth model'
};

export interface ProfileInputs {
	lineText: string;
	axisText: string;
	fullRate: number | null;
	asymmetry: number | null;
	potentialT: number | null;
	axialDepth: number | null;
	spacingKm: number | null;
	swathAngle: number | null;
}

export type FieldErrors = Partial<Record<ProfileField, string>>;

const REQUIRED_NUMBERS: [keyof ProfileInputs, ProfileField, string][] = [
	['fullRate', 'fullRate', 'the full rate across both flanks, e.g. 38'],
	['asymmetry', 'asymmetry', 'the left flank’s share of the spreading, 0.5 when symmetric'],
	['spacingKm', 'spacingKm', 'the distance between samples, e.g. 1'],
	['swathAngle', 'swathAngle', 'the multibeam’s total swath angle, e.g. 130']
];

const isBlank = (v: unknown) => v === null || v === undefined || v === '' || Number.isNaN(v);

/**
 * Checks the form before it is sent: an empty submission is explained field by field (what to
 * enter, and how), not as one schema error. Returns the positions when both are readable.
 */
export function checkInputs(v: ProfileInputs): {
	errors: FieldErrors;
	line?: [number, number][];
	axis?: [number, number][];
} {
	const errors: FieldErrors = {};
	const positions = (text: string, field: 'line' | 'axis', what: string) => {
		if (!text.trim()) {
			errors[field] =
				`${LABELS[field]}: empty — enter at least two positions, one per row (latitude then longitude), or paste a GeoJSON LineString.`;
			return undefined;
		}
		const r = parsePositions(text, what);
		if (!r.ok) {
			errors[field] = `${LABELS[field]}: ${r.message}`;
			return undefined;
		}
		return r.positions;
	};
	const line = positions(v.lineText, 'line', 'line');
	const axis = positions(v.axisText, 'axis', 'ridge axis');
	for (const [key, field, what] of REQUIRED_NUMBERS)
		if (isBlank(v[key])) errors[field] = `${LABELS[field]}: empty — enter ${what}.`;
	return { errors, line, axis };
}

// API body paths (DESIGN.md §6) → the page's fields.
const PATHS: [RegExp, ProfileField][] = [
	[/^line\b/, 'line'],
	[/^ridge\.axis\b/, 'axis'],
	[/^ridge\.fullRateMmYr$/, 'fullRate'],
	[/^ridge\.asymmetry$/, 'asymmetry'],
	[/^ridge\.potentialTemperatureC$/, 'potentialT'],
	[/^ridge\.axialDepthM$/, 'axialDepth'],
	[/^spacingKm$/, 'spacingKm'],
	[/^swathAngleDeg$/, 'swathAngle'],
	[/^model$/, 'model']
];

/**
 * Places the API's 422 details at their fields, each message led by the field's label on this page.
 * Details that match no field are returned apart, to be shown above the button.
 */
export function placeDetails(details: { field: string; message: string }[]): {
	errors: FieldErrors;
	other: string[];
} {
	const errors: FieldErrors = {};
	const other: string[] = [];
	for (const d of details) {
		const hit = PATHS.find(([re]) => re.test(d.field));
		if (!hit) {
			other.push(d.message);
			continue;
		}
		const field = hit[1];
		// Schema messages may already start with their own label ("Sample spacing (km): …").
		const text = d.message.replace(/^[^:]{1,60}: /, '');
		const where = /\.coordinates\.(\d+)/.exec(d.field);
		const msg = `${LABELS[field]}${where ? `, row ${Number(where[1]) + 1}` : ''}: ${text}`;
		errors[field] = errors[field] ? `${errors[field]} ${msg}` : msg;
	}
	return { errors, other };
}
