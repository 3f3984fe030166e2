import { describe, expect, it } from 'vitest';
import { KML_NS, readKml, writeKml } from './kml';
import { EXPORT_CAUTION } from './shared';
import { antimeridianPlan, pathLengthKm, samplePlan, sequenceViolations } from './testing';
import { childNamed, childrenNamed, parseXml, type XmlNode } from './xml';

function root(text: string): XmlNode {
	const p = parseXml(text);
	if (!p.ok) throw new Error(p.message);
	return p.root;
}

function placemarks(node: XmlNode): XmlNode[] {
	return node.children.flatMap((c) =>
		c.local === 'Placemark'
			? [c]
			: c.local === 'Folder' || c.local === 'Document'
				? placemarks(c)
				: []
	);
}

// [published] OGC KML 2.2 (07-147r2) schema: Feature elements before Placemark geometry.
const PLACEMARK_SEQ = [
	'name',
	'description',
	'TimeSpan',
	'styleUrl',
	'ExtendedData',
	'Point',
	'LineString',
	'Polygon'
];

describe('KML 2.2', () => {
	it('round-trips a plan exactly', () => {
		const plan = samplePlan();
		const back = readKml(writeKml(plan));
		expect(back.problems).toEqual([]);
		expect(back.plan).toEqual(plan);
	});

	it('writes KML 2.2 placemarks with lon,lat coordinates, ExtendedData and the caution', () => {
		const kml = root(writeKml(samplePlan()));
		expect(kml.ns).toBe(KML_NS);
		const doc = childNamed(kml, 'Document')!;
		expect(childNamed(doc, 'description')!.text).toBe(EXPORT_CAUTION);
		const pms = placemarks(kml);
		expect(pms).toHaveLength(2 + 1 + 2 + 4);
		for (const pm of pms) expect(sequenceViolations(pm, PLACEMARK_SEQ)).toEqual([]);
		const station = pms.find((p) => childNamed(p, 'name')!.text === 'CTD 1')!;
		// [published] KML 2.2 §16.9: coordinates are lon,lat[,alt].
		expect(childNamed(childNamed(station, 'Point')!, 'coordinates')!.text).toBe('-31.25,52.4');
		const data = childrenNamed(childNamed(station, 'ExtendedData')!, 'Data').map(
			(d) => d.attrs.name
		);
		expect(data).toEqual(['kind', 'id', 'stationKind', 'params', 'depthM', 'durationH']);
		// A style per kind in the document, and each placemark points at its kind's style.
		const styleIds = childrenNamed(doc, 'Style').map((s) => s.attrs.id);
		expect(styleIds).toEqual(['wl-ridge', 'wl-area', 'wl-line', 'wl-station']);
		expect(childNamed(station, 'styleUrl')!.text).toBe('#wl-station');
		// Planned times become a KML TimeSpan (KML 2.2 §9.2).
		const span = childNamed(station, 'TimeSpan')!;
		expect(childNamed(span, 'begin')!.text).toBe('2027-03-02T14:00:00Z');
		const ring = childNamed(
			childNamed(childNamed(pms[2], 'Polygon')!, 'outerBoundaryIs')!,
			'LinearRing'
		)!;
		const tuples = childNamed(ring, 'coordinates')!.text.split(' ');
		expect(tuples[0]).toBe(tuples[tuples.length - 1]);
	});

	it('keeps a line across 180° one short line', () => {
		const plan = antimeridianPlan();
		const back = readKml(writeKml(plan));
		expect(back.problems).toEqual([]);
		expect(back.plan).toEqual(plan);
		expect(pathLengthKm(back.plan.lines[0].coords)).toBeLessThan(110);
	});

	it('reads foreign KML: SimpleData, MultiGeometry, no kind, altitude in tuples', () => {
		const text = `<?xml version="1.0"?>
<kml xmlns="http://www.opengis.net/kml/2.2"><Document><name>Other</name>
 <Placemark><name>P</name><ExtendedData><SchemaData><SimpleData name="kind">station</SimpleData><SimpleData name="stationKind">dredge</SimpleData></SchemaData></ExtendedData><Point><coordinates>-20.5,10.25,0</coordinates></Point></Placemark>
 <Placemark><name>M</name><MultiGeometry><LineString><coordinates>1,2 3,4</coordinates></LineString><LineString><coordinates>5,6 7,8</coordinates></LineString></MultiGeometry></Placemark>
</Document></kml>`;
		const r = readKml(text);
		expect(r.plan.name).toBe('Other');
		expect(r.plan.stations[0]).toMatchObject({ kind: 'dredge', position: [-20.5, 10.25] });
		expect(r.plan.lines.map((l) => l.name)).toEqual(['M', 'M (part 2)']);
		expect(r.problems.every((p) => p.severity === 'warning')).toBe(true);
	});

	it('reports broken XML, swapped coordinates, empty geometry, unknown kind and bad numbers', () => {
		expect(readKml('<kml><Document></kml>').problems[0].message).toMatch(
			/not well-formed XML at line 1/
		);
		const text = `<kml xmlns="http://www.opengis.net/kml/2.2"><Document>
 <Placemark><name>swapped</name><Point><coordinates>52.4,-131.25</coordinates></Point></Placemark>
 <Placemark><name>empty</name><LineString><coordinates> </coordinates></LineString></Placemark>
 <Placemark><name>none</name></Placemark>
 <Placemark><ExtendedData><Data name="kind"><value>buoy</value></Data></ExtendedData><Point><coordinates>1,2</coordinates></Point></Placemark>
 <Placemark><ExtendedData><Data name="kind"><value>ridge</value></Data><Data name="fullRateMmYr"><value>fast</value></Data></ExtendedData><LineString><coordinates>1,2 2,3</coordinates></LineString></Placemark>
 <Placemark><ExtendedData><Data name="kind"><value>line</value></Data></ExtendedData><Point><coordinates>1,2</coordinates></Point></Placemark>
</Document></kml>`;
		const r = readKml(text);
		const where = Object.fromEntries(r.problems.map((p) => [p.where, p]));
		expect(where['Placemark 1'].message).toContain('coordinates look swapped, expected lon,lat');
		expect(where['Placemark 2'].message).toContain('empty geometry');
		expect(where['Placemark 3'].message).toContain('empty geometry');
		expect(where['Placemark 4'].message).toContain('unknown kind "buoy"');
		expect(where['Placemark 5']).toMatchObject({ field: 'fullRateMmYr', severity: 'error' });
		expect(where['Placemark 6'].message).toContain('cannot have a Point');
		expect(r.plan).toMatchObject({ ridges: [], lines: [], stations: [], areas: [] });
	});
});
