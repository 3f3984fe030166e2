import { describe, expect, it } from 'vitest';
import {
	boundsOf,
	bendPath,
	displayDraft,
	displayPlan,
	normalizeGeometry,
	unwrapPath
} from './shape';
import type { PlanFeature } from './types';

const across: PlanFeature = {
	type: 'Feature',
	id: 'l1',
	properties: {
		kind: 'line',
		name: 'Across 180',
		purpose: 'multibeam',
		surveySpeedKn: 9,
		overlapPct: 30,
		ihoOrder: '2'
	},
	geometry: {
		type: 'LineString',
		coordinates: [
			[179.5, -20],
			[-179.5, -20]
		]
	}
};

const station: PlanFeature = {
	type: 'Feature',
	id: 's1',
	properties: { kind: 'station', name: 'CTD east', stationKind: 'ctd', params: {} },
	geometry: { type: 'Point', coordinates: [-179.9, -20.1] }
};

describe('unwrapPath', () => {
	it('steps the short way across the antimeridian', () => {
		expect(
			unwrapPath([
				[179.5, -20],
				[-179.5, -20],
				[179.9, -21]
			])
		).toEqual([
			[179.5, -20],
			[180.5, -20],
			[179.9, -21]
		]);
	});
	it('leaves an ordinary path alone', () => {
		const p = [
			[-146.75, -29.4],
			[-145.25, -29.4]
		];
		expect(unwrapPath(p)).toEqual(p);
	});
});

describe('bendPath', () => {
	it('keeps the vertices and adds points on the geodesic of a long segment', () => {
		const p = [
			[-60, 50],
			[-10, 50]
		];
		const bent = bendPath(p);
		expect(bent[0]).toEqual(p[0]);
		expect(bent.at(-1)).toEqual(p[1]);
		expect(bent.length).toBeGreaterThan(10);
		// A geodesic between two points on 50°N bulges poleward [derived: great circles].
		const mid = bent[Math.floor(bent.length / 2)];
		expect(mid[1]).toBeGreaterThan(52);
	});
	it('does not bend short segments', () => {
		const p = [
			[-146, -30],
			[-145.9, -30]
		];
		expect(bendPath(p)).toEqual(p);
	});
});

describe('displayPlan', () => {
	it('draws a line across 180° without wrapping round the world', () => {
		const fc = displayPlan([across, station], 's1');
		const line = fc.features[0];
		expect(line.geometry.type).toBe('LineString');
		const xs = (line.geometry as GeoJSON.LineString).coordinates.map((c) => c[0]);
		expect(Math.max(...xs) - Math.min(...xs)).toBeLessThan(1.01);
		expect(xs.at(-1)).toBeCloseTo(180.5, 9);
		expect(line.properties).toMatchObject({ id: 'l1', kind: 'line', sub: 'multibeam' });
		expect(fc.features[1].properties).toMatchObject({ sub: 'ctd', selected: true });
	});
	it('hides the feature being edited', () => {
		expect(displayPlan([across, station], null, 'l1').features).toHaveLength(1);
	});
	it('shows drafts and previews', () => {
		const swath = {
			type: 'Polygon' as const,
			coordinates: [
				[
					[0, 0],
					[1, 0],
					[1, 1],
					[0, 0]
				]
			]
		};
		const d = displayDraft(
			{ kind: 'station', geometry: station.geometry },
			[across.geometry],
			[swath]
		);
		expect(d.features.map((f) => f.properties.kind)).toEqual(['swath', 'station', 'preview']);
	});
});

describe('boundsOf', () => {
	it('finds the box of the demo area', () => {
		expect(boundsOf([across.geometry].slice(0, 0))).toBeNull();
		const b = boundsOf([
			{
				type: 'LineString',
				coordinates: [
					[-146.75, -29.4],
					[-145.25, -31.9]
				]
			},
			{ type: 'Point', coordinates: [-144, -30.5] }
		]);
		expect(b).toEqual([
			[-146.75, -31.9],
			[-144, -29.4]
		]);
	});
	it('straddles the antimeridian instead of spanning the world', () => {
		const b = boundsOf([across.geometry, station.geometry])!;
		expect(b[0][0]).toBe(179.5);
		expect(b[1][0]).toBeCloseTo(180.5, 9);
	});
});

describe('normalizeGeometry', () => {
	it('brings unwrapped longitudes back into [−180, 180)', () => {
		expect(
			normalizeGeometry({
				type: 'LineString',
				coordinates: [
					[179.5, 1],
					[180.5, 1]
				]
			}).coordinates
		).toEqual([
			[179.5, 1],
			[-179.5, 1]
		]);
	});
});
