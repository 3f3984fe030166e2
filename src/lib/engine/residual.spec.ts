import { describe, expect, it } from 'vitest';
import { depthGdh1 } from './depth';
import { crustThicknessKm } from './melt';
import { RidgeDepthModel, type RidgeInput } from './profile';
import {
	alongTrackM,
	calibrateSegment,
	histogram,
	impliedByResidual,
	niceBinWidth,
	residualStats,
	trackResiduals
} from './residual';

/** A north–south axis at 30°W, 20 mm/yr full rate, anchored at 2800 m. */
const RIDGE: RidgeInput = {
	axis: [
		[-30, -1],
		[-30, 1]
	],
	fullRateMmYr: 20,
	axialDepthM: 2800
};

/** A track from 200 km west of the axis to 200 km east along the equator, every ~1 km. */
function crossing(n = 401) {
	const lon = new Float64Array(n);
	const lat = new Float64Array(n);
	for (let i = 0; i < n; i++) lon[i] = -30 - 1.8 + (3.6 * i) / (n - 1);
	return { lon, lat };
}

/** Deterministic noise in [−a, a] (a linear congruential generator), mean near zero. */
function noise(n: number, a: number, seed = 7) {
	let s = seed;
	const out = new Float64Array(n);
	for (let i = 0; i < n; i++) {
		s = (s * 1664525 + 1013904223) >>> 0;
		out[i] = (s / 2 ** 32 - 0.5) * 2 * a;
	}
	return out;
}

describe('residual depth', () => {
	it('Airy: +400 m of residual means crust 2.27 km thinner [derived] SCIENCE.md §3 (ρw 1030, ρc 2900, ρm 3300)', () => {
		// Δh = −400·(3300 − 1030)/(3300 − 2900) = −2270 m
		expect(impliedByResidual(400).crustalThicknessChangeKm).toBeCloseTo(-2.27, 6);
		expect(impliedByResidual(-400).crustalThicknessChangeKm).toBeCloseTo(2.27, 6);
	});

	it.each([
		[1280, 5.53],
		[1300, 6.7],
		[1350, 10.0],
		[1400, 13.8],
		[1450, 18.08]
	])(
		'M&B88 inversion: crust %s °C ↔ %s km returns the Tp within 5 °C [reference library] pyMelt 2.3 (SCIENCE.md §3 table)',
		(tp, crustKm) => {
			// the residual that moves the reference (7 km) crust to crustKm: −(h − 7)·(ρm−ρc)/(ρm−ρw)
			const residual = (-(crustKm - 7) * 1000 * 400) / 2270;
			const implied = impliedByResidual(residual, 0, 'mckenzie-bickle-1988');
			expect(implied.crustKm).toBeCloseTo(crustKm, 6);
			expect(Math.abs(implied.potentialTemperatureC! - tp)).toBeLessThanOrEqual(5);
		}
	);

	it('adds the curve’s own shift: a prediction for a 1350 °C mantle and zero residual imply 1350 °C', () => {
		const shift = (-(crustThicknessKm(1350) - 7) * 1000 * 400) / 2270;
		const implied = impliedByResidual(0, shift);
		expect(implied.crustalThicknessChangeKm).toBeCloseTo(0, 9);
		expect(implied.potentialTemperatureC!).toBeCloseTo(1350, 0);
	});

	it('gives back a known offset from a synthetic track [derived]', () => {
		const { lon, lat } = crossing();
		const model = new RidgeDepthModel([RIDGE]);
		const offset = 250;
		const depthM = new Float64Array(lon.length);
		for (let i = 0; i < lon.length; i++) depthM[i] = model.depthAt(lon[i], lat[i]).depthM + offset;
		const r = trackResiduals({ lon, lat, depthM }, [RIDGE]);
		expect(r.stats.n).toBe(lon.length);
		expect(r.stats.meanM).toBeCloseTo(offset, 3);
		expect(r.stats.medianM).toBeCloseTo(offset, 3);
		expect(r.stats.rmsM).toBeCloseTo(offset, 3);
		expect(r.stats.stdM).toBeLessThan(0.01);
		// GDH1 anchored at 2800 m: 100 km from the axis at 10 mm/yr half rate is 10 Myr [derived]
		const k = lon.findIndex((x) => x > -30 + 0.898);
		expect(r.ageMa[k]).toBeGreaterThan(9.9);
		expect(r.ageMa[k]).toBeLessThan(10.2);
		expect(r.predictedM[k]).toBeCloseTo(depthGdh1(r.ageMa[k]) - 2600 + 2800, 6);
		expect(r.implied!.crustalThicknessChangeKm).toBeCloseTo((-250 * 2270) / 400 / 1000, 3);
		// a track with noise keeps its mean
		const noisy = noise(lon.length, 100);
		const d2 = depthM.map((v, i) => v + noisy[i]);
		const r2 = trackResiduals({ lon, lat, depthM: d2 }, [RIDGE]);
		const meanNoise = noisy.reduce((a, b) => a + b, 0) / noisy.length;
		expect(r2.stats.meanM).toBeCloseTo(offset + meanNoise, 3);
		expect(r2.stats.stdM).toBeGreaterThan(40);
	});

	it('skips fixes without a sounding in the statistics', () => {
		const { lon, lat } = crossing(11);
		const depthM = new Float64Array(11).fill(3000);
		depthM[3] = NaN;
		const r = trackResiduals({ lon, lat, depthM }, [RIDGE]);
		expect(r.stats.n).toBe(10);
		expect(Number.isNaN(r.residualM[3])).toBe(true);
		expect(Number.isFinite(r.predictedM[3])).toBe(true);
	});

	it('statistics: mean, median, RMS, std of a small set [derived]', () => {
		const s = residualStats([1, 2, 3, 4, NaN, 10]);
		expect(s).toMatchObject({ n: 5, meanM: 4, medianM: 3, minM: 1, maxM: 10 });
		expect(s.rmsM).toBeCloseTo(Math.sqrt(130 / 5), 12);
		expect(s.stdM).toBeCloseTo(Math.sqrt(50 / 4), 12);
		const h = histogram([1, 2, 3, 4, NaN, 10], s, 5);
		expect(h).toEqual({ startM: 0, binWidthM: 5, counts: [4, 0, 1] });
		expect(niceBinWidth(600)).toBe(20);
	});

	it('measures along the track across the antimeridian without a jump', () => {
		const d = alongTrackM([179.9, -179.9], [0, 0]);
		expect(d[1]).toBeGreaterThan(22_000);
		expect(d[1]).toBeLessThan(22_500);
	});
});

describe('calibration', () => {
	it('recovers a known axial depth within 10 m from a noisy synthetic track [derived]', () => {
		const { lon, lat } = crossing();
		const truth: RidgeInput = { ...RIDGE, axialDepthM: 3150 };
		const model = new RidgeDepthModel([truth]);
		const noisy = noise(lon.length, 60, 11);
		const depthM = new Float64Array(lon.length);
		for (let i = 0; i < lon.length; i++)
			depthM[i] = model.depthAt(lon[i], lat[i]).depthM + noisy[i];
		const c = calibrateSegment({ lon, lat, depthM }, [RIDGE], 0);
		expect(c.before.axialDepthM).toBeCloseTo(2800, 6);
		expect(Math.abs(c.after.axialDepthM - 3150)).toBeLessThanOrEqual(10);
		expect(c.after.rmsM).toBeLessThan(c.before.rmsM);
		expect(c.after.rmsM).toBeLessThan(60);
		expect(c.nNearAxis).toBeGreaterThanOrEqual(25);
	});

	it('finds the full spreading rate by a 1-D search when asked [derived]', () => {
		const { lon, lat } = crossing();
		const truth: RidgeInput = { ...RIDGE, axialDepthM: 3000, fullRateMmYr: 32 };
		const model = new RidgeDepthModel([truth]);
		const noisy = noise(lon.length, 30, 5);
		const depthM = new Float64Array(lon.length);
		for (let i = 0; i < lon.length; i++)
			depthM[i] = model.depthAt(lon[i], lat[i]).depthM + noisy[i];
		const c = calibrateSegment({ lon, lat, depthM }, [RIDGE], 0, { fitRate: true });
		expect(Math.abs(c.after.fullRateMmYr - 32)).toBeLessThan(2);
		expect(Math.abs(c.after.axialDepthM - 3000)).toBeLessThanOrEqual(10);
		expect(c.after.rmsM).toBeLessThan(30);
	});

	it('refuses when too few fixes lie near the axis', () => {
		const lon = new Float64Array([-31.5, -31.4, -31.3]);
		const lat = new Float64Array(3);
		expect(() =>
			calibrateSegment({ lon, lat, depthM: new Float64Array([4000, 4000, 4000]) }, [RIDGE], 0)
		).toThrow(/within 15 km/);
	});
});
