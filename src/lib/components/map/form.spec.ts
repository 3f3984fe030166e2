import { describe, expect, it } from 'vitest';
import {
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
			message: 'The full spreading rate is needed.'
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
