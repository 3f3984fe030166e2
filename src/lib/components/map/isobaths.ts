// Isobaths and depth shading from a regular grid of predicted depths, traced with d3-contour
// (marching squares). The grid comes from the engine; this file only turns it into map features.
import { contours } from 'd3-contour';
import type { Feature, FeatureCollection, LineString, MultiPolygon, Position } from 'geojson';

/** A regular lon/lat grid: value (i, j) at (lon0 + i·dLon, lat0 + j·dLat), stored at j·nx + i. */
export interface GridSpec {
	lon0: number;
	lat0: number;
	dLon: number;
	dLat: number;
	nx: number;
	ny: number;
	/** Depth in metres, positive down; NaN where unknown. */
	values: ArrayLike<number>;
}

export interface DepthFeatureProps {
	kind: 'shade' | 'isobath';
	depthM: number;
	major: boolean;
	label: string;
}

const STEPS = [50, 100, 200, 250, 500, 1000];

/** Contour depths at a round step giving at most `maxLevels` levels over [min, max]. */
export function isobathLevels(
	minM: number,
	maxM: number,
	maxLevels = 12
): { levels: number[]; step: number; majorStep: number } {
	if (!(maxM > minM)) return { levels: [], step: 0, majorStep: 0 };
	const step =
		STEPS.find((s) => (maxM - minM) / s <= maxLevels) ??
		1000 * Math.ceil((maxM - minM) / maxLevels / 1000);
	// Label whole kilometres where the step divides them, else every fifth isobath.
	const majorStep = step >= 200 && 1000 % step === 0 ? 1000 : step * 5;
	const levels: number[] = [];
	for (let d = Math.ceil(minM / step) * step; d <= maxM; d += step) {
		if (d > minM) levels.push(d);
	}
	return { levels, step, majorStep };
}

/** Grid coordinates from d3-contour (value (i, j) sits at (i + ½, j + ½)) to lon/lat. */
function toLonLat(g: GridSpec, p: Position): Position {
	const x = Math.min(Math.max(p[0] - 0.5, 0), g.nx - 1);
	const y = Math.min(Math.max(p[1] - 0.5, 0), g.ny - 1);
	return [g.lon0 + x * g.dLon, g.lat0 + y * g.dLat];
}

function onBorder(g: GridSpec, p: Position): boolean {
	return p[0] <= 0 || p[1] <= 0 || p[0] >= g.nx || p[1] >= g.ny;
}

/** The parts of a closed contour ring that are real isobaths (not the grid's edge). */
function interiorRuns(g: GridSpec, ring: Position[]): Position[][] {
	const pts = ring.slice(0, -1);
	const n = pts.length;
	const startAt = pts.findIndex((p) => onBorder(g, p));
	if (startAt < 0) return [ring];
	const runs: Position[][] = [];
	let run: Position[] = [];
	for (let k = 1; k <= n; k++) {
		const p = pts[(startAt + k) % n];
		if (onBorder(g, p)) {
			if (run.length > 1) runs.push(run);
			run = [];
		} else run.push(p);
	}
	if (run.length > 1) runs.push(run);
	return runs;
}

/**
 * Shade polygons (area deeper than each level) and isobath lines, in lon/lat, ready for the map.
 * Polygons come in increasing depth so deeper shades are drawn over shallower ones.
 */
export function depthFeatures(
	g: GridSpec,
	levels: readonly number[],
	majorStep: number
): FeatureCollection<MultiPolygon | LineString, DepthFeatureProps> {
	const values = Array.from(g.values, (v) => (Number.isFinite(v) ? v : Number.NaN));
	const polys = contours().size([g.nx, g.ny]).thresholds(levels.slice())(values);
	const features: Feature<MultiPolygon | LineString, DepthFeatureProps>[] = [];
	for (const c of polys) {
		const depthM = c.value;
		const major = majorStep > 0 && depthM % majorStep === 0;
		const props = { depthM, major, label: `${depthM} m` };
		if (c.coordinates.length === 0) continue;
		features.push({
			type: 'Feature',
			properties: { kind: 'shade', ...props },
			geometry: {
				type: 'MultiPolygon',
				coordinates: c.coordinates.map((poly) =>
					poly.map((ring) => ring.map((p) => toLonLat(g, p)))
				)
			}
		});
		for (const poly of c.coordinates) {
			for (const ring of poly) {
				for (const run of interiorRuns(g, ring)) {
					features.push({
						type: 'Feature',
						properties: { kind: 'isobath', ...props },
						geometry: { type: 'LineString', coordinates: run.map((p) => toLonLat(g, p)) }
					});
				}
			}
		}
	}
	return { type: 'FeatureCollection', features };
}

/** Smallest and largest finite value of the grid. */
export function gridRange(g: GridSpec): [number, number] | null {
	let lo = Number.POSITIVE_INFINITY;
	let hi = Number.NEGATIVE_INFINITY;
	for (let k = 0; k < g.values.length; k++) {
		const v = g.values[k];
		if (!Number.isFinite(v)) continue;
		if (v < lo) lo = v;
		if (v > hi) hi = v;
	}
	return lo <= hi ? [lo, hi] : null;
}
