import { describe, expect, it } from 'vitest';
import {
	allowed,
	plainRefusal,
	defaultForm,
	formFromFeature,
	nextName,
	propertiesFromForm,
	withStationKind
} from './form';
import type { PlanFeature } from './types';

const plan: PlanFeature[] = [
	{
		type: 'Feature',
		id: 's1',
		properties: { kind: 'station', name: 'CTD-01', stationKind: 'ctd', params: { bottleStops: 6 } },
		geometry: { type: 'Point', coordinates: [-146, -30] }
	},
	{
		type: 'Feature',
		id: 'l1',
		properties: {
			kind: 'line',
			name: 'L-1',
			purpose: 'gravity',
			surveySpeedKn: 9,
			overlapPct: 40,
			ihoOrder: '1b'
		},
		geometry: {
			type: 'LineString',
			coordinates: [
				[-146, -30],
				[-145, -30]
			]
		}
	}
];

describe('nextName', () => {
	it('skips names already on the plan', () => {
		expect(nextName(plan, 'station')).toBe('CTD-02');
		expect(nextName(plan, 'station', 'dredge')).toBe('DR-01');
		expect(nextName(plan, 'line')).toBe('L-2');
		expect(nextName(plan, 'ridge')).toBe('Ridge 1');
	});
});

describe('forms', () => {
	it('starts lines at the vessel’s survey speed', () => {
		const f = defaultForm('line', plan, {
			surveySpeedKn: 9.5,
			transitSpeedKn: 11,
			swathAngleDeg: 130,
			swathDepthFactor: 4,
			winchSpeedMPerMin: 60
		});
		expect(f.surveySpeedKn).toBe(9.5);
		expect(propertiesFromForm('line', f)).toEqual({
			ok: true,
			name: 'L-2',
			properties: { purpose: 'multibeam', surveySpeedKn: 9.5, overlapPct: 30, ihoOrder: '2' }
		});
	});

	it('round-trips a saved feature and fills missing station parameters', () => {
		const f = formFromFeature(plan[0], null);
		expect(f.params).toEqual({ bottleStops: 6, bottleStopMin: 2, deckMin: 30, offBottomM: 10 });
		expect(propertiesFromForm('station', f)).toEqual({
			ok: true,
			name: 'CTD-01',
			properties: {
				stationKind: 'ctd',
				params: { bottleStops: 6, bottleStopMin: 2, deckMin: 30, offBottomM: 10 }
			}
		});
		const line = formFromFeature(plan[1], null);
		expect(propertiesFromForm('line', line)).toMatchObject({
			properties: { purpose: 'gravity', surveySpeedKn: 9, overlapPct: 40, ihoOrder: '1b' }
		});
	});

	it('names the missing field', () => {
		const f = { ...defaultForm('ridge', plan, null), fullRateMmYr: null };
		expect(propertiesFromForm('ridge', f)).toEqual({
			ok: false,
			field: 'fullRateMmYr',
			message:
				'Full spreading rate is needed. Full spreading rate must be above 0 and at most 250 mm/yr.'
		});
		expect(propertiesFromForm('ridge', { ...f, name: ' ' })).toMatchObject({ field: 'name' });
	});

	it('swaps station parameters and the generated name with the kind', () => {
		const f = withStationKind(defaultForm('station', plan, null), 'dredge', plan);
		expect(f.name).toBe('DR-01');
		expect(f.params).toEqual({ bottomH: 1.5, wireScope: 1.5, deckH: 1 });
		const kept = withStationKind({ ...f, name: 'Vent site' }, 'dive', plan);
		expect(kept.name).toBe('Vent site');
	});
});

describe('plain errors at the field', () => {
	const RAW = /too big|too small|expected|invalid_type|<=|>=/i;

	it('names the field in plain words and says what is allowed', () => {
		expect(allowed('surveySpeedKn')).toBe('Survey speed must be above 0 and at most 20 kn.');
		expect(allowed('overlapPct')).toBe('Target overlap must be from 0 to 90 %.');
		expect(allowed('name')).toBe('Name must be 1 to 80 characters long.');
		expect(allowed('axialDepthM')).toBe(
			'Measured axial depth must be from 0 to 8,000 m, or left empty.'
		);
	});

	it('refuses values out of their limits before anything is sent', () => {
		const form = defaultForm('line', [], null);
		expect(propertiesFromForm('line', { ...form, surveySpeedKn: 25 })).toEqual({
			ok: false,
			field: 'surveySpeedKn',
			message: 'Survey speed must be above 0 and at most 20 kn.'
		});
		expect(propertiesFromForm('line', { ...form, surveySpeedKn: 0 })).toMatchObject({
			field: 'surveySpeedKn'
		});
		expect(propertiesFromForm('line', { ...form, overlapPct: 95 })).toMatchObject({
			field: 'overlapPct'
		});
		expect(propertiesFromForm('line', { ...form, name: 'x'.repeat(81) })).toMatchObject({
			field: 'name',
			message: 'Name must be 1 to 80 characters long.'
		});
		const ridge = defaultForm('ridge', [], null);
		expect(propertiesFromForm('ridge', { ...ridge, axialDepthM: 9000 })).toMatchObject({
			field: 'axialDepthM'
		});
		expect(propertiesFromForm('ridge', { ...ridge, axialDepthM: null }).ok).toBe(true);
	});

	it('turns an API refusal into plain words, never the schema text', () => {
		expect(plainRefusal('properties.surveySpeedKn')).toEqual({
			field: 'surveySpeedKn',
			message: 'Survey speed must be above 0 and at most 20 kn.'
		});
		expect(plainRefusal('name').message).toBe('Name must be 1 to 80 characters long.');
		for (const f of ['geometry.coordinates.0.1', 'properties.params.bottleStops', 'other', null])
			expect(plainRefusal(f).message).not.toMatch(RAW);
	});
});
