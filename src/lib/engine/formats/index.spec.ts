import { describe, expect, it } from 'vitest';
import {
	EXPORT_CAUTION,
	ExportError,
	FORMATS,
	MAX_IMPORT_BYTES,
	detectFormat,
	exportPlan,
	importPlan,
	type FormatId,
	type PlanDoc
} from './index';
import { antimeridianPlan, pathLengthKm, roundedAsCsv, samplePlan } from './testing';

/** What each format carries: CSV and RTZ are waypoint lists, without ridges and areas; CSV
 * rounds numbers to what they mean. */
function carried(plan: PlanDoc, format: FormatId): PlanDoc {
	if (format === 'csv') return roundedAsCsv({ ...plan, ridges: [], areas: [] });
	return format === 'rtz' ? { ...plan, ridges: [], areas: [] } : plan;
}

describe('exportPlan → importPlan', () => {
	it.each(FORMATS)('%s round-trips what it carries (CSV to its rounding)', (format) => {
		const plan = samplePlan();
		const file = exportPlan(plan, format);
		const back = importPlan(file.body, format, { filename: file.filename });
		expect(back.problems).toEqual([]);
		expect(back.plan).toEqual(carried(plan, format));
	});

	it.each(FORMATS)('%s keeps a line from 179.5°E to 179.5°W one ~105 km line', (format) => {
		const plan = antimeridianPlan();
		const back = importPlan(exportPlan(plan, format).body, format);
		const line = back.plan.lines.find((l) => l.name === 'Across 180')!;
		expect(line.coords).toEqual(plan.lines[0].coords);
		// [reference library] GeographicLib: 1° of longitude at 20°S on WGS84 is 104.6 km.
		const km = pathLengthKm(line.coords);
		expect(km).toBeGreaterThan(104);
		expect(km).toBeLessThan(105.5);
		for (const l of back.plan.lines) for (const [lon] of l.coords) expect(lon).toBeLessThan(180);
	});

	it.each(FORMATS)('%s export names the file after the plan and carries the caution', (format) => {
		const file = exportPlan(samplePlan(), format);
		expect(file.filename).toMatch(new RegExp(`^WL-27_3_Leg_2_AEgir_North_South\\.${format}$`));
		expect(file.mimeType).toBeTruthy();
		const caution =
			format === 'kml' || format === 'gpx' || format === 'rtz'
				? EXPORT_CAUTION.replace(/'/g, "'")
				: EXPORT_CAUTION;
		expect(file.body).toContain(caution.slice(0, 60));
	});

	it('stamps the export time into GPX metadata only when asked', () => {
		expect(exportPlan(samplePlan(), 'gpx', { exportedAt: '2027-01-01T00:00:00Z' }).body).toContain(
			'<time>2027-01-01T00:00:00Z</time>'
		);
	});
});

describe('importPlan with bad input', () => {
	it('refuses a 50 MB string quickly with a size problem', () => {
		const big = 'x'.repeat(50 * 1024 * 1024);
		const started = Date.now();
		const r = importPlan(big, 'geojson');
		expect(Date.now() - started).toBeLessThan(500);
		expect(r.problems).toEqual([expect.objectContaining({ where: 'file', severity: 'error' })]);
		expect(r.problems[0].message).toContain('limit is 10.0 MiB');
		expect(r.plan.lines).toEqual([]);
	});

	it('counts multi-byte characters against the limit', () => {
		const text = 'é'.repeat(600);
		expect(importPlan(text, 'csv', { maxBytes: 1000 }).problems[0].message).toContain('limit');
		expect(MAX_IMPORT_BYTES).toBe(10 * 1024 * 1024);
	});

	it.each(['gpx', 'kml', 'rtz'] as const)('%s: broken XML is reported with its line', (format) => {
		const r = importPlan('<?xml version="1.0"?>\n<a>\n<b>\n</a>', format);
		expect(r.problems[0].message).toMatch(/^not well-formed XML at line [34]/);
	});

	it('never throws on garbage in any format', () => {
		const garbage = [
			'',
			'\u0000\u0001',
			'<',
			'{',
			'"',
			'a,b\n"c',
			'<gpx><wpt lat="x"/></gpx>',
			'{"type":"Feature"}',
			'<<<>>>'
		];
		for (const format of FORMATS) {
			for (const g of garbage) expect(() => importPlan(g, format)).not.toThrow();
		}
	});

	it('refuses to export a plan with impossible coordinates', () => {
		const plan = samplePlan();
		plan.stations[1].position = [40, 150];
		for (const format of FORMATS) {
			expect(() => exportPlan(plan, format)).toThrow(ExportError);
			expect(() => exportPlan(plan, format)).toThrow(/D-2 <wall>.*latitude 150/);
		}
	});

	it('rejects an unknown format name', () => {
		expect(importPlan('x', 'shp' as FormatId).problems[0].message).toContain('unknown format');
	});
});

describe('detectFormat', () => {
	it.each([
		['{"type":"FeatureCollection","features":[]}', undefined, 'geojson'],
		['\uFEFF<?xml version="1.0"?>\n<!-- c -->\n<gpx version="1.1">', undefined, 'gpx'],
		['<kml xmlns="http://www.opengis.net/kml/2.2">', 'x.xml', 'kml'],
		['<?xml version="1.0"?><route version="1.2">', undefined, 'rtz'],
		['<gpx/>', 'mislabelled.kml', 'gpx'],
		['# caution\nno,id,name\n1,,A', undefined, 'csv'],
		['name;lat;lon', undefined, 'csv'],
		['anything', 'plan.csv', 'csv'],
		['anything', 'plan.GPX', 'gpx'],
		['hello', undefined, null],
		['<html></html>', 'page.html', null]
	] as const)('%s (%s) → %s', (text, filename, expected) => {
		expect(detectFormat(text, filename)).toBe(expected);
	});

	it.each(FORMATS)('recognises its own %s exports', (format) => {
		expect(detectFormat(exportPlan(samplePlan(), format).body)).toBe(format);
	});
});
