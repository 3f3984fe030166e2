import { describe, expect, it } from 'vitest';
import {
	RidgeAgeModel,
	ageFromDistance,
	distanceFromAge,
	halfRates,
	type RidgeSegment
} from './age';
import { direct, distanceM, sampleLine, type LonLat } from './geodesy';

describe('age from distance', () => {
	it('matches the SCIENCE.md §2 check values', () => {
		// [derived] t = x/u, 1 mm/yr = 1 km/Myr
		expect(ageFromDistance(100, 12.5)).toBeCloseTo(8.0, 9);
		expect(Math.abs(ageFromDistance(50, 72.9) - 0.686)).toBeLessThan(0.0005);
		expect(Math.abs(ageFromDistance(300, 11.9) - 25.21)).toBeLessThan(0.005);
		expect(ageFromDistance(0, 0)).toBe(0);
		expect(distanceFromAge(8, 12.5)).toBeCloseTo(100, 9);
	});

	it('splits the full rate by the asymmetry (share on the left flank)', () => {
		// [derived] u_left = f·U, u_right = (1 − f)·U
		expect(halfRates(20)).toEqual({ leftMmYr: 10, rightMmYr: 10 });
		const r = halfRates(50, 0.7);
		expect(r.leftMmYr).toBeCloseTo(35, 12);
		expect(r.rightMmYr).toBeCloseTo(15, 12);
		expect(() => halfRates(0)).toThrow(RangeError);
		expect(() => halfRates(20, 1.2)).toThrow(RangeError);
	});
});

describe('RidgeAgeModel', () => {
	// A north-trending axis with a gentle bend, at 26°N in the Atlantic-like open ocean.
	const axis: LonLat[] = [
		[-44.9, 25.5],
		[-44.85, 26.0],
		[-44.95, 26.5]
	];

	it('grows monotonically away from the axis on each flank', () => {
		const model = new RidgeAgeModel([{ axis, fullRateMmYr: 23, asymmetry: 0.6 }]);
		const a = direct([-44.85, 26.0], 90, -300e3);
		const b = direct([-44.85, 26.0], 90, 300e3);
		const s = sampleLine(
			[
				[a.lon, a.lat],
				[b.lon, b.lat]
			],
			2000
		);
		const ages = Array.from({ length: s.count }, (_, k) => model.ageAt(s.lon[k], s.lat[k]));
		const iMin = ages.reduce((m, x, i) => (x.ageMa < ages[m].ageMa ? i : m), 0);
		expect(ages[iMin].ageMa).toBeLessThan(0.1);
		for (let k = iMin; k > 0; k--) expect(ages[k - 1].ageMa).toBeGreaterThan(ages[k].ageMa);
		for (let k = iMin; k < s.count - 1; k++)
			expect(ages[k + 1].ageMa).toBeGreaterThan(ages[k].ageMa);
		// west of a north-going axis is its left flank: u_left = 0.6·23
		expect(ages[0].side).toBe('left');
		expect(ages[0].halfRateMmYr).toBeCloseTo(13.8, 12);
		expect(ages[s.count - 1].side).toBe('right');
		// [derived] same distance, ages in the inverse ratio of the half rates
		const west = model.ageAt(-45.5, 26.0);
		const east = model.ageAt(-44.2, 26.0);
		expect(west.ageMa).toBeCloseTo(west.axisDistanceM / 1000 / 13.8, 9);
		expect(east.ageMa).toBeCloseTo(east.axisDistanceM / 1000 / 9.2, 9);
	});

	it('steps across a fracture zone between two offset segments', () => {
		// two segments offset 60 km east–west by a transform near 26°N, spreading at different rates
		const north: LonLat[] = [
			[-44.4, 26.0],
			[-44.4, 27.0]
		];
		const south: LonLat[] = [
			[-45.0, 25.0],
			[-45.0, 26.0]
		];
		const model = new RidgeAgeModel([
			{ axis: north, fullRateMmYr: 24 },
			{ axis: south, fullRateMmYr: 24 }
		]);
		// a line 150 km east of the northern segment, running south across the fracture zone
		const s = sampleLine(
			[
				[-42.9, 26.6],
				[-42.9, 25.4]
			],
			1000
		);
		const ages = Array.from({ length: s.count }, (_, k) => model.ageAt(s.lon[k], s.lat[k]));
		expect(ages[0].segment).toBe(0);
		expect(ages[s.count - 1].segment).toBe(1);
		let maxStep = 0;
		let at = 0;
		for (let k = 1; k < s.count; k++) {
			const step = ages[k].ageMa - ages[k - 1].ageMa;
			if (step > maxStep) {
				maxStep = step;
				at = s.lat[k];
			}
		}
		// [derived] the southern segment lies 0.6° (≈ 60 km) farther west: ≈ 60 km / 12 mm/yr ≈
		// 5 Myr older. The step sits on the fracture zone: the geodesics perpendicular to the axes
		// through the segment ends, which bend 1–2 km towards the equator over 150–210 km.
		expect(maxStep).toBeGreaterThan(4);
		expect(maxStep).toBeLessThan(6);
		expect(Math.abs(at - 26)).toBeLessThan(0.03);
		// within each domain the age changes smoothly (1 km samples: ≪ 1 Myr per step)
		for (let k = 1; k < s.count; k++) {
			if (Math.abs(s.lat[k] - 26) > 0.03) {
				expect(Math.abs(ages[k].ageMa - ages[k - 1].ageMa)).toBeLessThan(0.1);
			}
		}
	});

	it('gives the same age in the fast (grid) mode within 1e-4 relative', () => {
		const model = new RidgeAgeModel([{ axis, fullRateMmYr: 23 }]);
		for (const p of [
			[-46, 25.8],
			[-43.1, 26.3],
			[-44.9, 26.1]
		] as LonLat[]) {
			const exact = model.ageAt(p[0], p[1]);
			const fast = model.ageAt(p[0], p[1], { exact: false });
			expect(Math.abs(fast.ageMa - exact.ageMa)).toBeLessThanOrEqual(1e-4 * exact.ageMa + 1e-6);
			expect(fast.side).toBe(exact.side);
		}
		// the axis distance is the geodesic distance to the foot
		const n = model.ageAt(-46, 25.8);
		expect(n.axisDistanceM).toBeLessThanOrEqual(distanceM([-46, 25.8], [-44.9, 25.5]));
	});

	it('agesAlong equals ageAt sample by sample (within 1 mm of axis distance)', () => {
		const wiggly: LonLat[] = [];
		for (let i = 0; i < 3000; i++) {
			const t = i / 2999;
			wiggly.push([-44.8 + 0.08 * Math.sin(t * 37) + 0.03 * Math.sin(t * 211), 24 + 4 * t]);
		}
		const zigzag: LonLat[] = [];
		for (let i = 0; i < 60; i++) zigzag.push([-44.8 + (i % 2 ? 0.15 : -0.15), 24 + i * 0.07]);
		const cases: { ridges: RidgeSegment[]; line: LonLat[] }[] = [
			{
				ridges: [{ axis: wiggly, fullRateMmYr: 23, asymmetry: 0.4 }],
				line: [
					[-47, 26.1],
					[-42.5, 25.7]
				]
			},
			{
				ridges: [{ axis: zigzag, fullRateMmYr: 30 }],
				line: [
					[-46, 25.0],
					[-44.9, 27.5],
					[-43, 26]
				]
			},
			{
				ridges: [
					{
						axis: [
							[-44.4, 26.0],
							[-44.4, 27.0]
						],
						fullRateMmYr: 24
					},
					{
						axis: [
							[-45.0, 25.0],
							[-45.0, 26.0]
						],
						fullRateMmYr: 18
					}
				],
				line: [
					[-42.9, 26.6],
					[-42.9, 25.4],
					[-46.5, 25.8]
				]
			},
			{
				ridges: [
					{
						axis: [
							[179.7, -3],
							[-179.8, 3]
						],
						fullRateMmYr: 140
					}
				],
				line: [
					[178, 0.5],
					[-178, -0.5]
				]
			}
		];
		for (const { ridges, line } of cases) {
			const model = new RidgeAgeModel(ridges);
			const s = sampleLine(line, 250);
			const along = model.agesAlong(s.lon, s.lat, s.distanceM);
			for (let k = 0; k < s.count; k++) {
				const one = model.ageAt(s.lon[k], s.lat[k]);
				expect(Math.abs(along.axisDistanceM[k] - one.axisDistanceM)).toBeLessThan(1e-3);
				expect(along.segment[k]).toBe(one.segment);
				expect(Math.abs(along.ageMa[k] - one.ageMa)).toBeLessThan(1e-6 + 1e-9 * one.ageMa);
			}
		}
	});

	it('needs at least one segment', () => {
		expect(() => new RidgeAgeModel([])).toThrow(RangeError);
	});
});
