import { describe, expect, it } from 'vitest';
import { coreHours, ctdDuration, dredgeHours, stationHours, vehicleDiveHours } from './stations';

describe('CTD casts', () => {
	it('spends 133 min on the wire for a 4000 m cast at a constant 60 m/min', () => {
		// [derived] SCIENCE.md §6: 2 × 4000 m / 60 m/min = 133.3 min (no slow zone)
		const c = ctdDuration(4000, { slowZoneM: 0 });
		expect(Math.abs(c.wireMin - 133.3)).toBeLessThan(0.05);
		expect(c.totalMin).toBeCloseTo(c.wireMin + 30, 9);
	});

	it('runs the first 100 m of the downcast at 30 m/min by default', () => {
		// [published] CalCOFI procedures: 30 m/min for the first 100 m, then 50–60 m/min
		// [derived] 100/30 + 3900/60 down, 4000/60 up = 135.0 min
		const c = ctdDuration(4000);
		expect(c.downMin).toBeCloseTo(100 / 30 + 3900 / 60, 9);
		expect(c.upMin).toBeCloseTo(4000 / 60, 9);
		expect(Math.abs(c.wireMin - 135.0)).toBeLessThan(0.05);
		// a cast shallower than the slow zone runs slowly all the way down
		expect(ctdDuration(60).downMin).toBeCloseTo(2, 9);
	});

	it('adds bottle stops and deck time', () => {
		// [derived] time = down + up + bottle stops + deck
		const c = ctdDuration(2000, { bottleStops: 12, bottleStopMin: 1.5, deckMin: 45 });
		expect(c.bottleMin).toBe(18);
		expect(c.totalMin).toBeCloseTo(c.downMin + c.upMin + 18 + 45, 9);
	});
});

describe('dredges, cores and dives', () => {
	it('takes about 5 h for a rock dredge at 3 km', () => {
		// [trade] about 5 h each at ridge depths including a drag of about 1 km
		expect(Math.abs(dredgeHours(3000) - 5)).toBeLessThan(0.5);
		// [derived] defaults: 2 × 4500 m / 60 m/min = 2.5 h + 1.5 h bottom + 1 h deck
		expect(dredgeHours(3000)).toBeCloseTo(5, 9);
		expect(dredgeHours(4000)).toBeGreaterThan(dredgeHours(3000));
	});

	it('times cores from the wire and fixed bottom and deck blocks', () => {
		// [derived] 2 × 3000 m / 60 m/min = 1.667 h + 0.25 h + 1.5 h
		expect(coreHours(3000)).toBeCloseTo(100 / 60 + 1.75, 9);
	});

	it('uses fixed blocks for vehicle dives', () => {
		// [trade] a crewed dive takes 6–10 h with launch and recovery
		expect(vehicleDiveHours('crewed')).toBeGreaterThanOrEqual(6);
		expect(vehicleDiveHours('crewed')).toBeLessThanOrEqual(10);
		expect(vehicleDiveHours('rov', 20)).toBe(20);
	});

	it('uses the vessel winch speed and the CTD stand-off from the seafloor', () => {
		// [derived] a 3010 m deep CTD station stops 10 m above the seafloor: 3000 m of wire
		expect(stationHours('ctd', 3010)).toBeCloseTo(ctdDuration(3000).totalMin / 60, 9);
		expect(stationHours('ctd', 3010, { winchSpeedMPerMin: 45 })).toBeCloseTo(
			ctdDuration(3000, { wireSpeedMPerMin: 45 }).totalMin / 60,
			9
		);
		expect(stationHours('dredge', 3000, { winchSpeedMPerMin: 45 })).toBeCloseTo(
			dredgeHours(3000, { winchSpeedMPerMin: 45 }),
			9
		);
		expect(stationHours('core', 2000)).toBeCloseTo(coreHours(2000), 9);
		expect(stationHours('dive', 2500, { vehicle: 'crewed' })).toBe(8);
	});
});
