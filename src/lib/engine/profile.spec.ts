import { describe, expect, it } from 'vitest';
import {
	EngineInputError,
	MAX_PROFILE_SAMPLES,
	RidgeDepthModel,
	depthGrid,
	depthProfile,
	depthProfileForRidges,
	type DepthProfileInput
} from './profile';
import { depthGdh1, depthHalfSpace, depthParsonsSclater, predictDepth } from './depth';
import { direct, distanceM, type LonLat } from './geodesy';
import { airyShiftFromPotentialTemperatureM } from './melt';
import { swathWidthM } from './survey';

// a north-trending axis at 30°W and a 200 km line across it along 10°N
const axis: LonLat[] = [
	[-30, 9],
	[-30, 11]
];
const west = direct([-30, 10], 270, 100e3);
const east = direct([-30, 10], 90, 100e3);
const base: DepthProfileInput = {
	line: {
		type: 'LineString',
		coordinates: [
			[west.lon, west.lat],
			[east.lon, east.lat]
		]
	},
	ridge: { axis: { coordinates: axis }, fullRateMmYr: 25 }
};

function fieldOf(f: () => unknown): string | undefined {
	try {
		f();
	} catch (e) {
		if (e instanceof EngineInputError) return e.field;
		throw e;
	}
	return undefined;
}

describe('depthProfile (POST /api/v1/depth-profile)', () => {
	it('answers samples at the start, every spacingKm and the end, with the documented fields', () => {
		const r = depthProfile({ ...base, spacingKm: 3 });
		expect(r.model).toBe('stein-stein-1992');
		expect(Math.abs(r.lengthKm - 200)).toBeLessThan(1e-6);
		// [derived] 200 km every 3 km: 0, 3, …, 198 and the end at 200 → 68 samples
		expect(r.samples.length).toBe(68);
		expect(Object.keys(r.samples[0]).sort()).toEqual(
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
		expect(r.samples[0].distanceKm).toBe(0);
		expect(r.samples[1].distanceKm).toBeCloseTo(3, 12);
		expect(r.samples[67].distanceKm).toBeCloseTo(200, 9);
		expect(distanceM([r.samples[67].lon, r.samples[67].lat], [east.lon, east.lat])).toBeLessThan(
			1e-3
		);
	});

	it('computes age and GDH1 depth from the geodesic distance to the axis', () => {
		const r = depthProfile(base);
		for (const s of r.samples) {
			// [derived] t = x/u with u = 12.5 mm/yr; x is the distance to the meridian axis
			expect(s.ageMa).toBeCloseTo(s.axisDistanceKm / 12.5, 9);
			expect(s.depthM).toBeCloseTo(depthGdh1(s.ageMa), 6);
			expect(s.depthLowM).toBeLessThanOrEqual(s.depthM);
			expect(s.depthHighM).toBeGreaterThanOrEqual(s.depthM);
			expect(s.swathWidthM).toBeCloseTo(swathWidthM(s.depthM, 120), 6);
		}
		// [derived] the line's end is 100 km from the axis along 10°N (a geodesic perpendicular
		// to the meridian): 100 km / 12.5 mm/yr = 8 Myr
		const last = r.samples[r.samples.length - 1];
		expect(Math.abs(last.axisDistanceKm - 100)).toBeLessThan(0.5);
		expect(r.samples[100].axisDistanceKm).toBeLessThan(1e-6);
		expect(r.samples[100].depthM).toBeCloseTo(2600, 3);
	});

	it('grows age away from the axis on each flank and honours asymmetry', () => {
		const r = depthProfile({ ...base, ridge: { ...base.ridge, asymmetry: 0.7 } });
		const s = r.samples;
		for (let i = 1; i <= 100; i++) expect(s[i].ageMa).toBeLessThan(s[i - 1].ageMa);
		for (let i = 101; i < s.length; i++) expect(s[i].ageMa).toBeGreaterThan(s[i - 1].ageMa);
		// west of a north-going axis is the left flank: u = 0.7·25 = 17.5 mm/yr
		expect(s[0].ageMa).toBeCloseTo(s[0].axisDistanceKm / 17.5, 9);
		expect(s[200].ageMa).toBeCloseTo(s[200].axisDistanceKm / 7.5, 9);
	});

	it('echoes and applies the chosen model', () => {
		for (const [model, f] of [
			['parsons-sclater-1977', depthParsonsSclater],
			['half-space', (t: number) => depthHalfSpace(t)]
		] as const) {
			const r = depthProfile({ ...base, model, spacingKm: 10 });
			expect(r.model).toBe(model);
			for (const s of r.samples) expect(s.depthM).toBeCloseTo(f(s.ageMa), 6);
		}
	});

	it('anchors to a measured axial depth, which wins over the potential temperature', () => {
		const r = depthProfile({
			...base,
			ridge: { ...base.ridge, axialDepthM: 3200, potentialTemperatureC: 1450 }
		});
		const onAxis = r.samples[100];
		expect(onAxis.depthM).toBeCloseTo(3200, 3);
		const p = predictDepth(r.samples[0].ageMa, 'stein-stein-1992', { axialDepthM: 3200 });
		expect(r.samples[0].depthM).toBeCloseTo(p.depthM, 6);
		expect(r.samples[0].depthLowM).toBeCloseTo(p.lowM, 6);
	});

	it('shifts the curve by the Airy effect of an entered potential temperature', () => {
		const plain = depthProfile({ ...base, spacingKm: 20 });
		const hot = depthProfile({
			...base,
			spacingKm: 20,
			ridge: { ...base.ridge, potentialTemperatureC: 1450 }
		});
		const shift = airyShiftFromPotentialTemperatureM(1450);
		expect(shift).toBeLessThan(-1500); // 18 km of crust: about 1.9 km shallower
		hot.samples.forEach((s, i) => {
			expect(s.depthM - plain.samples[i].depthM).toBeCloseTo(shift, 6);
			expect(s.depthHighM - plain.samples[i].depthHighM).toBeCloseTo(shift, 6);
		});
	});

	it('works across the antimeridian', () => {
		const r = depthProfile({
			line: {
				coordinates: [
					[179.5, -20],
					[-179.5, -20]
				]
			},
			ridge: {
				axis: {
					coordinates: [
						[180, -22],
						[180, -18]
					]
				},
				fullRateMmYr: 60
			},
			spacingKm: 5
		});
		expect(Math.abs(r.lengthKm - distanceM([0.5, -20], [1.5, -20]) / 1000)).toBeLessThan(1e-6);
		for (const s of r.samples) {
			expect(s.lon >= -180 && s.lon < 180).toBe(true);
			expect(Math.abs(s.lon)).toBeGreaterThan(179.4);
			expect(s.axisDistanceKm).toBeLessThan(53);
		}
		const mid = r.samples.reduce((m, s) => (s.ageMa < m.ageMa ? s : m));
		expect(Math.abs(mid.distanceKm - r.lengthKm / 2)).toBeLessThan(5.1);
	});

	it('answers typed errors naming the field', () => {
		// more than 200 000 samples
		expect(fieldOf(() => depthProfile({ ...base, spacingKm: 0.0009 }))).toBe('spacingKm');
		expect(200 / 0.0009).toBeGreaterThan(MAX_PROFILE_SAMPLES);
		expect(fieldOf(() => depthProfile({ ...base, spacingKm: 0 }))).toBe('spacingKm');
		expect(fieldOf(() => depthProfile({ ...base, swathAngleDeg: 190 }))).toBe('swathAngleDeg');
		expect(
			fieldOf(() => depthProfile({ ...base, ridge: { ...base.ridge, fullRateMmYr: 0 } }))
		).toBe('ridge.fullRateMmYr');
		expect(fieldOf(() => depthProfile({ ...base, ridge: { ...base.ridge, asymmetry: 2 } }))).toBe(
			'ridge.asymmetry'
		);
		expect(
			fieldOf(() =>
				depthProfile({ ...base, ridge: { ...base.ridge, potentialTemperatureC: 1700 } })
			)
		).toBe('ridge.potentialTemperatureC');
		expect(
			fieldOf(() =>
				depthProfile({ ...base, ridge: { ...base.ridge, axis: { coordinates: [[-30, 9]] } } })
			)
		).toBe('ridge.axis.coordinates');
		expect(
			fieldOf(() =>
				depthProfile({
					...base,
					ridge: {
						...base.ridge,
						axis: {
							coordinates: [
								[-30, 9],
								[-30, 9]
							]
						}
					}
				})
			)
		).toBe('ridge.axis.coordinates.1');
		expect(
			fieldOf(() => depthProfile({ ...base, model: 'plate' as unknown as 'half-space' }))
		).toBe('model');
		// swapped [lat, lon]
		try {
			depthProfile({
				...base,
				line: {
					coordinates: [
						[10, -130],
						[10.5, -130]
					]
				}
			});
			expect.unreachable();
		} catch (e) {
			expect(e).toBeInstanceOf(EngineInputError);
			expect((e as EngineInputError).field).toBe('line.coordinates.0');
			expect((e as EngineInputError).message).toMatch(/swapped/);
		}
	});
});

describe('several ridge segments', () => {
	it('steps in age and depth across a fracture zone', () => {
		const ridges = [
			{
				axis: [
					[-44.4, 26.0],
					[-44.4, 27.0]
				] as LonLat[],
				fullRateMmYr: 24
			},
			{
				axis: [
					[-45.0, 25.0],
					[-45.0, 26.0]
				] as LonLat[],
				fullRateMmYr: 24,
				axialDepthM: 3600
			}
		];
		const r = depthProfileForRidges(
			[
				[-42.9, 26.6],
				[-42.9, 25.4]
			],
			ridges,
			{ spacingKm: 1 }
		);
		let step = 0;
		for (let i = 1; i < r.samples.length; i++) {
			step = Math.max(step, r.samples[i].depthM - r.samples[i - 1].depthM);
		}
		// older floor south of the fracture zone and a deeper anchored segment: a step of hundreds of metres
		expect(step).toBeGreaterThan(300);
		const depth = new RidgeDepthModel(ridges);
		expect(depth.depthAt(-45.0, 25.5).depthM).toBeCloseTo(3600, 3);
		expect(depth.depthAt(-44.4, 26.5).depthM).toBeCloseTo(2600, 3);
	});
});

describe('depthGrid', () => {
	const ridges = [{ axis, fullRateMmYr: 25 }];

	it('fills an nx × ny grid in image order, north row first', () => {
		const g = depthGrid([-31, 9.5, -29, 10.5], 5, 3, ridges);
		expect(g).toBeInstanceOf(Float32Array);
		expect(g.length).toBe(15);
		const model = new RidgeDepthModel(ridges);
		// row 0 is the north edge, column 0 the west edge
		expect(g[0]).toBeCloseTo(model.depthAt(-31, 10.5).depthM, 0);
		expect(g[2]).toBeCloseTo(2600, 0);
		expect(g[14]).toBeCloseTo(model.depthAt(-29, 9.5).depthM, 0);
		// symmetric about the axis
		expect(g[5]).toBeCloseTo(g[9], 0);
	});

	it('crosses the antimeridian when west > east', () => {
		const g = depthGrid([179, -1, -179, 1], 3, 2, [
			{
				axis: [
					[180, -5],
					[180, 5]
				],
				fullRateMmYr: 100
			}
		]);
		// the middle column is on the axis at 180°
		expect(g[1]).toBeCloseTo(2600, 0);
		expect(g[0]).toBeCloseTo(g[2], 0);
		expect(g[0]).toBeGreaterThan(2600);
	});

	it('rejects bad grids', () => {
		expect(() => depthGrid([-31, 9, -29, 11], 1, 5, ridges)).toThrow(EngineInputError);
		expect(() => depthGrid([-31, 11, -29, 9], 5, 5, ridges)).toThrow(EngineInputError);
	});
});
