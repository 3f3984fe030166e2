import { describe, expect, it } from 'vitest';
import { depthProfileRequestSchema } from './depthProfile';
import { EngineInputError, depthProfile } from '$lib/engine/profile';

const valid = {
	line: {
		type: 'LineString',
		coordinates: [
			[-31, 10],
			[-29, 10]
		]
	},
	ridge: {
		axis: {
			type: 'LineString',
			coordinates: [
				[-30, 9],
				[-30, 11]
			]
		},
		fullRateMmYr: 25
	}
};

function issues(body: unknown) {
	const r = depthProfileRequestSchema.safeParse(body);
	return r.success
		? []
		: r.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }));
}

describe('depth-profile request schema', () => {
	it('accepts a valid body and feeds the engine', () => {
		const r = depthProfileRequestSchema.parse({ ...valid, model: 'half-space', spacingKm: 5 });
		const out = depthProfile(r);
		expect(out.model).toBe('half-space');
		expect(out.samples.length).toBeGreaterThan(40);
	});

	it('names swapped [lat, lon] positions', () => {
		const bad = {
			...valid,
			line: {
				type: 'LineString',
				coordinates: [
					[10, -131],
					[10, -129]
				]
			}
		};
		const found = issues(bad);
		expect(found[0].path).toBe('line.coordinates.0.1');
		expect(found[0].message).toMatch(/\[longitude, latitude\].*swapped/);
	});

	it('rejects out-of-range and non-finite numbers, short lines and bad settings', () => {
		expect(
			issues({
				...valid,
				line: {
					type: 'LineString',
					coordinates: [
						[200, 10],
						[0, 0]
					]
				}
			})[0].path
		).toBe('line.coordinates.0.0');
		expect(issues({ ...valid, line: { type: 'LineString', coordinates: [[0, 0]] } })[0].path).toBe(
			'line.coordinates'
		);
		expect(
			issues({
				...valid,
				line: {
					type: 'LineString',
					coordinates: [
						[Infinity, 0],
						[0, 0]
					]
				}
			})[0].path
		).toBe('line.coordinates.0.0');
		expect(
			issues({ ...valid, line: { type: 'Point', coordinates: [0, 0] } }).length
		).toBeGreaterThan(0);
		expect(issues({ ...valid, ridge: { ...valid.ridge, fullRateMmYr: 0 } })[0].path).toBe(
			'ridge.fullRateMmYr'
		);
		expect(issues({ ...valid, ridge: { ...valid.ridge, asymmetry: 1.5 } })[0].path).toBe(
			'ridge.asymmetry'
		);
		expect(issues({ ...valid, ridge: { ...valid.ridge, asymmetry: 0 } })).toEqual([]);
		expect(
			issues({ ...valid, ridge: { ...valid.ridge, potentialTemperatureC: 1800 } })[0].path
		).toBe('ridge.potentialTemperatureC');
		expect(issues({ ...valid, model: 'plate' })[0].path).toBe('model');
		expect(issues({ ...valid, spacingKm: -1 })[0].path).toBe('spacingKm');
		expect(issues({ ...valid, swathAngleDeg: 180 })[0].path).toBe('swathAngleDeg');
	});

	it('leaves the sample limit to the engine, which names spacingKm', () => {
		// 2° of longitude at 10° N is ≈ 219 km: every 10 m (the smallest spacing) is > 20 000 samples
		const body = depthProfileRequestSchema.parse({ ...valid, spacingKm: 0.01 });
		try {
			depthProfile(body);
			expect.unreachable();
		} catch (e) {
			expect(e).toBeInstanceOf(EngineInputError);
			expect((e as EngineInputError).field).toBe('spacingKm');
		}
	});
});
