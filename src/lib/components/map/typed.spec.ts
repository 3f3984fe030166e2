import { describe, expect, it } from 'vitest';
import { formatPosition, hemisphereDoubt, parseTyped } from './typed';

describe('parseTyped', () => {
	it('places a station typed in degrees and decimal minutes', () => {
		const r = parseTyped("30°12.5'S 145°24.0'W", 'station');
		expect(r.ok).toBe(true);
		if (!r.ok) return;
		expect(r.geometry.type).toBe('Point');
		const [lon, lat] = (r.geometry as GeoJSON.Point).coordinates;
		// 12.5′ = 0.208333…°, 24′ = 0.4° [derived].
		expect(lat).toBeCloseTo(-30.208333333, 8);
		expect(lon).toBeCloseTo(-145.4, 10);
	});

	it('reads a line from rows in mixed notations', () => {
		const r = parseTyped('-29.5, -146.5\n\n29 30.000 S 145 30.000 W\n', 'line');
		expect(r.ok && r.geometry).toEqual({
			type: 'LineString',
			coordinates: [
				[-146.5, -29.5],
				[-145.5, -29.5]
			]
		});
	});

	it('closes an area ring', () => {
		const r = parseTyped('-30 -146\n-30 -145\n-31 -145', 'area');
		expect(r.ok && (r.geometry as GeoJSON.Polygon).coordinates[0]).toHaveLength(4);
	});

	it('names the row that cannot be read, and asks for enough positions', () => {
		const bad = parseTyped('-30 -146\n95 10', 'line');
		expect(bad.ok).toBe(false);
		if (!bad.ok) {
			expect(bad.row).toBe(2);
			expect(bad.message).toMatch(/^Row 2, (position|latitude): /);
		}
		const few = parseTyped('-30 -146', 'ridge');
		expect(!few.ok && few.message).toBe('Type at least 2 positions, one per row.');
		const many = parseTyped('-30 -146\n-31 -146', 'station');
		expect(!many.ok && many.message).toBe('A station takes one position.');
	});
});

describe('formatPosition', () => {
	it('reads back in degrees and decimal minutes', () => {
		expect(formatPosition(-145.4, -30.208333333333)).toBe('30°12.500′S 145°24.000′W');
	});
});

describe('hemisphereDoubt: "did you mean W?"', () => {
	// The rest of a cruise near 30°S 146°W (the demo's working area).
	const others = [
		[-146.5, -30.4],
		[-145.9, -29.8]
	];

	it('asks "W?" for a position typed east by slip, and the flip lands near the rest', () => {
		const d = hemisphereDoubt([[146.4, -30.2]], others);
		expect(d?.flip).toBe('W');
		expect(d?.positions).toEqual([[-146.4, -30.2]]);
		// [derived] 146.4°E to 146.5°W at 30°S is 67.1° of longitude: thousands of km.
		expect(d!.distanceKm).toBeGreaterThan(6000);
		expect(d!.flippedKm).toBeLessThan(30);
	});

	it('asks "S?" for a latitude typed north by slip', () => {
		const d = hemisphereDoubt(
			[
				[-146.2, 30.1],
				[-146.2, 29.9]
			],
			others
		);
		expect(d?.flip).toBe('S');
		expect(d?.positions).toEqual([
			[-146.2, -30.1],
			[-146.2, -29.9]
		]);
	});

	it('says nothing for a position within 1,000 km of the rest', () => {
		// [published] WGS84 meridian arc: one degree of latitude near 25°S is about 110.8 km, so
		// 8° north of the nearest position is about 886 km.
		expect(hemisphereDoubt([[-145.9, -21.8]], others)).toBeNull();
	});

	it('says nothing when no flip brings the position near (far on purpose)', () => {
		// a line across the antimeridian at 30°S: far from 146°W either way
		expect(
			hemisphereDoubt(
				[
					[179.5, -30],
					[-179.5, -30]
				],
				others
			)
		).toBeNull();
	});

	it('says nothing for the first positions of a cruise', () => {
		expect(hemisphereDoubt([[146.4, -30.2]], [])).toBeNull();
	});
});
