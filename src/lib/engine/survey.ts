/**
 * Multibeam coverage: swath width, line spacing, coverage gaps between lines and depth-adaptive
 * parallel line plans over an area (SCIENCE.md §4).
 */
import { LocalProjection, PolylineIndex, distanceM, type LonLat } from './geodesy';
import { hoursAt } from './time';

/** Effective width factor k: outer beams are lost in deep water, so W ≤ k·d [trade]. */
export const DEFAULT_WIDTH_FACTOR = 4;
export const DEFAULT_SWATH_ANGLE_DEG = 120;
/** Overlap guidance (Lucieer et al. 2018, AusSeabed multibeam field manual). */
export const OVERLAP_BASELINE = 0.3;
export const OVERLAP_MONITORING = 0.6;

function checkAngle(deg: number): void {
	if (!(deg > 0 && deg < 180)) throw new RangeError('swath angle must be within (0, 180) degrees');
}

/** Flat-seafloor swath over depth: W/d = 2·tan(θ/2). */
export function flatSwathRatio(swathAngleDeg: number): number {
	checkAngle(swathAngleDeg);
	return 2 * Math.tan((swathAngleDeg * Math.PI) / 360);
}

/** Effective swath width W_eff = min(2·d·tan(θ/2), k·d) in metres. */
export function swathWidthM(
	depthM: number,
	swathAngleDeg = DEFAULT_SWATH_ANGLE_DEG,
	widthFactor = DEFAULT_WIDTH_FACTOR
): number {
	return Math.max(0, depthM) * Math.min(flatSwathRatio(swathAngleDeg), widthFactor);
}

/** Line spacing S = W_eff·(1 − p) from the shallowest depth under the swath. */
export function lineSpacingM(
	shallowestDepthM: number,
	overlap = OVERLAP_BASELINE,
	swathAngleDeg = DEFAULT_SWATH_ANGLE_DEG,
	widthFactor = DEFAULT_WIDTH_FACTOR
): number {
	if (!(overlap >= 0 && overlap < 1)) throw new RangeError('overlap must be within [0, 1)');
	return swathWidthM(shallowestDepthM, swathAngleDeg, widthFactor) * (1 - overlap);
}

// --- Coverage gaps ---------------------------------------------------------------------------

/** A sampled line with the swath width at each sample. */
export interface SwathTrack {
	lon: ArrayLike<number>;
	lat: ArrayLike<number>;
	/** Distance along the line (m), increasing. */
	distanceM: ArrayLike<number>;
	swathWidthM: ArrayLike<number>;
}

export interface CoverageGap {
	/** Along the first line (km). */
	fromKm: number;
	toKm: number;
	/** Widest open strip between the two swaths (m). */
	maxGapM: number;
}

function widthAt(track: SwathTrack, alongM: number): number {
	const d = track.distanceM;
	const w = track.swathWidthM;
	const n = d.length;
	if (alongM <= d[0]) return w[0];
	if (alongM >= d[n - 1]) return w[n - 1];
	let lo = 0;
	let hi = n - 1;
	while (hi - lo > 1) {
		const mid = (lo + hi) >> 1;
		if (d[mid] <= alongM) lo = mid;
		else hi = mid;
	}
	const f = (alongM - d[lo]) / (d[hi] - d[lo] || 1);
	return w[lo] + f * (w[hi] - w[lo]);
}

/**
 * Stretches along line `a` where its swath and that of a neighbouring line `b` do not meet:
 * geodesic distance between the lines > (W_a + W_b)/2, counted where `b` lies abeam (its
 * nearest point is not one of its ends). Each swath is taken symmetric about its line.
 */
export function coverageGaps(a: SwathTrack, b: SwathTrack): CoverageGap[] {
	const coords: LonLat[] = [];
	for (let i = 0; i < b.lon.length; i++) coords.push([b.lon[i], b.lat[i]]);
	const index = new PolylineIndex([coords]);
	const gaps: CoverageGap[] = [];
	let open: CoverageGap | null = null;
	for (let k = 0; k < a.lon.length; k++) {
		const n = index.nearest(a.lon[k], a.lat[k]);
		const gap = n.atEnd ? -Infinity : n.distanceM - 0.5 * (a.swathWidthM[k] + widthAt(b, n.alongM));
		const km = a.distanceM[k] / 1000;
		if (gap > 0) {
			if (!open) {
				open = { fromKm: km, toKm: km, maxGapM: gap };
				gaps.push(open);
			}
			open.toKm = km;
			open.maxGapM = Math.max(open.maxGapM, gap);
		} else open = null;
	}
	return gaps;
}

// --- Depth-adaptive line plan ----------------------------------------------------------------

export interface SurveyPlanOptions {
	/** Line direction, degrees clockwise from north; default: the polygon's longest edge. */
	headingDeg?: number;
	swathAngleDeg?: number;
	widthFactor?: number;
	/** Target overlap p between adjacent swaths (default 0.3). */
	overlap?: number;
	/** Survey speed (kn) for the time estimate; default 8. */
	speedKn?: number;
	/** Spacing of depth samples when searching for the shallowest depth (m); default 1000. */
	depthSampleM?: number;
}

export interface PlannedLine {
	/** Start and end, in running order (lines alternate direction). */
	coords: [LonLat, LonLat];
	lengthKm: number;
	/** Offset across the area from its first edge (m, in the local plane). */
	offsetM: number;
	/** Distance to the next line (m); 0 for the last. */
	spacingToNextM: number;
	/** Shallowest predicted depth along this line (m). */
	shallowestDepthM: number;
}

export interface SurveyPlan {
	lines: PlannedLine[];
	headingDeg: number;
	lineKm: number;
	/** Runs between the end of one line and the start of the next. */
	turnKm: number;
	totalKm: number;
	hours: number;
}

type Pt = [number, number];

/** Intervals of u where the horizontal line v = const crosses the polygon (even–odd rule). */
function chordsAt(poly: Pt[], v: number): [number, number][] {
	const xs: number[] = [];
	for (let i = 0; i < poly.length; i++) {
		const [u1, v1] = poly[i];
		const [u2, v2] = poly[(i + 1) % poly.length];
		if (v1 <= v !== v2 <= v) xs.push(u1 + ((v - v1) / (v2 - v1)) * (u2 - u1));
	}
	xs.sort((p, q) => p - q);
	const out: [number, number][] = [];
	for (let i = 0; i + 1 < xs.length; i += 2) if (xs[i + 1] > xs[i]) out.push([xs[i], xs[i + 1]]);
	return out;
}

/** Centre of a ring from the mean of its ECEF-like unit vectors (safe across the antimeridian). */
function ringCentre(ring: readonly LonLat[]): LonLat {
	let x = 0,
		y = 0,
		z = 0;
	for (const [lon, lat] of ring) {
		const l = (lon * Math.PI) / 180;
		const p = (lat * Math.PI) / 180;
		x += Math.cos(p) * Math.cos(l);
		y += Math.cos(p) * Math.sin(l);
		z += Math.sin(p);
	}
	return [(Math.atan2(y, x) * 180) / Math.PI, (Math.atan2(z, Math.hypot(x, y)) * 180) / Math.PI];
}

/**
 * Parallel survey lines over a polygon whose spacing follows the predicted depth, so adjacent
 * swaths overlap by at least the target everywhere (flat-seafloor swaths).
 *
 * In a local azimuthal equidistant plane rotated so lines run along u, each next line sits at
 * S = W_eff(d_min)·(1 − p), d_min the shallowest depth sampled in the strip between the lines.
 * The strip is first taken S₀ wide (S₀ from the depth under the current line alone); the final
 * S ≤ S₀ then lies inside it, so its shallowest depth is no shallower than the one used. With
 * both swaths at least W_eff(d_min) wide, the overlap is ≥ p of the narrower swath. The first
 * line sits half a spacing inside the edge; lines continue until a swath reaches the far edge.
 */
export function planSurvey(
	polygon: readonly LonLat[],
	depthAt: (lon: number, lat: number) => number,
	options: SurveyPlanOptions = {}
): SurveyPlan {
	const ring = polygon.slice();
	if (ring.length > 1) {
		const [f, l] = [ring[0], ring[ring.length - 1]];
		if (f[0] === l[0] && f[1] === l[1]) ring.pop();
	}
	if (ring.length < 3) throw new RangeError('a survey area needs at least three vertices');
	const overlap = options.overlap ?? OVERLAP_BASELINE;
	const angle = options.swathAngleDeg ?? DEFAULT_SWATH_ANGLE_DEG;
	const k = options.widthFactor ?? DEFAULT_WIDTH_FACTOR;
	const speedKn = options.speedKn ?? 8;
	const sampleM = options.depthSampleM ?? 1000;
	const proj = new LocalProjection(ringCentre(ring));
	const xy = ring.map((p) => proj.forward(p));

	let heading = options.headingDeg;
	if (heading === undefined) {
		let best = -1;
		for (let i = 0; i < xy.length; i++) {
			const [x1, y1] = xy[i];
			const [x2, y2] = xy[(i + 1) % xy.length];
			const len = Math.hypot(x2 - x1, y2 - y1);
			if (len > best) {
				best = len;
				heading = (Math.atan2(x2 - x1, y2 - y1) * 180) / Math.PI;
			}
		}
	}
	const h = (((heading as number) % 360) + 360) % 360;
	const sh = Math.sin((h * Math.PI) / 180);
	const ch = Math.cos((h * Math.PI) / 180);
	// u along the heading, v to its right
	const toUv = ([x, y]: readonly number[]): Pt => [x * sh + y * ch, x * ch - y * sh];
	const toXy = (u: number, v: number): Pt => [u * sh + v * ch, u * ch - v * sh];
	const poly = xy.map(toUv);
	const vMin = Math.min(...poly.map((p) => p[1]));
	const vMax = Math.max(...poly.map((p) => p[1]));

	const depthUv = (u: number, v: number): number => {
		const [x, y] = toXy(u, v);
		const [lon, lat] = proj.reverse(x, y);
		return depthAt(lon, lat);
	};
	/** Shallowest depth along v = const inside the polygon (sampled every sampleM). */
	const shallowestAt = (v: number): number => {
		let min = Infinity;
		for (const [u0, u1] of chordsAt(poly, v)) {
			const n = Math.max(1, Math.ceil((u1 - u0) / sampleM));
			for (let i = 0; i <= n; i++) min = Math.min(min, depthUv(u0 + ((u1 - u0) * i) / n, v));
		}
		return min;
	};
	/** Shallowest depth in the strip [v0, v1], sampled at ≤ sampleM across. */
	const shallowestIn = (v0: number, v1: number): number => {
		const n = Math.max(1, Math.ceil((v1 - v0) / sampleM));
		let min = Infinity;
		for (let i = 0; i <= n; i++) {
			const v = Math.min(vMax, Math.max(vMin, v0 + ((v1 - v0) * i) / n));
			min = Math.min(min, shallowestAt(v));
		}
		return min;
	};
	const spacing = (d: number) => lineSpacingM(d, overlap, angle, k);

	const offsets: { v: number; dLine: number }[] = [];
	// first line: half a spacing inside the near edge
	let s0 = spacing(shallowestAt(vMin + 1e-6 * (vMax - vMin)));
	let s = spacing(shallowestIn(vMin, vMin + s0));
	let v = vMin + s / 2;
	let vPrev = -Infinity;
	for (let guard = 0; guard < 100_000; guard++) {
		if (!(s > 0)) throw new RangeError('predicted depth must be positive over the survey area');
		let vLine = v;
		// Pull a line that would reach past the far edge back to where its swath just reaches it
		// (closer lines only add overlap); never onto the edge itself, where no chord is left.
		const w = swathWidthM(shallowestIn(Math.max(vMin, vMax - (v - vPrev)), vMax), angle, k);
		if (v + w / 2 > vMax) vLine = Math.max(Math.min(v, vMax - w / 2), vPrev + 1);
		vLine = Math.min(vLine, vMax - 1e-6 * (vMax - vMin));
		const dLine = shallowestAt(vLine);
		offsets.push({ v: vLine, dLine });
		if (vLine + swathWidthM(dLine, angle, k) / 2 >= vMax) break;
		s0 = spacing(dLine);
		s = spacing(shallowestIn(vLine, vLine + s0));
		vPrev = vLine;
		v = vLine + s;
	}

	const lines: PlannedLine[] = [];
	let forward = true;
	for (const { v: off, dLine } of offsets) {
		const chords = chordsAt(poly, off);
		const ordered = forward ? chords : chords.slice().reverse();
		for (const [u0, u1] of ordered) {
			const a = proj.reverse(...toXy(forward ? u0 : u1, off));
			const b = proj.reverse(...toXy(forward ? u1 : u0, off));
			lines.push({
				coords: [a, b],
				lengthKm: distanceM(a, b) / 1000,
				offsetM: off - vMin,
				spacingToNextM: 0,
				shallowestDepthM: dLine
			});
		}
		forward = !forward;
	}
	let lineKm = 0;
	let turnKm = 0;
	for (let i = 0; i < lines.length; i++) {
		lineKm += lines[i].lengthKm;
		if (i + 1 < lines.length) {
			lines[i].spacingToNextM = lines[i + 1].offsetM - lines[i].offsetM;
			turnKm += distanceM(lines[i].coords[1], lines[i + 1].coords[0]) / 1000;
		}
	}
	const totalKm = lineKm + turnKm;
	return { lines, headingDeg: h, lineKm, turnKm, totalKm, hours: hoursAt(totalKm, speedKn) };
}
