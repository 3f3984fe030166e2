// Observed tracks over real HTTP against the built server: upload (streamed), refusals that store
// nothing, roles, residuals against the cruise's own ridge model, calibration applied to a segment.
import { and, eq } from 'drizzle-orm';
import { request as httpRequest } from 'node:http';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writeMgd77t } from '../../src/lib/engine/formats/mgd77t';
import { RidgeDepthModel } from '../../src/lib/engine/profile';
import { openDb, type Db } from '../../src/lib/server/db/client';
import { auditLog, cruise, observedTrack, ridgeSegment } from '../../src/lib/server/db/schema';
import { ridgeInputs } from '../../src/lib/server/plancompute';
import { DEMO, signIn, startServer, type TestServer } from '../support/server';

let srv: TestServer;
let db: Db;
let cruiseId: string;
let chief: string;
let participant: string;
let agent: string;
let master: string;

beforeAll(async () => {
	srv = await startServer();
	db = openDb(srv.dbPath);
	cruiseId = db.select().from(cruise).where(eq(cruise.code, 'MT27-03')).get()!.id;
	chief = (await signIn(srv.url, DEMO.chief)).cookie!;
	participant = (await signIn(srv.url, DEMO.participant)).cookie!;
	agent = (await signIn(srv.url, DEMO.agent)).cookie!;
	master = (await signIn(srv.url, DEMO.master)).cookie!;
});
afterAll(async () => {
	db?.$client.close();
	await srv?.stop();
});

const base = () => `/api/v1/cruises/${cruiseId}/tracks`;
const upload = (cookie: string, body: string | Blob, query = 'filename=line.m77t') =>
	fetch(`${srv.url}${base()}?${query}`, {
		method: 'POST',
		body,
		headers: { cookie, 'content-type': 'application/octet-stream' }
	});
const get = (path: string, cookie: string) => fetch(srv.url + path, { headers: { cookie } });
const count = () =>
	db.select().from(observedTrack).where(eq(observedTrack.cruiseId, cruiseId)).all().length;

/** A crossing of the northern demo segment: the cruise's model plus `offset` metres. */
function crossing(offset: number, n = 400, flip = false) {
	const c = db.select().from(cruise).where(eq(cruise.id, cruiseId)).get()!;
	const ridges = db.select().from(ridgeSegment).where(eq(ridgeSegment.cruiseId, cruiseId)).all();
	const model = new RidgeDepthModel(ridgeInputs(ridges), { model: c.depthModel });
	const lon = Array.from({ length: n }, (_, i) => -146.9 + (1.8 * i) / (n - 1));
	const lat = lon.map(() => -29.6);
	const depthM = lon.map((x, i) => (flip ? -1 : 1) * (model.depthAt(x, lat[i]).depthM + offset));
	const timeS = lon.map((_, i) => Date.UTC(2024, 0, 2) / 1000 + i * 60);
	return writeMgd77t(`T${offset}${n}`, { lon, lat, depthM, timeS });
}

describe('tracks API', () => {
	let trackId: string;

	it('a participant uploads MGD77T: 201 with the track', async () => {
		const res = await upload(participant, crossing(300));
		expect(res.status).toBe(201);
		const { track } = await res.json();
		expect(track).toMatchObject({ name: 'line', format: 'mgd77t', points: 400 });
		expect(typeof track.id).toBe('string');
		trackId = track.id;
		const list = await (await get(base(), master)).json();
		expect(list.tracks.map((t: { id: string }) => t.id)).toContain(trackId);
	});

	it('residuals give back the offset, with statistics and what it implies [derived]', async () => {
		const res = await get(`${base()}/${trackId}/residuals`, participant);
		expect(res.status).toBe(200);
		const r = await res.json();
		expect(r.points).toHaveLength(400);
		const p = r.points[10];
		for (const k of [
			'distanceKm',
			'lon',
			'lat',
			'time',
			'observedM',
			'predictedM',
			'residualM',
			'ageMa'
		])
			expect(p).toHaveProperty(k);
		expect(p.residualM).toBeCloseTo(300, 0);
		expect(p.time).toBe('2024-01-02T00:10:00.000Z');
		expect(r.stats.n).toBe(400);
		// MGD77T keeps depth to 0.1 m, so the mean is 300 within rounding
		expect(Math.abs(r.stats.meanM - 300)).toBeLessThan(0.2);
		expect(Math.abs(r.stats.medianM - 300)).toBeLessThan(0.2);
		expect(r.stats.stdM).toBeLessThan(0.2);
		// Airy [derived] SCIENCE.md §3: −300·2270/400 = −1.7025 km
		expect(r.implied.crustalThicknessChangeKm).toBeCloseTo(-1.703, 2);
		expect(r.implied.potentialTemperatureC).toBeGreaterThan(1200);
		expect(r.implied.potentialTemperatureC).toBeLessThan(1330);
		const thin = await (await get(`${base()}/${trackId}/residuals?maxPoints=50`, master)).json();
		expect(thin.points.length).toBeLessThanOrEqual(51);
		expect(thin.stats.n).toBe(400);
		expect((await get(`${base()}/${trackId}/residuals?maxPoints=0`, master)).status).toBe(400);
	});

	it('a bad row refuses the whole file naming row and column, and stores nothing', async () => {
		const before = count();
		const text = crossing(0, 5).split('\n');
		text[3] = text[3].replace(/\t-29\.60000\t/, '\t-95.00000\t');
		const res = await upload(participant, text.join('\n'));
		expect(res.status).toBe(422);
		const { error } = await res.json();
		expect(error.code).toBe('invalid_track');
		expect(error.details).toEqual({ row: 4, column: 'latitude' });
		expect(error.message).toMatch(/Row 4/);
		const notNumber = await upload(participant, 'lon,lat,depth\n1,2,3\n1,x,3\n', 'filename=a.csv');
		expect((await notNumber.json()).error.details).toEqual({ row: 3, column: 'lat' });
		expect(count()).toBe(before);
	});

	it('asks when depths are negative, and reads them flipped when told', async () => {
		const text = crossing(100, 20, true);
		const res = await upload(chief, text);
		expect(res.status).toBe(422);
		expect((await res.json()).error.code).toBe('negative_depths');
		const ok = await upload(chief, text, 'filename=flip.m77t&flipDepths=1');
		expect(ok.status).toBe(201);
		expect((await ok.json()).track.points).toBe(20);
	});

	it('the same file twice is a conflict; binary and oversize files are refused', async () => {
		const dup = await upload(participant, crossing(300));
		expect(dup.status).toBe(409);
		expect((await dup.json()).error.details.trackId).toBe(trackId);
		const bin = await upload(participant, new Blob([new Uint8Array([0x50, 0x4b, 3, 4, 0, 0, 0])]));
		expect(bin.status).toBe(415);
		// a declared body over the 60 MiB limit is refused before it is read
		const status = await new Promise<{ status: number; body: string }>((resolve, reject) => {
			const u = new URL(`${srv.url}${base()}?filename=huge.xyz`);
			const req = httpRequest(
				u,
				{
					method: 'POST',
					headers: {
						cookie: participant,
						'content-type': 'application/octet-stream',
						'content-length': String(70 * 1024 * 1024)
					}
				},
				(res) => {
					let body = '';
					res.on('data', (c) => (body += c));
					res.on('end', () => resolve({ status: res.statusCode!, body }));
				}
			);
			req.on('error', reject);
			req.write('1 2 3\n');
			setTimeout(() => req.destroy(), 3000);
		});
		expect(status.status).toBe(413);
		expect(JSON.parse(status.body).error.code).toBe('payload_too_large');
	});

	it('the port agent may not upload or read tracks', async () => {
		expect((await upload(agent, crossing(7, 5))).status).toBe(403);
		expect((await get(base(), agent)).status).toBe(403);
		expect((await upload(master, crossing(7, 5))).status).toBe(403);
	});

	it('calibration: previewed by anyone, applied by the chief scientist only, audit-logged; the plan follows', async () => {
		const north = db
			.select()
			.from(ridgeSegment)
			.where(and(eq(ridgeSegment.cruiseId, cruiseId), eq(ridgeSegment.name, 'Sallow Ridge north')))
			.get()!;
		const preview = await get(
			`${base()}/${trackId}/calibration?segmentId=${north.id}`,
			participant
		);
		expect(preview.status).toBe(200);
		const { calibration } = await preview.json();
		expect(calibration.after.axialDepthM - calibration.before.axialDepthM).toBeCloseTo(300, 0);
		expect(calibration.after.rmsM).toBeLessThan(calibration.before.rmsM);
		const body = JSON.stringify({ segmentId: north.id });
		const headers = { 'content-type': 'application/json' };
		const denied = await fetch(`${srv.url}${base()}/${trackId}/calibration`, {
			method: 'POST',
			body,
			headers: { ...headers, cookie: participant }
		});
		expect(denied.status).toBe(403);
		const applied = await fetch(`${srv.url}${base()}/${trackId}/calibration`, {
			method: 'POST',
			body,
			headers: { ...headers, cookie: chief }
		});
		expect(applied.status).toBe(200);
		const after = db.select().from(ridgeSegment).where(eq(ridgeSegment.id, north.id)).get()!;
		expect(after.axialDepthM).toBeCloseTo(calibration.after.axialDepthM, 1);
		const logged = db
			.select()
			.from(auditLog)
			.where(and(eq(auditLog.cruiseId, cruiseId), eq(auditLog.action, 'track.calibration.applied')))
			.all();
		expect(logged).toHaveLength(1);
		// every prediction follows: the same track now sits on the model near the axis
		const r = await (await get(`${base()}/${trackId}/residuals`, chief)).json();
		const nearAxis = r.points.filter((p: { ageMa: number }) => p.ageMa < 0.5);
		expect(nearAxis.length).toBeGreaterThan(5);
		for (const p of nearAxis) expect(Math.abs(p.residualM)).toBeLessThan(1);
	});

	it('deletes: not the port agent, a participant their own, the chief scientist any', async () => {
		const other = await (await upload(chief, crossing(50, 10), 'filename=chief.m77t')).json();
		const del = (id: string, cookie: string) =>
			fetch(`${srv.url}${base()}/${id}`, { method: 'DELETE', headers: { cookie } });
		expect((await del(trackId, agent)).status).toBe(403);
		expect((await del(other.track.id, participant)).status).toBe(403);
		expect((await del(trackId, participant)).status).toBe(204);
		expect((await del(other.track.id, chief)).status).toBe(204);
		expect((await get(`${base()}/${trackId}/residuals`, chief)).status).toBe(404);
	});
});
