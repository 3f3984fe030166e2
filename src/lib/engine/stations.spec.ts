import { describe, expect, it } from 'vitest';
import {
	coreDurationH,
	ctdDurationH,
	diveDurationH,
	dredgeDurationH,
	stationDurationH,
	wireMinutes
} from './stations';

describe('wire time', () => {
	it('a 4000 m cast at 60 m/min spends 133 min on the wire', () => {
		// [derived] SCIENCE.md §6: 2 × 4000 m / 60 m/min = 133.3 min
		expect(wireMinutes(4000, 60)).toBeCloseTo(133.333, 3);
	});
	it('goes slow through the first 100 m (CalCOFI: 30 m/min)', () => {
		// [published] CalCOFI procedures via SCIENCE.md §6; [derived] 2 × (100/30 + 3900/60) = 136.67 min
		expect(wireMinutes(4000, 60, 100, 30)).toBeCloseTo(136.667, 3);
	});
	it('refuses a wire speed of zero', () => {
		expect(() => wireMinutes(100, 0)).toThrow(RangeError);
	});
});

describe('station durations', () => {
	it('CTD: wire + bottle stops + deck time', () => {
		// [derived] cast to 3990 m: 2 × (100/30 + 3890/60) = 136.33 min; 12 stops × 2 min; 30 min deck
		expect(ctdDurationH(4000) * 60).toBeCloseTo(136.333 + 24 + 30, 2);
		expect(
			ctdDurationH(4000, { bottleStops: 0, deckMin: 0, altitudeM: 0, slowFirstM: 0 }) * 60
		).toBeCloseTo(133.333, 3);
	});
	it('a rock dredge at 3 km takes about 5 h', () => {
		// [trade] SCIENCE.md §6: about 5 h each at ridge depths including a drag of about 1 km
		const h = dredgeDurationH(3000);
		expect(h).toBeGreaterThan(4.5);
		expect(h).toBeLessThan(5.5);
	});
	it('deeper stations take longer; a faster winch shortens them', () => {
		expect(dredgeDurationH(4000)).toBeGreaterThan(dredgeDurationH(3000));
		expect(coreDurationH(4000, { winchSpeedMPerMin: 80 })).toBeLessThan(coreDurationH(4000));
	});
	it('a crewed dive is a fixed block of 6–10 h, 8 h by default', () => {
		// [trade] SCIENCE.md §6
		expect(diveDurationH()).toBe(8);
		expect(diveDurationH({ blockH: 6 })).toBe(6);
	});
	it('the vessel winch speed applies unless the station sets its own', () => {
		expect(stationDurationH('core', 3000, {}, { winchSpeedMPerMin: 30 })).toBeCloseTo(
			coreDurationH(3000, { winchSpeedMPerMin: 30 }),
			9
		);
		expect(
			stationDurationH('core', 3000, { winchSpeedMPerMin: 60 }, { winchSpeedMPerMin: 30 })
		).toBeCloseTo(coreDurationH(3000), 9);
		expect(stationDurationH('dive', 3000, { blockH: 9 })).toBe(9);
	});
});
