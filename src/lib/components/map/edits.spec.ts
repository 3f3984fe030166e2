import { describe, expect, it } from 'vitest';
import { ApiFailure, describeEdit, inverseRequests, send, settingsOf } from './edits';
import type { PlanFeature } from './types';

const line: PlanFeature = {
	type: 'Feature',
	id: 'l1',
	properties: {
		kind: 'line',
		name: 'N-X1',
		purpose: 'multibeam',
		surveySpeedKn: 8,
		overlapPct: 30,
		ihoOrder: '2',
		lengthKm: 145,
		durationH: 9.8
	},
	geometry: {
		type: 'LineString',
		coordinates: [
			[-146.75, -29.4],
			[-145.25, -29.4]
		]
	}
};
const station: PlanFeature = {
	type: 'Feature',
	id: 's1',
	properties: { kind: 'station', name: 'CTD-01', stationKind: 'ctd', params: { bottleStops: 12 } },
	geometry: { type: 'Point', coordinates: [-145.98, -29.9] }
};

describe('settingsOf', () => {
	it('keeps the settings and leaves computed values to the server', () => {
		expect(settingsOf(line)).toEqual({
			purpose: 'multibeam',
			surveySpeedKn: 8,
			overlapPct: 30,
			ihoOrder: '2'
		});
	});
});

describe('inverseRequests', () => {
	it('deletes what was added', () => {
		expect(inverseRequests('c1', { op: 'create', features: [line, station] })).toEqual([
			{ method: 'DELETE', path: '/api/v1/cruises/c1/plan/features/l1' },
			{ method: 'DELETE', path: '/api/v1/cruises/c1/plan/features/s1' }
		]);
	});
	it('puts back the old shape and settings of a changed feature', () => {
		const moved = { ...station, geometry: { type: 'Point' as const, coordinates: [-145, -30] } };
		expect(inverseRequests('c1', { op: 'update', before: station, after: moved })).toEqual([
			{
				method: 'PATCH',
				path: '/api/v1/cruises/c1/plan/features/s1',
				body: {
					name: 'CTD-01',
					geometry: station.geometry,
					properties: { stationKind: 'ctd', params: { bottleStops: 12 } }
				}
			}
		]);
	});
	it('re-creates a deleted feature and restores bulk-edited lines one by one', () => {
		const [re] = inverseRequests('c1', { op: 'delete', feature: line });
		expect(re).toMatchObject({
			method: 'POST',
			path: '/api/v1/cruises/c1/plan/features',
			body: { kind: 'line', name: 'N-X1', geometry: line.geometry }
		});
		expect(inverseRequests('c1', { op: 'bulk', before: [line] })[0]).toMatchObject({
			method: 'PATCH',
			body: { properties: { surveySpeedKn: 8, overlapPct: 30 } }
		});
	});
});

describe('describeEdit', () => {
	it('says what an undo would take back', () => {
		expect(describeEdit({ op: 'create', features: [station] })).toBe('add station CTD-01');
		expect(describeEdit({ op: 'create', features: [line, line] })).toBe('add 2 lines');
		expect(describeEdit({ op: 'create', features: [station, line] })).toBe(
			'add station CTD-01 and 1 line'
		);
		expect(describeEdit({ op: 'delete', feature: line })).toBe('delete line N-X1');
		expect(describeEdit({ op: 'bulk', before: [line] })).toBe('bulk edit of 1 line');
	});
});

describe('send', () => {
	it('passes the API error message on', async () => {
		const fake = (async () =>
			new Response(
				JSON.stringify({
					error: {
						code: 'invalid',
						message: 'geometry.coordinates.0: latitude 95 is beyond ±90',
						details: [{ field: 'geometry.coordinates.0', message: 'latitude 95 is beyond ±90' }]
					}
				}),
				{ status: 422 }
			)) as typeof fetch;
		const err = (await send({ method: 'POST', path: '/x', body: {} }, fake).catch(
			(e) => e
		)) as ApiFailure;
		expect(err).toBeInstanceOf(ApiFailure);
		expect(err.status).toBe(422);
		expect(err.details?.[0].field).toBe('geometry.coordinates.0');
	});
	it('answers undefined for 204', async () => {
		const fake = (async () => new Response(null, { status: 204 })) as typeof fetch;
		expect(await send({ method: 'DELETE', path: '/x' }, fake)).toBeUndefined();
	});
});
