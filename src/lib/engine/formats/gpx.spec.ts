import { describe, expect, it } from 'vitest';
import { GPX_NS, readGpx, writeGpx } from './gpx';
import { EXPORT_CAUTION, WAKELINE_NS } from './shared';
import { antimeridianPlan, pathLengthKm, samplePlan, sequenceViolations } from './testing';
import { childrenNamed, parseXml, type XmlNode } from './xml';

function root(text: string): XmlNode {
	const p = parseXml(text);
	if (!p.ok) throw new Error(p.message);
	return p.root;
}

// [published] GPX 1.1 schema (topografix.com/GPX/1/1/gpx.xsd): the <sequence> of each type.
const GPX_SEQ = ['metadata', 'wpt', 'rte', 'trk', 'extensions'];
const METADATA_SEQ = [
	'name',
	'desc',
	'author',
	'copyright',
	'link',
	'time',
	'keywords',
	'bounds',
	'extensions'
];
const WPT_SEQ = [
	'ele',
	'time',
	'magvar',
	'geoidheight',
	'name',
	'cmt',
	'desc',
	'src',
	'link',
	'sym',
	'type',
	'fix',
	'sat',
	'hdop',
	'vdop',
	'pdop',
	'ageofdgpsdata',
	'dgpsid',
	'extensions'
];
const RTE_SEQ = ['name', 'cmt', 'desc', 'src', 'link', 'number', 'type', 'extensions', 'rtept'];

describe('GPX 1.1', () => {
	it('round-trips a plan exactly', () => {
		const plan = samplePlan();
		const back = readGpx(writeGpx(plan));
		expect(back.problems).toEqual([]);
		expect(back.plan).toEqual(plan);
	});

	it('follows the GPX 1.1 schema: root attributes, element order, lat/lon ranges [published] GPX 1.1 schema', () => {
		const text = writeGpx(antimeridianPlan(), { exportedAt: '2027-01-01T00:00:00Z' });
		const gpx = root(text);
		expect(gpx.local).toBe('gpx');
		expect(gpx.ns).toBe(GPX_NS);
		// version is required and fixed to 1.1; creator is required.
		expect(gpx.attrs.version).toBe('1.1');
		expect(gpx.attrs.creator).toBeTruthy();
		expect(sequenceViolations(gpx, GPX_SEQ, ['wpt', 'rte', 'trk'])).toEqual([]);
		expect(sequenceViolations(childrenNamed(gpx, 'metadata')[0], METADATA_SEQ, ['link'])).toEqual(
			[]
		);
		const written = root(writeGpx(samplePlan()));
		const all = [gpx, written];
		for (const doc of all) {
			for (const w of childrenNamed(doc, 'wpt')) {
				expect(sequenceViolations(w, WPT_SEQ, ['link'])).toEqual([]);
			}
			for (const r of childrenNamed(doc, 'rte')) {
				expect(sequenceViolations(r, RTE_SEQ, ['link', 'rtept'])).toEqual([]);
				for (const p of childrenNamed(r, 'rtept')) {
					expect(sequenceViolations(p, WPT_SEQ, ['link'])).toEqual([]);
				}
			}
			const points = [
				...childrenNamed(doc, 'wpt'),
				...childrenNamed(doc, 'rte').flatMap((r) => childrenNamed(r, 'rtept'))
			];
			for (const p of points) {
				// latitudeType [-90, 90], longitudeType [-180, 180).
				const lat = Number(p.attrs.lat);
				const lon = Number(p.attrs.lon);
				expect(lat).toBeGreaterThanOrEqual(-90);
				expect(lat).toBeLessThanOrEqual(90);
				expect(lon).toBeGreaterThanOrEqual(-180);
				expect(lon).toBeLessThan(180);
				expect(p.attrs.lat).not.toMatch(/e/i);
			}
		}
		// Wakeline settings sit in our namespace inside <extensions>.
		const ext = childrenNamed(childrenNamed(written, 'rte')[0], 'extensions')[0];
		expect(ext.children[0].ns).toBe(WAKELINE_NS);
	});

	it('carries the caution in metadata/desc and a comment', () => {
		const text = writeGpx(samplePlan());
		expect(text).toContain(`<!-- ${EXPORT_CAUTION.replace(/&/g, '&amp;')}`.slice(0, 40));
		const metadata = childrenNamed(root(text), 'metadata')[0];
		expect(childrenNamed(metadata, 'desc')[0].text).toBe(EXPORT_CAUTION);
	});

	it('keeps a line across 180° one short route', () => {
		const plan = antimeridianPlan();
		const back = readGpx(writeGpx(plan));
		expect(back.problems).toEqual([]);
		expect(back.plan).toEqual(plan);
		expect(pathLengthKm(back.plan.lines[0].coords)).toBeLessThan(110);
	});

	it('reads a foreign GPX: defaults, foreign <type>, tracks skipped', () => {
		const text = `<?xml version="1.0"?>
<gpx version="1.1" creator="x" xmlns="http://www.topografix.com/GPX/1/1">
 <wpt lat="10.5" lon="-20.25"><name>A</name><type>Flag</type></wpt>
 <rte><name>R</name><type>seismic</type><rtept lat="1" lon="2"/><rtept lat="1.5" lon="2.5"/></rte>
 <trk><trkseg><trkpt lat="1" lon="2"/></trkseg></trk>
</gpx>`;
		const r = readGpx(text);
		expect(r.plan.stations[0]).toMatchObject({ name: 'A', kind: 'ctd', position: [-20.25, 10.5] });
		expect(r.plan.lines[0]).toMatchObject({ name: 'R', purpose: 'seismic', surveySpeedKn: 8 });
		expect(r.problems.some((p) => p.message.includes('trk'))).toBe(true);
		expect(r.problems.every((p) => p.severity === 'warning')).toBe(true);
	});

	it('reports broken XML with its line, swapped and empty geometry with the element index', () => {
		const broken = readGpx(
			'<?xml version="1.0"?>\n<gpx version="1.1">\n<wpt lat="1" lon="2">\n</gpx>'
		);
		expect(broken.problems[0].message).toMatch(/not well-formed XML at line \d/);
		const text = `<gpx version="1.1" creator="x" xmlns="http://www.topografix.com/GPX/1/1">
 <wpt lat="150" lon="40"><name>swapped</name></wpt>
 <wpt lat="abc" lon="40"/>
 <rte><name>R</name><rtept lat="1" lon="2"/><rtept lat="1" lon="2"/><rtept lat="1" lon="2"/><rtept lat="100" lon="3"/></rte>
 <rte><name>empty</name></rte>
 <wpt lat="1" lon="2"><extensions><wl:station xmlns:wl="${WAKELINE_NS}" kind="buoy"/></extensions></wpt>
</gpx>`;
		const r = readGpx(text);
		const where = Object.fromEntries(r.problems.map((p) => [p.where, p.message]));
		expect(where['wpt 1']).toContain('coordinates look swapped');
		expect(where['wpt 2']).toContain('not numbers');
		expect(where['rte 1, rtept 4']).toContain('swapped');
		expect(where['rte 2']).toContain('empty geometry');
		expect(where['wpt 3']).toContain('unknown kind "buoy"');
		expect(r.plan.stations).toHaveLength(0);
		expect(readGpx('<kml/>').problems[0].message).toContain('not a GPX file');
	});
});
