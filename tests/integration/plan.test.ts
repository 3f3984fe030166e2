import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDb, type Db } from '../../src/lib/server/db/client';
import { cruise, station, surveyLine } from '../../src/lib/server/db/schema';
import { DEMO, signIn, startServer, type TestServer } from '../support/server';

let srv: TestServer;
let db: Db;
let cruiseId: string;
let otherCruiseId: string;
let chief: string;
let participant: string;
let otherChief: string;

beforeAll(async () => {
	srv = await startServer();
	db = openDb(srv.dbPath);
	cruiseId = db.select().from(cruise).where(eq(cruise.code, 'MT27-03')).get()!.id;
	otherCruiseId = db.select().from(cruise).where(eq(cruise.code, 'SL27-01')).get()!.id;
	chief = (await signIn(srv.url, DEMO.chief)).cookie!;
	participant = (await signIn(srv.url, DEMO.participant)).cookie!;
	otherChief = (await signIn(srv.url, 'asha.lindqvist@example.org')).cookie!;
});
afterAll(async () => {
	db?.$client.close();
	await srv?.stop();
});

const call = (path: string, cookie: string, init: RequestInit = {}) =>
	fetch(srv.url + path, {
		...init,
		headers: { cookie, 'content-type': 'application/json', ...(init.headers ?? {}) }
	});

describe('plan API', () => {
	it('everyone on the cruise reads the plan as GeoJSON with computed values', async () => {
		const res = await call(`/api/v1/cruises/${cruiseId}/plan`, participant);
		expect(res.status).toBe(200);
		const fc = await res.json();
		expect(fc.type).toBe('FeatureCollection');
		expect(fc.cruise.canEdit).toBe(false);
		const kinds = new Set(
			fc.features.map((f: { properties: { kind: string } }) => f.properties.kind)
		);
		expect(kinds).toEqual(new Set(['ridge', 'line', 'area', 'station']));
		const line = fc.features.find(
			(f: { properties: { name: string } }) => f.properties.name === 'N-X1'
		);
		expect(line.properties.surveySpeedKn).toBe(8);
		expect(line.properties.overlapPct).toBe(30);
		expect(line.properties.lengthKm).toBeGreaterThan(140);
		// [derived] time = length / (speed × 1.852 km/h)
		expect(line.properties.durationH).toBeCloseTo(line.properties.lengthKm / (8 * 1.852), 9);
		expect(line.properties.minDepthM).toBeLessThan(line.properties.maxDepthM);
		const ridge = fc.features.find(
			(f: { properties: { kind: string } }) => f.properties.kind === 'ridge'
		);
		expect(ridge.properties.fullRateMmYr).toBe(38);
		const ctd = fc.features.find(
			(f: { properties: { name: string } }) => f.properties.name === 'CTD-01'
		);
		expect(ctd.properties.depthM).toBeGreaterThan(1500);
		expect(ctd.properties.durationH).toBeGreaterThan(1);
	});

	it('the chief scientist adds, edits and deletes a line; the server computes it', async () => {
		const created = await call(`/api/v1/cruises/${cruiseId}/plan/features`, chief, {
			method: 'POST',
			body: JSON.stringify({
				kind: 'line',
				name: 'TEST-1',
				geometry: {
					type: 'LineString',
					coordinates: [
						[-146.5, -29.6],
						[-145.5, -29.6]
					]
				},
				properties: { surveySpeedKn: 9 }
			})
		});
		expect(created.status).toBe(201);
		const f = await created.json();
		expect(f.properties).toMatchObject({
			kind: 'line',
			name: 'TEST-1',
			surveySpeedKn: 9,
			overlapPct: 30
		});
		expect(f.properties.maxDepthM).toBeGreaterThan(2000);

		const patched = await call(`/api/v1/cruises/${cruiseId}/plan/features/${f.id}`, chief, {
			method: 'PATCH',
			body: JSON.stringify({ properties: { overlapPct: 60 } })
		});
		expect(patched.status).toBe(200);
		expect((await patched.json()).properties.overlapPct).toBe(60);

		const del = await call(`/api/v1/cruises/${cruiseId}/plan/features/${f.id}`, chief, {
			method: 'DELETE'
		});
		expect(del.status).toBe(204);
		expect(db.select().from(surveyLine).where(eq(surveyLine.id, f.id)).get()).toBeUndefined();
	});

	it('a generated line remembers its survey area; an area of another cruise is refused', async () => {
		const fc = await (await call(`/api/v1/cruises/${cruiseId}/plan`, chief)).json();
		const area = fc.features.find(
			(f: { properties: { kind: string } }) => f.properties.kind === 'area'
		);
		const line = (areaId: string) =>
			call(`/api/v1/cruises/${cruiseId}/plan/features`, chief, {
				method: 'POST',
				body: JSON.stringify({
					kind: 'line',
					name: 'BOX-01',
					geometry: {
						type: 'LineString',
						coordinates: [
							[-146, -30.4],
							[-145.4, -30.4]
						]
					},
					properties: { areaId }
				})
			});
		const ok = await line(area.id);
		expect(ok.status).toBe(201);
		const made = await ok.json();
		expect(made.properties.areaId).toBe(area.id);
		const bad = await line('not-an-area');
		expect(bad.status).toBe(422);
		expect((await bad.json()).error.details[0].field).toBe('properties.areaId');
		await call(`/api/v1/cruises/${cruiseId}/plan/features/${made.id}`, chief, { method: 'DELETE' });
	});

	it('a participant cannot edit the plan', async () => {
		const before = db.select().from(station).all().length;
		const res = await call(`/api/v1/cruises/${cruiseId}/plan/features`, participant, {
			method: 'POST',
			body: JSON.stringify({
				kind: 'station',
				name: 'X',
				geometry: { type: 'Point', coordinates: [-146, -30] },
				properties: { stationKind: 'ctd' }
			})
		});
		expect(res.status).toBe(403);
		expect(db.select().from(station).all().length).toBe(before);
	});

	it('a latitude beyond 90 is refused naming the field and suggesting the order is swapped', async () => {
		const res = await call(`/api/v1/cruises/${cruiseId}/plan/features`, chief, {
			method: 'POST',
			body: JSON.stringify({
				kind: 'station',
				name: 'Swapped',
				geometry: { type: 'Point', coordinates: [-30, -146] },
				properties: { stationKind: 'ctd' }
			})
		});
		expect(res.status).toBe(422);
		const body = await res.json();
		expect(body.error.details[0].field).toMatch(/^geometry\.coordinates/);
		expect(body.error.message).toMatch(/swapped/);
	});

	it('malformed JSON gets 400 and changes nothing', async () => {
		const before = db.select().from(surveyLine).all().length;
		const res = await call(`/api/v1/cruises/${cruiseId}/plan/features`, chief, {
			method: 'POST',
			body: '{"kind": "line", "name": '
		});
		expect(res.status).toBe(400);
		expect((await res.json()).error.code).toBe('bad_json');
		expect(db.select().from(surveyLine).all().length).toBe(before);
	});

	it('bulk-edits the speed of several lines, all or nothing', async () => {
		const ids = db
			.select()
			.from(surveyLine)
			.where(eq(surveyLine.cruiseId, cruiseId))
			.all()
			.slice(0, 3)
			.map((l) => l.id);
		const ok = await call(`/api/v1/cruises/${cruiseId}/plan/features/bulk`, chief, {
			method: 'POST',
			body: JSON.stringify({ ids, properties: { surveySpeedKn: 9.5 } })
		});
		expect(ok.status).toBe(200);
		expect(
			db
				.select()
				.from(surveyLine)
				.all()
				.filter((l) => ids.includes(l.id))
				.every((l) => l.surveySpeedKn === 9.5)
		).toBe(true);
		const bad = await call(`/api/v1/cruises/${cruiseId}/plan/features/bulk`, chief, {
			method: 'POST',
			body: JSON.stringify({ ids: [ids[0], 'not-a-line'], properties: { surveySpeedKn: 7 } })
		});
		expect(bad.status).toBe(404);
		expect(db.select().from(surveyLine).where(eq(surveyLine.id, ids[0])).get()!.surveySpeedKn).toBe(
			9.5
		);
	});
});

describe('exports and imports through the API', () => {
	const counts = (id: string) => ({
		lines: db.select().from(surveyLine).where(eq(surveyLine.cruiseId, id)).all().length,
		stations: db.select().from(station).where(eq(station.cruiseId, id)).all().length
	});

	// The plan layers carry every line and station; the route (RTZ) carries those in the order of
	// work, which in the demo is all of them. The route's ports are not plan items and stay out.
	for (const path of ['layers/geojson', 'layers/gpx', 'layers/kml', 'layers/csv', 'route/rtz']) {
		it(`${path}: the demo plan exported and imported into another cruise arrives whole`, async () => {
			const exp = await call(`/api/v1/cruises/${cruiseId}/export/${path}`, participant);
			expect(exp.status).toBe(200);
			const disposition = exp.headers.get('content-disposition')!;
			const filename = disposition.match(/filename="([^"]+)"/)![1];
			const body = await exp.text();
			expect(body).toMatch(/not for navigation/i);

			const before = counts(otherCruiseId);
			const imp = await fetch(
				`${srv.url}/api/v1/cruises/${otherCruiseId}/import?filename=${encodeURIComponent(filename)}`,
				{
					method: 'POST',
					body,
					headers: { cookie: otherChief, 'content-type': 'application/octet-stream' }
				}
			);
			expect(imp.status, await imp.clone().text()).toBe(201);
			const after = counts(otherCruiseId);
			const source = counts(cruiseId);
			expect(after.lines - before.lines).toBe(source.lines);
			expect(after.stations - before.stations).toBe(source.stations);
		});
	}

	it('a broken file is refused with where it broke, and nothing is imported', async () => {
		const before = counts(otherCruiseId);
		const res = await fetch(`${srv.url}/api/v1/cruises/${otherCruiseId}/import?filename=plan.gpx`, {
			method: 'POST',
			body: '<?xml version="1.0"?>\n<gpx version="1.1">\n<wpt lat="10" lon="20"><name>A</name></wpt>\n<rte><rtept lat="1"',
			headers: { cookie: otherChief, 'content-type': 'application/octet-stream' }
		});
		expect(res.status).toBe(422);
		const body = await res.json();
		expect(body.error.details.problems[0].message).toMatch(/line \d/);
		expect(counts(otherCruiseId)).toEqual(before);
	});

	it('a file with one bad item imports nothing, unless the valid items are accepted', async () => {
		const fc = {
			type: 'FeatureCollection',
			features: [
				{
					type: 'Feature',
					geometry: { type: 'Point', coordinates: [-145, -30] },
					properties: { kind: 'station', name: 'OK-1', stationKind: 'ctd' }
				},
				{
					type: 'Feature',
					geometry: { type: 'Point', coordinates: [-30, -145] },
					properties: { kind: 'station', name: 'SWAPPED', stationKind: 'ctd' }
				}
			]
		};
		const post = (q: string) =>
			fetch(`${srv.url}/api/v1/cruises/${otherCruiseId}/import?filename=p.geojson${q}`, {
				method: 'POST',
				body: JSON.stringify(fc),
				headers: { cookie: otherChief, 'content-type': 'application/octet-stream' }
			});
		const before = counts(otherCruiseId);
		const refused = await post('');
		expect(refused.status).toBe(422);
		const problems = (await refused.json()).error.details.problems;
		expect(problems[0].where).toMatch(/feature 2/);
		expect(counts(otherCruiseId)).toEqual(before);
		const accepted = await post('&acceptValid=1');
		expect(accepted.status).toBe(201);
		expect(counts(otherCruiseId).stations).toBe(before.stations + 1);
	});

	it('a 50 MB upload is refused as too large', async () => {
		const res = await fetch(`${srv.url}/api/v1/cruises/${otherCruiseId}/import?filename=big.csv`, {
			method: 'POST',
			body: new Uint8Array(50 * 1024 * 1024).fill(97),
			headers: { cookie: otherChief, 'content-type': 'application/octet-stream' }
		});
		expect(res.status).toBe(413);
		expect((await res.json()).error.message).toMatch(/limit is 10/);
	});

	it('only the chief scientist imports', async () => {
		const res = await fetch(`${srv.url}/api/v1/cruises/${cruiseId}/import?filename=p.geojson`, {
			method: 'POST',
			body: '{"type":"FeatureCollection","features":[]}',
			headers: { cookie: participant, 'content-type': 'application/octet-stream' }
		});
		expect(res.status).toBe(403);
	});
});
