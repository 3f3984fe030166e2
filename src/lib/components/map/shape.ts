// Shaping the plan for the map: longitudes made continuous so a line across the antimeridian is
// drawn the short way, long segments bent along their geodesic, and a few flat properties the
// style reads. Geometry in the plan itself stays normalised to [−180, 180).
import type { Feature, FeatureCollection, Geometry, LineString, Point, Polygon } from 'geojson';
import { distanceM, normalizeLon, sampleLine } from '$lib/engine/geodesy';
import type { Draft, PlanFeature, PlanKind } from './types';

export interface DisplayProps {
	id: string;
	kind: PlanKind;
	name: string;
	/** Purpose of a line or kind of a station: the style colours by it. */
	sub: string;
	selected: boolean;
}

/** Segments longer than this are drawn through points on their geodesic. */
const BEND_ABOVE_M = 20_000;
/** At most this many points per bent segment. */
const BEND_POINTS = 64;

/** Each step the short way round (|Δλ| ≤ 180°), starting from the first longitude as given. */
export function unwrapPath(coords: readonly number[][], start = coords[0]?.[0] ?? 0): number[][] {
	const out: number[][] = [];
	let prev = start;
	for (let i = 0; i < coords.length; i++) {
		// The copy of this longitude (±360°·k) nearest the previous one; exact for stored values.
		const raw = coords[i][0];
		const lon = i === 0 ? start : raw + 360 * Math.round((prev - raw) / 360);
		out.push([lon, coords[i][1]]);
		prev = lon;
	}
	return out;
}

/** The path with long segments replaced by points along their WGS84 geodesic (ends kept exactly). */
export function bendPath(coords: readonly number[][]): number[][] {
	if (coords.length < 2) return coords.map((c) => [c[0], c[1]]);
	const out: number[][] = [[coords[0][0], coords[0][1]]];
	for (let i = 1; i < coords.length; i++) {
		const a = coords[i - 1];
		const b = coords[i];
		const lengthM = distanceM(a, b);
		if (lengthM > BEND_ABOVE_M) {
			const n = Math.min(BEND_POINTS, Math.ceil(lengthM / BEND_ABOVE_M));
			const inner = sampleLine([a, b], lengthM / n);
			for (let k = 1; k < inner.count - 1; k++) out.push([inner.lon[k], inner.lat[k]]);
		}
		out.push([b[0], b[1]]);
	}
	return out;
}

function displayGeometry(g: Geometry): Geometry {
	switch (g.type) {
		case 'LineString':
			return { type: 'LineString', coordinates: unwrapPath(bendPath(g.coordinates)) };
		case 'Polygon':
			return {
				type: 'Polygon',
				coordinates: g.coordinates.map((ring) => unwrapPath(bendPath(ring)))
			};
		case 'Point':
			return { type: 'Point', coordinates: [normalizeLon(g.coordinates[0]), g.coordinates[1]] };
		default:
			return g;
	}
}

function subOf(f: PlanFeature): string {
	if (f.properties.kind === 'line') return f.properties.purpose;
	if (f.properties.kind === 'station') return f.properties.stationKind;
	return f.properties.kind;
}

/** The saved plan as the map draws it. */
export function displayPlan(
	features: readonly PlanFeature[],
	selectedId: string | null = null,
	hiddenId: string | null = null
): FeatureCollection<Geometry, DisplayProps> {
	return {
		type: 'FeatureCollection',
		features: features
			.filter((f) => f.id !== hiddenId)
			.map((f) => ({
				type: 'Feature',
				id: undefined,
				properties: {
					id: f.id,
					kind: f.properties.kind,
					name: f.properties.name,
					sub: subOf(f),
					selected: f.id === selectedId
				},
				geometry: displayGeometry(f.geometry)
			}))
	};
}

/**
 * A draft (drawn, typed or generated geometry not yet saved) as the map draws it, with lines
 * offered for review and swath footprints (coverage).
 */
export function displayDraft(
	draft: Pick<Draft, 'kind' | 'geometry'> | null,
	extra: readonly (LineString | Polygon | Point)[] = [],
	swaths: readonly Polygon[] = []
): FeatureCollection<Geometry, { kind: PlanKind | 'preview' | 'swath' }> {
	const features: Feature<Geometry, { kind: PlanKind | 'preview' | 'swath' }>[] = [];
	for (const g of swaths) {
		features.push({ type: 'Feature', properties: { kind: 'swath' }, geometry: displayGeometry(g) });
	}
	if (draft) {
		features.push({
			type: 'Feature',
			properties: { kind: draft.kind },
			geometry: displayGeometry(draft.geometry)
		});
	}
	for (const g of extra) {
		features.push({
			type: 'Feature',
			properties: { kind: 'preview' },
			geometry: displayGeometry(g)
		});
	}
	return { type: 'FeatureCollection', features };
}

export type Bounds = [[number, number], [number, number]];

/**
 * The smallest box holding every position, as [[west, south], [east, north]] with east > west
 * possibly past 180 when the box straddles the antimeridian (found from the widest empty gap
 * of longitudes around the circle). Null when there is nothing to hold.
 */
export function boundsOf(geometries: readonly Geometry[]): Bounds | null {
	const lons: number[] = [];
	let south = 90;
	let north = -90;
	const add = (c: number[]) => {
		lons.push(normalizeLon(c[0]));
		south = Math.min(south, c[1]);
		north = Math.max(north, c[1]);
	};
	for (const g of geometries) {
		if (g.type === 'Point') add(g.coordinates);
		else if (g.type === 'LineString' || g.type === 'MultiPoint') g.coordinates.forEach(add);
		else if (g.type === 'Polygon' || g.type === 'MultiLineString')
			g.coordinates.forEach((r) => r.forEach(add));
		else if (g.type === 'MultiPolygon')
			g.coordinates.forEach((p) => p.forEach((r) => r.forEach(add)));
	}
	if (lons.length === 0) return null;
	lons.sort((a, b) => a - b);
	// The widest gap between neighbouring longitudes (the wrap-around gap included) is outside.
	let gap = lons[0] + 360 - lons[lons.length - 1];
	let west = lons[0];
	let east = lons[lons.length - 1];
	for (let i = 1; i < lons.length; i++) {
		const g = lons[i] - lons[i - 1];
		if (g > gap) {
			gap = g;
			west = lons[i];
			east = lons[i - 1] + 360;
		}
	}
	return [
		[west, south],
		[east, north]
	];
}

/** Geometry as the plan stores it: longitudes back in [−180, 180). */
export function normalizeGeometry<G extends LineString | Polygon | Point>(g: G): G {
	const n = (c: number[]) => [normalizeLon(c[0]), c[1]];
	if (g.type === 'Point') return { ...g, coordinates: n(g.coordinates) };
	if (g.type === 'LineString') return { ...g, coordinates: g.coordinates.map(n) };
	return { ...g, coordinates: (g as Polygon).coordinates.map((r) => r.map(n)) } as G;
}
