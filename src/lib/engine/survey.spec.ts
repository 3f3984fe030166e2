import { describe, expect, it } from 'vitest';
import {
	coverageGaps,
	flatSwathRatio,
	lineSpacingM,
	planSurvey,
	swathWidthM,
	type SwathTrack
} from './survey';
import { PolylineIndex, direct, distanceM, sampleLine, type LonLat } from './geodesy';
import { RidgeAgeModel } from './age';
import { depthGdh1 } from './depth';

describe('swath width and spacing', () => {
	it('gives the flat-seafloor swath ratios W/d = 2·tan(θ/2)', () => {
		// [derived] SCIENCE.md §4
		expect(Math.abs(flatSwathRatio(120) - 3.464)).toBeLessThan(5e-4);
		expect(Math.abs(flatSwathRatio(130) - 4.289)).toBeLessThan(5e-4);
		expect(Math.abs(flatSwathRatio(140) - 5.495)).toBeLessThan(5e-4);
		expect(Math.abs(flatSwathRatio(150) - 7.464)).toBeLessThan(5e-4);
	});

	it('caps the effective width at k·d', () => {
		// [trade] W_eff = min(2·d·tan(θ/2), k·d), k = 4 by default
		expect(swathWidthM(3000, 150)).toBeCloseTo(12_000, 9);
		expect(swathWidthM(3000, 120)).toBeCloseTo(3000 * 2 * Math.tan(Math.PI / 3), 9);
		expect(swathWidthM(3000, 150, 6)).toBeCloseTo(18_000, 9);
		expect(() => swathWidthM(3000, 180)).toThrow(RangeError);
	});

	it('spaces lines by W_eff·(1 − p)', () => {
		// [derived] 3000 m, 120°, 30 % overlap: 3000·3.4641·0.7 = 7274.6 m
		expect(Math.abs(lineSpacingM(3000, 0.3, 120) - 7274.6)).toBeLessThan(0.1);
		// [published] 60 % overlap for monitoring (Lucieer et al. 2018)
		expect(lineSpacingM(3000, 0.6, 120)).toBeCloseTo(3000 * 2 * Math.tan(Math.PI / 3) * 0.4, 9);
		expect(() => lineSpacingM(3000, 1)).toThrow(RangeError);
	});
});

function track(coords: LonLat[], width: (alongM: number) => number): SwathTrack {
	const s = sampleLine(coords, 500);
	return {
		lon: s.lon,
		lat: s.lat,
		distanceM: s.distanceM,
		swathWidthM: Array.from(s.distanceM, (d) => width(d))
	};
}

describe('coverage gaps', () => {
	it('finds where two parallel swaths do not meet', () => {
		const a = track(
			[
				[0, 0],
				[0, 1]
			],
			() => 10_000
		);
		// 0.1° of longitude on the equator is 11.13 km; b widens from 10 km to 14 km half-way
		const b = track(
			[
				[0.1, 0],
				[0.1, 1]
			],
			(d) => (d < 55_000 ? 10_000 : 14_000)
		);
		const gaps = coverageGaps(a, b);
		expect(gaps.length).toBe(1);
		expect(gaps[0].fromKm).toBeLessThan(0.6);
		expect(Math.abs(gaps[0].toKm - 55)).toBeLessThan(0.6);
		// [derived] 11 132 m apart, half-widths 5 + 5 km → an open strip of ≈ 1132 m
		const sep = distanceM([0, 0.25], [0.1, 0.25]);
		expect(gaps[0].maxGapM).toBeCloseTo(sep - 10_000, 0);
		// wider swaths close the gap
		const wide = track(
			[
				[0, 0],
				[0, 1]
			],
			() => 13_000
		);
		expect(coverageGaps(wide, b)).toEqual([]);
	});
});

describe('depth-adaptive line plan', () => {
	// a ridge axis at 30°W; the area spans 60 km off-axis on its east flank, 100 km along it
	const ridge = new RidgeAgeModel([
		{
			axis: [
				[-30, 9],
				[-30, 12]
			],
			fullRateMmYr: 25
		}
	]);
	const depthAt = (lon: number, lat: number) =>
		depthGdh1(ridge.ageAt(lon, lat, { exact: false }).ageMa);
	const sw = direct([-30, 10], 90, 5000);
	const se = direct([sw.lon, sw.lat], 90, 60_000);
	const ne = direct([se.lon, se.lat], 0, 100_000);
	const nw = direct([sw.lon, sw.lat], 0, 100_000);
	const polygon: LonLat[] = [
		[sw.lon, sw.lat],
		[se.lon, se.lat],
		[ne.lon, ne.lat],
		[nw.lon, nw.lat],
		[sw.lon, sw.lat]
	];

	it('keeps the overlap of adjacent swaths at or above the target everywhere', () => {
		const overlap = 0.3;
		const plan = planSurvey(polygon, depthAt, { headingDeg: 0, overlap, swathAngleDeg: 120 });
		expect(plan.lines.length).toBeGreaterThan(5);
		// spacing adapts: lines farther off-axis (deeper) are farther apart
		// (the last spacing may be shorter: the last line is pulled back to just reach the edge)
		const sp = plan.lines.slice(0, -2).map((l) => l.spacingToNextM);
		expect(sp[sp.length - 1]).toBeGreaterThan(sp[0] * 1.1);
		for (let i = 0; i + 1 < plan.lines.length; i++) {
			const a = plan.lines[i];
			const b = new PolylineIndex([plan.lines[i + 1].coords]);
			const s = sampleLine(a.coords, 1000);
			for (let k = 0; k < s.count; k++) {
				const n = b.nearest(s.lon[k], s.lat[k]);
				const wa = swathWidthM(depthAt(s.lon[k], s.lat[k]), 120);
				const wb = swathWidthM(depthAt(n.lon, n.lat), 120);
				const ov = (wa / 2 + wb / 2 - n.distanceM) / Math.min(wa, wb);
				expect(ov).toBeGreaterThanOrEqual(overlap - 0.005);
			}
		}
	});

	it('covers the area edge to edge and reports length and time', () => {
		const plan = planSurvey(polygon, depthAt, { headingDeg: 0, speedKn: 9 });
		const first = plan.lines[0];
		const last = plan.lines[plan.lines.length - 1];
		const edgeW = new PolylineIndex([[polygon[0], polygon[3]]]);
		const edgeE = new PolylineIndex([[polygon[1], polygon[2]]]);
		const pw = first.coords[0];
		const pe = last.coords[0];
		expect(edgeW.nearest(pw[0], pw[1]).distanceM).toBeLessThanOrEqual(
			swathWidthM(first.shallowestDepthM) / 2
		);
		expect(edgeE.nearest(pe[0], pe[1]).distanceM).toBeLessThanOrEqual(
			swathWidthM(last.shallowestDepthM) / 2 + 1
		);
		// lines run the 100 km length of the area and alternate direction
		for (const l of plan.lines) expect(Math.abs(l.lengthKm - 100)).toBeLessThan(0.5);
		expect(plan.lines[0].coords[0][1]).toBeLessThan(plan.lines[0].coords[1][1]);
		expect(plan.lines[1].coords[0][1]).toBeGreaterThan(plan.lines[1].coords[1][1]);
		const lineKm = plan.lines.reduce((s, l) => s + l.lengthKm, 0);
		expect(plan.lineKm).toBeCloseTo(lineKm, 9);
		expect(plan.totalKm).toBeCloseTo(plan.lineKm + plan.turnKm, 9);
		// [derived] hours = km / (kn × 1.852)
		expect(plan.hours).toBeCloseTo(plan.totalKm / (9 * 1.852), 9);
	});

	it('spaces lines evenly over a flat seafloor', () => {
		const plan = planSurvey(polygon, () => 3000, { headingDeg: 0, overlap: 0.3 });
		const s = lineSpacingM(3000, 0.3);
		for (const l of plan.lines.slice(0, -2)) expect(l.spacingToNextM).toBeCloseTo(s, 6);
		expect(plan.lines[plan.lines.length - 2].spacingToNextM).toBeLessThanOrEqual(s);
		// [derived] first line at S/2 from the near edge; lines stop once a swath reaches the far one
		expect(plan.lines[0].offsetM).toBeCloseTo(s / 2, 6);
		const edgeE = new PolylineIndex([[polygon[1], polygon[2]]]);
		const reach = (l: (typeof plan.lines)[number]) => {
			const m = sampleLine(l.coords, 1000);
			let worst = Infinity;
			for (let k = 0; k < m.count; k++) {
				worst = Math.min(worst, edgeE.nearest(m.lon[k], m.lat[k]).distanceM);
			}
			return worst;
		};
		const w = swathWidthM(3000);
		expect(reach(plan.lines[plan.lines.length - 1])).toBeLessThanOrEqual(w / 2 + 1);
		expect(reach(plan.lines[plan.lines.length - 2])).toBeGreaterThan(w / 2);
	});

	it('rejects a degenerate area', () => {
		expect(() =>
			planSurvey(
				[
					[0, 0],
					[1, 0]
				],
				() => 3000
			)
		).toThrow(RangeError);
	});
});
