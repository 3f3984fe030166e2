// The settings form behind the side panel: one flat record for every kind, filled from a saved
// feature or from defaults, and turned back into the properties the API takes for a kind.
import type { IhoOrder, LinePurpose, StationKind } from '$lib/engine/formats/types';
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

function need(v: number | null, field: string, label: string): FormResult | null {
	return v === null || !Number.isFinite(v)
		? { ok: false, field, message: `${label} is needed.` }
		: null;
}

/** The API properties for `kind`, or the first missing field. */
export function propertiesFromForm(kind: PlanKind, form: SettingsForm): FormResult {
	const name = form.name.trim();
	if (!name) return { ok: false, field: 'name', message: 'Give it a name.' };
	switch (kind) {
		case 'ridge': {
			const miss = need(form.fullRateMmYr, 'fullRateMmYr', 'The full spreading rate');
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
			const miss =
				need(form.surveySpeedKn, 'surveySpeedKn', 'The survey speed') ??
				need(form.overlapPct, 'overlapPct', 'The target overlap');
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
