import { describe, expect, it } from 'vitest';
import { RTZ_NS, readRtz, rtzFileName, rtzRouteName, writeRtz } from './rtz';
import { EXPORT_CAUTION, ExportError } from './shared';
import { antimeridianPlan, pathLengthKm, samplePlan, sequenceViolations } from './testing';
import { childNamed, childrenNamed, parseXml, type XmlNode } from './xml';

function root(text: string): XmlNode {
	const p = parseXml(text);
	if (!p.ok) throw new Error(p.message);
	return p.root;
}

/**
 * The RTZ 1.2 schema rules checked by hand [published] RTZ schema version 1.2 (IEC 61174 ed. 4,
 * Annex S): sequences, required attributes, value ranges and id uniqueness.
 */
function rtzViolations(route: XmlNode): string[] {
	const out: string[] = [];
	if (route.local !== 'route' || route.ns !== RTZ_NS) out.push('root is not {RTZ/1/2}route');
	if (route.attrs.version !== '1.2') out.push('route@version must be 1.2');
	out.push(...sequenceViolations(route, ['routeInfo', 'waypoints', 'schedules', 'extensions']));
	const info = childNamed(route, 'routeInfo');
	if (!info?.attrs.routeName) out.push('routeInfo@routeName is required');
	const wps = childNamed(route, 'waypoints');
	if (!wps) return [...out, 'waypoints is required'];
	out.push(...sequenceViolations(wps, ['defaultWaypoint', 'waypoint', 'extensions'], ['waypoint']));
	const list = childrenNamed(wps, 'waypoint');
	if (list.length < 2) out.push('at least two waypoints');
	const ids = new Set<string>();
	for (const w of list) {
		out.push(...sequenceViolations(w, ['position', 'leg', 'extensions']));
		if (!/^\d+$/.test(w.attrs.id ?? '') || Number(w.attrs.id) < 1)
			out.push(`waypoint id ${w.attrs.id}`);
		if (ids.has(w.attrs.id)) out.push(`duplicate id ${w.attrs.id}`);
		ids.add(w.attrs.id);
		const p = childNamed(w, 'position');
		const lat = Number(p?.attrs.lat);
		const lon = Number(p?.attrs.lon);
		if (!(lat >= -90 && lat <= 90)) out.push(`lat ${p?.attrs.lat}`);
		if (!(lon >= -180 && lon < 180)) out.push(`lon ${p?.attrs.lon}`);
		if (/e/i.test(`${p?.attrs.lat}${p?.attrs.lon}`)) out.push('exponent in xsd:decimal');
		const leg = childNamed(w, 'leg');
		if (leg && !['Orthodrome', 'Loxodrome'].includes(leg.attrs.geometryType ?? 'Orthodrome')) {
			out.push('leg@geometryType');
		}
	}
	for (const ext of [route, info!, ...list].flatMap((n) => childrenNamed(n, 'extensions'))) {
		for (const e of childrenNamed(ext, 'extension')) {
			if (!e.attrs.manufacturer || !e.attrs.name)
				out.push('extension@manufacturer and @name required');
		}
	}
	for (const s of childrenNamed(childNamed(route, 'schedules') ?? route, 'schedule')) {
		if (!/^\d+$/.test(s.attrs.id ?? '')) out.push('schedule@id');
		for (const part of s.children) {
			for (const e of childrenNamed(part, 'scheduleElement')) {
				if (!ids.has(e.attrs.waypointId))
					out.push(`scheduleElement@waypointId ${e.attrs.waypointId}`);
			}
		}
	}
	return out;
}

describe('RTZ 1.2', () => {
	it('round-trips lines and stations exactly; ridges and areas are not carried', () => {
		const plan = samplePlan();
		const back = readRtz(writeRtz(plan), { filename: rtzFileName(plan) });
		expect(back.problems).toEqual([]);
		expect(back.plan).toEqual({ ...plan, ridges: [], areas: [] });
	});

	it('passes the schema rules; routeName matches the file name', () => {
		const plan = samplePlan();
		const route = root(writeRtz(plan));
		expect(rtzViolations(route)).toEqual([]);
		expect(rtzFileName(plan)).toBe('WL-27_3_Leg_2_AEgir_North_South.rtz');
		expect(childNamed(route, 'routeInfo')!.attrs.routeName).toBe(rtzRouteName(plan));
		// One ordered route: 3 + 2 line vertices and 4 stations, ids 1..9.
		const wps = childrenNamed(childNamed(route, 'waypoints')!, 'waypoint');
		expect(wps.map((w) => w.attrs.id)).toEqual(['1', '2', '3', '4', '5', '6', '7', '8', '9']);
		expect(wps.map((w) => w.attrs.name)).toEqual([
			'Line 01 SOL',
			'Line 01 WP2',
			'Line 01 EOL',
			'CTD 1 [ctd]',
			'D-2 <wall> [dredge]',
			'Mag tie, "B" SOL',
			'Mag tie, "B" EOL',
			'Core 3 [core]',
			'Dive 4 [dive]'
		]);
		expect(wps.every((w) => childNamed(w, 'leg')?.attrs.geometryType === 'Orthodrome')).toBe(true);
		expect(rtzViolations(root(writeRtz(antimeridianPlan())))).toEqual([]);
	});

	it('carries the caution as a comment and in the plan extension', () => {
		const text = writeRtz(samplePlan());
		expect(text.split('\n')[1]).toContain('NOT FOR NAVIGATION');
		const ext = childrenNamed(
			childNamed(childNamed(root(text), 'routeInfo')!, 'extensions')!,
			'extension'
		)[0];
		expect(ext.attrs.caution).toBe(EXPORT_CAUTION);
	});

	it('keeps a line across 180° one short line', () => {
		const plan = antimeridianPlan();
		const back = readRtz(writeRtz(plan));
		expect(back.plan.lines).toEqual(plan.lines);
		expect(pathLengthKm(back.plan.lines[0].coords)).toBeLessThan(110);
	});

	it('refuses a route of fewer than two waypoints', () => {
		const plan = {
			...samplePlan(),
			lines: [],
			stations: samplePlan().stations.slice(0, 1),
			order: undefined
		};
		expect(() => writeRtz(plan)).toThrow(ExportError);
	});

	it('falls back on waypoint names when the extensions are stripped', () => {
		const stripped = writeRtz(samplePlan()).replace(/<extensions>[\s\S]*?<\/extensions>/g, '');
		const r = readRtz(stripped);
		expect(r.plan.lines.map((l) => [l.name, l.coords.length])).toEqual([
			['Line 01', 3],
			['Mag tie, "B"', 2]
		]);
		expect(r.plan.stations.map((s) => [s.name, s.kind])).toEqual([
			['CTD 1', 'ctd'],
			['D-2 <wall>', 'dredge'],
			['Core 3', 'core'],
			['Dive 4', 'dive']
		]);
		expect(r.plan.order).toEqual(samplePlan().order);
		expect(r.problems.every((p) => p.severity === 'warning')).toBe(true);
	});

	it('reads a foreign route as one line and reports bad waypoints', () => {
		const text = `<?xml version="1.0"?>
<route version="1.2" xmlns="http://www.cirm.org/RTZ/1/2">
 <routeInfo routeName="Transit"/>
 <waypoints>
  <waypoint id="1"><position lat="10" lon="20"/></waypoint>
  <waypoint id="1"><position lat="10.5" lon="20.5"/></waypoint>
  <waypoint id="3"><position lat="160" lon="21"/></waypoint>
  <waypoint id="4"/>
  <waypoint id="5"><position lat="11" lon="21"/></waypoint>
 </waypoints>
</route>`;
		const r = readRtz(text, { filename: 'Other.rtz' });
		expect(r.plan.name).toBe('Transit');
		expect(r.plan.lines[0].coords).toEqual([
			[20, 10],
			[20.5, 10.5],
			[21, 11]
		]);
		const where = Object.fromEntries(r.problems.map((p) => [p.where, p.message]));
		expect(where['waypoint 2']).toContain('used twice');
		expect(where['waypoint 3']).toContain('coordinates look swapped');
		expect(where['waypoint 4']).toContain('empty geometry');
		expect(where.routeInfo).toContain('does not match the file name');
		expect(readRtz('<route><waypoints>').problems[0].message).toMatch(
			/not well-formed XML at line 1/
		);
		expect(readRtz('<gpx/>').problems[0].message).toContain('not an RTZ route');
	});
});
