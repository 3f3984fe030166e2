import { describe, expect, it } from 'vitest';
import {
	CK95_BOUNDARIES_MA,
	GTS2020_BOUNDARIES_MA,
	flankStripes,
	polarityAlongProfile,
	polarityAt,
	polarityIntervals
} from './polarity';

describe('polarity timescales', () => {
	it('holds the PmagPy boundary tables, increasing', () => {
		// [reference library] PmagPy tables as listed in SCIENCE.md §7
		expect(GTS2020_BOUNDARIES_MA.length).toBe(49);
		expect(CK95_BOUNDARIES_MA.length).toBe(47);
		expect(GTS2020_BOUNDARIES_MA[0]).toBe(0.773);
		expect(CK95_BOUNDARIES_MA[0]).toBe(0.78);
		for (const b of [GTS2020_BOUNDARIES_MA, CK95_BOUNDARIES_MA]) {
			for (let i = 1; i < b.length; i++) expect(b[i]).toBeGreaterThan(b[i - 1]);
		}
	});

	it('alternates from normal at 0 Ma', () => {
		expect(polarityAt(0)).toBe('normal');
		expect(polarityAt(0.5)).toBe('normal');
		expect(polarityAt(0.8)).toBe('reversed');
		expect(polarityAt(1.0)).toBe('normal'); // Jaramillo
		expect(polarityAt(0.775, 'ck95')).toBe('normal');
		expect(polarityAt(0.775)).toBe('reversed');
		expect(polarityAt(20)).toBeNull();
		expect(polarityIntervals()[2]).toEqual({ fromMa: 0.99, toMa: 1.07, polarity: 'normal' });
	});

	it('puts the stripes at the SCIENCE.md §7 distances for a half rate of 11.9 mm/yr', () => {
		const s = flankStripes(11.9);
		// [derived] Brunhes/Matuyama boundary 9.20 km from the axis
		expect(Math.abs(s[0].toKm - 9.2)).toBeLessThan(0.005);
		// [derived] Jaramillo 11.78–12.73 km
		expect(s[2].polarity).toBe('normal');
		expect(Math.abs(s[2].fromKm - 11.78)).toBeLessThan(0.005);
		expect(Math.abs(s[2].toKm - 12.73)).toBeLessThan(0.005);
		// [derived] Olduvai 21.12–23.01 km
		expect(s[6].polarity).toBe('normal');
		expect(Math.abs(s[6].fromKm - 21.12)).toBeLessThan(0.005);
		expect(Math.abs(s[6].toKm - 23.01)).toBeLessThan(0.005);
	});
});

describe('polarity along a profile', () => {
	it('places boundaries symmetrically on a line across the axis', () => {
		// a line from −30 km to +30 km across the axis at 10 mm/yr half rate, sampled every 1 km
		const dist: number[] = [];
		const age: number[] = [];
		for (let x = -30; x <= 30; x++) {
			dist.push(x + 30);
			age.push(Math.abs(x) / 10);
		}
		const stripes = polarityAlongProfile(dist, age);
		const centre = stripes.find((s) => s.fromKm < 30 && s.toKm > 30);
		expect(centre?.polarity).toBe('normal');
		// [derived] Brunhes spans ±7.73 km about the axis (0.773 Ma × 10 km/Myr)
		expect(centre?.fromKm).toBeCloseTo(30 - 7.73, 9);
		expect(centre?.toKm).toBeCloseTo(30 + 7.73, 9);
		// contiguous and alternating
		for (let i = 1; i < stripes.length; i++) {
			expect(stripes[i].fromKm).toBeCloseTo(stripes[i - 1].toKm, 12);
			expect(stripes[i].polarity).not.toBe(stripes[i - 1].polarity);
		}
		expect(stripes[0].fromKm).toBe(0);
		expect(stripes[stripes.length - 1].toKm).toBe(60);
	});

	it('marks floor older than the timescale as unknown', () => {
		const stripes = polarityAlongProfile([0, 10, 20], [10.5, 11.5, 12]);
		expect(stripes[stripes.length - 1].polarity).toBeNull();
		// [derived] the last boundary 11.056 Ma is crossed at 5.56 km
		expect(stripes[stripes.length - 1].fromKm).toBeCloseTo(5.56, 9);
	});
});
