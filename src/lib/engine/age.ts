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
