import { describe, expect, it } from 'vitest';
import {
	BAND_WIDEN_M,
	DEPTH_MODEL_IDS,
	GDH1_PLATE,
	GDH1_SWITCH_AGE_MA,
	HALF_SPACE_DEFAULTS,
	PS77_SWITCH_AGE_MA,
	curveShift,
	depthForModel,
	depthGdh1,
	depthGdh1Old,
	depthGdh1Young,
	depthHalfSpace,
	depthParsonsSclater,
	depthParsonsSclaterOld,
	depthParsonsSclaterYoung,
	depthPlate,
	halfSpaceCoefficient,
	makeDepthPredictor,
	predictDepth
} from './depth';

/** SCIENCE.md §1 check table [derived from the published formulas]: t, P&S young, P&S old, GDH1, half-space. */
const TABLE: [number, number, number, number, number][] = [
	[0, 2500.0, 3200.0, 2600.0, 2500.0],
	[1, 2850.0, 3250.6, 2965.0, 2854.7],
	[10, 3606.8, 3671.1, 3754.2, 3621.7],
	[25, 4250.0, 4250.9, 4416.8, 4273.5],
	[50, 4974.9, 4956.6, 5035.0, 5008.1],
	[80, 5630.5, 5504.8, 5383.5, 5672.5],
	[100, 6000.0, 5749.0, 5497.6, 6047.0],
	[150, 6786.6, 6106.4, 5612.8, 6844.1]
];
// the table is printed to 0.1 m, so allow the rounding (0.05 m) plus the 0.1 m formula tolerance
const TOL = 0.1;

describe('age–depth curves', () => {
	it.each(TABLE)('match the check table at %s Myr', (t, psYoung, psOld, gdh1, hs) => {
		// [derived] Parsons & Sclater 1977 branches, Stein & Stein 1992 GDH1, half-space (d_r 2500)
		expect(Math.abs(depthParsonsSclaterYoung(t) - psYoung)).toBeLessThanOrEqual(TOL);
		expect(Math.abs(depthParsonsSclaterOld(t) - psOld)).toBeLessThanOrEqual(TOL);
		expect(Math.abs(depthGdh1(t) - gdh1)).toBeLessThanOrEqual(TOL);
		expect(Math.abs(depthHalfSpace(t) - hs)).toBeLessThanOrEqual(TOL);
	});

	it('switches Parsons & Sclater where the branches cross, 26.27 Myr at 4293.8 m', () => {
		// [derived] SCIENCE.md §1: the branches intersect at t = 26.27 Myr, d = 4293.8 m
		expect(Math.abs(PS77_SWITCH_AGE_MA - 26.27)).toBeLessThan(0.005);
		expect(Math.abs(depthParsonsSclater(PS77_SWITCH_AGE_MA) - 4293.8)).toBeLessThan(0.1);
		// the combined curve picks the young branch before the switch and the old one after
		expect(depthParsonsSclater(10)).toBe(depthParsonsSclaterYoung(10));
		expect(depthParsonsSclater(50)).toBe(depthParsonsSclaterOld(50));
	});

	it('is continuous at every model switch age', () => {
		const eps = 1e-9;
		for (const [f, tSwitch] of [
			[depthParsonsSclater, PS77_SWITCH_AGE_MA],
			[depthGdh1, GDH1_SWITCH_AGE_MA]
		] as const) {
			// [derived] GDH1's published branches leave a 0.41 m step at 20 Myr (SCIENCE.md: "within
			// 0.4 m", rounded); the P&S branches meet exactly at the computed crossing
			expect(Math.abs(f(tSwitch + eps) - f(tSwitch - eps))).toBeLessThan(0.41);
		}
		expect(Math.abs(depthGdh1Young(20) - depthGdh1Old(20))).toBeLessThan(0.41);
		expect(
			Math.abs(
				depthParsonsSclaterYoung(PS77_SWITCH_AGE_MA) - depthParsonsSclaterOld(PS77_SWITCH_AGE_MA)
			)
		).toBeLessThan(1e-6);
	});

	it('has the half-space coefficient 354.7 m per √Myr', () => {
		// [derived] 2·3300·3e-5·1300/2300 · √(1e-6·3.15576e13/π)
		expect(Math.abs(halfSpaceCoefficient() - 354.7)).toBeLessThan(0.05);
	});

	it('lets the half-space parameters be edited', () => {
		// [derived] doubling κ scales the coefficient by √2; d_r shifts the curve
		const p = { ...HALF_SPACE_DEFAULTS, kappa: 2e-6, ridgeDepthM: 2700 };
		expect(halfSpaceCoefficient(p) / halfSpaceCoefficient()).toBeCloseTo(Math.SQRT2, 12);
		expect(depthHalfSpace(0, p)).toBe(2700);
		expect(depthHalfSpace(4, p)).toBeCloseTo(2700 + 2 * halfSpaceCoefficient(p), 9);
	});

	it('deepens monotonically with age for every model', () => {
		for (const m of DEPTH_MODEL_IDS) {
			let prev = depthForModel(m, 0);
			for (let t = 0.25; t <= 200; t += 0.25) {
				const d = depthForModel(m, t);
				expect(d).toBeGreaterThan(prev);
				prev = d;
			}
		}
	});

	it('puts 80–100 Myr GDH1 seafloor at about 5–5.5 km', () => {
		// [trade] mature seafloor of 80–100 Myr lies at about 5–5.5 km
		expect(depthGdh1(80)).toBeGreaterThan(5000);
		expect(depthGdh1(100)).toBeLessThan(5500);
	});

	it('rejects negative or non-finite ages', () => {
		expect(() => depthGdh1(-1)).toThrow(RangeError);
		expect(() => depthParsonsSclater(Number.NaN)).toThrow(RangeError);
		expect(() => depthHalfSpace(Infinity)).toThrow(RangeError);
	});
});

describe('plate model series', () => {
	it('reproduces the GDH1 closed form within 3 m over 1–200 Myr with the GDH1 plate', () => {
		// [derived] SCIENCE.md §1: the series with GDH1's plate is within 3 m of GDH1
		let worst = 0;
		for (let t = 1; t <= 200; t += 0.5)
			worst = Math.max(worst, Math.abs(depthPlate(t) - depthGdh1(t)));
		expect(worst).toBeLessThan(3);
	});

	it('starts at the ridge depth and approaches d_r + ρm·α·Tm·a/(2(ρm − ρw))', () => {
		// [derived] the bracket is 0 at t = 0 (Σ_{n odd} n⁻² = π²/8) and ½ as t → ∞
		const p = GDH1_PLATE;
		expect(depthPlate(0)).toBe(p.ridgeDepthM);
		expect(Math.abs(depthPlate(1e-6) - p.ridgeDepthM)).toBeLessThan(2);
		const asymptote =
			p.ridgeDepthM +
			(p.rhoMantle * p.alpha * p.mantleTempC * p.plateThicknessM) /
				(2 * (p.rhoMantle - p.rhoWater));
		expect(Math.abs(depthPlate(5000) - asymptote)).toBeLessThan(0.01);
	});

	it('follows half-space cooling while the plate is young', () => {
		// [derived] for κt ≪ a² the plate series equals half-space cooling with ΔT = Tm
		const p = GDH1_PLATE;
		const kappa = p.conductivity / (p.rhoMantle * p.heatCapacity);
		const hs = {
			ridgeDepthM: p.ridgeDepthM,
			rhoMantle: p.rhoMantle,
			rhoWater: p.rhoWater,
			alpha: p.alpha,
			deltaT: p.mantleTempC,
			kappa
		};
		for (const t of [0.01, 0.5, 2]) {
			expect(Math.abs(depthPlate(t) - depthHalfSpace(t, hs))).toBeLessThan(0.1);
		}
	});
});

describe('anchoring and the uncertainty band', () => {
	it('anchors every curve to a measured axial depth', () => {
		for (const m of DEPTH_MODEL_IDS) {
			const p = predictDepth(0, m, { axialDepthM: 3100 });
			// [derived] shift so the depth at t = 0 equals the measured axial depth
			expect(p.depthM).toBeCloseTo(3100, 9);
			expect(p.lowM).toBeCloseTo(3100 - BAND_WIDEN_M, 9);
			expect(p.highM).toBeCloseTo(3100 + BAND_WIDEN_M, 9);
			expect(
				predictDepth(30, m, { axialDepthM: 3100 }).depthM - predictDepth(30, m).depthM
			).toBeCloseTo(3100 - depthForModel(m, 0), 9);
		}
	});

	it('shifts the curve and the band by an Airy shift unless anchored', () => {
		const plain = predictDepth(12);
		const shifted = predictDepth(12, 'stein-stein-1992', { airyShiftM: -500 });
		expect(shifted.depthM - plain.depthM).toBeCloseTo(-500, 9);
		expect(shifted.lowM - plain.lowM).toBeCloseTo(-500, 9);
		expect(shifted.highM - plain.highM).toBeCloseTo(-500, 9);
		// an anchor wins over the Airy shift
		expect(curveShift('stein-stein-1992', { axialDepthM: 2800, airyShiftM: -500 })).toBeCloseTo(
			200,
			9
		);
	});

	it('is the envelope of the three published curves widened by ±200 m', () => {
		for (const t of [0, 1, 7.5, 26.27, 60, 150]) {
			const p = predictDepth(t);
			const ds = DEPTH_MODEL_IDS.map((m) => depthForModel(m, t));
			// [derived] our band convention, SCIENCE.md §1
			expect(p.lowM).toBeCloseTo(Math.min(...ds) - 200, 9);
			expect(p.highM).toBeCloseTo(Math.max(...ds) + 200, 9);
		}
	});

	it('keeps low ≤ depth ≤ high, and the fast predictor equals predictDepth', () => {
		for (const m of DEPTH_MODEL_IDS) {
			for (const shift of [{}, { axialDepthM: 2200 }, { airyShiftM: 800 }]) {
				const fast = makeDepthPredictor(m, shift);
				for (let t = 0; t <= 180; t += 3.7) {
					const p = predictDepth(t, m, shift);
					expect(p.lowM).toBeLessThanOrEqual(p.depthM);
					expect(p.depthM).toBeLessThanOrEqual(p.highM);
					const f = fast(t);
					expect(f.depthM).toBeCloseTo(p.depthM, 9);
					expect(f.lowM).toBeCloseTo(p.lowM, 9);
					expect(f.highM).toBeCloseTo(p.highM, 9);
				}
			}
		}
	});
});
