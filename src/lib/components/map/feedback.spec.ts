import { describe, expect, it } from 'vitest';
import {
	depthProfileForRidges,
	hoursAt,
	RidgeDepthModel,
	stationHours,
	tvuMaxM
} from '$lib/engine';
import {
	depthLayer,
	depthModelOf,
	FALLBACK_VESSEL,
	generateSurvey,
	lineFeedback,
	ridgeInputs,
	stationFeedback,
	stationSettings,
	swathFootprint,
	workArea
} from './feedback';
import type { PlanFeature } from './types';

// An invented ridge like the demo's: a north–south axis near 146°W, 38 mm/yr full rate.
const ridge: PlanFeature = {
	type: 'Feature',
	id: 'r1',
	properties: {
		kind: 'ridge',
		name: 'Axis',
		fullRateMmYr: 38,
		asymmetry: 0.5,
		potentialTemperatureC: null,
		axialDepthM: 2750
	},
	geometry: {
		type: 'LineString',
		coordinates: [
			[-146, -29],
			[-146, -31]
		]
	}
};
const across = [
	[-146.75, -30],
	[-145.25, -30]
];

describe('ridgeInputs', () => {
	it('takes saved ridges and a ridge being drawn, not the one being replaced', () => {
		expect(ridgeInputs([ridge])).toEqual([
			{
				axis: ridge.geometry.coordinates,
				fullRateMmYr: 38,
				asymmetry: 0.5,
				potentialTemperatureC: undefined,
				axialDepthM: 2750
			}
		]);
		const draft = {
			key: 1,
			kind: 'ridge' as const,
			featureId: 'r1',
			origin: 'saved' as const,
			geometry: ridge.geometry
		};
		const form = {
			name: 'Axis',
			fullRateMmYr: 20,
			asymmetry: 0.5,
			potentialTemperatureC: null,
			axialDepthM: null,
			purpose: 'multibeam' as const,
			surveySpeedKn: 8,
			overlapPct: 30,
			ihoOrder: '2' as const,
			stationKind: 'ctd' as const,
			params: {}
		};
		const r = ridgeInputs([ridge], draft, form);
		expect(r).toHaveLength(1);
		expect(r[0].fullRateMmYr).toBe(20);
		expect(depthModelOf('half-space')).toBe('half-space');
		expect(depthModelOf('nonsense')).toBe('stein-stein-1992');
	});
});

describe('lineFeedback', () => {
	const ridges = ridgeInputs([ridge]);
	const r = lineFeedback(
		across,
		ridges,
		'stein-stein-1992',
		{ speedKn: 8, overlapPct: 30, ihoOrder: '2' },
		FALLBACK_VESSEL
	);

	it('gives the engine’s profile, with the axis anchored to its measured depth', () => {
		expect(r.ok).toBe(true);
		if (!r.ok) return;
		const v = r.value;
		const engine = depthProfileForRidges(across, ridges, { spacingKm: 0.5 });
		expect(v.lengthKm).toBeCloseTo(engine.lengthKm, 6);
		expect(v.lengthNm).toBeCloseTo(v.lengthKm / 1.852, 9);
		expect(v.hours).toBeCloseTo(hoursAt(v.lengthKm, 8), 9);
		expect(v.minDepthM).toBeCloseTo(2750, -1);
		expect(v.maxDepthM).toBeGreaterThan(v.minDepthM);
		expect(v.tvuDeepM).toBeCloseTo(tvuMaxM('2', v.maxDepthM), 9);
		// Profile starts west of the axis and ends east of it: old–young–old.
		expect(v.samples[0].ageMa).toBeGreaterThan(1);
		expect(v.minAgeMa).toBeLessThan(0.05);
	});

	it('shows symmetric polarity stripes about the axis, normal in the middle', () => {
		if (!r.ok) return;
		const mid = r.value.stripes.find((s) => s.fromKm < 72 && s.toKm > 72);
		expect(mid?.polarity).toBe('normal');
		expect(r.value.stripes.length).toBeGreaterThan(10);
	});

	it('finds coverage gaps with a neighbour run too far away, and none with a close one', () => {
		const far = [
			[-146.75, -30.12],
			[-145.25, -30.12]
		];
		const close = [
			[-146.75, -30.05],
			[-145.25, -30.05]
		];
		const g = lineFeedback(
			across,
			ridges,
			'stein-stein-1992',
			{ speedKn: 8, overlapPct: 30, ihoOrder: '2' },
			FALLBACK_VESSEL,
			[
				{ name: 'far', coords: far },
				{ name: 'close', coords: close },
				{
					name: 'elsewhere',
					coords: [
						[-140, -20],
						[-139, -20]
					]
				},
				{
					name: 'crossing',
					coords: [
						[-146.2, -29.8],
						[-146.2, -30.2]
					]
				}
			]
		);
		if (!g.ok) throw new Error(g.message);
		expect(g.value.gaps.map((x) => x.neighbour)).toEqual(['far', 'close']);
		expect(g.value.gaps[0].gaps.length).toBeGreaterThan(0);
		expect(g.value.gaps[1].gaps).toEqual([]);
	});

	it('says why nothing can be predicted without a ridge', () => {
		const none = lineFeedback(
			across,
			[],
			'stein-stein-1992',
			{ speedKn: 8, overlapPct: 30, ihoOrder: '2' },
			FALLBACK_VESSEL
		);
		expect(none).toEqual({ ok: false, message: 'Draw or import a ridge axis to predict depths.' });
	});
});

describe('swathFootprint', () => {
	it('is as wide as the swath across the line', () => {
		const p = depthProfileForRidges(across, ridgeInputs([ridge]), { spacingKm: 10 });
		const poly = swathFootprint(p.samples)!;
		const ring = poly.coordinates[0];
		expect(ring[0]).toEqual(ring.at(-1));
		expect(ring.length).toBe(2 * p.samples.length + 1);
	});
});

describe('stationFeedback', () => {
	it('uses the engine’s depth and duration with the station’s own settings', () => {
		const ridges = ridgeInputs([ridge]);
		const f = stationFeedback(
			[-145.5, -30],
			'ctd',
			{ bottleStops: 12 },
			ridges,
			'stein-stein-1992',
			FALLBACK_VESSEL
		);
		const d = new RidgeDepthModel(ridges).depthAt(-145.5, -30);
		expect(f.depthM).toBeCloseTo(d.depthM, 6);
		expect(f.hours).toBeCloseTo(
			stationHours('ctd', d.depthM, { winchSpeedMPerMin: 60, ctd: { bottleStops: 12 } }),
			9
		);
		const dive = stationFeedback(
			[-145.5, -30],
			'dive',
			{ blockH: 9 },
			[],
			'stein-stein-1992',
			FALLBACK_VESSEL
		);
		expect(dive).toMatchObject({ depthM: null, hours: 9 });
	});
	it('maps station parameters to the engine’s settings', () => {
		expect(stationSettings('dive', { vehicle: 'rov', blockH: 10 }, 45)).toEqual({
			winchSpeedMPerMin: 45,
			diveBlockH: 10,
			vehicle: 'rov'
		});
		expect(stationSettings('core', { coreType: 'gravity', bottomH: 0.5 }, 60)).toEqual({
			winchSpeedMPerMin: 60,
			core: { bottomH: 0.5 }
		});
	});
});

describe('depthLayer', () => {
	it('draws isobaths over the work area, shallow at the axis', () => {
		const area = workArea([
			[-146.75, -31],
			[-145.25, -29]
		]);
		expect(area[0][0]).toBeCloseTo(-147.25, 9);
		const layer = depthLayer(ridgeInputs([ridge]), 'stein-stein-1992', area, null, 60)!;
		expect(layer.range[0]).toBeGreaterThan(2700);
		expect(layer.levels.length).toBeGreaterThan(2);
		const iso = layer.features.features.filter((f) => f.properties?.kind === 'isobath');
		expect(iso.length).toBeGreaterThan(0);
		expect(depthLayer([], 'stein-stein-1992', area, null)).toBeNull();
	});
});

describe('generateSurvey', () => {
	it('lays parallel lines with their swaths over an area and times them', () => {
		const ring = [
			[-146.3, -29.9],
			[-145.7, -29.9],
			[-145.7, -30.1],
			[-146.3, -30.1],
			[-146.3, -29.9]
		];
		const g = generateSurvey(
			ring,
			ridgeInputs([ridge]),
			'stein-stein-1992',
			{ overlapPct: 30, speedKn: 8 },
			FALLBACK_VESSEL
		);
		if (!g.ok) throw new Error(g.message);
		expect(g.value.lines.length).toBeGreaterThan(1);
		expect(g.value.coverage).toHaveLength(g.value.lines.length);
		expect(g.value.plan.hours).toBeCloseTo(hoursAt(g.value.plan.totalKm, 8), 9);
	});
});
