import { describe, expect, it } from 'vitest';
import { buildTimeline, type TimelineInput } from './engine/timeline';
import {
	arrange,
	windowWarning,
	dayRows,
	eventKeys,
	legSpans,
	monthsBefore,
	offsetLabel,
	clock,
	returnAt
} from './schedule';

const utc = (s: string) => Date.parse(s);

// A small cruise on the equator: 1° of longitude is 60.1 nm on WGS84, so at 10 kn each leg of
// transit takes about 6 h; the exact figures come from the engine.
const input: TimelineInput = {
	departure: {
		name: 'Port A',
		position: [0, 0],
		at: utc('2027-05-03T08:00Z'),
		utcOffsetMinutes: -600
	},
	arrival: { name: 'Port A', position: [0, 0] },
	transitSpeedKn: 10,
	turnH: 1,
	margin: { days: 1 },
	allocatedDays: 6,
	items: [
		{
			kind: 'line',
			id: 'a',
			name: 'A',
			coords: [
				[1, 0],
				[1, 1]
			],
			surveySpeedKn: 8
		},
		{
			kind: 'line',
			id: 'b',
			name: 'B',
			coords: [
				[1.2, 1],
				[1.2, 0]
			],
			surveySpeedKn: 8
		},
		{ kind: 'port_call', id: 'p', name: 'Port call, Port B', position: [2, 0], durationH: 24 },
		{ kind: 'station', id: 's', name: 'S', position: [1, 0.5], durationH: 5 }
	],
	clockChanges: [{ at: utc('2027-05-04T00:00Z'), utcOffsetMinutes: -540 }]
};

describe('legs, days and keys', () => {
	const t = buildTimeline(input);

	it('splits the cruise into legs at port calls', () => {
		const legs = legSpans(t, input);
		expect(legs.map((l) => [l.from, l.to])).toEqual([
			['Port A', 'Port B'],
			['Port B', 'Port A']
		]);
		const call = t.events.find((e) => e.kind === 'port')!;
		expect(legs[0].end).toBe(call.start);
		expect(legs[1].start).toBe(call.end);
		expect(legs[1].end).toBe(returnAt(t));
	});

	it('gives each day its hours: a whole day at sea sums to 24 h', () => {
		const rows = dayRows(t, input);
		expect(clock(rows[0].day)).toBe('2027-05-03 00:00');
		expect(rows[0].operatingDay).toBe(1);
		// Sailing at 08:00 leaves 16 h of the first day.
		const first = Object.values(rows[0].hours).reduce((a, b) => a + b, 0);
		expect(first).toBeCloseTo(16, 6);
		const second = Object.values(rows[1].hours).reduce((a, b) => a + b, 0);
		expect(second).toBeCloseTo(24, 6);
		// The ship's clock from the change at midnight on the 4th.
		expect(rows[0].offsetMinutes).toBe(-600);
		expect(rows[1].offsetMinutes).toBe(-540);
		expect(rows.at(-1)!.operatingDay).toBe(t.totals.operatingDays);
		expect(rows.some((r) => r.hours.margin > 0)).toBe(true);
	});

	it('keeps event keys when the order changes', () => {
		const before = eventKeys(t.events);
		const swapped = buildTimeline({
			...input,
			items: arrange(input.items, [
				{ id: 'b', reversed: true },
				{ id: 'a', reversed: false },
				{ id: 'p', reversed: false },
				{ id: 's', reversed: false }
			])
		});
		const after = eventKeys(swapped.events);
		// Every item, transit and the margin keep their key; a turn belongs to the line after it.
		const noTurns = (keys: string[]) => new Set(keys.filter((k) => !k.startsWith('turn-')));
		expect(noTurns(after)).toEqual(noTurns(before));
		expect(before).toContain('line-a');
		expect(before).toContain('transit-a');
		expect(before).toContain('margin');
		const lineB = swapped.events.find((e) => e.refId === 'b' && e.kind === 'line')!;
		// Reversed: B now runs from 0° to 1° latitude.
		expect(lineB.from).toEqual([1.2, 0]);
	});
});

describe('dates and clocks', () => {
	it('counts months back on the calendar, clamping to the month end', () => {
		expect(clock(monthsBefore(utc('2027-05-03T00:00Z'), 6))).toBe('2026-11-03 00:00');
		expect(clock(monthsBefore(utc('2027-08-31T00:00Z'), 6))).toBe('2027-02-28 00:00');
		expect(clock(monthsBefore(utc('2028-08-31T00:00Z'), 6))).toBe('2028-02-29 00:00');
		expect(clock(monthsBefore(utc('2027-01-15T00:00Z'), 13))).toBe('2025-12-15 00:00');
	});
	it('writes offsets and local times', () => {
		expect(offsetLabel(-600)).toBe('UTC−10');
		expect(offsetLabel(330)).toBe('UTC+5:30');
		expect(offsetLabel(0)).toBe('UTC');
		expect(clock(utc('2027-05-03T08:00Z'), -600)).toBe('2027-05-02 22:00');
	});
});

describe('day rows stay bounded', () => {
	it('gives at most SIZES.timelineDays rows for a plan that would run for years', async () => {
		const { SIZES } = await import('$lib/engine/limits');
		const start = Date.UTC(2027, 0, 1);
		const t = {
			events: [{ kind: 'line', name: 'L', start, end: start + 5000 * 86_400_000 }]
		} as unknown as Parameters<typeof dayRows>[0];
		const rows = dayRows(t, { departure: { at: start, utcOffsetMinutes: 0 } } as never);
		expect(rows).toHaveLength(SIZES.timelineDays);
	});
});

describe('windowWarning', () => {
	it('warns only when the plan ends after the allocated return, saying by how much [derived]', () => {
		const end = Date.UTC(2027, 5, 1, 12);
		expect(windowWarning(end, end)).toBeNull();
		expect(windowWarning(end, null)).toBeNull();
		expect(windowWarning(end + 90 * 60_000, end)).toMatch(/1\.5 h after the allocated return/);
	});
});
