import { describe, expect, it } from 'vitest';
import {
	alongTrackSpacingM,
	maxSpeedForSpacingKn,
	pingIntervalS,
	soundSpeedMackenzie,
	soundSpeedUnesco
} from './soundspeed';

describe('sound speed', () => {
	it('matches the Mackenzie 1981 check value', () => {
		// [published] Mackenzie 1981: T 25 °C, S 35, D 1000 m → 1550.744 m/s
		expect(Math.abs(soundSpeedMackenzie(25, 35, 1000) - 1550.744)).toBeLessThan(5e-4);
	});

	it('matches the UNESCO 1983 check values', () => {
		// [published] Fofonoff & Millard 1983: S 40, T 40 °C, P 10 000 dbar → 1731.995 m/s
		expect(Math.abs(soundSpeedUnesco(40, 40, 10_000) - 1731.995)).toBeLessThan(5e-4);
		// [derived] SCIENCE.md §5: S 35, T 25, P 1000 dbar → 1551.143 m/s
		expect(Math.abs(soundSpeedUnesco(35, 25, 1000) - 1551.143)).toBeLessThan(5e-4);
	});

	it('rises with temperature, salinity and depth in the ocean range', () => {
		const base = soundSpeedMackenzie(10, 35, 1000);
		expect(soundSpeedMackenzie(11, 35, 1000)).toBeGreaterThan(base);
		expect(soundSpeedMackenzie(10, 36, 1000)).toBeGreaterThan(base);
		expect(soundSpeedMackenzie(10, 35, 2000)).toBeGreaterThan(base);
		expect(soundSpeedUnesco(35, 10, 1000)).toBeGreaterThan(soundSpeedUnesco(35, 10, 0));
	});
});

describe('ping timing', () => {
	it('gives the two-way travel time and the fastest speed for a sounding spacing', () => {
		// [derived] 2·d/c: 3000 m at 1500 m/s → 4 s
		expect(pingIntervalS(3000)).toBeCloseTo(4, 12);
		// [derived] 10 kn = 5.1444 m/s → 20.578 m between pings
		expect(alongTrackSpacingM(10, 3000)).toBeCloseTo((10 * 1852 * 4) / 3600, 9);
		// [derived] the inverse: 20.578 m wanted → 10 kn
		expect(maxSpeedForSpacingKn(alongTrackSpacingM(10, 3000), 3000)).toBeCloseTo(10, 9);
		expect(maxSpeedForSpacingKn(25, 4000, 1480)).toBeCloseTo(
			((25 / ((2 * 4000) / 1480)) * 3600) / 1852,
			9
		);
	});
});
