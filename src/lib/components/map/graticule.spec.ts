import { describe, expect, it } from 'vitest';
import { graticule, graticuleLabel, graticuleStep, MERCATOR_MAX_LAT } from './graticule';

describe('graticuleStep', () => {
	it('picks coarse steps for the world and fine ones for a survey box', () => {
		expect(graticuleStep({ west: -180, south: -80, east: 180, north: 80 })).toBe(30);
		expect(graticuleStep({ west: -147, south: -32, east: -144, north: -29 })).toBe(1 / 2);
		expect(graticuleStep({ west: -146, south: -30.1, east: -145.9, north: -30 })).toBe(1 / 60);
	});
});

describe('graticuleLabel', () => {
	it('writes degrees, and whole minutes only when present', () => {
		expect(graticuleLabel(-30, 'lat')).toBe('30°S');
		expect(graticuleLabel(-145.25, 'lon')).toBe('145°15′W');
		expect(graticuleLabel(0, 'lat')).toBe('0°');
		expect(graticuleLabel(180, 'lon')).toBe('180°');
		expect(graticuleLabel(-180, 'lon')).toBe('180°');
	});
	it('normalises unwrapped longitudes past the antimeridian', () => {
		expect(graticuleLabel(190, 'lon')).toBe('170°W');
		expect(graticuleLabel(170, 'lon')).toBe('170°E');
	});
});

describe('graticule', () => {
	it('covers a view across the antimeridian with continuous longitudes', () => {
		const g = graticule({ west: 175, south: -10, east: 185, north: 10 }, 5);
		const meridians = g.features.filter((f) => f.properties.axis === 'lon');
		const lons = meridians.map((f) => f.geometry.coordinates[0][0]);
		expect(lons).toEqual([170, 175, 180, 185, 190]);
		expect(meridians.map((f) => f.properties.label)).toEqual([
			'170°E',
			'175°E',
			'180°',
			'175°W',
			'170°W'
		]);
		const parallel = g.features.find((f) => f.properties.label === '0°')!;
		const xs = parallel.geometry.coordinates.map((c) => c[0]);
		expect(xs[0]).toBe(170);
		expect(xs.at(-1)).toBe(190);
	});

	it('stops at the Mercator limit, or reaches the poles for the globe', () => {
		const merc = graticule({ west: -20, south: 70, east: 20, north: 90 }, 10);
		const lats = merc.features.filter((f) => f.properties.axis === 'lat');
		expect(Math.max(...lats.map((f) => f.geometry.coordinates[0][1]))).toBe(80);
		const m = merc.features.find((f) => f.properties.axis === 'lon')!;
		expect(m.geometry.coordinates[1][1]).toBe(MERCATOR_MAX_LAT);
		const globe = graticule({ west: -20, south: 70, east: 20, north: 90 }, 10, 90);
		expect(
			globe.features.find((f) => f.properties.axis === 'lon')!.geometry.coordinates[1][1]
		).toBe(90);
	});

	it('keeps exact multiples of fractional steps and bounds the line count', () => {
		const g = graticule({ west: -146, south: -30.2, east: -145.8, north: -30 }, 1 / 12);
		const lats = g.features
			.filter((f) => f.properties.axis === 'lat')
			.map((f) => f.properties.label);
		expect(lats).toContain('30°05′S');
		const huge = graticule({ west: -180, south: -80, east: 180, north: 80 }, 1 / 60);
		expect(huge.features.length).toBeLessThanOrEqual(402);
	});
});
