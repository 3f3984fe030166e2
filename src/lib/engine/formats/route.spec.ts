import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { buildTimeline, type TimelineInput } from '../timeline';
import {
	ROUTE_CSV_COLUMNS,
	buildRoute,
	isoSecond,
	writeRouteCsv,
	writeRouteGpx,
	writeRouteRtz
} from './route';
import { EXPORT_CAUTION } from './shared';
import { childNamed, childrenNamed, parseXml } from './xml';

const AT = Date.UTC(2027, 4, 3, 8, 0, 0);

function input(reversed: boolean): TimelineInput {
	return {
		departure: { name: 'Harbour A', position: [-20, 40], at: AT },
		arrival: { name: 'Harbour B', position: [-21, 41] },
		transitSpeedKn: 11,
		turnH: 0.5,
		margin: { pct: 10 },
		items: [
			{
				kind: 'line',
				id: 'p1',
				name: 'L1',
				coords: [
					[-20.5, 40.2],
					[-20.5, 40.5],
					[-20.5, 40.8]
				],
				reversed,
				surveySpeedKn: 8
			},
			{ kind: 'station', id: 'p2', name: 'CTD 1', position: [-20.7, 40.9], durationH: 3 },
			{
				kind: 'port_call',
				id: 'p3',
				name: 'Port call, Harbour C',
				position: [-21, 41.5],
				durationH: 24
			}
		]
	};
}

function routeOf(reversed: boolean) {
	const inp = input(reversed);
	const t = buildTimeline(inp);
	return { t, doc: buildRoute(t, inp, { name: 'XX27-01', depthAt: () => 3012.4 }) };
}

describe('the route in the order of work', () => {
	it('runs port → line (as ordered) → station → port call → port, with the timeline’s times', () => {
		const { t, doc } = routeOf(false);
		expect(doc.waypoints.map((w) => w.name)).toEqual([
			'Harbour A',
			'L1 SOL',
			'L1 WP2',
			'L1 EOL',
			'CTD 1',
			'Port call, Harbour C',
			'Harbour B'
		]);
		const ev = (kind: string, ref?: string) =>
			t.events.find((e) => e.kind === kind && (!ref || e.refId === ref))!;
		const line = ev('line', 'p1');
		expect(doc.waypoints[0].etd).toBe(AT);
		expect(doc.waypoints[1].eta).toBe(line.start);
		expect(doc.waypoints[3].eta).toBe(line.end);
		// [derived] the middle vertex splits the line into two near-equal meridian arcs.
		expect(doc.waypoints[2].eta! - line.start).toBeCloseTo((line.end - line.start) / 2, -4);
		const ctd = ev('station', 'p2');
		expect([doc.waypoints[4].eta, doc.waypoints[4].etd]).toEqual([ctd.start, ctd.end]);
		const port = ev('port', 'p3');
		expect([doc.waypoints[5].eta, doc.waypoints[5].etd]).toEqual([port.start, port.end]);
		const home = t.events.filter((e) => e.kind === 'transit').at(-1)!;
		expect(doc.waypoints[6].eta).toBe(home.end);
		expect(doc.waypoints[6].etd).toBeNull();
		// Leg speeds: transit to items, survey speed along the line.
		expect(doc.waypoints.map((w) => w.leg?.speedKn ?? null)).toEqual([null, 11, 8, 8, 11, 11, 11]);
		// After the line the ship leaves L1's end when the next transit starts.
		const toCtd = t.events.find((e) => e.kind === 'transit' && e.name === 'Transit to CTD 1')!;
		expect(doc.waypoints[3].etd).toBe(toCtd.start);
		expect(doc.marginH).toBeGreaterThan(0);
	});

	it('runs a reversed line from its last vertex to its first', () => {
		const { doc } = routeOf(true);
		const line = doc.waypoints.filter((w) => w.item?.kind === 'line');
		expect(line.map((w) => w.position[1])).toEqual([40.8, 40.5, 40.2]);
		expect(line.map((w) => w.storedVertex)).toEqual([3, 2, 1]);
		expect(line.every((w) => w.reversed)).toBe(true);
	});

	it('writes RTZ 1.2 with a calculated schedule: ETA/ETD per waypoint and leg speeds', () => {
		const { doc } = routeOf(true);
		const p = parseXml(writeRouteRtz(doc));
		if (!p.ok) throw new Error(p.message);
		const ns = p.root.ns;
		const wps = childrenNamed(childNamed(p.root, 'waypoints', ns)!, 'waypoint', ns);
		expect(wps).toHaveLength(7);
		expect(wps[1].attrs.name).toBe('L1 SOL');
		expect(childNamed(wps[1], 'position', ns)!.attrs.lat).toBe('40.800000');
		expect(childNamed(wps[0], 'leg', ns)).toBeUndefined();
		const els = childrenNamed(
			childNamed(
				childNamed(childNamed(p.root, 'schedules', ns)!, 'schedule', ns)!,
				'calculated',
				ns
			)!,
			'scheduleElement',
			ns
		);
		expect(els).toHaveLength(7);
		expect(els[0].attrs.etd).toBe(isoSecond(AT));
		expect(els[0].attrs.eta).toBeUndefined();
		expect(els[2].attrs.speed).toBe('8.0');
		expect(els[6].attrs.etd).toBeUndefined();
		expect(els[4].attrs.eta).toBe(isoSecond(doc.waypoints[4].eta!));
	});

	it('writes GPX 1.1 as one <rte> whose points carry their times', () => {
		const { doc } = routeOf(false);
		const p = parseXml(writeRouteGpx(doc));
		if (!p.ok) throw new Error(p.message);
		const rte = childrenNamed(p.root, 'rte', p.root.ns);
		expect(rte).toHaveLength(1);
		const pts = childrenNamed(rte[0], 'rtept', p.root.ns);
		expect(pts.map((x) => childNamed(x, 'name', p.root.ns)!.text)[1]).toBe('L1 SOL');
		expect(childNamed(pts[0], 'time', p.root.ns)!.text).toBe('2027-05-03T08:00:00Z');
		expect(childNamed(pts[4], 'time', p.root.ns)!.text).toBe(isoSecond(doc.waypoints[4].eta!));
	});

	it('writes CSV with the header first, one row per waypoint, rounded numbers', () => {
		const { doc } = routeOf(false);
		const text = writeRouteCsv(doc);
		expect(text.split('\r\n')[0]).toBe(ROUTE_CSV_COLUMNS.join(','));
		const rows = Papa.parse<Record<string, string>>(text, {
			header: true,
			skipEmptyLines: true
		}).data;
		expect(rows).toHaveLength(7);
		expect(rows[0].note).toBe(EXPORT_CAUTION);
		expect(rows[1].latitude_dd).toBe('40.200000');
		// [derived] 40.2° = 40° 12.000′.
		expect(rows[1].latitude_dmm).toBe('40 12.000 N');
		expect(rows[1].predicted_depth_m).toBe('3012');
		expect(rows[4].stay_h).toBe('3.00');
		expect(rows[2].leg).toBe('survey');
		expect(rows[2].leg_speed_kn).toBe('8.0');
	});
});
