import { describe, expect, it } from 'vitest';
import {
	LocalProjection,
	PolylineIndex,
	direct,
	distanceM,
	finalBearingDeg,
	initialBearingDeg,
	inverse,
	lineLengthM,
	normalizeLon,
	sampleLine,
	type LonLat
} from './geodesy';

const MM = 1e-3;

/** Deterministic pseudo-random numbers (mulberry32) so failures are reproducible. */
function rng(seed: number): () => number {
	let a = seed >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

describe('geodesics (GeographicLib, WGS84)', () => {
	it('solves the direct problem of Karney 2013 §5', () => {
		// [published] Karney 2013, J. Geodesy 87, 43: (40°, 0°), azimuth 30°, 10 000 km
		const r = direct([0, 40], 30, 10_000e3);
		const expected: LonLat = [137.84490004377, 41.79331020506];
		expect(distanceM([r.lon, r.lat], expected)).toBeLessThan(MM);
		expect(r.azimuthDeg).toBeCloseTo(149.09016931807, 9);
	});

	it('solves the nearly antipodal inverse problem of Karney 2013', () => {
		// [published] Karney 2013: (−30°, 0°) → (29.9°, 179.8°) = 19 989 832.827610 m
		expect(Math.abs(distanceM([0, -30], [179.8, 29.9]) - 19_989_832.82761)).toBeLessThan(MM);
	});

	it('solves the short inverse problem of Karney 2013', () => {
		// [published] Karney 2013: (−30.12345°, 0°) → (−30.12344°, 0.00005°) = 4.944208 m
		expect(Math.abs(distanceM([0, -30.12345], [0.00005, -30.12344]) - 4.944208)).toBeLessThan(1e-6);
	});

	it('measures one degree on the equator and along the meridian', () => {
		// [reference library] GeographicLib GeodSolve: 111 319.4908 m and 110 574.3886 m
		expect(Math.abs(distanceM([0, 0], [1, 0]) - 111_319.4908)).toBeLessThan(1e-4);
		expect(Math.abs(distanceM([0, 0], [0, 1]) - 110_574.3886)).toBeLessThan(1e-4);
	});

	it('gives bearings in [0, 360)', () => {
		// [derived] due east and due north along the equator / a meridian
		expect(initialBearingDeg([0, 0], [1, 0])).toBeCloseTo(90, 9);
		expect(initialBearingDeg([0, 0], [0, 1])).toBeCloseTo(0, 9);
		expect(initialBearingDeg([0, 1], [0, 0])).toBeCloseTo(180, 9);
		expect(initialBearingDeg([0, 0], [-1, 0])).toBeCloseTo(270, 9);
		// the final bearing is the forward azimuth at the destination
		const fb = finalBearingDeg([0, 0], [10, 10]);
		expect(fb).toBeCloseTo(inverse([0, 0], [10, 10]).azimuth2Deg, 12);
		expect(fb).toBeGreaterThan(0);
		expect(fb).toBeLessThan(90);
	});

	it('normalises longitudes into [−180, 180)', () => {
		// [derived] wrapping by whole turns
		expect(normalizeLon(180)).toBe(-180);
		expect(normalizeLon(-180)).toBe(-180);
		expect(normalizeLon(540)).toBe(-180);
		expect(normalizeLon(190)).toBeCloseTo(-170, 12);
		expect(normalizeLon(-190)).toBeCloseTo(170, 12);
		expect(normalizeLon(359.5)).toBeCloseTo(-0.5, 12);
		expect(normalizeLon(12.25)).toBe(12.25);
	});

	it('round-trips the local azimuthal equidistant projection', () => {
		const proj = new LocalProjection([-30, 20]);
		for (const p of [
			[-29.5, 20.3],
			[-30.7, 19.4],
			[-30, 20]
		] as LonLat[]) {
			const [x, y] = proj.forward(p);
			// [derived] distance from the centre is preserved exactly
			expect(Math.hypot(x, y)).toBeCloseTo(distanceM([-30, 20], p), 6);
			const back = proj.reverse(x, y);
			expect(distanceM(back, p)).toBeLessThan(MM);
		}
	});
});

describe('sampleLine', () => {
	it('samples a 2000 km line every 100 m: 20 001 samples, start and end included', () => {
		const a = direct([-30, 0], 90, -1000e3);
		const b = direct([-30, 0], 90, 1000e3);
		const s = sampleLine(
			[
				[a.lon, a.lat],
				[b.lon, b.lat]
			],
			100
		);
		// [derived] 2 000 000 m / 100 m + 1
		expect(Math.abs(s.lengthM - 2_000_000)).toBeLessThan(MM);
		expect(s.count).toBe(20_001);
		expect(distanceM([s.lon[0], s.lat[0]], [a.lon, a.lat])).toBeLessThan(MM);
		expect(distanceM([s.lon[s.count - 1], s.lat[s.count - 1]], [b.lon, b.lat])).toBeLessThan(MM);
		for (const k of [1, 777, 12_345, 19_999]) {
			expect(distanceM([s.lon[k - 1], s.lat[k - 1]], [s.lon[k], s.lat[k]])).toBeCloseTo(100, 6);
		}
	});

	it('places samples at the true along-line distance across vertices, with a short last step', () => {
		const coords: LonLat[] = [
			[-30, 10],
			[-29.7, 10.05],
			[-29.6, 10.4]
		];
		const s = sampleLine(coords, 1000);
		const len = lineLengthM(coords);
		expect(s.lengthM).toBeCloseTo(len, 6);
		expect(s.count).toBe(Math.ceil(len / 1000) + 1);
		expect(s.distanceM[s.count - 1]).toBe(s.lengthM);
		const idx = new PolylineIndex([coords]);
		for (let k = 0; k < s.count; k++) {
			const n = idx.nearest(s.lon[k], s.lat[k]);
			expect(n.distanceM).toBeLessThan(MM);
			expect(Math.abs(n.alongM - s.distanceM[k])).toBeLessThan(MM);
		}
	});

	it('crosses the antimeridian the short way with longitudes in [−180, 180)', () => {
		const s = sampleLine(
			[
				[179.5, 10],
				[-179.5, 10]
			],
			5000
		);
		// [derived] by symmetry the same as one degree of longitude elsewhere at 10°N
		expect(Math.abs(s.lengthM - distanceM([0.5, 10], [1.5, 10]))).toBeLessThan(MM);
		for (let k = 0; k < s.count; k++) {
			expect(Math.abs(s.lon[k])).toBeGreaterThanOrEqual(179.4);
			expect(s.lon[k]).toBeGreaterThanOrEqual(-180);
			expect(s.lon[k]).toBeLessThan(180);
		}
	});

	it('follows a line over the pole', () => {
		const s = sampleLine(
			[
				[0, 89.5],
				[180, 89.5]
			],
			1000
		);
		// [derived] meridian distance to the pole and down the other side
		expect(Math.abs(s.lengthM - 2 * distanceM([0, 89.5], [0, 90]))).toBeLessThan(MM);
		const maxLat = Math.max(...s.lat);
		expect(maxLat).toBeGreaterThan(89.99);
	});

	it('rejects a non-positive spacing', () => {
		expect(() =>
			sampleLine(
				[
					[0, 0],
					[1, 0]
				],
				0
			)
		).toThrow(RangeError);
	});
});

describe('PolylineIndex — nearest point of a polyline', () => {
	it('finds the perpendicular foot on a meridian axis and tells the sides apart', () => {
		const idx = new PolylineIndex([
			[
				[0, -5],
				[0, 5]
			]
		]);
		const east = idx.nearest(1, 0);
		// [derived] a meridian is a geodesic; the equator crosses it at right angles, so the
		// nearest point of the meridian to (1°E, 0°) is (0°, 0°), one equatorial degree away
		expect(Math.abs(east.distanceM - 111_319.4908)).toBeLessThan(1e-3);
		expect(Math.abs(east.lat)).toBeLessThan(1e-9);
		expect(east.side).toBe('right');
		expect(idx.nearest(-1, 0).side).toBe('left');
		expect(idx.nearest(0, 1).side).toBe('on');
		// beyond the northern end: distance to the end vertex
		const beyond = idx.nearest(0.1, 6);
		expect(beyond.atEnd).toBe(true);
		expect(Math.abs(beyond.distanceM - distanceM([0.1, 6], [0, 5]))).toBeLessThan(MM);
	});

	it('agrees with a dense independent sampling of the geodesic', () => {
		const a: LonLat = [-40, 30];
		const b: LonLat = [-36, 33];
		const idx = new PolylineIndex([[a, b]]);
		const { distanceM: len, azimuth1Deg } = inverse(a, b);
		const pts: LonLat[] = [];
		for (let k = 0; k <= 40_000; k++) {
			const r = direct(a, azimuth1Deg, (k / 40_000) * len);
			pts.push([r.lon, r.lat]);
		}
		for (const q of [
			[-37, 30],
			[-39.5, 34],
			[-38, 31.7],
			[-30, 20]
		] as LonLat[]) {
			let min = Infinity;
			for (const p of pts) min = Math.min(min, distanceM(q, p));
			const n = idx.nearest(q[0], q[1]);
			// sampling every ~12 m overestimates the minimum by at most (6 m)²/(2·d) ≪ 1 mm at d > 20 km
			expect(n.distanceM).toBeLessThanOrEqual(min + 1e-6);
			expect(min - n.distanceM).toBeLessThan(MM);
		}
	});

	it('equals the brute-force search on random axes and points (incl. antimeridian and poles)', () => {
		const rand = rng(20240601);
		for (let trial = 0; trial < 12; trial++) {
			const lon0 = trial % 3 === 0 ? 179 : -180 + 360 * rand();
			const lat0 = trial % 4 === 1 ? 84 : -70 + 140 * rand();
			const n = 3 + Math.floor(rand() * 60);
			const axis: LonLat[] = [];
			let lon = lon0;
			let lat = lat0;
			for (let i = 0; i < n; i++) {
				axis.push([normalizeLon(lon), lat]);
				lon += (rand() - 0.3) * 0.6;
				lat = Math.max(-89, Math.min(89.5, lat + (rand() - 0.3) * 0.5));
			}
			const idx = new PolylineIndex([axis]);
			for (let q = 0; q < 25; q++) {
				const ql = normalizeLon(lon0 + (rand() - 0.5) * 30);
				const qa = Math.max(-89.9, Math.min(89.9, lat0 + (rand() - 0.5) * 20));
				const fast = idx.nearest(ql, qa);
				const brute = idx.nearestBrute(ql, qa);
				expect(Math.abs(fast.distanceM - brute.distanceM)).toBeLessThan(MM);
				if (brute.distanceM > 1) expect(fast.side).toBe(brute.side);
				const approx = idx.nearest(ql, qa, { exact: false });
				expect(Math.abs(approx.distanceM - brute.distanceM)).toBeLessThan(
					1e-4 * brute.distanceM + 0.01
				);
			}
		}
	});

	it('equals brute force on a zig-zag axis, where far points find their foot at a vertex', () => {
		const axis: LonLat[] = [];
		for (let i = 0; i < 200; i++) axis.push([-30 + (i % 2 ? 0.05 : -0.05), 10 + i * 0.02]);
		const idx = new PolylineIndex([axis]);
		const rand = rng(99);
		let atVertex = 0;
		for (let q = 0; q < 150; q++) {
			const lon = -30 + (rand() - 0.5) * 40;
			const lat = 10 + rand() * 4;
			const a = idx.nearest(lon, lat);
			const b = idx.nearestBrute(lon, lat);
			expect(Math.abs(a.distanceM - b.distanceM)).toBeLessThan(MM);
			expect(a.side).toBe(b.side);
			const v = axis[a.vertex + 1];
			if (distanceM([a.lon, a.lat], v) < 1e-3 || distanceM([a.lon, a.lat], axis[a.vertex]) < 1e-3) {
				atVertex++;
			}
		}
		// the shortcut for feet on a shared vertex is exercised, not just present
		expect(atVertex).toBeGreaterThan(50);
	});

	it('handles an axis across the antimeridian', () => {
		const idx = new PolylineIndex([
			[
				[179.8, -2],
				[-179.9, 0],
				[-179.6, 2]
			]
		]);
		const p = idx.nearest(179.9, 0.5);
		const brute = idx.nearestBrute(179.9, 0.5);
		expect(p.distanceM).toBeLessThan(40_000);
		expect(Math.abs(p.distanceM - brute.distanceM)).toBeLessThan(MM);
		// walking roughly north-east, a point to the west is on the left
		expect(p.side).toBe('left');
		expect(idx.nearest(-179.5, 0).side).toBe('right');
	});

	it('handles an axis over the pole', () => {
		const idx = new PolylineIndex([
			[
				[0, 88],
				[180, 88]
			]
		]);
		// [derived] the axis is the 0°/180° meridian through the pole; (90°E, 89°N) is one degree
		// of latitude from the pole along the 90°E meridian, perpendicular to the axis
		const p = idx.nearest(90, 89);
		expect(Math.abs(p.distanceM - distanceM([90, 89], [0, 90]))).toBeLessThan(MM);
		// walking from 0° over the pole towards 180°, 90°E lies on the right
		expect(p.side).toBe('right');
		expect(idx.nearest(-90, 89).side).toBe('left');
	});

	it('uses the bisector at a vertex so both sides of a bend stay consistent', () => {
		// east then north: the outer corner (south-east of the bend) is on the right
		const idx = new PolylineIndex([
			[
				[0, 0],
				[1, 0],
				[1, 1]
			]
		]);
		const outer = idx.nearest(1.2, -0.2);
		expect(outer.vertex === 0 || outer.vertex === 1).toBe(true);
		expect(outer.side).toBe('right');
		expect(idx.nearest(0.8, 0.2).side).toBe('left');
	});

	it('reports which of several polylines is nearest', () => {
		const idx = new PolylineIndex([
			[
				[0, 0],
				[0, 1]
			],
			[
				[0.5, 1.2],
				[0.5, 2.2]
			]
		]);
		expect(idx.nearest(0.1, 0.5).line).toBe(0);
		expect(idx.nearest(0.4, 1.8).line).toBe(1);
	});

	it('rejects degenerate or invalid polylines', () => {
		expect(() => new PolylineIndex([[[0, 0]]])).toThrow(RangeError);
		expect(
			() =>
				new PolylineIndex([
					[
						[0, 0],
						[0, 0]
					]
				])
		).toThrow(RangeError);
		expect(
			() =>
				new PolylineIndex([
					[
						[0, 0],
						[0, 95]
					]
				])
		).toThrow(RangeError);
	});
});
