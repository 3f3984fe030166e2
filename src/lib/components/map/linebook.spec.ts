import { describe, expect, it } from 'vitest';
import { bookRows, bookTotals, sortRows } from './linebook';
import type { PlanFeature } from './types';

const line = (id: string, name: string, lengthKm?: number, durationH?: number): PlanFeature => ({
	type: 'Feature',
	id,
	properties: {
		kind: 'line',
		name,
		purpose: 'multibeam',
		surveySpeedKn: 8,
		overlapPct: 30,
		ihoOrder: '2',
		lengthKm,
		durationH
	},
	geometry: {
		type: 'LineString',
		coordinates: [
			[0, 0],
			[1, 0]
		]
	}
});

const features: PlanFeature[] = [
	line('a', 'N-X10', 148.2, 10),
	line('b', 'N-X2', 185.2, 12.5),
	line('c', 'Draft', undefined, undefined),
	{
		type: 'Feature',
		id: 's',
		properties: {
			kind: 'station',
			name: 'CTD-01',
			stationKind: 'ctd',
			params: {},
			depthM: 2900,
			durationH: 3.2
		},
		geometry: { type: 'Point', coordinates: [0, 0] }
	},
	{
		type: 'Feature',
		id: 'r',
		properties: {
			kind: 'ridge',
			name: 'Axis',
			fullRateMmYr: 30,
			asymmetry: 0.5,
			potentialTemperatureC: null,
			axialDepthM: null
		},
		geometry: {
			type: 'LineString',
			coordinates: [
				[0, 0],
				[0, 1]
			]
		}
	}
];

describe('bookRows', () => {
	it('lists lines and stations with nautical miles beside kilometres', () => {
		const rows = bookRows(features);
		expect(rows.map((r) => r.id)).toEqual(['a', 'b', 'c', 's']);
		// 185.2 km / 1.852 = 100 nm [derived: 1 nm = 1852 m exactly].
		expect(rows[1].lengthNm).toBeCloseTo(100, 12);
		expect(rows[3]).toMatchObject({ what: 'CTD cast', minDepthM: 2900, durationH: 3.2 });
	});
});

describe('sortRows', () => {
	it('sorts names naturally and numbers numerically, empty values last', () => {
		const rows = bookRows(features);
		expect(sortRows(rows, 'name').map((r) => r.name)).toEqual(['CTD-01', 'Draft', 'N-X2', 'N-X10']);
		expect(sortRows(rows, 'lengthKm').map((r) => r.id)).toEqual(['a', 'b', 's', 'c']);
		expect(sortRows(rows, 'lengthKm', false).map((r) => r.id)).toEqual(['b', 'a', 's', 'c']);
	});
});

describe('bookTotals', () => {
	it('adds up lengths and hours', () => {
		expect(bookTotals(bookRows(features))).toEqual({
			lines: 3,
			stations: 1,
			lengthKm: 333.4,
			lineHours: 22.5,
			stationHours: 3.2
		});
	});
});
