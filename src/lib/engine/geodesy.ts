/**
 * Geodesy on the WGS84 ellipsoid: lengths, sampling along geodesics, bearings, and the nearest
 * point of a polyline (a ridge axis or a survey line) to any point.
 *
 * Geodesics come from GeographicLib (Karney 2013, J. Geodesy 87, 43) through the npm package
 * geographiclib-geodesic. Positions are GeoJSON order [lon, lat] in degrees; distances in metres.
 */
import { Geodesic } from './geographiclib';

const G = Geodesic;
const geod = G.WGS84;
type GeodesicLine = ReturnType<typeof geod.InverseLine>;

/** A position in GeoJSON order: [longitude, latitude] in degrees (extra members ignored). */
export type LonLat = readonly number[];

/** WGS84 defining constants (NIMA TR8350.2). */
export const WGS84_A = 6378137;
export const WGS84_F = 1 / 298.257223563;
const B = WGS84_A * (1 - WGS84_F);
const E2 = WGS84_F * (2 - WGS84_F);
/** Smallest radius of curvature of the ellipsoid (meridional, at the equator): b²/a. */
const RHO_MIN = (B * B) / WGS84_A;
/** Mean radius R1 = (2a + b)/3 (IUGG); only used for first guesses and the fast path. */
export const MEAN_RADIUS_M = (2 * WGS84_A + B) / 3;

const DEG = Math.PI / 180;
const LATLON = G.LATITUDE | G.LONGITUDE;
const LATLON_AZI = G.LATITUDE | G.LONGITUDE | G.AZIMUTH;
const DIST_AZI = G.DISTANCE | G.AZIMUTH;
const LINE_CAPS = G.LATITUDE | G.LONGITUDE | G.AZIMUTH | G.DISTANCE_IN | G.DISTANCE;

/** Longitude wrapped into [−180, 180): 180 becomes −180, 190 becomes −170. */
export function normalizeLon(lon: number): number {
	if (!Number.isFinite(lon)) return lon;
	if (lon >= -180 && lon < 180) return lon;
	const r = (((lon + 180) % 360) + 360) % 360;
	return r - 180;
}

export interface InverseResult {
	distanceM: number;
	/** Forward azimuth at the first point, degrees clockwise from north, (−180, 180]. */
	azimuth1Deg: number;
	/** Forward azimuth at the second point. */
	azimuth2Deg: number;
}

/** Inverse geodesic problem between two positions. */
export function inverse(a: LonLat, b: LonLat): InverseResult {
	const r = geod.Inverse(a[1], a[0], b[1], b[0], DIST_AZI);
	return { distanceM: r.s12 ?? 0, azimuth1Deg: r.azi1 ?? 0, azimuth2Deg: r.azi2 ?? 0 };
}

/** Geodesic distance in metres. */
export function distanceM(a: LonLat, b: LonLat): number {
	return geod.Inverse(a[1], a[0], b[1], b[0], G.DISTANCE).s12 ?? 0;
}

/** Initial bearing from a to b, degrees in [0, 360). */
export function initialBearingDeg(a: LonLat, b: LonLat): number {
	return wrap360(inverse(a, b).azimuth1Deg);
}

/** Final bearing on arrival at b, degrees in [0, 360). */
export function finalBearingDeg(a: LonLat, b: LonLat): number {
	return wrap360(inverse(a, b).azimuth2Deg);
}

function wrap360(deg: number): number {
	const r = ((deg % 360) + 360) % 360;
	return r === 360 ? 0 : r;
}

export interface DirectResult {
	lon: number;
	lat: number;
	/** Forward azimuth at the destination, degrees. */
	azimuthDeg: number;
}

/** Direct geodesic problem: the point at distanceM from p along azimuthDeg. */
export function direct(p: LonLat, azimuthDeg: number, distM: number): DirectResult {
	const r = geod.Direct(p[1], p[0], azimuthDeg, distM, LATLON_AZI);
	return { lon: normalizeLon(r.lon2 ?? 0), lat: r.lat2 ?? 0, azimuthDeg: r.azi2 ?? 0 };
}

/** Length of a polyline whose vertices are joined by geodesics. */
export function lineLengthM(coords: readonly LonLat[]): number {
	let total = 0;
	for (let i = 1; i < coords.length; i++) total += distanceM(coords[i - 1], coords[i]);
	return total;
}

export interface LineSamples {
	count: number;
	lengthM: number;
	lon: Float64Array;
	lat: Float64Array;
	/** Distance along the line from its start. */
	distanceM: Float64Array;
}

/** A line that would give more samples than allowed; thrown before anything is allocated. */
export class SampleCountError extends RangeError {
	constructor(
		readonly count: number,
		readonly lengthM: number
	) {
		super(`${count} samples`);
		this.name = 'SampleCountError';
	}
}

/** Samples closer than this to the end are merged with it (float noise, not a real sample). */
const END_MERGE_M = 1e-3;

/**
 * Points along the geodesics through a line's vertices: at the start, every spacingM along the
 * line, and at the end (the last regular sample is dropped if it falls within 1 mm of the end).
 */
export function sampleLine(
	coords: readonly LonLat[],
	spacingM: number,
	/** Refuse (RangeError) before allocating when the line would give more samples than this. */
	maxCount = Infinity
): LineSamples {
	if (!(spacingM > 0) || !Number.isFinite(spacingM)) {
		throw new RangeError('spacing must be a positive finite number');
	}
	const lines: GeodesicLine[] = [];
	const starts: number[] = [];
	let lengthM = 0;
	for (let i = 1; i < coords.length; i++) {
		const a = coords[i - 1];
		const b = coords[i];
		const line = geod.InverseLine(a[1], a[0], b[1], b[0], LINE_CAPS);
		if (!(line.s13 > 0)) continue;
		lines.push(line);
		starts.push(lengthM);
		lengthM += line.s13;
	}
	const regular = lengthM > END_MERGE_M ? Math.ceil((lengthM - END_MERGE_M) / spacingM) : 1;
	const count = lengthM > 0 ? regular + 1 : 1;
	if (count > maxCount) throw new SampleCountError(count, lengthM);
	const lon = new Float64Array(count);
	const lat = new Float64Array(count);
	const dist = new Float64Array(count);
	if (lines.length === 0) {
		const p = coords[0];
		lon.fill(normalizeLon(p[0]));
		lat.fill(p[1]);
		return { count, lengthM: 0, lon, lat, distanceM: dist };
	}
	let seg = 0;
	for (let k = 0; k < count; k++) {
		const d = k === count - 1 ? lengthM : k * spacingM;
		while (seg < lines.length - 1 && d > starts[seg] + lines[seg].s13) seg++;
		const r = lines[seg].Position(Math.min(d - starts[seg], lines[seg].s13), LATLON);
		lon[k] = normalizeLon(r.lon2 ?? 0);
		lat[k] = r.lat2 ?? 0;
		dist[k] = d;
	}
	return { count, lengthM, lon, lat, distanceM: dist };
}

/** Earth-centred, earth-fixed coordinates (metres) of a point on the ellipsoid surface. */
export function toEcef(lon: number, lat: number, out: Float64Array | number[], o = 0): void {
	const phi = lat * DEG;
	const lam = lon * DEG;
	const sp = Math.sin(phi);
	const cp = Math.cos(phi);
	const n = WGS84_A / Math.sqrt(1 - E2 * sp * sp);
	out[o] = n * cp * Math.cos(lam);
	out[o + 1] = n * cp * Math.sin(lam);
	out[o + 2] = n * (1 - E2) * sp;
}

/** Geodesic distance estimate from a chord on the mean sphere (fast path, ~1e-5 relative). */
function arcFromChord(chordM: number): number {
	const x = chordM / (2 * MEAN_RADIUS_M);
	return x >= 1 ? Math.PI * MEAN_RADIUS_M : 2 * MEAN_RADIUS_M * Math.asin(x);
}

// ---------------------------------------------------------------------------------------------
// Nearest point of a polyline
// ---------------------------------------------------------------------------------------------

export type Side = 'left' | 'right' | 'on';

export interface NearestResult {
	/** Geodesic distance from the query point to the nearest point of the polylines. */
	distanceM: number;
	/** The nearest point itself (NaN in the fast mode, which does not locate it on the ellipsoid). */
	lon: number;
	lat: number;
	/** Which polyline (index into the constructor's list). */
	line: number;
	/** The foot lies on the geodesic from vertex `vertex` to vertex `vertex + 1`. */
	vertex: number;
	/** Distance along that polyline from its first vertex to the foot. */
	alongM: number;
	/** Side of the query point, walking along the polyline; 'on' within 1 µm. */
	side: Side;
	/** True when the foot is the polyline's first or last vertex (the point lies beyond an end). */
	atEnd: boolean;
}

export interface NearestOptions {
	/**
	 * true (default): the foot is refined on the WGS84 geodesic (GeographicLib) to sub-millimetre.
	 * false: distance from the 3D chord mapped onto the mean sphere (≈1e-5 relative; for grids).
	 */
	exact?: boolean;
}

/** Pieces of each geodesic segment kept short so a chord stays within ~1 mm of the curve. */
const PIECE_M = 250;
const LEAF_SIZE = 4;

interface Segment {
	line: number;
	vertex: number;
	geo: GeodesicLine;
	length: number;
	alongStart: number;
	azStart: number;
	azEnd: number;
	/** Neighbouring segment indices within the same polyline (−1 at the ends). */
	prev: number;
	next: number;
	/** Its pieces are [pieceStart, pieceEnd). */
	pieceStart: number;
	pieceEnd: number;
}

/**
 * A static index of one or more polylines (vertices joined by WGS84 geodesics) answering
 * nearest-point queries in O(log n).
 *
 * Method: each geodesic segment is cut into pieces of ≤ 250 m whose chords (in ECEF metres) lie
 * within the sagitta L²/(8ρmin) of the curve. A bounding-volume hierarchy over the piece boxes,
 * built over contiguous runs of the polylines (which are spatially coherent), finds the pieces
 * whose chord distance is within a small margin of the best one; 3D chords are insensitive to the
 * antimeridian and the poles. The few candidate segments are then refined exactly: a Newton
 * iteration on the geodesic (GeographicLib Position + Inverse) drives the azimuth from the foot
 * to the point perpendicular to the segment.
 */
export class PolylineIndex {
	readonly lineCount: number;
	private readonly segments: Segment[] = [];
	private readonly pieceCount: number;
	private readonly pa: Float64Array; // piece start xyz
	private readonly pd: Float64Array; // piece direction vector (end − start)
	private readonly pLen2: Float64Array; // |end − start|²
	private readonly pSeg: Int32Array;
	private readonly pS0: Float64Array; // distance along segment of piece start
	private readonly pSLen: Float64Array; // geodesic length of piece
	private readonly maxSag: number;
	// BVH nodes
	private nodeCount = 0;
	private readonly box: Float64Array; // 6 per node
	private readonly child: Int32Array; // 2 per node: left,right; leaf: -(start+1), count
	private readonly stack: Int32Array;
	private readonly cand: Float64Array; // candidate scratch: piece, chordDist pairs
	private readonly segIds: Int32Array; // per-query scratch: candidate segments
	private readonly segD: Float64Array;
	private readonly segS: Float64Array;
	private readonly p = new Float64Array(3);
	// two reusable results: nearest() keeps the best segment's while refining another
	private readonly slotA: Refined = { d: Infinity, s: 0, lon: 0, lat: 0, alpha: 0, beta: 0 };
	private readonly slotB: Refined = { d: Infinity, s: 0, lon: 0, lat: 0, alpha: 0, beta: 0 };

	constructor(lines: readonly (readonly LonLat[])[]) {
		this.lineCount = lines.length;
		const pieces: { seg: number; s0: number; s1: number }[] = [];
		for (let k = 0; k < lines.length; k++) {
			const coords = lines[k];
			let along = 0;
			let prevSeg = -1;
			for (let i = 1; i < coords.length; i++) {
				const a = coords[i - 1];
				const b = coords[i];
				assertPosition(a);
				assertPosition(b);
				const geo = geod.InverseLine(a[1], a[0], b[1], b[0], LINE_CAPS);
				const length = geo.s13;
				if (!(length > 1e-6)) continue;
				const end = geo.Position(length, G.AZIMUTH);
				const idx = this.segments.length;
				this.segments.push({
					line: k,
					vertex: i - 1,
					geo,
					length,
					alongStart: along,
					azStart: geo.azi1,
					azEnd: end.azi2 ?? geo.azi1,
					prev: prevSeg,
					next: -1,
					pieceStart: pieces.length,
					pieceEnd: 0
				});
				if (prevSeg >= 0) this.segments[prevSeg].next = idx;
				prevSeg = idx;
				along += length;
				const n = Math.max(1, Math.ceil(length / PIECE_M));
				for (let j = 0; j < n; j++) {
					pieces.push({ seg: idx, s0: (j * length) / n, s1: ((j + 1) * length) / n });
				}
				this.segments[idx].pieceEnd = pieces.length;
			}
		}
		if (this.segments.length === 0) throw new RangeError('polyline needs two distinct vertices');
		const m = pieces.length;
		this.pieceCount = m;
		this.pa = new Float64Array(3 * m);
		this.pd = new Float64Array(3 * m);
		this.pLen2 = new Float64Array(m);
		this.pSeg = new Int32Array(m);
		this.pS0 = new Float64Array(m);
		this.pSLen = new Float64Array(m);
		const q = new Float64Array(3);
		let maxLen = 0;
		let lastSeg = -1;
		let lastEnd = 0;
		for (let j = 0; j < m; j++) {
			const pc = pieces[j];
			const sg = this.segments[pc.seg];
			if (pc.seg === lastSeg && pc.s0 === lastEnd) {
				// reuse the previous piece's end as this start
				this.pa[3 * j] = this.pa[3 * (j - 1)] + this.pd[3 * (j - 1)];
				this.pa[3 * j + 1] = this.pa[3 * (j - 1) + 1] + this.pd[3 * (j - 1) + 1];
				this.pa[3 * j + 2] = this.pa[3 * (j - 1) + 2] + this.pd[3 * (j - 1) + 2];
			} else {
				const r0 = sg.geo.Position(pc.s0, LATLON);
				toEcef(r0.lon2 ?? 0, r0.lat2 ?? 0, this.pa, 3 * j);
			}
			const r1 = sg.geo.Position(pc.s1, LATLON);
			toEcef(r1.lon2 ?? 0, r1.lat2 ?? 0, q, 0);
			const dx = q[0] - this.pa[3 * j];
			const dy = q[1] - this.pa[3 * j + 1];
			const dz = q[2] - this.pa[3 * j + 2];
			this.pd[3 * j] = dx;
			this.pd[3 * j + 1] = dy;
			this.pd[3 * j + 2] = dz;
			this.pLen2[j] = dx * dx + dy * dy + dz * dz;
			this.pSeg[j] = pc.seg;
			this.pS0[j] = pc.s0;
			this.pSLen[j] = pc.s1 - pc.s0;
			maxLen = Math.max(maxLen, pc.s1 - pc.s0);
			lastSeg = pc.seg;
			lastEnd = pc.s1;
		}
		// A curve of curvature ≤ 1/ρmin stays within its chord's sagitta L²/(8ρmin); doubled for safety.
		this.maxSag = (2 * maxLen * maxLen) / (8 * RHO_MIN) + 1e-6;
		const maxNodes = 2 * m + 1;
		this.box = new Float64Array(6 * maxNodes);
		this.child = new Int32Array(2 * maxNodes);
		this.build(0, m);
		this.stack = new Int32Array(2 * Math.ceil(Math.log2(maxNodes + 1)) + 8);
		this.cand = new Float64Array(2 * m);
		this.segIds = new Int32Array(this.segments.length);
		this.segD = new Float64Array(this.segments.length);
		this.segS = new Float64Array(this.segments.length);
	}

	/** Build a node over pieces [lo, hi) and return its index. */
	private build(lo: number, hi: number): number {
		const node = this.nodeCount++;
		const bx = this.box;
		let x0 = Infinity,
			y0 = Infinity,
			z0 = Infinity,
			x1 = -Infinity,
			y1 = -Infinity,
			z1 = -Infinity;
		for (let j = lo; j < hi; j++) {
			for (let e = 0; e < 2; e++) {
				const x = this.pa[3 * j] + e * this.pd[3 * j];
				const y = this.pa[3 * j + 1] + e * this.pd[3 * j + 1];
				const z = this.pa[3 * j + 2] + e * this.pd[3 * j + 2];
				if (x < x0) x0 = x;
				if (x > x1) x1 = x;
				if (y < y0) y0 = y;
				if (y > y1) y1 = y;
				if (z < z0) z0 = z;
				if (z > z1) z1 = z;
			}
		}
		const pad = this.maxSag;
		bx[6 * node] = x0 - pad;
		bx[6 * node + 1] = y0 - pad;
		bx[6 * node + 2] = z0 - pad;
		bx[6 * node + 3] = x1 + pad;
		bx[6 * node + 4] = y1 + pad;
		bx[6 * node + 5] = z1 + pad;
		if (hi - lo <= LEAF_SIZE) {
			this.child[2 * node] = -(lo + 1);
			this.child[2 * node + 1] = hi - lo;
		} else {
			const mid = (lo + hi) >>> 1;
			const l = this.build(lo, mid);
			const r = this.build(mid, hi);
			this.child[2 * node] = l;
			this.child[2 * node + 1] = r;
		}
		return node;
	}

	private boxDist2(node: number, x: number, y: number, z: number): number {
		const b = this.box;
		const o = 6 * node;
		const dx = x < b[o] ? b[o] - x : x > b[o + 3] ? x - b[o + 3] : 0;
		const dy = y < b[o + 1] ? b[o + 1] - y : y > b[o + 4] ? y - b[o + 4] : 0;
		const dz = z < b[o + 2] ? b[o + 2] - z : z > b[o + 5] ? z - b[o + 5] : 0;
		return dx * dx + dy * dy + dz * dz;
	}

	/** Squared 3D distance from (x,y,z) to piece j's chord; also its parameter via this.tParam. */
	private tParam = 0;
	private pieceDist2(j: number, x: number, y: number, z: number): number {
		const o = 3 * j;
		const ax = this.pa[o],
			ay = this.pa[o + 1],
			az = this.pa[o + 2];
		const dx = this.pd[o],
			dy = this.pd[o + 1],
			dz = this.pd[o + 2];
		let t = ((x - ax) * dx + (y - ay) * dy + (z - az) * dz) / this.pLen2[j];
		if (t < 0) t = 0;
		else if (t > 1) t = 1;
		this.tParam = t;
		const ex = ax + t * dx - x;
		const ey = ay + t * dy - y;
		const ez = az + t * dz - z;
		return ex * ex + ey * ey + ez * ez;
	}

	/**
	 * Candidate pieces: every piece whose chord distance could belong to the nearest point.
	 * Returns the number of candidates written to this.cand as (piece, chord distance) pairs.
	 */
	private candidates(x: number, y: number, z: number): number {
		const stack = this.stack;
		const sag = this.maxSag;
		let sp = 0;
		stack[sp++] = 0;
		let best = Infinity; // min over pieces of (chord distance + sag): an upper bound
		let limit = Infinity; // (best + margin + sag)², pruning threshold on squared distances
		let nc = 0;
		while (sp > 0) {
			const node = stack[--sp];
			if (this.boxDist2(node, x, y, z) > limit) continue;
			const c0 = this.child[2 * node];
			if (c0 < 0) {
				const start = -c0 - 1;
				const end = start + this.child[2 * node + 1];
				for (let j = start; j < end; j++) {
					const d2 = this.pieceDist2(j, x, y, z);
					if (d2 > limit) continue;
					const d = Math.sqrt(d2);
					this.cand[2 * nc] = j;
					this.cand[2 * nc + 1] = d;
					nc++;
					if (d + sag < best) {
						best = d + sag;
						const lim = best + this.margin(best) + sag;
						limit = lim * lim;
					}
				}
			} else {
				const c1 = this.child[2 * node + 1];
				const d0 = this.boxDist2(c0, x, y, z);
				const d1 = this.boxDist2(c1, x, y, z);
				// push the farther child first so the nearer is explored first
				if (d0 <= d1) {
					if (d1 <= limit) stack[sp++] = c1;
					if (d0 <= limit) stack[sp++] = c0;
				} else {
					if (d0 <= limit) stack[sp++] = c0;
					if (d1 <= limit) stack[sp++] = c1;
				}
			}
		}
		// keep only pieces that can still compete with the final bound
		const cut = best + this.margin(best) + sag;
		let w = 0;
		for (let i = 0; i < nc; i++) {
			if (this.cand[2 * i + 1] <= cut) {
				this.cand[2 * w] = this.cand[2 * i];
				this.cand[2 * w + 1] = this.cand[2 * i + 1];
				w++;
			}
		}
		return w;
	}

	/**
	 * Slack allowed when ranking pieces by chord distance instead of geodesic distance. The
	 * chord→geodesic map s ≈ c + c³/(24R²) varies with the direction of the path through R, by
	 * about e²·c²/(12R²) per metre of separation between two feet (1.4e-5 at c = 1000 km). Any foot
	 * that is truly nearer lies within this margin (2 mm + 1e-6·c·(c/ρ)², 25 mm at 1000 km) unless
	 * the axis is bent into an arc centred on the point over kilometres, where all its points are
	 * equidistant to ~1e-7 relative anyway.
	 */
	private margin(c: number): number {
		const r = c / RHO_MIN;
		return 2e-3 + 1e-6 * c * r * r;
	}

	/** Nearest point of the polylines to (lon, lat); written into `out` when given (no allocation). */
	nearest(
		lon: number,
		lat: number,
		options: NearestOptions = {},
		out?: NearestResult
	): NearestResult {
		const exact = options.exact !== false;
		const p = this.p;
		toEcef(lon, lat, p, 0);
		const x = p[0],
			y = p[1],
			z = p[2];
		const nc = this.candidates(x, y, z);
		if (!exact) return this.fastResult(nc, x, y, z, out);
		// Best candidate piece per segment (usually one or two segments), nearest chord first.
		const ids = this.segIds;
		const ds = this.segD;
		const ss = this.segS;
		let k = 0;
		for (let i = 0; i < nc; i++) {
			const j = this.cand[2 * i];
			const d = this.cand[2 * i + 1];
			const sg = this.pSeg[j];
			let at = 0;
			while (at < k && ids[at] !== sg) at++;
			if (at === k || d < ds[at]) {
				this.pieceDist2(j, x, y, z);
				ids[at] = sg;
				ds[at] = d;
				ss[at] = this.pS0[j] + this.tParam * this.pSLen[j];
				if (at === k) k++;
			}
		}
		let best: Refined | null = null;
		let bestSeg = -1;
		for (let n = 0; n < k; n++) {
			let m = n;
			for (let q = n + 1; q < k; q++) if (ds[q] < ds[m]) m = q;
			const sg = ids[m];
			const d = ds[m];
			const s0 = ss[m];
			ids[m] = ids[n];
			ds[m] = ds[n];
			ss[m] = ss[n];
			// The straight chord is never longer than the geodesic: such a segment cannot win.
			if (best && d - this.maxSag > best.d) continue;
			if (best && this.sharedVertexSettles(bestSeg, best, sg)) continue;
			const r = this.refine(sg, s0, lon, lat, best === this.slotA ? this.slotB : this.slotA);
			if (!best || r.d < best.d) {
				best = r;
				bestSeg = sg;
			}
		}
		return this.exactResult(bestSeg, best as Refined, out);
	}

	/**
	 * When the best foot so far is a vertex shared with segment `sg` and the geodesic to the point
	 * leaves that vertex backwards relative to `sg` (cos(β − α) ≤ 0), the distance only grows
	 * along `sg`: its nearest point is the same vertex, so refining it would change nothing.
	 * (Skipped within 0.1° of a pole, where the two azimuths may not share a meridian.)
	 */
	private sharedVertexSettles(bestSeg: number, best: Refined, sg: number): boolean {
		if (Math.abs(best.lat) > 89.9) return false;
		const seg = this.segments[bestSeg];
		if (best.s >= seg.length && seg.next === sg) {
			return Math.cos((best.beta - this.segments[sg].azStart) * DEG) <= 0;
		}
		if (best.s <= 0 && seg.prev === sg) {
			return Math.cos((best.beta - this.segments[sg].azEnd) * DEG) >= 0;
		}
		return false;
	}

	/** Nearest point by exact refinement on every segment: O(n), for tests and audits. */
	nearestBrute(lon: number, lat: number): NearestResult {
		const p = this.p;
		toEcef(lon, lat, p, 0);
		let best: Refined | null = null;
		let bestSeg = -1;
		for (let sg = 0; sg < this.segments.length; sg++) {
			// start from the best piece of this segment by chord distance
			let bd = Infinity;
			let bs = 0;
			for (let j = this.segments[sg].pieceStart; j < this.segments[sg].pieceEnd; j++) {
				const d2 = this.pieceDist2(j, p[0], p[1], p[2]);
				if (d2 < bd) {
					bd = d2;
					bs = this.pS0[j] + this.tParam * this.pSLen[j];
				}
			}
			const r = this.refine(sg, bs, lon, lat, best === this.slotA ? this.slotB : this.slotA);
			if (!best || r.d < best.d) {
				best = r;
				bestSeg = sg;
			}
		}
		return this.exactResult(bestSeg, best as Refined);
	}

	/**
	 * Newton iteration for the foot of the perpendicular geodesic on one segment. The step is the
	 * spherical along-track distance tan(Δs/R) = tan(d/R)·cos(β − α), with α the segment azimuth at
	 * the trial foot and β the azimuth from it to the point; it converges in one or two steps.
	 */
	private refine(sg: number, s0: number, lon: number, lat: number, out: Refined): Refined {
		const seg = this.segments[sg];
		const R = MEAN_RADIUS_M;
		let s = Math.min(Math.max(s0, 0), seg.length);
		for (let it = 0; it < 12; it++) {
			const pos = seg.geo.Position(s, LATLON_AZI);
			const fl = pos.lat2 ?? 0;
			const fo = pos.lon2 ?? 0;
			const alpha = pos.azi2 ?? 0;
			const inv = geod.Inverse(fl, fo, lat, lon, DIST_AZI);
			const d = inv.s12 ?? 0;
			const beta = inv.azi1 ?? 0;
			out.d = d;
			out.s = s;
			out.lon = fo;
			out.lat = fl;
			out.alpha = alpha;
			out.beta = beta;
			if (d < 1e-9) break;
			const ang = d / R;
			const step = R * Math.atan2(Math.sin(ang) * Math.cos((beta - alpha) * DEG), Math.cos(ang));
			const sNew = Math.min(Math.max(s + step, 0), seg.length);
			const ds = sNew - s;
			if (Math.abs(ds) < 1e-4) break;
			// Once the remaining step changes the distance by < 10 µm (second order in the step),
			// keep this distance and move only the foot, which costs no further inverse problem. The
			// azimuths α, β stay those measured at the same trial point (near a pole they would not
			// share a reference meridian otherwise).
			if (ds * ds < 2e-5 * d) {
				const fin = seg.geo.Position(sNew, LATLON);
				out.s = sNew;
				out.lon = fin.lon2 ?? 0;
				out.lat = fin.lat2 ?? 0;
				break;
			}
			s = sNew;
		}
		return out;
	}

	private exactResult(sg: number, r: Refined, out?: NearestResult): NearestResult {
		const seg = this.segments[sg];
		let side: Side;
		let atEnd = false;
		if (r.d < 1e-6) side = 'on';
		else {
			let ref = r.alpha;
			const atStart = r.s <= 0;
			const atStop = r.s >= seg.length;
			if (atStart && seg.prev >= 0) ref = bisect(this.segments[seg.prev].azEnd, seg.azStart);
			else if (atStop && seg.next >= 0) ref = bisect(seg.azEnd, this.segments[seg.next].azStart);
			else if ((atStart && seg.prev < 0) || (atStop && seg.next < 0)) atEnd = true;
			side = Math.sin((r.beta - ref) * DEG) > 0 ? 'right' : 'left';
		}
		return put(
			out,
			r.d,
			normalizeLon(r.lon),
			r.lat,
			seg.line,
			seg.vertex,
			seg.alongStart + r.s,
			side,
			atEnd
		);
	}

	private fastResult(
		nc: number,
		x: number,
		y: number,
		z: number,
		out?: NearestResult
	): NearestResult {
		let bj = -1;
		let bd = Infinity;
		for (let i = 0; i < nc; i++) {
			if (this.cand[2 * i + 1] < bd) {
				bd = this.cand[2 * i + 1];
				bj = this.cand[2 * i];
			}
		}
		this.pieceDist2(bj, x, y, z);
		const t = this.tParam;
		const sgi = this.pSeg[bj];
		const seg = this.segments[sgi];
		const s = this.pS0[bj] + t * this.pSLen[bj];
		const o = 3 * bj;
		const fx = this.pa[o] + t * this.pd[o];
		const fy = this.pa[o + 1] + t * this.pd[o + 1];
		const fz = this.pa[o + 2] + t * this.pd[o + 2];
		// side: sign of (P − F)·(tangent × up), "right" when positive
		const tx = this.pd[o],
			ty = this.pd[o + 1],
			tz = this.pd[o + 2];
		const ux = fx / (WGS84_A * WGS84_A),
			uy = fy / (WGS84_A * WGS84_A),
			uz = fz / (B * B);
		const rx = ty * uz - tz * uy;
		const ry = tz * ux - tx * uz;
		const rz = tx * uy - ty * ux;
		const dot = (x - fx) * rx + (y - fy) * ry + (z - fz) * rz;
		const distance = arcFromChord(bd);
		const atEnd = (s <= 0 && seg.prev < 0) || (s >= seg.length && seg.next < 0);
		const side = distance < 1e-6 ? 'on' : dot > 0 ? 'right' : 'left';
		return put(out, distance, NaN, NaN, seg.line, seg.vertex, seg.alongStart + s, side, atEnd);
	}
}

function put(
	out: NearestResult | undefined,
	distance: number,
	lon: number,
	lat: number,
	line: number,
	vertex: number,
	alongM: number,
	side: Side,
	atEnd: boolean
): NearestResult {
	if (!out) return { distanceM: distance, lon, lat, line, vertex, alongM, side, atEnd };
	out.distanceM = distance;
	out.lon = lon;
	out.lat = lat;
	out.line = line;
	out.vertex = vertex;
	out.alongM = alongM;
	out.side = side;
	out.atEnd = atEnd;
	return out;
}

interface Refined {
	d: number;
	s: number;
	lon: number;
	lat: number;
	/** segment azimuth at the foot */
	alpha: number;
	/** azimuth from the foot to the point */
	beta: number;
}

/** Mean direction of two azimuths (degrees); falls back to the first for a hairpin. */
function bisect(a: number, b: number): number {
	const sx = Math.sin(a * DEG) + Math.sin(b * DEG);
	const cx = Math.cos(a * DEG) + Math.cos(b * DEG);
	if (Math.hypot(sx, cx) < 1e-9) return a;
	return Math.atan2(sx, cx) / DEG;
}

function assertPosition(p: LonLat): void {
	if (!Number.isFinite(p[0]) || !Number.isFinite(p[1]) || Math.abs(p[1]) > 90) {
		throw new RangeError(`invalid position [${p[0]}, ${p[1]}]`);
	}
}

// ---------------------------------------------------------------------------------------------
// Local projection for planning (azimuthal equidistant about a centre, via geodesics)
// ---------------------------------------------------------------------------------------------

/**
 * Azimuthal equidistant projection about a centre: x east, y north, metres. Distances and
 * azimuths from the centre are exact (geodesic); used to lay survey lines over an area.
 */
export class LocalProjection {
	constructor(readonly centre: LonLat) {}

	forward(p: LonLat): [number, number] {
		const r = geod.Inverse(this.centre[1], this.centre[0], p[1], p[0], DIST_AZI);
		const s = r.s12 ?? 0;
		const a = (r.azi1 ?? 0) * DEG;
		return [s * Math.sin(a), s * Math.cos(a)];
	}

	reverse(x: number, y: number): [number, number] {
		const s = Math.hypot(x, y);
		if (s === 0) return [normalizeLon(this.centre[0]), this.centre[1]];
		const r = geod.Direct(this.centre[1], this.centre[0], Math.atan2(x, y) / DEG, s, LATLON);
		return [normalizeLon(r.lon2 ?? 0), r.lat2 ?? 0];
	}
}
