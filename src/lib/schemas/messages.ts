// Plain messages for every zod schema in this folder, in forms (superforms) and in the API's 422
// details alike. A schema may still give its own message; where it does not, zod's built-in text
// ("Too big: expected string to have <=200 characters") is replaced by one that names the field in
// plain words and says what is allowed ("Title: at most 200 characters."). The limits come from the
// schema itself, so a bound changed in a schema changes its message and its input's attributes.
//
// Every schema file imports `z` from here, so the error map is installed wherever a schema is.
import { z } from 'zod';

/** Plain names for field keys; keys not listed are spelled out from camelCase with their unit. */
export const FIELD_LABELS: Record<string, string> = {
	code: 'Cruise code',
	title: 'Title',
	status: 'Status',
	vesselId: 'Vessel',
	departurePortId: 'Departure port',
	returnPortId: 'Return port',
	departureAt: 'Departure',
	returnAt: 'Return',
	allocatedDays: 'Allocated days',
	weatherMarginPct: 'Weather margin (%)',
	weatherMarginDays: 'Weather margin (days)',
	depthModel: 'Age–depth model',
	email: 'E-mail',
	password: 'Password',
	currentPassword: 'Current password',
	confirm: 'The same again',
	name: 'Name',
	role: 'Role',
	callSign: 'Call sign',
	scienceBerths: 'Science berths',
	transitSpeedKn: 'Transit speed (kn)',
	surveySpeedKn: 'Survey speed (kn)',
	dayRate: 'Day rate',
	currency: 'Currency',
	swathAngleDeg: 'Swath angle (°)',
	swathDepthFactor: 'Usable swath (× depth)',
	winchSpeedMPerMin: 'Winch speed (m/min)',
	enduranceDays: 'Endurance (days)',
	fullRateMmYr: 'Full spreading rate (mm/yr)',
	asymmetry: 'Left-flank share',
	potentialTemperatureC: 'Mantle potential temperature (°C)',
	axialDepthM: 'Axial depth (m)',
	spacingKm: 'Sample spacing (km)',
	model: 'Age–depth model',
	turnH: 'Turn between lines (hours)',
	mobilisationH: 'Mobilisation (hours)',
	demobilisationH: 'Demobilisation (hours)',
	offsetHours: 'Hours from UTC',
	at: 'Time',
	note: 'Note',
	hours: 'Hours alongside',
	portId: 'Port',
	coastalState: 'Coastal state',
	leadMonths: 'Months ahead',
	notes: 'Notes',
	offsetDays: 'Days (− before)',
	overlapPct: 'Overlap (%)',
	ihoOrder: 'IHO S-44 order',
	purpose: 'Purpose',
	stationKind: 'Station kind',
	coordinates: 'Positions',
	items: 'Items',
	ids: 'Lines'
};

// Unit suffixes of field keys, as the schemas name them (metres, knots … at the edges).
const UNITS: [RegExp, string][] = [
	[/MPerMin$/, 'm/min'],
	[/MmYr$/, 'mm/yr'],
	[/Kn$/, 'kn'],
	[/Pct$/, '%'],
	[/Deg$/, '°'],
	[/Km$/, 'km'],
	[/Nm$/, 'nm'],
	[/H$/, 'hours'],
	[/C$/, '°C'],
	[/M$/, 'm']
];

/** "surveySpeedKn" → "Survey speed (kn)"; a key in FIELD_LABELS keeps its own label. */
export function labelFor(key: string): string {
	if (FIELD_LABELS[key]) return FIELD_LABELS[key];
	let stem = key;
	let unit = '';
	for (const [re, u] of UNITS)
		if (re.test(key) && key.replace(re, '').length > 0) {
			stem = key.replace(re, '');
			unit = u;
			break;
		}
	const words = stem
		.replace(/([a-z0-9])([A-Z])/g, '$1 $2')
		.replace(/[_-]+/g, ' ')
		.toLowerCase()
		.trim();
	const plain = words.charAt(0).toUpperCase() + words.slice(1);
	return unit ? `${plain} (${unit})` : plain;
}

/** The field an issue is about, in plain words: its last named key, and the item if in a list. */
export function fieldOf(path: readonly PropertyKey[] | undefined): string {
	if (!path?.length) return '';
	const keys = path.filter((p): p is string => typeof p === 'string');
	const last = keys.at(-1);
	if (!last) return `Item ${Number(path[0]) + 1}`;
	const after = path.slice(path.lastIndexOf(last) + 1).filter((p) => typeof p === 'number');
	const where = after.length ? ` (${after.map((n) => `#${n + 1}`).join(', ')})` : '';
	return labelFor(last) + where;
}

const fmt = (n: number | bigint) =>
	typeof n === 'bigint'
		? n.toString()
		: Number.isInteger(n)
			? n.toLocaleString('en').replace(/,/g, ' ')
			: String(n);

const plural = (n: number | bigint, one: string, many: string) =>
	`${fmt(n)} ${Number(n) === 1 ? one : many}`;

type Issue = Parameters<z.core.$ZodErrorMap>[0];

/** What is allowed, in plain words, for one zod issue (without the field's name). */
export function allowed(iss: Issue): string {
	const input = (iss as { input?: unknown }).input;
	switch (iss.code) {
		case 'invalid_type': {
			if (input === undefined || input === null || input === '') return 'required.';
			if (iss.expected === 'number' || iss.expected === 'int') return 'enter a number.';
			if (iss.expected === 'string') return 'enter text.';
			if (iss.expected === 'boolean') return 'yes or no.';
			if (iss.expected === 'array') return 'expected a list.';
			if (iss.expected === 'object') return 'expected an object with named fields.';
			return `expected ${iss.expected}.`;
		}
		case 'too_big': {
			const max = iss.maximum as number | bigint;
			switch (iss.origin) {
				case 'string':
					return `at most ${plural(max, 'character', 'characters')}.`;
				case 'array':
				case 'set':
					return `at most ${plural(max, 'entry', 'entries')}.`;
				case 'file':
					return `at most ${plural(max, 'byte', 'bytes')}.`;
				case 'date':
					return `on or before ${new Date(Number(max)).toISOString().slice(0, 16)} UTC.`;
				default:
					return iss.inclusive ? `at most ${fmt(max)}.` : `below ${fmt(max)}.`;
			}
		}
		case 'too_small': {
			const min = iss.minimum as number | bigint;
			switch (iss.origin) {
				case 'string':
					return Number(min) === 1
						? 'required.'
						: `at least ${plural(min, 'character', 'characters')}.`;
				case 'array':
				case 'set':
					return `at least ${plural(min, 'entry', 'entries')}.`;
				case 'date':
					return `on or after ${new Date(Number(min)).toISOString().slice(0, 16)} UTC.`;
				default:
					return iss.inclusive ? `at least ${fmt(min)}.` : `above ${fmt(min)}.`;
			}
		}
		case 'invalid_format':
			if (iss.format === 'email') return 'enter an e-mail address, e.g. name@example.org.';
			if (iss.format === 'regex') return 'not in the expected form.';
			return `not a valid ${iss.format}.`;
		case 'not_multiple_of':
			return `in steps of ${fmt(iss.divisor as number)}.`;
		case 'invalid_value':
			return iss.values.length === 1
				? `must be ${String(iss.values[0])}.`
				: `choose one of ${iss.values.map(String).join(', ')}.`;
		case 'unrecognized_keys':
			return `unknown ${iss.keys.length === 1 ? 'field' : 'fields'} ${iss.keys.join(', ')}.`;
		case 'invalid_union':
			return 'does not match any allowed form.';
		case 'invalid_key':
			return 'has a key that is not allowed.';
		case 'invalid_element':
			return 'has a value that is not allowed.';
		default:
			return 'not valid.';
	}
}

/** The whole plain message: "Title: at most 200 characters." */
export function plainMessage(iss: Issue): string {
	const field = fieldOf(iss.path);
	const what = allowed(iss);
	return field ? `${field}: ${what}` : what.charAt(0).toUpperCase() + what.slice(1);
}

z.config({ customError: (iss) => plainMessage(iss) });

export { z };
