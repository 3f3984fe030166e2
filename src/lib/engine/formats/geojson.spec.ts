import { describe, expect, it } from 'vitest';
import { readGeoJson, writeGeoJson } from './geojson';
import { EXPORT_CAUTION } from './shared';
import { antimeridianPlan, pathLengthKm, samplePlan } from './testing';

describe('GeoJSON', () => {
	it('round-trips a plan exactly', () => {
		const plan = samplePlan();
		const back = readGeoJson(writeGeoJson(plan));
		expect(back.problems).toEqual([]);
		expect(back.plan).toEqual(plan);
	});

	it('writes an RFC 7946 FeatureCollection with kind, settings, computed values and the caution', () => {
		const doc = JSON.parse(writeGeoJson(samplePlan()));
		expect(doc.type).toBe('FeatureCollection');
		expect(doc.caution).toBe(EXPORT_CAUTION);
		const kinds = doc.features.map((f: { properties: { kind: string } }) => f.properties.kind);
		expect(kinds).toEqual([
			'ridge',
			'ridge',
			'area',
			'line',
			'station',
			'station',
			'line',
			'station',
			'station'
		]);
		const line = doc.features[3];
		expect(line.geometry.type).toBe('LineString');
		expect(line.properties).toMatchObject({
			name: 'Line 01',
			surveySpeedKn: 8.5,
			overlapPct: 30,
			lengthKm: 111.123456789,
			durationH: 7.06,
			minDepthM: 2400.5,
			maxDepthM: 3850
		});
		const station = doc.features[4];
		expect(station.properties).toMatchObject({
			stationKind: 'ctd',
			depthM: 2900.25,
			durationH: 2.75
		});
		// [published] RFC 7946 §3.1.6: polygon rings are closed.
		const ring = doc.features[2].geometry.coordinates[0];
		expect(ring[0]).toEqual(ring[ring.length - 1]);
	});

	it('cuts lines across 180° into a MultiLineString and joins them on reading [published] RFC 7946 §3.1.9', () => {
		const plan = antimeridianPlan();
		const doc = JSON.parse(writeGeoJson(plan));
		const line = doc.features.find(
			(f: { properties: { name: string } }) => f.properties.name === 'Across 180'
		);
		expect(line.geometry.type).toBe('MultiLineString');
		for (const part of line.geometry.coordinates) {
			for (const [lon] of part) expect(Math.abs(lon)).toBeLessThanOrEqual(180);
		}
		const area = doc.features.find(
			(f: { properties: { kind: string } }) => f.properties.kind === 'area'
		);
		expect(area.geometry.type).toBe('MultiPolygon');
		const back = readGeoJson(JSON.stringify(doc));
		expect(back.problems).toEqual([]);
		expect(back.plan).toEqual(plan);
		const km = pathLengthKm(back.plan.lines[0].coords);
		expect(km).toBeGreaterThan(100);
		expect(km).toBeLessThan(110);
	});

	it('reads foreign GeoJSON: kind from geometry, defaults counted, unwrapped longitudes normalised', () => {
		const text = JSON.stringify({
			type: 'FeatureCollection',
			features: [
				{
					type: 'Feature',
					geometry: {
						type: 'LineString',
						coordinates: [
							[179.5, 0],
							[180.5, 0]
						]
					},
					properties: null
				},
				{
					type: 'Feature',
					geometry: { type: 'Point', coordinates: [10, 20, -3000] },
					properties: { name: 'P' }
				}
			]
		});
		const r = readGeoJson(text);
		expect(r.plan.lines[0].coords).toEqual([
			[179.5, 0],
			[-179.5, 0]
		]);
		expect(r.plan.lines[0].surveySpeedKn).toBe(8);
		expect(r.plan.stations[0]).toMatchObject({ name: 'P', kind: 'ctd', position: [10, 20] });
		expect(r.problems.every((p) => p.severity === 'warning')).toBe(true);
		expect(r.problems.map((p) => p.field)).toContain('surveySpeedKn');
	});

	it('reports bad features with where and field, keeping the good ones', () => {
		const text = JSON.stringify({
			type: 'FeatureCollection',
			features: [
				{
					type: 'Feature',
					geometry: { type: 'Point', coordinates: [48.1, 150.2] },
					properties: { kind: 'station' }
				},
				{
					type: 'Feature',
					geometry: { type: 'LineString', coordinates: [] },
					properties: { kind: 'line' }
				},
				{ type: 'Feature', geometry: null, properties: { kind: 'line' } },
				{
					type: 'Feature',
					geometry: { type: 'Point', coordinates: [1, 2] },
					properties: { kind: 'buoy' }
				},
				{
					type: 'Feature',
					geometry: { type: 'Point', coordinates: [1, 2] },
					properties: {
						kind: 'station',
						stationKind: 'ctd',
						params: {},
						depthM: 'deep',
						durationH: 2
					}
				},
				{
					type: 'Feature',
					geometry: {
						type: 'LineString',
						coordinates: [
							[1, 2],
							[3, 4]
						]
					},
					properties: { kind: 'line', surveySpeedKn: 'fast' }
				},
				{
					type: 'Feature',
					geometry: { type: 'Point', coordinates: [5, 6] },
					properties: { kind: 'station', stationKind: 'ctd' }
				}
			]
		});
		const r = readGeoJson(text);
		const byWhere = Object.fromEntries(r.problems.map((p) => [p.where, p]));
		expect(byWhere['feature 1'].message).toContain('coordinates look swapped, expected lon,lat');
		expect(byWhere['feature 2'].message).toContain('empty geometry');
		expect(byWhere['feature 3'].message).toContain('empty geometry');
		expect(byWhere['feature 4'].message).toContain('unknown kind "buoy"');
		expect(byWhere['feature 5']).toMatchObject({ field: 'depthM', severity: 'warning' });
		expect(byWhere['feature 6']).toMatchObject({ field: 'surveySpeedKn', severity: 'error' });
		expect(byWhere['feature 6'].message).toContain('not a number');
		expect(r.plan.stations).toHaveLength(2);
		expect(r.plan.stations[0].computed).toBeUndefined();
		expect(r.plan.lines).toHaveLength(0);
	});

	it('reports broken JSON with a line number and never throws', () => {
		const r = readGeoJson('{\n "type": "FeatureCollection",\n "features": [ oops ]\n}');
		expect(r.problems[0].where).toMatch(/^line 3|^file/);
		expect(r.problems[0].message).toContain('not valid JSON');
		expect(readGeoJson('[1,2]').problems[0].message).toContain('not a GeoJSON');
		expect(readGeoJson('{"type":"FeatureCollection"}').problems[0].message).toContain('features');
	});
});
