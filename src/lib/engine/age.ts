/**
 * Plate age from distance to the spreading axis: t = x / u (SCIENCE.md §2), with x the geodesic
 * distance to the nearest point of the axis trace and u the half rate on the point's flank.
 * 1 mm/yr = 1 km/Myr exactly, so km / (mm/yr) gives Myr.
 */
import {
	PolylineIndex,
	type LonLat,
	type NearestOptions,
	type NearestResult,
	type Side
} from './geodesy';

/** One ridge segment between transform offsets. */
export interface RidgeSegment {
	/** Axis trace, GeoJSON order [lon, lat], vertices joined by geodesics. */
	axis: readonly LonLat[];
	/** Full spreading rate U (mm/yr). */
	fullRateMmYr: number;
	/**
	 * Share f of the full rate on the LEFT flank walking along the axis (0..1, default 0.5):
	 * u_left = f·U, u_right = (1 − f)·U.
	 */
	asymmetry?: number;
}

export const DEFAULT_ASYMMETRY = 0.5;

export interface HalfRates {
	leftMmYr: number;
	rightMmYr: number;
}

export function halfRates(fullRateMmYr: number, asymmetry = DEFAULT_ASYMMETRY): HalfRates {
	if (!(fullRateMmYr > 0) || !Number.isFinite(fullRateMmYr)) {
		throw new RangeError('full spreading rate must be a positive number (mm/yr)');
	}
	if (!(asymmetry >= 0 && asymmetry <= 1)) throw new RangeError('asymmetry must be within 0..1');
	return { leftMmYr: asymmetry * fullRateMmYr, rightMmYr: (1 - asymmetry) * fullRateMmYr };
}

/** t (Myr) = x (km) / u (mm/yr); infinite when the flank does not spread (u = 0, x > 0). */
export function ageFromDistance(distanceKm: number, halfRateMmYr: number): number {
	if (distanceKm === 0) return 0;
	return distanceKm / halfRateMmYr;
}

/** Distance (km) reached by floor of age t on a flank spreading at u: x = t·u. */
export function distanceFromAge(ageMa: number, halfRateMmYr: number): number {
	return ageMa * halfRateMmYr;
}

const FAST: NearestOptions = { exact: false };
const EXACT: NearestOptions = { exact: true };

export interface AgesAlong {
	ageMa: Float64Array;
	/** Geodesic distance to the axis (m). */
	axisDistanceM: Float64Array;
	/** Ridge segment each age comes from. */
	segment: Int32Array;
}

export interface AgeAt {
	ageMa: number;
	/** Geodesic distance to the nearest axis point of the chosen segment (m). */
	axisDistanceM: number;
	/** Index of the ridge segment the age comes from. */
	segment: number;
	side: Side;
	/** Half rate used (mm/yr). */
	halfRateMmYr: number;
	/** True when the nearest axis point is an end of the segment's trace. */
	beyondEnd: boolean;
}

/**
 * Ages from one or more ridge segments (offset by transform faults). A point takes its age from
 * the nearest segment it lies beside — its nearest axis point is not an end of that trace — and
 * uses the half rate of its flank of that segment. Beside no segment (beyond every tip), the
 * nearest segment overall. Segment domains are therefore bounded by the lines through the
 * segment ends perpendicular to the axis, which is where fracture zones run when transforms are
 * perpendicular to the axes, and ages step where a line crosses one.
 */
export class RidgeAgeModel {
	readonly segments: readonly RidgeSegment[];
	private readonly index: PolylineIndex;
	private readonly rates: HalfRates[];
	private readonly perSegment: (PolylineIndex | undefined)[];

	constructor(segments: readonly RidgeSegment[]) {
		if (segments.length === 0) throw new RangeError('at least one ridge segment is needed');
		this.segments = segments;
		this.rates = segments.map((s) => halfRates(s.fullRateMmYr, s.asymmetry ?? DEFAULT_ASYMMETRY));
		this.index = new PolylineIndex(segments.map((s) => s.axis));
		this.perSegment = segments.map(() => undefined);
	}

	/** Nearest axis point under the domain rule above. */
	private readonly scratch: NearestResult = {
		distanceM: 0,
		lon: 0,
		lat: 0,
		line: 0,
		vertex: 0,
		alongM: 0,
		side: 'on',
		atEnd: false
	};

	private nearest(lon: number, lat: number, options?: NearestOptions): NearestResult {
		const n = this.index.nearest(lon, lat, options, this.scratch);
		if (!n.atEnd || this.segments.length === 1) return n;
		let best: NearestResult | null = null;
		for (let k = 0; k < this.segments.length; k++) {
			if (k === n.line) continue;
			let idx = this.perSegment[k];
			if (!idx) {
				idx = new PolylineIndex([this.segments[k].axis]);
				this.perSegment[k] = idx;
			}
			const m = idx.nearest(lon, lat, options);
			if (!m.atEnd && (!best || m.distanceM < best.distanceM)) best = { ...m, line: k };
		}
		return best ?? n;
	}

	/**
	 * Ages for consecutive samples along a line, equal to `ageAt` per sample within 1 mm of axis
	 * distance but several times faster. Every sample gets the fast chord distance d_c (with its
	 * segment, flank and end state). Along a run of samples sharing those, the exact geodesic
	 * distance d_g is refined at anchors (the run's ends and every `stride` samples) and in between
	 * d_g = d_c·r with the ratio r = d_g/d_c interpolated linearly along the line: r − 1 is the
	 * ellipsoid's small (≲ 1e-5) departure from the mean sphere, varying over hundreds of km, so a
	 * stride of a few hundred metres leaves errors of micrometres. Where anchors disagree with the
	 * fast ranking, or within 1 m of the axis, every sample is refined exactly.
	 */
	agesAlong(
		lon: ArrayLike<number>,
		lat: ArrayLike<number>,
		alongM: ArrayLike<number>,
		stride = 8
	): AgesAlong {
		const n = lon.length;
		const dist = new Float64Array(n);
		const seg = new Int32Array(n);
		const flank = new Int8Array(n);
		const key = new Float64Array(n);
		const vertex = new Int32Array(n);
		const foot = new Float64Array(n);
		const done = new Uint8Array(n);
		const keyOf = (r: NearestResult) =>
			(r.line * 3 + (r.side === 'left' ? 0 : r.side === 'right' ? 2 : 1)) * 2 + (r.atEnd ? 1 : 0);
		const put = (k: number, r: NearestResult) => {
			dist[k] = r.distanceM;
			seg[k] = r.line;
			flank[k] = r.side === 'left' ? -1 : r.side === 'right' ? 1 : 0;
		};
		for (let k = 0; k < n; k++) {
			const r = this.nearest(lon[k], lat[k], FAST);
			put(k, r);
			key[k] = keyOf(r);
			vertex[k] = r.vertex;
			foot[k] = r.alongM;
		}
		// A run continues while segment domain, flank and end state stay the same and the foot
		// slides continuously along the axis (onto the next vertex at most, no further than the
		// sample step): then d_g/d_c is smooth. A foot that jumps (the inside of a bend, another
		// branch of the axis) starts a new run.
		const continues = (k: number) =>
			key[k] === key[k - 1] &&
			Math.abs(vertex[k] - vertex[k - 1]) <= 1 &&
			Math.abs(foot[k] - foot[k - 1]) <= 2 * Math.abs(alongM[k] - alongM[k - 1]) + 1;
		/** Refine sample k exactly; true when it agrees with the fast ranking. */
		const exact = (k: number): boolean => {
			const r = this.nearest(lon[k], lat[k], EXACT);
			const same = keyOf(r) === key[k] && Math.abs(r.vertex - vertex[k]) <= 1;
			put(k, r);
			done[k] = 1;
			return same;
		};
		const fastD = Float64Array.from(dist);
		let i0 = 0;
		while (i0 < n) {
			let i1 = i0;
			while (i1 + 1 < n && continues(i1 + 1)) i1++;
			for (let a = i0; a <= i1; a += stride) {
				const b = Math.min(a + stride, i1);
				const okA = done[a] ? true : exact(a);
				const okB = b === a || done[b] ? true : exact(b);
				if (b - a < 2) continue;
				if (!okA || !okB || fastD[a] < 1 || fastD[b] < 1) {
					for (let k = a + 1; k < b; k++) exact(k);
					continue;
				}
				const ra = dist[a] / fastD[a];
				const rb = dist[b] / fastD[b];
				const span = alongM[b] - alongM[a];
				for (let k = a + 1; k < b; k++) {
					if (fastD[k] < 1) {
						exact(k);
						continue;
					}
					const t = span > 0 ? (alongM[k] - alongM[a]) / span : 0;
					dist[k] = fastD[k] * (ra + t * (rb - ra));
				}
			}
			i0 = i1 + 1;
		}
		const ageMa = new Float64Array(n);
		for (let k = 0; k < n; k++) {
			const r = this.rates[seg[k]];
			const u =
				flank[k] < 0 ? r.leftMmYr : flank[k] > 0 ? r.rightMmYr : 0.5 * (r.leftMmYr + r.rightMmYr);
			ageMa[k] = ageFromDistance(dist[k] / 1000, u);
		}
		return { ageMa, axisDistanceM: dist, segment: seg };
	}

	ageAt(lon: number, lat: number, options?: NearestOptions): AgeAt {
		const n = this.nearest(lon, lat, options);
		const rates = this.rates[n.line];
		// on the axis either flank is right; use the mean so a zero-rate flank cannot give NaN
		const u =
			n.side === 'left'
				? rates.leftMmYr
				: n.side === 'right'
					? rates.rightMmYr
					: 0.5 * (rates.leftMmYr + rates.rightMmYr);
		return {
			ageMa: ageFromDistance(n.distanceM / 1000, u),
			axisDistanceM: n.distanceM,
			segment: n.line,
			side: n.side,
			halfRateMmYr: u,
			beyondEnd: n.atEnd
		};
	}
}
