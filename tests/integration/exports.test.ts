// What leaves Wakeline, read back by the trade's own readers: the route for the bridge (RTZ, GPX,
// CSV) in the timeline's order with its times, and the plan layers for GIS, opened with GDAL
// (ogrinfo / ogr2ogr, Debian gdal-bin) and gpsbabel. Against the built server and the demo MT27-03.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { childNamed, childrenNamed, parseXml } from '../../src/lib/engine/formats/xml';
import { openDb } from '../../src/lib/server/db/client';
import { cruise } from '../../src/lib/server/db/schema';
import { DEMO, signIn, startServer, type TestServer } from '../support/server';

let srv: TestServer;
let cruiseId: string;
let participant: string;
let dir: string;

beforeAll(async () => {
	srv = await startServer();
	const db = openDb(srv.dbPath);
	cruiseId = db.select().from(cruise).where(eq(cruise.code, 'MT27-03')).get()!.id;
	db.$client.close();
	participant = (await signIn(srv.url, DEMO.participant, DEMO.password, '10.13.0.2')).cookie!;
	dir = mkdtempSync(join(tmpdir(), 'wl-exports-'));
});
afterAll(async () => {
	if (dir) rmSync(dir, { recursive: true, force: true });
	await srv?.stop();
});

const get = (path: string, cookie = participant) => fetch(srv.url + path, { headers: { cookie } });

async function download(
	path: string,
	cookie = participant
): Promise<{ file: string; body: string }> {
	const res = await get(path, cookie);
	expect(res.status, path).toBe(200);
	const name = res.headers.get('content-disposition')!.match(/filename="([^"]+)"/)![1];
	const body = await res.text();
	const file = join(dir, `${Math.random().toString(36).slice(2)}-${name}`);
	writeFileSync(file, body);
	return { file, body };
}

const CSV_OPTS = ['-oo', 'X_POSSIBLE_NAMES=lon*', '-oo', 'Y_POSSIBLE_NAMES=lat*'];

/** Feature count per layer as ogrinfo reports it. */
function ogrCounts(file: string, extra: string[] = []): Record<string, number> {
	const out = execFileSync('ogrinfo', ['-ro', '-al', '-so', ...extra, file], { encoding: 'utf8' });
	const counts: Record<string, number> = {};
	let layer = '';
	for (const line of out.split('\n')) {
		const l = line.match(/^Layer name: (.+)$/);
		if (l) layer = l[1].trim();
		const c = line.match(/^Feature Count: (\d+)/);
		if (c) counts[layer] = Number(c[1]);
	}
	return counts;
}

/** A layer as GeoJSON, converted by GDAL (not by us). */
function ogrGeoJson(file: string, layer?: string, extra: string[] = []) {
	const out = execFileSync(
		'ogr2ogr',
		['-f', 'GeoJSON', '/vsistdout/', ...extra, file, ...(layer ? [layer] : [])],
		{ encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 }
	);
	return JSON.parse(out) as {
		features: {
			geometry: { type: string; coordinates: number[] };
			properties: Record<string, unknown>;
		}[];
	};
}

interface ApiEvent {
	kind: string;
	name: string;
	start: string;
	end: string;
}
const sec = (iso: string) => Math.round(Date.parse(iso) / 1000);

async function timeline() {
	const t = (await (await get(`/api/v1/cruises/${cruiseId}/timeline`)).json()) as {
		events: ApiEvent[];
	};
	const order = (await (await get(`/api/v1/cruises/${cruiseId}/timeline/order`)).json()) as {
		items: { id: string; kind: string; name: string; reversed: boolean }[];
	};
	const plan = (await (await get(`/api/v1/cruises/${cruiseId}/plan`)).json()) as {
		features: {
			geometry: { coordinates: unknown };
			properties: { kind: string; name: string };
		}[];
	};
	return { events: t.events, order: order.items, plan };
}

/** The waypoints the timeline implies: name, ETA, ETD (seconds), for lines their ends. */
function expectedStops(events: ApiEvent[]) {
	const stops: { name: string; eta: number; etd: number }[] = [];
	for (const e of events) {
		if (e.kind === 'line') {
			stops.push({ name: `${e.name} SOL`, eta: sec(e.start), etd: sec(e.start) });
			stops.push({ name: `${e.name} EOL`, eta: sec(e.end), etd: NaN });
		} else if (e.kind === 'station' || e.kind === 'port')
			stops.push({ name: e.name, eta: sec(e.start), etd: sec(e.end) });
	}
	return stops;
}

describe('the route for the bridge follows the timeline', () => {
	it('RTZ, GPX and CSV list the waypoints in the order of work with the timeline’s ETAs to the second', async () => {
		const { events, order } = await timeline();
		const stops = expectedStops(events);
		const firstTransit = events.find((e) => e.kind === 'transit')!;
		const lastTransit = events.filter((e) => e.kind === 'transit').at(-1)!;

		// CSV, as GDAL reads it.
		const csv = await download(`/api/v1/cruises/${cruiseId}/export/route/csv`);
		expect(csv.body.split('\r\n')[0]).toMatch(/^seq,name,kind,/);
		const rows = Papa.parse<Record<string, string>>(csv.body, {
			header: true,
			skipEmptyLines: true
		}).data;
		const named = (n: string) => rows.find((r) => r.name === n)!;
		for (const s of stops) {
			expect(named(s.name), s.name).toBeTruthy();
			expect(sec(named(s.name).eta_utc), `${s.name} ETA`).toBe(s.eta);
			if (!Number.isNaN(s.etd)) expect(sec(named(s.name).etd_utc), `${s.name} ETD`).toBe(s.etd);
		}
		expect(sec(rows[0].etd_utc)).toBe(sec(firstTransit.start));
		expect(sec(rows.at(-1)!.eta_utc)).toBe(sec(lastTransit.end));
		// The order of the stops is the order of work: ports and items in sequence, lines SOL → EOL.
		const inRoute = rows.map((r) => r.name).filter((n) => stops.some((s) => s.name === n));
		expect(inRoute).toEqual(stops.map((s) => s.name));
		const itemsInRoute = [...new Set(rows.map((r) => r.item).filter(Boolean))];
		expect(itemsInRoute).toEqual(order.map((o) => o.name));
		// Speeds: transit between items, the line's survey speed along it.
		const sol = rows.findIndex((r) => r.kind === 'line start');
		expect(rows[sol].leg).toBe('transit');
		expect(rows[sol + 1].leg).toBe('survey');
		expect(Number(rows[sol + 1].leg_speed_kn)).toBeLessThan(Number(rows[sol].leg_speed_kn));

		const gdal = ogrGeoJson(csv.file, undefined, CSV_OPTS);
		expect(gdal.features).toHaveLength(rows.length);
		expect(gdal.features[1].geometry.coordinates).toEqual([
			Number(rows[1].longitude_dd),
			Number(rows[1].latitude_dd)
		]);

		// RTZ: the schedule carries the same instants.
		const rtz = await download(`/api/v1/cruises/${cruiseId}/export/route/rtz`);
		const p = parseXml(rtz.body);
		if (!p.ok) throw new Error(p.message);
		const ns = p.root.ns;
		const wps = childrenNamed(childNamed(p.root, 'waypoints', ns)!, 'waypoint', ns);
		expect(wps.map((w) => w.attrs.name)).toEqual(rows.map((r) => r.name));
		const sched = childrenNamed(
			childNamed(
				childNamed(childNamed(p.root, 'schedules', ns)!, 'schedule', ns)!,
				'calculated',
				ns
			)!,
			'scheduleElement',
			ns
		);
		expect(sched).toHaveLength(wps.length);
		sched.forEach((el, i) => {
			expect(el.attrs.waypointId).toBe(wps[i].attrs.id);
			if (rows[i].eta_utc) expect(el.attrs.eta).toBe(rows[i].eta_utc);
			if (rows[i].etd_utc) expect(el.attrs.etd).toBe(rows[i].etd_utc);
		});

		// GPX: one route, read by GDAL and by gpsbabel.
		const gpx = await download(`/api/v1/cruises/${cruiseId}/export/route/gpx`);
		const counts = ogrCounts(gpx.file);
		expect(counts.routes).toBe(1);
		expect(counts.route_points).toBe(rows.length);
		const pts = ogrGeoJson(gpx.file, 'route_points');
		pts.features.forEach((f, i) => {
			expect(f.properties.name).toBe(rows[i].name);
			expect(f.geometry.coordinates[0]).toBeCloseTo(Number(rows[i].longitude_dd), 6);
			expect(f.geometry.coordinates[1]).toBeCloseTo(Number(rows[i].latitude_dd), 6);
			const when = rows[i].eta_utc || rows[i].etd_utc;
			expect(sec(String(f.properties.time).replace(/\//g, '-').replace(' ', 'T'))).toBe(sec(when));
		});
		const out = join(dir, 'babel.csv');
		execFileSync('gpsbabel', ['-r', '-i', 'gpx', '-f', gpx.file, '-o', 'unicsv', '-F', out]);
		const babel = Papa.parse<Record<string, string>>(readFileSync(out, 'utf8'), {
			header: true,
			skipEmptyLines: true
		}).data;
		expect(babel).toHaveLength(rows.length);
		expect(babel.map((b) => b.Name)).toEqual(rows.map((r) => r.name));
		expect(Number(babel[1].Latitude)).toBeCloseTo(Number(rows[1].latitude_dd), 6);
	});

	it('a reversed line in the order comes out reversed in every route format', async () => {
		const { order, plan } = await timeline();
		const rev = order.find((o) => o.kind === 'line' && o.reversed)!;
		const fwd = order.find((o) => o.kind === 'line' && !o.reversed)!;
		expect(rev, 'the demo runs some lines the other way').toBeTruthy();
		const coordsOf = (name: string) =>
			plan.features.find((f) => f.properties.kind === 'line' && f.properties.name === name)!
				.geometry.coordinates as [number, number][];
		const check = (name: string, sol: number[], eol: number[], reversed: boolean) => {
			const c = coordsOf(name);
			const [first, last] = reversed ? [c.at(-1)!, c[0]] : [c[0], c.at(-1)!];
			expect(sol[0]).toBeCloseTo(first[0], 6);
			expect(sol[1]).toBeCloseTo(first[1], 6);
			expect(eol[0]).toBeCloseTo(last[0], 6);
			expect(eol[1]).toBeCloseTo(last[1], 6);
		};

		const csv = await download(`/api/v1/cruises/${cruiseId}/export/route/csv`);
		const rows = Papa.parse<Record<string, string>>(csv.body, {
			header: true,
			skipEmptyLines: true
		}).data;
		const pos = (n: string) => {
			const r = rows.find((x) => x.name === n)!;
			return [Number(r.longitude_dd), Number(r.latitude_dd)];
		};
		for (const o of [rev, fwd])
			check(o.name, pos(`${o.name} SOL`), pos(`${o.name} EOL`), o.reversed);
		expect(rows.find((r) => r.name === `${rev.name} SOL`)!.reversed).toBe('yes');

		const rtz = await download(`/api/v1/cruises/${cruiseId}/export/route/rtz`);
		const p = parseXml(rtz.body);
		if (!p.ok) throw new Error(p.message);
		const ns = p.root.ns;
		const wps = childrenNamed(childNamed(p.root, 'waypoints', ns)!, 'waypoint', ns);
		const rtzPos = (n: string) => {
			const w = childNamed(
				wps.find((x) => x.attrs.name === n)!,
				'position',
				ns
			)!;
			return [Number(w.attrs.lon), Number(w.attrs.lat)];
		};
		for (const o of [rev, fwd])
			check(o.name, rtzPos(`${o.name} SOL`), rtzPos(`${o.name} EOL`), o.reversed);

		const gpx = await download(`/api/v1/cruises/${cruiseId}/export/route/gpx`);
		const pts = ogrGeoJson(gpx.file, 'route_points').features;
		const gpxPos = (n: string) => pts.find((f) => f.properties.name === n)!.geometry.coordinates;
		for (const o of [rev, fwd])
			check(o.name, gpxPos(`${o.name} SOL`), gpxPos(`${o.name} EOL`), o.reversed);
	});

	it('the first export URLs still answer: rtz, gpx and csv with the route, geojson and kml with the layers', async () => {
		const route = await download(`/api/v1/cruises/${cruiseId}/export/route/rtz`);
		const legacy = await download(`/api/v1/cruises/${cruiseId}/export/rtz`);
		expect(legacy.body).toBe(route.body);
		const layers = await download(`/api/v1/cruises/${cruiseId}/export/layers/geojson`);
		const old = await download(`/api/v1/cruises/${cruiseId}/export/geojson`);
		expect(old.body).toBe(layers.body);
		expect((await get(`/api/v1/cruises/${cruiseId}/export/route/kml`)).status).toBe(404);
		expect((await get(`/api/v1/cruises/${cruiseId}/export/layers/rtz`)).status).toBe(404);
		expect((await get(`/api/v1/cruises/${cruiseId}/export/route/csv`, '')).status).toBe(401);
	});
});

describe('the plan layers open in GIS', () => {
	it('GDAL and gpsbabel read every layer export with the plan’s feature counts', async () => {
		const { plan } = await timeline();
		const n = (k: string) => plan.features.filter((f) => f.properties.kind === k).length;
		const lines = plan.features.filter((f) => f.properties.kind === 'line');
		const vertices = lines.reduce((s, f) => s + (f.geometry.coordinates as unknown[]).length, 0);

		const geojson = await download(`/api/v1/cruises/${cruiseId}/export/layers/geojson`);
		const gj = Object.values(ogrCounts(geojson.file));
		expect(gj.reduce((a, b) => a + b, 0)).toBe(n('ridge') + n('area') + n('line') + n('station'));
		const fc = JSON.parse(geojson.body);
		// RFC 7946 §6.1 foreign members: the cruise, vessel, depth model and planned times.
		expect(fc.cruise.code).toBe('MT27-03');
		expect(fc.vessel.name).toBeTruthy();
		expect(fc.depthModel).toBeTruthy();
		expect(fc.backInPortAt).toMatch(/Z$/);
		const line = fc.features.find(
			(f: { properties: { kind: string } }) => f.properties.kind === 'line'
		);
		expect(line.properties.order).toBeGreaterThan(0);
		expect(line.properties.plannedStart).toMatch(/Z$/);
		expect(line.properties.vertexDepthsM).toHaveLength(line.geometry.coordinates.length);

		const kml = await download(`/api/v1/cruises/${cruiseId}/export/layers/kml`);
		const kc = ogrCounts(kml.file);
		expect(Object.values(kc).reduce((a, b) => a + b, 0)).toBe(
			n('ridge') + n('area') + n('line') + n('station')
		);
		expect(kml.body).toContain('<styleUrl>#wl-line</styleUrl>');
		expect(kml.body).toContain('<TimeSpan>');

		const gpx = await download(`/api/v1/cruises/${cruiseId}/export/layers/gpx`);
		const gc = ogrCounts(gpx.file);
		expect(gc.waypoints).toBe(n('station'));
		expect(gc.routes).toBe(n('line'));
		const out = join(dir, 'layers-babel.csv');
		execFileSync('gpsbabel', ['-i', 'gpx', '-f', gpx.file, '-o', 'csv', '-F', out]);
		// gpsbabel's csv writer lists waypoints and every route point: stations plus line vertices.
		const babelRows = readFileSync(out, 'utf8').split(/\r?\n/).filter(Boolean);
		expect(babelRows).toHaveLength(n('station') + vertices);
		const [blat, blon] = babelRows[0].split(',').map((x) => Number(x.trim()));
		const s0 = plan.features.find((f) => f.properties.kind === 'station')!;
		const [s0lon, s0lat] = s0.geometry.coordinates as number[];
		expect(blat).toBeCloseTo(s0lat, 5);
		expect(blon).toBeCloseTo(s0lon, 5);

		const csv = await download(`/api/v1/cruises/${cruiseId}/export/layers/csv`);
		expect(csv.body.startsWith('no,id,name,')).toBe(true);
		const cc = ogrCounts(csv.file, CSV_OPTS);
		expect(Object.values(cc)[0]).toBe(n('station') + vertices);
		const pts = ogrGeoJson(csv.file, undefined, CSV_OPTS).features;
		const st = plan.features.find((f) => f.properties.kind === 'station')!;
		const [lon, lat] = st.geometry.coordinates as number[];
		const mine = pts.find((f) => f.properties.name === st.properties.name)!;
		expect(mine.geometry.coordinates[0]).toBeCloseTo(lon, 6);
		expect(mine.geometry.coordinates[1]).toBeCloseTo(lat, 6);
		// Every line vertex carries its predicted depth, to 1 m.
		const vrows = pts.filter((f) => f.properties.kind === 'line');
		expect(vrows.every((f) => /^\d+$/.test(String(f.properties.predicted_depth_m)))).toBe(true);
	});
});
