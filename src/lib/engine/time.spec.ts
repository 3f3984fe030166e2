import { describe, expect, it } from 'vitest';
import { hoursAt, kmToNm, knotsToKmH, nmToKm, routeTime } from './time';
import { distanceM } from './geodesy';

describe('time and distance', () => {
	it('runs 200 km at 10 kn in 10.80 h', () => {
		// [derived] SCIENCE.md §6: 200 km / (10 × 1.852 km/h)
		expect(Math.abs(hoursAt(200, 10) - 10.8)).toBeLessThan(0.005);
		expect(hoursAt(200, 10)).toBeCloseTo(200 / 18.52, 12);
	});

	it('converts nautical miles and knots exactly', () => {
		// [published] 1 nm = 1852 m exactly (international nautical mile)
		expect(nmToKm(1)).toBe(1.852);
		expect(kmToNm(1.852)).toBe(1);
		expect(knotsToKmH(10)).toBeCloseTo(18.52, 12);
		expect(() => hoursAt(10, 0)).toThrow(RangeError);
	});

	it('times a route along geodesics', () => {
		const r = routeTime(
			[
				[-30, 10],
				[-29, 10],
				[-29, 11]
			],
			10
		);
		const km = (distanceM([-30, 10], [-29, 10]) + distanceM([-29, 10], [-29, 11])) / 1000;
		expect(r.km).toBeCloseTo(km, 9);
		expect(r.hours).toBeCloseTo(km / 18.52, 9);
	});
});
