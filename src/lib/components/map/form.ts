// The settings form behind the side panel: one flat record for every kind, filled from a saved
// feature or from defaults, and turned back into the properties the API takes for a kind.
import type { IhoOrder, LinePurpose, StationKind } from '$lib/engine/formats/types';
import { MAX_POTENTIAL_TEMPERATURE_C } from '$lib/engine/melt';
import type { PlanFeature, PlanKind, PlanVessel } from './types';

export interface SettingsForm {
	name: string;
	fullRateMmYr: number | null;
	asymmetry: number | null;
	potentialTemperatureC: number | null;
	axialDepthM: number | null;
	purpose: LinePurpose;
	surveySpeedKn: number | null;
	overlapPct: number | null;
	ihoOrder: IhoOrder;
	stationKind: StationKind;
	params: Record<string, number | string | null>;
}

export interface ParamSpec {
	key: string;
	label: string;
	type: 'number' | 'text';
	default: number | string;
	hint?: string;
}

/** What each kind of station asks for. */
export const STATION_PARAMS: Record<StationKind, ParamSpec[]> = {
	ctd: [
		{ key: 'bottleStops', label: 'Bottle stops', type: 'number', default: 12 },
		{ key: 'bottleStopMin', label: 'Minutes per stop', type: 'number', default: 2 },
		{ key: 'deckMin', label: 'Deck time (min)', type: 'number', default: 30 },
		{ key: 'offBottomM', label: 'Stop above bottom (m)', type: 'number', default: 10 }
	],
	dredge: [
		{ key: 'bottomH', label: 'Bottom time (h)', type: 'number', default: 1.5 },
		{ key: 'wireScope', label: 'Wire scope (× depth)', type: 'number', default: 1.5 },
		{ key: 'deckH', label: 'Deck time (h)', type: 'number', default: 1 }
	],
	core: [
		{ key: 'coreType', label: 'Corer', type: 'text', default: 'gravity', hint: 'gravity, piston' },
		{ key: 'bottomH', label: 'Bottom time (h)', type: 'number', default: 0.25 },
		{ key: 'deckH', label: 'Deck time (h)', type: 'number', default: 1.5 }
	],
	dive: [
		{ key: 'vehicle', label: 'Vehicle', type: 'text', default: 'crewed', hint: 'crewed, rov, auv' },
		{ key: 'blockH', label: 'Dive block (h)', type: 'number', default: 8 }
	]
};

export const KIND_LABELS: Record<PlanKind, string> = {
	ridge: 'Ridge segment',
	line: 'Survey line',
	area: 'Survey area',
	station: 'Station'
};

export const PURPOSE_LABELS: Record<LinePurpose, string> = {
	multibeam: 'Multibeam',
	magnetics: 'Magnetics',
	gravity: 'Gravity',
	seismic: 'Seismic'
};

export const STATION_LABELS: Record<StationKind, string> = {
	ctd: 'CTD cast',
	dredge: 'Rock dredge',
	core: 'Core',
	dive: 'Vehicle dive'
};

export const IHO_LABELS: Record<IhoOrder, string> = {
	exclusive: 'Exclusive',
	special: 'Special',
	'1a': 'Order 1a',
	'1b': 'Order 1b',
	'2': 'Order 2'
};

const PREFIX: Record<PlanKind, string> = {
	ridge: 'Ridge ',
	line: 'L-',
	area: 'Area ',
	station: ''
};
const STATION_PREFIX: Record<StationKind, string> = {
	ctd: 'CTD-',
	dredge: 'DR-',
	core: 'GC-',
	dive: 'DIVE-'
};

function paramDefaults(kind: StationKind): Record<string, number | string> {
	return Object.fromEntries(STATION_PARAMS[kind].map((p) => [p.key, p.default]));
}

/** A name not yet used on the plan: "L-13", "CTD-04", "Ridge 3". */
export function nextName(
	plan: readonly PlanFeature[],
	kind: PlanKind,
	stationKind: StationKind = 'ctd'
): string {
	const prefix = kind === 'station' ? STATION_PREFIX[stationKind] : PREFIX[kind];
	const taken = new Set(plan.map((f) => f.properties.name));
	const width = kind === 'station' ? 2 : 1;
	for (let n = 1; ; n++) {
		const name = `${prefix}${String(n).padStart(width, '0')}`;
		if (!taken.has(name)) return name;
	}
}

export function defaultForm(
	kind: PlanKind,
	plan: readonly PlanFeature[],
	vessel: PlanVessel | null
): SettingsForm {
	return {
		name: nextName(plan, kind),
		fullRateMmYr: 30,
		asymmetry: 0.5,
		potentialTemperatureC: null,
		axialDepthM: null,
		purpose: 'multibeam',
		surveySpeedKn: vessel?.surveySpeedKn ?? 8,
		overlapPct: 30,
		ihoOrder: '2',
		stationKind: 'ctd',
		params: paramDefaults('ctd')
	};
}

export function formFromFeature(f: PlanFeature, vessel: PlanVessel | null): SettingsForm {
	const form = defaultForm(f.properties.kind, [], vessel);
	form.name = f.properties.name;
	const p = f.properties;
	if (p.kind === 'ridge') {
		Object.assign(form, {
			fullRateMmYr: p.fullRateMmYr,
			asymmetry: p.asymmetry,
			potentialTemperatureC: p.potentialTemperatureC,
			axialDepthM: p.axialDepthM
		});
	} else if (p.kind === 'line') {
		Object.assign(form, {
			purpose: p.purpose,
			surveySpeedKn: p.surveySpeedKn,
			overlapPct: p.overlapPct,
			ihoOrder: p.ihoOrder
		});
	} else if (p.kind === 'area') {
		Object.assign(form, { surveySpeedKn: p.surveySpeedKn, overlapPct: p.overlapPct });
	} else {
		form.stationKind = p.stationKind;
		form.params = { ...paramDefaults(p.stationKind), ...p.params };
	}
	return form;
}

/** Switching a station's kind swaps its parameters for the new kind's defaults. */
export function withStationKind(
	form: SettingsForm,
	kind: StationKind,
	plan: readonly PlanFeature[]
): SettingsForm {
	const renamed = /^(CTD|DR|GC|DIVE)-\d+$/.test(form.name) || form.name === '';
	return {
		...form,
		stationKind: kind,
		params: paramDefaults(kind),
		name: renamed ? nextName(plan, 'station', kind) : form.name
	};
}

export type FormResult =
	| { ok: true; name: string; properties: Record<string, unknown> }
	| { ok: false; field: string; message: string };

/**
 * What each settings field allows, in the API's own limits (src/lib/schemas/plan.ts), with the
 * plain words a person reads next to the field. The inputs carry the same min/max/maxlength.
 */
export interface FieldLimit {
	label: string;
	min?: number;
	/** true when the value must be strictly above `min` */
	above?: boolean;
	max?: number;
	maxLength?: number;
	unit?: string;
	optional?: boolean;
}

export const NAME_MAX = 80;

export const FIELD_LIMITS: Record<string, FieldLimit> = {
	name: { label: 'Name', maxLength: NAME_MAX },
	fullRateMmYr: { label: 'Full spreading rate', min: 0, above: true, max: 250, unit: 'mm/yr' },
	asymmetry: { label: 'Asymmetry', min: 0, max: 1, optional: true },
	potentialTemperatureC: {
		label: 'Potential temperature',
		min: 1000,
		max: MAX_POTENTIAL_TEMPERATURE_C,
		unit: '°C',
		optional: true
	},
	axialDepthM: { label: 'Measured axial depth', min: 0, max: 8000, unit: 'm', optional: true },
	surveySpeedKn: { label: 'Survey speed', min: 0, above: true, max: 20, unit: 'kn' },
	overlapPct: { label: 'Target overlap', min: 0, max: 90, unit: '%' }
};

const num = (v: number) => v.toLocaleString('en');

/** "Survey speed must be above 0 and at most 20 kn." — what the field allows, in plain words. */
export function allowed(field: string): string {
	const l = FIELD_LIMITS[field];
	if (!l) return 'Check this value.';
	if (l.maxLength) return `${l.label} must be 1 to ${l.maxLength} characters long.`;
	const unit = l.unit ? (l.unit === '%' ? ' %' : ` ${l.unit}`) : '';
	const low = l.min === undefined ? '' : l.above ? `above ${num(l.min)}` : `at least ${num(l.min)}`;
	const high = l.max === undefined ? '' : `at most ${num(l.max)}`;
	const range =
		!l.above && l.min !== undefined && l.max !== undefined
			? `from ${num(l.min)} to ${num(l.max)}${unit}`
			: [low, high].filter(Boolean).join(' and ') + unit;
	return `${l.label} must be ${range}${l.optional ? ', or left empty' : ''}.`;
}

/** The first field of `fields` whose value is missing or out of its limits, with what it allows. */
function check(form: SettingsForm, fields: (keyof SettingsForm)[]): FormResult | null {
	for (const field of fields) {
		const l = FIELD_LIMITS[field];
		const v = form[field] as number | null;
		if (v === null || v === undefined || (v as unknown) === '') {
			if (l.optional) continue;
			return { ok: false, field, message: `${l.label} is needed. ${allowed(field)}` };
		}
		const bad =
			!Number.isFinite(v) ||
			(l.min !== undefined && (l.above ? v <= l.min : v < l.min)) ||
			(l.max !== undefined && v > l.max);
		if (bad) return { ok: false, field, message: allowed(field) };
	}
	return null;
}

/**
 * A refusal from the API as a person should read it: the field in plain words and what it allows,
 * never the schema's own text. `field` is the API's path (e.g. "properties.surveySpeedKn").
 */
export function plainRefusal(field: string | undefined | null): {
	field: string | null;
	message: string;
} {
	const key = field?.startsWith('properties.') ? field.slice('properties.'.length) : field;
	if (key && FIELD_LIMITS[key]) return { field: key, message: allowed(key) };
	if (key?.startsWith('geometry'))
		return {
			field: null,
			message:
				'A position is outside the allowed range: latitude −90 to 90°, longitude −180 to 180°.'
		};
	if (key?.startsWith('params') || key?.startsWith('properties.params'))
		return { field: null, message: 'A station setting was refused: use a number of zero or more.' };
	return { field: null, message: 'The change was refused. Check the settings and try again.' };
}

/** The API properties for `kind`, or the first field that is missing or out of its limits. */
export function propertiesFromForm(kind: PlanKind, form: SettingsForm): FormResult {
	const name = form.name.trim();
	if (!name) return { ok: false, field: 'name', message: `Give it a name. ${allowed('name')}` };
	if (name.length > NAME_MAX) return { ok: false, field: 'name', message: allowed('name') };
	switch (kind) {
		case 'ridge': {
			const miss = check(form, [
				'fullRateMmYr',
				'asymmetry',
				'potentialTemperatureC',
				'axialDepthM'
			]);
			if (miss) return miss;
			return {
				ok: true,
				name,
				properties: {
					fullRateMmYr: form.fullRateMmYr,
					asymmetry: form.asymmetry ?? 0.5,
					potentialTemperatureC: form.potentialTemperatureC ?? null,
					axialDepthM: form.axialDepthM ?? null
				}
			};
		}
		case 'line':
		case 'area': {
			const miss = check(form, ['surveySpeedKn', 'overlapPct']);
			if (miss) return miss;
			const base = { surveySpeedKn: form.surveySpeedKn, overlapPct: form.overlapPct };
			return {
				ok: true,
				name,
				properties:
					kind === 'line' ? { ...base, purpose: form.purpose, ihoOrder: form.ihoOrder } : base
			};
		}
		case 'station': {
			const params: Record<string, number | string> = {};
			for (const spec of STATION_PARAMS[form.stationKind]) {
				const v = form.params[spec.key];
				if (v === null || v === undefined || v === '') continue;
				params[spec.key] = spec.type === 'number' ? Number(v) : String(v);
			}
			return { ok: true, name, properties: { stationKind: form.stationKind, params } };
		}
	}
}
