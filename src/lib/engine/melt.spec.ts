import { describe, expect, it } from 'vitest';
import {
	AIRY_DEFAULTS,
	TP_SEARCH_RANGE_C,
	airyDepthShiftM,
	airyShiftFromPotentialTemperatureM,
	crustFromDepthShiftKm,
	crustThicknessKm,
	hirschmannSolidus,
	impliedFromAxialDepth,
	impliedFromResidualDepth,
	katzFraction,
	katzLherzoliteLiquidus,
	katzSolidus,
	mckenzieBickleFraction,
	mckenzieBickleLiquidus,
	mckenzieBickleSolidus,
	mckenzieBickleSolidusPressure,
	meltColumn,
	meltPath,
	potentialTemperatureForCrust,
	seafloorWithSedimentM,
	sedimentLoadingM,
	solidAdiabat,
	type MeltModelId
} from './melt';

/** [reference library] pyMelt 2.3 (Matthews et al.), adiabaticMelt + spreadingCentre (SCIENCE.md §3). */
const PYMELT: [number, number, number, number, number][] = [
	// Tp, M&B88 F, M&B88 crust km, Katz F, Katz crust km
	[1280, 0.234, 5.53, 0.165, 4.05],
	[1300, 0.253, 6.7, 0.185, 5.07],
	[1350, 0.293, 10.0, 0.236, 8.18],
	[1400, 0.325, 13.8, 0.287, 12.15],
	[1450, 0.349, 18.08, 0.337, 17.04],
	[1580, 0.389, 31.82, 0.389, 33.28]
];

describe('melting models', () => {
	it('inverts the McKenzie & Bickle solidus P(T)', () => {
		for (const p of [0, 0.5, 1.5, 3, 5, 7]) {
			// [derived] T(P) substituted back into the published P(T)
			expect(mckenzieBickleSolidusPressure(mckenzieBickleSolidus(p))).toBeCloseTo(p, 10);
		}
		// [derived] at T = 1100 °C the published form gives P = 4.968e-4 GPa
		expect(mckenzieBickleSolidus(4.968e-4)).toBeCloseTo(1100, 8);
	});

	it('evaluates the McKenzie & Bickle melt fraction at the ends and the middle', () => {
		const p = 1.2;
		const ts = mckenzieBickleSolidus(p);
		const tl = mckenzieBickleLiquidus(p);
		// [derived] x = 0.5 + T' + (T'² − 0.25)(0.4256 + 2.988T'): 0 at T' = −0.5, 1 at 0.5,
		// 0.5 − 0.25·0.4256 = 0.3936 at T' = 0
		expect(mckenzieBickleFraction(p, ts)).toBeCloseTo(0, 12);
		expect(mckenzieBickleFraction(p, tl)).toBeCloseTo(1, 12);
		expect(mckenzieBickleFraction(p, 0.5 * (ts + tl))).toBeCloseTo(0.3936, 12);
		expect(mckenzieBickleFraction(p, ts - 10)).toBe(0);
		// [derived] liquidus at 0 GPa is 1736 °C
		expect(mckenzieBickleLiquidus(0)).toBe(1736);
	});

	it('evaluates the Katz 2003 melt fraction continuously through cpx exhaustion', () => {
		const p = 1;
		const tsol = katzSolidus(p);
		const tlz = katzLherzoliteLiquidus(p);
		const fcpx = 0.17 / (0.5 + 0.08 * p);
		// [derived] F = ((T − Tsol)/(Tlz − Tsol))^1.5 reaches Fcpx at Tcpx
		const tcpx = tsol + Math.pow(fcpx, 1 / 1.5) * (tlz - tsol);
		expect(katzFraction(p, tcpx - 1e-9)).toBeCloseTo(fcpx, 6);
		expect(katzFraction(p, tcpx + 1e-9)).toBeCloseTo(fcpx, 6);
		expect(katzFraction(p, tsol)).toBe(0);
		expect(katzFraction(p, 2500)).toBe(1);
		// [derived] the solidus 1085.7 + 132.9P − 5.1P² at 2 GPa is 1331.1 °C
		expect(katzSolidus(2)).toBeCloseTo(1331.1, 9);
	});

	it('gives the Hirschmann 2000 comparison solidus', () => {
		// [derived] SCIENCE.md §3: 2 GPa → 1366.0 °C
		expect(Math.abs(hirschmannSolidus(2) - 1366.0)).toBeLessThan(0.05);
	});

	it('follows the solid adiabat', () => {
		// [derived] T(P) = (Tp + 273.15)·exp(αP/(ρcp)) − 273.15; at P = 0 it is Tp
		expect(solidAdiabat(1350, 0)).toBe(1350);
		expect(solidAdiabat(1350, 2)).toBeCloseTo(
			1623.15 * Math.exp((4e-5 * 2e9) / (3300 * 1120)) - 273.15,
			9
		);
	});
});

describe('decompression melting column', () => {
	it.each(PYMELT)(
		'matches pyMelt at Tp %s °C (0.01 in F, 0.3 km in crust)',
		(tp, mbF, mbH, kF, kH) => {
			// [reference library] pyMelt 2.3 adiabaticMelt + spreadingCentre
			const mb = meltColumn(tp, { model: 'mckenzie-bickle-1988' });
			expect(Math.abs(mb.surfaceMeltFraction - mbF)).toBeLessThanOrEqual(0.01);
			expect(Math.abs(mb.crustKm - mbH)).toBeLessThanOrEqual(0.3);
			const k = meltColumn(tp, { model: 'katz-2003' });
			expect(Math.abs(k.surfaceMeltFraction - kF)).toBeLessThanOrEqual(0.01);
			expect(Math.abs(k.crustKm - kH)).toBeLessThanOrEqual(0.3);
		}
	);

	it('reproduces the straight-from-the-text M&B88 values (step 1e-3 GPa, trapezoids)', () => {
		// [derived] SCIENCE.md §3: 0.234 / 5.52 km at 1280 °C and 0.389 / 31.75 km at 1580 °C
		const a = meltColumn(1280);
		expect(Math.abs(a.surfaceMeltFraction - 0.234)).toBeLessThan(0.0015);
		expect(Math.abs(a.crustKm - 5.52)).toBeLessThan(0.1);
		const b = meltColumn(1580);
		expect(Math.abs(b.surfaceMeltFraction - 0.389)).toBeLessThan(0.0015);
		expect(Math.abs(b.crustKm - 31.75)).toBeLessThan(0.1);
	});

	it('melts about a quarter at 1280 °C and makes ≥ 30 km of crust at 1580 °C', () => {
		// [trade] SCIENCE.md §3
		expect(meltColumn(1280).surfaceMeltFraction).toBeGreaterThan(0.2);
		expect(meltColumn(1280).surfaceMeltFraction).toBeLessThan(0.3);
		expect(meltColumn(1580).crustKm).toBeGreaterThan(30);
	});

	it.each(['mckenzie-bickle-1988', 'katz-2003'] as MeltModelId[])(
		'%s: F never decreases and T falls along the path; the crust load equals the top pressure',
		(model) => {
			const path = meltPath(1450, { model });
			expect(path.pressureGPa[0]).toBeCloseTo(meltColumn(1450, { model }).solidusPressureGPa, 12);
			expect(path.pressureGPa[path.pressureGPa.length - 1]).toBe(0);
			for (let i = 1; i < path.meltFraction.length; i++) {
				expect(path.meltFraction[i]).toBeGreaterThanOrEqual(path.meltFraction[i - 1]);
				expect(path.temperatureC[i]).toBeLessThan(path.temperatureC[i - 1]);
			}
			const c = meltColumn(1450, { model });
			// [derived] h = P_top/(ρg) where the crust's own load equals the pressure
			expect(c.crustKm).toBeCloseTo((c.topPressureGPa * 1e9) / (3300 * 9.81) / 1000, 9);
		}
	);

	it('grows the crust monotonically with potential temperature and not at all when cold', () => {
		let prev = -1;
		for (let tp = 1250; tp <= 1600; tp += 25) {
			const h = crustThicknessKm(tp);
			expect(h).toBeGreaterThan(prev);
			prev = h;
		}
		// below the surface solidus (~1100 °C for M&B88) nothing melts
		const cold = meltColumn(1050);
		expect(cold.crustKm).toBe(0);
		expect(cold.surfaceMeltFraction).toBe(0);
		expect(Number.isNaN(cold.solidusPressureGPa)).toBe(true);
	});

	it('memoises columns per model and Tp', () => {
		expect(meltColumn(1333)).toBe(meltColumn(1333));
		expect(meltColumn(1333)).not.toBe(meltColumn(1333, { model: 'katz-2003' }));
		expect(() => meltColumn(Number.NaN)).toThrow(RangeError);
		// beyond the calibrated solidi
		expect(() => meltColumn(1650)).toThrow(RangeError);
		expect(meltColumn(1600, { model: 'katz-2003' }).solidusPressureGPa).toBeLessThan(7.5);
	});
});

describe('Airy isostasy, inverse and sediment', () => {
	it('puts the axis shallower for thicker crust', () => {
		// [derived] Δh·(ρm − ρc)/(ρm − ρw), ρw 1030, ρc 2900, ρm 3300: 20 km → 2291 m, 30 km → 4053 m
		expect(Math.abs(airyDepthShiftM(20) + 2291)).toBeLessThan(0.5);
		expect(Math.abs(airyDepthShiftM(30) + 4053)).toBeLessThan(0.5);
		expect(airyDepthShiftM(AIRY_DEFAULTS.referenceCrustKm)).toBeCloseTo(0, 12);
		expect(crustFromDepthShiftKm(airyDepthShiftM(12.3))).toBeCloseTo(12.3, 9);
		expect(airyShiftFromPotentialTemperatureM(1400)).toBeCloseTo(
			airyDepthShiftM(crustThicknessKm(1400)),
			9
		);
	});

	it('recovers crust and Tp from a residual depth by bisection on the forward model', () => {
		const tp = 1400;
		const residual = airyDepthShiftM(crustThicknessKm(tp));
		const implied = impliedFromResidualDepth(residual);
		expect(implied.crustKm).toBeCloseTo(crustThicknessKm(tp), 9);
		expect(Math.abs((implied.potentialTemperatureC ?? 0) - tp)).toBeLessThan(0.05);
		const katz = potentialTemperatureForCrust(crustThicknessKm(1350, { model: 'katz-2003' }), {
			model: 'katz-2003'
		});
		expect(Math.abs((katz ?? 0) - 1350)).toBeLessThan(0.05);
		// an axis 2291 m shallower than the reference-crust curve implies 20 km of crust
		const axial = impliedFromAxialDepth(2600 - 2290.75, 2600);
		expect(Math.abs(axial.crustKm - 20)).toBeLessThan(0.01);
		// outside what the model makes over the search range → no temperature
		expect(potentialTemperatureForCrust(0)).toBeNull();
		expect(impliedFromResidualDepth(3000).potentialTemperatureC).toBeNull();
		expect(potentialTemperatureForCrust(crustThicknessKm(TP_SEARCH_RANGE_C[1]) + 1)).toBeNull();
	});

	it('deepens the basement under sediment', () => {
		// [derived] h·(ρs − ρw)/(ρm − ρw): ρs 2000, h 1 km → 427 m
		expect(Math.abs(sedimentLoadingM(1000) - 427)).toBeLessThan(0.5);
		expect(sedimentLoadingM(1000)).toBeCloseTo((1000 * 970) / 2270, 9);
		// predicted seafloor = basement − h + loading
		expect(seafloorWithSedimentM(5000, 1000)).toBeCloseTo(5000 - 1000 + (1000 * 970) / 2270, 9);
	});
});
