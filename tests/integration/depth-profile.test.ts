import { execFileSync } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO, startServer, type TestServer } from '../support/server';

let srv: TestServer;
let token: string;

beforeAll(async () => {
	srv = await startServer();
	token = execFileSync('npm', ['run', '-s', 'token', '--', DEMO.participant], {
		env: { ...process.env, DATABASE_PATH: srv.dbPath },
		encoding: 'utf8'
	}).trim();
});
afterAll(async () => srv?.stop());

const post = (body: unknown, auth = true) =>
	fetch(`${srv.url}/api/v1/depth-profile`, {
		method: 'POST',
		body: typeof body === 'string' ? body : JSON.stringify(body),
		headers: {
			'content-type': 'application/json',
			...(auth ? { authorization: `Bearer ${token}` } : {})
		}
	});

// A north–south axis on the prime meridian and a line east along the equator, so a sample's
// distance along the line is its distance from the axis.
const valid = {
	line: {
		type: 'LineString',
		coordinates: [
			[0, 0],
			[1, 0]
		]
	},
	ridge: {
		axis: {
			type: 'LineString',
			coordinates: [
				[0, -1],
				[0, 1]
			]
		},
		fullRateMmYr: 25
	},
	spacingKm: 10
};

describe('POST /api/v1/depth-profile', () => {
	it('answers the documented shape with published-model depths', async () => {
		const res = await post(valid);
		expect(res.status).toBe(200);
		const body = await res.json();
		expect(body.model).toBe('stein-stein-1992');
		// [reference library] GeographicLib: 1° of longitude on the equator = 111 319.4908 m
		expect(body.lengthKm).toBeCloseTo(111.3194908, 6);
		expect(body.samples).toHaveLength(13); // 0, 10, …, 110 km and the end
		const s = body.samples[10];
		expect(Object.keys(s).sort()).toEqual(
			[
				'ageMa',
				'axisDistanceKm',
				'depthHighM',
				'depthLowM',
				'depthM',
				'distanceKm',
				'lat',
				'lon',
				'swathWidthM'
			].sort()
		);
		expect(s.distanceKm).toBeCloseTo(100, 6);
		expect(s.axisDistanceKm).toBeCloseTo(100, 3);
		// [derived] SCIENCE.md §2: 100 km at a half rate of 12.5 mm/yr → 8.000 Myr
		expect(s.ageMa).toBeCloseTo(8, 3);
		// [published] Stein & Stein 1992: d = 2600 + 365·√t → 3632.4 m at 8 Myr
		expect(s.depthM).toBeCloseTo(2600 + 365 * Math.sqrt(8), 0);
		expect(s.depthLowM).toBeLessThanOrEqual(s.depthM);
		expect(s.depthHighM).toBeGreaterThanOrEqual(s.depthM);
		// [derived] SCIENCE.md §4: the default 120° swath is W/d = 2·tan 60° = 3.464
		expect(s.swathWidthM / s.depthM).toBeCloseTo(3.464, 3);
		expect(body.samples.at(-1).distanceKm).toBeCloseTo(body.lengthKm, 6);
	});

	it('caps a wide swath at 4 × depth', async () => {
		const body = await (await post({ ...valid, swathAngleDeg: 130 })).json();
		// [derived] SCIENCE.md §4: 2·tan 65° = 4.289 > k = 4 (trade default), so W = 4·d
		expect(body.samples[10].swathWidthM).toBeCloseTo(4 * body.samples[10].depthM, 3);
	});

	it('echoes the model asked for', async () => {
		const body = await (await post({ ...valid, model: 'parsons-sclater-1977' })).json();
		expect(body.model).toBe('parsons-sclater-1977');
		// [published] Parsons & Sclater 1977: d = 2500 + 350·√t
		expect(body.samples[10].depthM).toBeCloseTo(2500 + 350 * Math.sqrt(8), 0);
	});

	it('401 without credentials, in the JSON error shape', async () => {
		const res = await post(valid, false);
		expect(res.status).toBe(401);
		expect((await res.json()).error.code).toBe('unauthenticated');
	});

	it('400 for malformed JSON', async () => {
		const res = await post('{"line": ');
		expect(res.status).toBe(400);
		expect((await res.json()).error.code).toBe('bad_json');
	});

	const cases: [string, unknown, RegExp][] = [
		[
			'a latitude outside ±90',
			{
				...valid,
				line: {
					type: 'LineString',
					coordinates: [
						[0, 0],
						[10, 95]
					]
				}
			},
			/^line\.coordinates\.1/
		],
		[
			'fewer than two positions',
			{ ...valid, line: { type: 'LineString', coordinates: [[0, 0]] } },
			/^line\.coordinates/
		],
		[
			'a zero rate',
			{ ...valid, ridge: { ...valid.ridge, fullRateMmYr: 0 } },
			/^ridge\.fullRateMmYr/
		],
		[
			'a negative rate',
			{ ...valid, ridge: { ...valid.ridge, fullRateMmYr: -5 } },
			/^ridge\.fullRateMmYr/
		],
		[
			'a non-finite number',
			`{"line":{"type":"LineString","coordinates":[[0,0],[1e999,0]]},"ridge":{"axis":{"type":"LineString","coordinates":[[0,-1],[0,1]]},"fullRateMmYr":25}}`,
			/^line\.coordinates\.1/
		],
		[
			'more than 200 000 samples',
			{
				...valid,
				line: {
					type: 'LineString',
					coordinates: [
						[0, 0],
						[18, 0]
					]
				},
				spacingKm: 0.001
			},
			/^spacingKm/
		]
	];
	for (const [what, body, field] of cases) {
		it(`422 naming the field for ${what}`, async () => {
			const res = await post(body);
			expect(res.status).toBe(422);
			const err = (await res.json()).error;
			expect(err.details[0].field).toMatch(field);
			expect(err.message.length).toBeGreaterThan(10);
		});
	}

	it('says when a position looks swapped', async () => {
		const res = await post({
			...valid,
			line: {
				type: 'LineString',
				coordinates: [
					[0, 0],
					[45, 120]
				]
			}
		});
		expect((await res.json()).error.message).toMatch(/swapped/);
	});
});
