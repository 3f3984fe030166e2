import { describe, expect, it } from 'vitest';
import { IHO_ORDERS, IHO_S44, thuMaxM, tvuMaxM } from './iho';

describe('IHO S-44 Edition 6.0.0', () => {
	it('matches the SCIENCE.md §4 TVU and THU checks', () => {
		// [published] IHO S-44 Ed. 6.0.0 Table 1; values [derived] from its formula
		expect(Math.abs(tvuMaxM('2', 4000) - 92.005)).toBeLessThan(5e-4);
		expect(thuMaxM('2', 4000)).toBeCloseTo(420, 9);
		expect(Math.abs(tvuMaxM('2', 1000) - 23.022)).toBeLessThan(5e-4);
		expect(Math.abs(tvuMaxM('1a', 100) - 1.393)).toBeLessThan(5e-4);
		expect(Math.abs(tvuMaxM('special', 40) - 0.391)).toBeLessThan(5e-4);
		expect(Math.abs(tvuMaxM('exclusive', 10) - 0.168)).toBeLessThan(5e-4);
	});

	it('holds the published parameters per order', () => {
		// [published] IHO S-44 Ed. 6.0.0 Table 1
		expect(IHO_S44['1b']).toMatchObject({ a: 0.5, b: 0.013, thuFixedM: 5, thuDepthShare: 0.05 });
		expect(IHO_S44.special.thuFixedM).toBe(2);
		expect(IHO_S44.exclusive.coveragePercent).toBe(200);
		expect(IHO_S44['1a'].coverage).toBe('≤100%');
		expect(thuMaxM('special', 3000)).toBe(2);
		expect(thuMaxM('1a', 200)).toBeCloseTo(15, 12);
	});

	it('orders the standards from strictest to loosest at every depth', () => {
		for (const d of [5, 50, 500, 5000]) {
			const tvu = IHO_ORDERS.map((o) => tvuMaxM(o, d));
			for (let i = 1; i < tvu.length; i++) expect(tvu[i]).toBeGreaterThanOrEqual(tvu[i - 1]);
		}
	});
});
