// Saving a survey area with the lines generated over it: one request, one transaction, all or nothing.
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDb, type Db } from '../../src/lib/server/db/client';
import { cruise, surveyArea, surveyLine } from '../../src/lib/server/db/schema';
import { DEMO, signIn, startServer, type TestServer } from '../support/server';

let srv: TestServer;
let db: Db;
let cruiseId: string;
let otherCruiseId: string;
let chief: string;
let participant: string;

beforeAll(async () => {
	srv = await startServer();
	db = openDb(srv.dbPath);
	cruiseId = db.select().from(cruise).where(eq(cruise.code, 'MT27-03')).get()!.id;
	otherCruiseId = db.select().from(cruise).where(eq(cruise.code, 'SL27-01')).get()!.id;
	chief = (await signIn(srv.url, DEMO.chief)).cookie!;
	participant = (await signIn(srv.url, DEMO.participant)).cookie!;
});
afterAll(async () => {
	db?.$client.close();
	await srv?.stop();
});

const post = (cookie: string, body: unknown) =>
	fetch(`${srv.url}/api/v1/cruises/${cruiseId}/plan/areas`, {
		method: 'POST',
		headers: { cookie, 'content-type': 'application/json' },
		body: JSON.stringify(body)
	});

const counts = () => ({
	areas: db.select().from(surveyArea).where(eq(surveyArea.cruiseId, cruiseId)).all().length,
	lines: db.select().from(surveyLine).where(eq(surveyLine.cruiseId, cruiseId)).all().length
});

const box = {
	name: 'Box A',
	geometry: {
		type: 'Polygon',
		coordinates: [
			[
				[-146.6, -30.4],
				[-146.2, -30.4],
				[-146.2, -30.1],
				[-146.6, -30.1],
				[-146.6, -30.4]
			]
		]
	},
	properties: { overlapPct: 30, surveySpeedKn: 8 }
};

const lineAt = (name: string, lat: number) => ({
	name,
	geometry: {
		type: 'LineString',
		coordinates: [
			[-146.6, lat],
			[-146.2, lat]
		]
	},
	properties: { purpose: 'multibeam', surveySpeedKn: 8, overlapPct: 30, ihoOrder: '2' }
});

describe('POST /api/v1/cruises/{id}/plan/areas', () => {
	it('saves the area and all its lines at once, each line remembering its area', async () => {
		const before = counts();
		const res = await post(chief, {
			area: box,
			lines: [lineAt('Box A-01', -30.35), lineAt('Box A-02', -30.25), lineAt('Box A-03', -30.15)]
		});
		expect(res.status).toBe(201);
		const body = await res.json();
		expect(body.area.properties.kind).toBe('area');
		expect(body.lines.map((l: { properties: { name: string } }) => l.properties.name)).toEqual([
			'Box A-01',
			'Box A-02',
			'Box A-03'
		]);
		expect(counts()).toEqual({ areas: before.areas + 1, lines: before.lines + 3 });
		const stored = db.select().from(surveyLine).where(eq(surveyLine.areaId, body.area.id)).all();
		expect(stored).toHaveLength(3);
		// computed on the server like any other line: [derived] time = length / (8 kn × 1.852 km/h)
		const first = body.lines[0].properties;
		expect(first.durationH).toBeCloseTo(first.lengthKm / (8 * 1.852), 9);
	});

	it('lines over an area already saved join it', async () => {
		const area = db.select().from(surveyArea).where(eq(surveyArea.cruiseId, cruiseId)).get()!;
		const before = counts();
		const res = await post(chief, { areaId: area.id, lines: [lineAt('Again-01', -30.3)] });
		expect(res.status).toBe(201);
		expect(counts()).toEqual({ areas: before.areas, lines: before.lines + 1 });
		expect((await res.json()).lines[0].properties.areaId).toBe(area.id);
	});

	it('one bad line among them stores nothing, and the answer names it', async () => {
		const before = counts();
		const bad = lineAt('Box B-03', -30.15);
		bad.geometry.coordinates[1] = [-146.2, -95];
		const res = await post(chief, {
			area: { ...box, name: 'Box B' },
			lines: [lineAt('Box B-01', -30.35), lineAt('Box B-02', -30.25), bad]
		});
		expect(res.status).toBe(422);
		const { error } = await res.json();
		expect(error.details[0].field).toBe('lines.2.geometry.coordinates.1.1');
		expect(counts()).toEqual(before);
		expect(db.select().from(surveyArea).where(eq(surveyArea.name, 'Box B')).all()).toHaveLength(0);
	});

	it('a failure while writing the third line rolls back the area and the first two', async () => {
		// A trigger makes the database itself refuse one row mid-transaction.
		db.$client.exec(
			`CREATE TRIGGER refuse_boom BEFORE INSERT ON survey_line WHEN NEW.name = 'BOOM'
			 BEGIN SELECT RAISE(ABORT, 'refused for the test'); END`
		);
		try {
			const before = counts();
			const res = await post(chief, {
				area: { ...box, name: 'Box C' },
				lines: [lineAt('Box C-01', -30.35), lineAt('Box C-02', -30.25), lineAt('BOOM', -30.15)]
			});
			expect(res.status).toBe(500);
			expect(counts()).toEqual(before);
			expect(db.select().from(surveyArea).where(eq(surveyArea.name, 'Box C')).all()).toHaveLength(
				0
			);
		} finally {
			db.$client.exec('DROP TRIGGER refuse_boom');
		}
	});

	it('an area of another cruise, both or neither area, and a participant are refused', async () => {
		const before = counts();
		const foreign = db
			.select()
			.from(surveyArea)
			.where(eq(surveyArea.cruiseId, otherCruiseId))
			.get();
		if (foreign) {
			const r = await post(chief, { areaId: foreign.id, lines: [lineAt('X-01', -30.3)] });
			expect(r.status).toBe(422);
		}
		const both = await post(chief, { area: box, areaId: 'x', lines: [lineAt('X-01', -30.3)] });
		expect(both.status).toBe(422);
		const neither = await post(chief, { lines: [lineAt('X-01', -30.3)] });
		expect(neither.status).toBe(422);
		const noLines = await post(chief, { area: box, lines: [] });
		expect(noLines.status).toBe(422);
		const denied = await post(participant, { area: box, lines: [lineAt('X-01', -30.3)] });
		expect(denied.status).toBe(403);
		expect(counts()).toEqual(before);
	});
});
