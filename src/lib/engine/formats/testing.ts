/**
 * Test support shared by the format specs: a seeded random source (so property tests are
 * reproducible) and plan fixtures that exercise every field.
 */
import { Geodesic } from '../geographiclib';
import type { LonLat, PlanDoc } from './types';

/** Seeded PRNG (mulberry32), uniform in [0, 1). */
export function mulberry32(seed: number): () => number {
	let a = seed >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

/** Geodesic length of a path on WGS84 in km [reference library: GeographicLib]. */
export function pathLengthKm(coords: LonLat[]): number {
	let m = 0;
	for (let i = 1; i < coords.length; i++) {
		const [lon1, lat1] = coords[i - 1];
		const [lon2, lat2] = coords[i];
		m += Geodesic.WGS84.Inverse(lat1, lon1, lat2, lon2).s12 ?? Number.NaN;
	}
	return m / 1000;
}

/** A fictitious plan touching every field, with names that need escaping in every format. */
export function samplePlan(): PlanDoc {
	return {
		name: 'WL-27/3 Leg 2 — Ægir "North" & <South>',
		ridges: [
			{
				id: 'r1',
				name: 'Segment A',
				axis: [
					[-31.5, 52.1],
					[-31.2, 52.6],
					[-30.9, 53.05]
				],
				fullRateMmYr: 22.5,
				asymmetry: 0.45,
				potentialTemperatureC: 1360,
				axialDepthM: 2450
			},
			{
				name: 'Segment B, north',
				axis: [
					[-30.4, 53.3],
					[-30.1, 53.8]
				],
				fullRateMmYr: 20,
				potentialTemperatureC: null,
				axialDepthM: null
			}
		],
		lines: [
			{
				id: 'l1',
				name: 'Line 01',
				coords: [
					[-31.9, 52.2],
					[-31.1, 52.35],
					[-30.3, 52.5]
				],
				purpose: 'multibeam',
				surveySpeedKn: 8.5,
				overlapPct: 30,
				ihoOrder: '2',
				computed: { lengthKm: 111.123456789, durationH: 7.06, minDepthM: 2400.5, maxDepthM: 3850 },
				plannedStart: '2027-03-02T06:00:00Z',
				plannedEnd: '2027-03-02T13:03:36Z'
			},
			{
				name: 'Mag tie, "B"',
				coords: [
					[-31.6, 52.9],
					[-30.7, 52.7]
				],
				purpose: 'magnetics',
				surveySpeedKn: 10,
				overlapPct: 0,
				ihoOrder: '1b'
			}
		],
		areas: [
			{
				id: 'a1',
				name: 'Box 1',
				ring: [
					[-31.0, 52.8],
					[-30.5, 52.8],
					[-30.5, 53.1],
					[-31.0, 53.1]
				],
				overlapPct: 40,
				surveySpeedKn: 9
			}
		],
		stations: [
			{
				id: 's1',
				name: 'CTD 1',
				kind: 'ctd',
				position: [-31.25, 52.4],
				params: { maxWireM: 3000, bottles: 24, note: 'yo-yo; "deep"' },
				computed: { depthM: 2900.25, durationH: 2.75 },
				plannedStart: '2027-03-02T14:00:00Z',
				plannedEnd: '2027-03-02T16:45:00Z'
			},
			{
				name: 'D-2 <wall>',
				kind: 'dredge',
				position: [-30.95, 52.65],
				params: {}
			},
			{
				id: 's3',
				name: 'Core 3',
				kind: 'core',
				position: [-0.0000001, -0.5],
				params: { lengthM: 6 }
			},
			{
				id: 's4',
				name: 'Dive 4',
				kind: 'dive',
				position: [-30.61, 52.88],
				params: { vehicle: 'ROV' }
			}
		],
		order: [
			{ kind: 'line', index: 0 },
			{ kind: 'station', index: 0 },
			{ kind: 'station', index: 1 },
			{ kind: 'line', index: 1 },
			{ kind: 'station', index: 2 },
			{ kind: 'station', index: 3 }
		]
	};
}

/** A line and an area across the antimeridian: 179.5°E → 179.5°W is about 111 km, not 40 000. */
export function antimeridianPlan(): PlanDoc {
	return {
		name: 'Antimeridian test',
		ridges: [
			{
				name: 'Dateline ridge',
				axis: [
					[179.2, -20.5],
					[-179.7, -19.5]
				],
				fullRateMmYr: 60
			}
		],
		lines: [
			{
				name: 'Across 180',
				coords: [
					[179.5, -20],
					[-179.5, -20]
				],
				purpose: 'multibeam',
				surveySpeedKn: 9,
				overlapPct: 30,
				ihoOrder: '2'
			},
			{
				name: 'Zigzag',
				coords: [
					[179.8, -21],
					[-179.8, -21.1],
					[179.9, -21.2],
					[-179.9, -21.3]
				],
				purpose: 'gravity',
				surveySpeedKn: 9,
				overlapPct: 30,
				ihoOrder: '2'
			}
		],
		areas: [
			{
				name: 'Box across 180',
				ring: [
					[179.6, -22],
					[-179.6, -22],
					[-179.6, -21.5],
					[179.6, -21.5]
				],
				overlapPct: 30,
				surveySpeedKn: 9
			},
			{
				name: 'Box starting east',
				ring: [
					[-179.6, -23],
					[-179.6, -22.5],
					[179.6, -22.5],
					[179.6, -23]
				],
				overlapPct: 30,
				surveySpeedKn: 9
			}
		],
		stations: [{ name: 'CTD east', kind: 'ctd', position: [-179.9, -20.1], params: {} }]
	};
}

export interface XmlElementLike {
	local: string;
	children: XmlElementLike[];
}

/**
 * Order and multiplicity problems of an element's children against an XSD <sequence>: each
 * child must appear in sequence order, and names not in `repeatable` at most once.
 */
export function sequenceViolations(
	node: XmlElementLike,
	sequence: string[],
	repeatable: string[] = []
): string[] {
	const problems: string[] = [];
	let last = -1;
	const seen = new Set<string>();
	for (const c of node.children) {
		const at = sequence.indexOf(c.local);
		if (at < 0) problems.push(`<${c.local}> is not allowed in <${node.local}>`);
		else if (at < last)
			problems.push(`<${c.local}> comes after <${sequence[last]}> in <${node.local}>`);
		else last = at;
		if (seen.has(c.local) && !repeatable.includes(c.local)) {
			problems.push(`<${c.local}> repeated in <${node.local}>`);
		}
		seen.add(c.local);
	}
	return problems;
}

/**
 * The plan as a CSV export carries it: positions to 0.000001°, depths to 1 m, durations to 0.01 h,
 * lengths to 0.01 km (the rounding rule of the CSV writer, applied here by hand) [derived].
 */
export function roundedAsCsv(plan: PlanDoc): PlanDoc {
	const r = (x: number, n: number) => Number(x.toFixed(n)) || 0;
	const pos = ([lon, lat]: [number, number]): [number, number] => [r(lon, 6), r(lat, 6)];
	return {
		...plan,
		lines: plan.lines.map((l) => ({
			...l,
			coords: l.coords.map(pos),
			...(l.computed
				? {
						computed: {
							lengthKm: r(l.computed.lengthKm, 2),
							durationH: r(l.computed.durationH, 2),
							minDepthM: r(l.computed.minDepthM, 0),
							maxDepthM: r(l.computed.maxDepthM, 0)
						}
					}
				: {})
		})),
		stations: plan.stations.map((s) => ({
			...s,
			position: pos(s.position),
			...(s.computed
				? { computed: { depthM: r(s.computed.depthM, 0), durationH: r(s.computed.durationH, 2) } }
				: {})
		}))
	};
}
