import { describe, expect, it } from 'vitest';
import {
	buildTimeline,
	cheapestInsertion,
	operatingDays,
	shortestTransitOrder,
	suggestCuts,
	transitLengthM,
	type OrderableItem,
	type TimelineInput
} from './timeline';

const utc = (s: string) => Date.parse(s);

describe('operating days (any calendar day or part of one away from port)', () => {
	// [trade] SCIENCE.md §6: billing counts every calendar day touched.
	it('a few hours across midnight are two days', () => {
		expect(operatingDays(utc('2027-03-10T22:00Z'), utc('2027-03-11T02:00Z'))).toBe(2);
	});
	it('across a month end (February of a common year)', () => {
		expect(operatingDays(utc('2027-02-27T08:00Z'), utc('2027-03-02T08:00Z'))).toBe(4);
	});
	it('one day when leaving and returning on the same date', () => {
		expect(operatingDays(utc('2027-05-03T08:00Z'), utc('2027-05-03T20:00Z'))).toBe(1);
	});
	it('an arrival at exactly midnight does not open the next day', () => {
		expect(operatingDays(utc('2027-05-03T08:00Z'), utc('2027-05-05T00:00Z'))).toBe(2);
	});
	it('days follow the chosen clock', () => {
		// 23:00 UTC is already the next date at UTC+2: 2027-05-04 01:00 → 05:00 local is one day.
		expect(operatingDays(utc('2027-05-03T23:00Z'), utc('2027-05-04T03:00Z'), 120)).toBe(1);
		expect(operatingDays(utc('2027-05-03T23:00Z'), utc('2027-05-04T03:00Z'), 0)).toBe(2);
	});
});

const base: TimelineInput = {
	departure: { name: 'Port A', position: [0, 0], at: utc('2027-05-03T08:00Z') },
	arrival: { name: 'Port A', position: [0, 0] },
	transitSpeedKn: 10,
	turnH: 0.5,
	items: [
		{
			kind: 'line',
			id: 'l1',
			name: 'L1',
			coords: [
				[1, 0],
				[1, 1]
			],
			surveySpeedKn: 8
		},
		{
			kind: 'line',
			id: 'l2',
			name: 'L2',
			coords: [
				[1.1, 1],
				[1.1, 0]
			],
			surveySpeedKn: 8
		},
		{ kind: 'station', id: 's1', name: 'CTD-1', position: [1.2, 0], durationH: 4 }
	],
	margin: { pct: 10 },
	allocatedDays: 5,
	dayRateMinor: 3_000_000,
	currency: 'EUR'
};

describe('timeline', () => {
	const tl = buildTimeline(base);

	it('is one continuous sequence in time order, from sailing back to port', () => {
		expect(tl.events[0].start).toBe(base.departure.at);
		for (let i = 1; i < tl.events.length; i++)
			expect(tl.events[i].start).toBe(tl.events[i - 1].end);
		expect(tl.events.map((e) => e.kind)).toEqual([
			'transit',
			'line',
			'turn',
			'transit',
			'line',
			'transit',
			'station',
			'transit',
			'margin'
		]);
	});

	it('runs lines at survey speed and transits at transit speed along geodesics', () => {
		const line = tl.events.find((e) => e.refId === 'l1')!;
		// [reference library] GeographicLib: one degree of latitude from the equator is 110 574.3886 m
		expect(line.distanceNm! * 1852).toBeCloseTo(110_574.3886, 2);
		expect(line.durationH).toBeCloseTo(110_574.3886 / (8 * 1852), 6);
		const first = tl.events[0];
		// [reference library] GeographicLib: one degree of longitude on the equator is 111 319.4908 m
		expect(first.distanceNm! * 1852).toBeCloseTo(111_319.4908, 2);
		expect(first.durationH).toBeCloseTo(111_319.4908 / (10 * 1852), 6);
	});

	it('keeps the weather margin apart: a share of the sea time, last', () => {
		const margin = tl.events.at(-1)!;
		expect(margin.kind).toBe('margin');
		const sea = tl.totals.scienceH + tl.totals.transitH + tl.totals.portH;
		expect(margin.durationH).toBeCloseTo(sea * 0.1, 9);
		expect(tl.totals.marginDays).toBeCloseTo((sea * 0.1) / 24, 9);
	});

	it('counts operating days and the cost at the day rate', () => {
		const end = tl.events.at(-1)!.end;
		expect(tl.totals.operatingDays).toBe(operatingDays(base.departure.at, end));
		expect(tl.totals.cost).toEqual({
			amountMinor: tl.totals.operatingDays * 3_000_000,
			currency: 'EUR'
		});
		expect(tl.warnings).toEqual([]);
		expect(tl.cuts).toEqual([]);
	});

	it('a reversed line is run from its other end', () => {
		const rev = buildTimeline({
			...base,
			items: [
				{
					kind: 'line',
					id: 'l1',
					name: 'L1',
					coords: [
						[1, 0],
						[1, 1]
					],
					surveySpeedKn: 8,
					reversed: true
				}
			]
		});
		const line = rev.events.find((e) => e.kind === 'line')!;
		expect(line.from).toEqual([1, 1]);
		expect(line.to).toEqual([1, 0]);
	});

	it('crosses the date line the short way', () => {
		const dl = buildTimeline({
			...base,
			departure: { ...base.departure, position: [179.5, 0] },
			arrival: { name: 'Port B', position: [-179.5, 0] },
			items: [],
			margin: { pct: 0 }
		});
		// [reference library] GeographicLib: 1° of longitude on the equator = 111 319.4908 m
		expect(dl.events).toHaveLength(1);
		expect(dl.events[0].distanceNm! * 1852).toBeCloseTo(111_319.4908, 2);
		expect(dl.events[0].durationH).toBeCloseTo(6.0107, 3);
	});

	it('warns and suggests cuts when the plan overruns the allocation', () => {
		const over = buildTimeline({ ...base, allocatedDays: 1, margin: { days: 1 } });
		expect(over.totals.overrunDays).toBeGreaterThan(0);
		expect(over.warnings.join(' ')).toMatch(/more than the 1 allocated/);
		expect(over.cuts.length).toBeGreaterThan(0);
		expect(over.cuts[0].hours).toBeGreaterThanOrEqual(over.cuts.at(-1)!.hours);
	});

	it('says when science eats into the margin', () => {
		const sea = buildTimeline({ ...base, margin: { pct: 0 }, allocatedDays: 0 });
		const days = sea.totals.operatingDays;
		const tight = buildTimeline({ ...base, margin: { days: 2 }, allocatedDays: days });
		expect(tight.totals.intoMargin).toBe(true);
		expect(tight.warnings.join(' ')).toMatch(/eating into the margin/);
	});

	it('shows ship’s local time from the clock changes', () => {
		const change = base.departure.at + 3 * 3_600_000;
		const local = buildTimeline({
			...base,
			departure: { ...base.departure, utcOffsetMinutes: -600 },
			clockChanges: [{ at: change, utcOffsetMinutes: -540 }]
		});
		expect(local.events[0].localOffsetMinutes).toBe(-600);
		expect(local.events.at(-1)!.localOffsetMinutes).toBe(-540);
	});

	it('puts mobilisation before sailing and demobilisation after return', () => {
		const m = buildTimeline({ ...base, mobilisationH: 24, demobilisationH: 12 });
		expect(m.events[0]).toMatchObject({ kind: 'mobilisation', end: base.departure.at });
		expect(m.events.at(-1)!.kind).toBe('demobilisation');
		// Alongside time at home is not ship time away from port.
		expect(m.totals.operatingDays).toBe(buildTimeline(base).totals.operatingDays);
	});
});

describe('cut suggestions', () => {
	it('takes the longest science items until the overrun is covered', () => {
		const ev = [
			{ kind: 'line', refId: 'a', name: 'A', durationH: 5 },
			{ kind: 'station', refId: 'b', name: 'B', durationH: 12 },
			{ kind: 'transit', name: 'T', durationH: 30 },
			{ kind: 'line', refId: 'c', name: 'C', durationH: 8 }
		].map((e) => ({ ...e, start: 0, end: 0, localOffsetMinutes: 0 })) as Parameters<
			typeof suggestCuts
		>[0];
		expect(suggestCuts(ev, 15).map((c) => c.refId)).toEqual(['b', 'c']);
	});
});

describe('shortest transit order', () => {
	// Five parallel N–S lines 0.1° apart, given in a scrambled order, all pointing north.
	const lines: OrderableItem[] = [3, 0, 4, 1, 2].map((i) => ({
		id: `L${i}`,
		ends: [
			[i * 0.1, 0],
			[i * 0.1, 1]
		]
	}));
	const start: [number, number] = [-0.5, 0];

	function bruteForce(items: OrderableItem[]): number {
		let best = Infinity;
		const perm = (rest: OrderableItem[], acc: { id: string; reversed: boolean }[]) => {
			if (!rest.length) {
				best = Math.min(best, transitLengthM(start, start, items, acc));
				return;
			}
			rest.forEach((it, k) => {
				for (const reversed of [false, true])
					perm([...rest.slice(0, k), ...rest.slice(k + 1)], [...acc, { id: it.id, reversed }]);
			});
		};
		perm(items, []);
		return best;
	}

	it('runs parallel lines as a lawnmower and matches the exhaustive optimum', () => {
		const order = shortestTransitOrder(start, start, lines);
		expect(order.map((o) => o.id)).toEqual(['L0', 'L1', 'L2', 'L3', 'L4']);
		expect(order.map((o) => o.reversed)).toEqual([false, true, false, true, false]);
		const len = transitLengthM(start, start, lines, order);
		expect(len).toBeCloseTo(bruteForce(lines), 3);
	});

	it('never lengthens the given order', () => {
		const given = lines.map((l) => ({ id: l.id, reversed: false }));
		const order = shortestTransitOrder(start, start, lines);
		expect(transitLengthM(start, start, lines, order)).toBeLessThanOrEqual(
			transitLengthM(start, start, lines, given)
		);
	});

	it('keeps a port call in its place', () => {
		const items: OrderableItem[] = [
			...lines.slice(0, 2),
			{ id: 'PORT', ends: [[5, 5]], fixed: true },
			...lines.slice(2)
		];
		const order = shortestTransitOrder(start, start, items);
		expect(order[2].id).toBe('PORT');
		expect(new Set(order.slice(0, 2).map((o) => o.id))).toEqual(new Set(['L3', 'L0']));
	});
});

describe('cheapestInsertion', () => {
	// Points on the equator, one degree apart: distances add along the line, so the cheapest place
	// is between the neighbours that bracket the new point [derived].
	const pt = (id: string, lon: number) => ({ id, ends: [[lon, 0]] as [[number, number]] });
	const route = [0, 1, 2, 3].map((lon) => ({ item: pt(`p${lon}`, lon), reversed: false }));

	it('puts a point between the neighbours that bracket it, adding no transit', () => {
		const ins = cheapestInsertion([-1, 0], [4, 0], route, [pt('new', 1.5)]);
		expect(ins.index).toBe(2);
		expect(ins.addedM).toBeCloseTo(0, 3);
	});

	it('runs a line the way that adds least, and keeps a block together', () => {
		const line = (id: string, a: number, b: number) => ({
			id,
			ends: [
				[a, 0],
				[b, 0]
			] as [[number, number], [number, number]]
		});
		// A line from lon 2.8 back to 2.2 fits between p2 and p3 when run 2.2 → 2.8.
		const one = cheapestInsertion([-1, 0], [4, 0], route, [line('L', 2.8, 2.2)]);
		expect(one.index).toBe(3);
		expect(one.items).toEqual([{ id: 'L', reversed: true }]);
		// Two lines made together stay one block, inner directions alternating.
		const two = cheapestInsertion([-1, 0], [4, 0], route, [
			line('A', 0.2, 0.4),
			line('B', 0.4, 0.6)
		]);
		expect(two.index).toBe(1);
		expect(two.items.map((o) => o.id)).toEqual(['A', 'B']);
		// Limited to a range, it stays inside it even when another place is cheaper.
		const limited = cheapestInsertion([-1, 0], [4, 0], route, [pt('x', 1.5)], [3, 4]);
		expect(limited.index).toBeGreaterThanOrEqual(3);
	});
});
