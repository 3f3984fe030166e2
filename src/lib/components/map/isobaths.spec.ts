import { describe, expect, it } from 'vitest';
import { depthFeatures, gridRange, isobathLevels, type GridSpec } from './isobaths';

/** Depth growing eastward by 100 m per grid step from 2500 m: the 3000 m isobath sits at i = 5. */
function ramp(nx = 11, ny = 4): GridSpec {
	const values: number[] = [];
	for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) values.push(2500 + 100 * i);
	return { lon0: -146, lat0: -31, dLon: 0.1, dLat: 0.1, nx, ny, values };
}

describe('isobathLevels', () => {
	it('chooses a round step and marks every 1000 m as major', () => {
		expect(isobathLevels(2500, 3500)).toEqual({
			levels: [2600, 2700, 2800, 2900, 3000, 3100, 3200, 3300, 3400, 3500],
			step: 100,
			majorStep: 500
		});
		const wide = isobathLevels(2400, 5600);
		expect(wide.step).toBe(500);
		expect(wide.majorStep).toBe(1000);
		expect(wide.levels[0]).toBe(2500);
		expect(isobathLevels(2300, 5300).majorStep).toBe(1000);
		expect(isobathLevels(3000, 3000).levels).toEqual([]);
	});
});

describe('depthFeatures', () => {
	it('places an isobath where the depth crosses the level, in lon/lat', () => {
		const g = ramp();
		const fc = depthFeatures(g, [3000], 1000);
		const lines = fc.features.filter((f) => f.properties.kind === 'isobath');
		expect(lines).toHaveLength(1);
		const coords = (lines[0].geometry as GeoJSON.LineString).coordinates;
		// Linear interpolation between columns 4 (2900 m) and 5 (3000 m) puts it on column 5:
		// lon = −146 + 5 × 0.1 [derived].
		for (const c of coords) expect(c[0]).toBeCloseTo(-145.5, 9);
		expect(Math.min(...coords.map((c) => c[1]))).toBeCloseTo(-31, 9);
		expect(Math.max(...coords.map((c) => c[1]))).toBeCloseTo(-30.7, 9);
		expect(lines[0].properties).toEqual({
			kind: 'isobath',
			depthM: 3000,
			major: true,
			label: '3000 m'
		});
	});

	it('shades the deeper side and keeps grid edges out of the isobaths', () => {
		const g = ramp();
		const fc = depthFeatures(g, [2800, 3300], 1000);
		const shades = fc.features.filter((f) => f.properties.kind === 'shade');
		expect(shades.map((f) => f.properties.depthM)).toEqual([2800, 3300]);
		const poly = (shades[0].geometry as GeoJSON.MultiPolygon).coordinates[0][0];
		// The deeper side is east: the polygon reaches the grid's east edge.
		expect(Math.max(...poly.map((c) => c[0]))).toBeCloseTo(-145, 9);
		const lines = fc.features.filter((f) => f.properties.kind === 'isobath');
		for (const l of lines) {
			const xs = (l.geometry as GeoJSON.LineString).coordinates.map((c) => c[0]);
			expect(Math.max(...xs) - Math.min(...xs)).toBeLessThan(1e-9);
		}
		expect(lines.map((l) => l.properties.major)).toEqual([false, false]);
	});

	it('skips unknown cells', () => {
		const g = ramp();
		const values = Array.from(g.values);
		values[0] = Number.NaN;
		expect(gridRange({ ...g, values })).toEqual([2500, 3500]);
		expect(gridRange({ ...g, values: [Number.NaN] })).toBeNull();
	});
});
