/**
 * The one set of bounds for every number and size that enters Wakeline: the JSON API, the forms,
 * bulk edit and file imports all read them from here, so a value one door accepts is accepted by
 * every door, and every accepted value is one the engine can compute with in bounded time and
 * memory. Pure data plus two small checks; no framework imports (the engine and the worker use it).
 */

export interface Range {
	min: number;
	max: number;
	/** min itself is refused (e.g. a speed must be above it, not equal). */
	minExclusive?: boolean;
	unit: string;
}

/** Speeds, rates, durations and counts, each with its unit. */
export const LIMITS = {
	/** [trade] multibeam survey runs at 4–12 kn; below 1 kn a ship cannot keep steerage way. */
	surveySpeedKn: { min: 1, max: 20, unit: 'kn' },
	/** [trade] research vessels cruise at 10–15 kn; none transits above 25. */
	transitSpeedKn: { min: 2, max: 25, unit: 'kn' },
	/** [trade] oceanographic winches pay out 30–90 m/min. */
	winchSpeedMPerMin: { min: 5, max: 150, unit: 'm/min' },
	/** [published] full spreading rates span ≈ 10–160 mm/yr (ultra-slow to super-fast). */
	fullRateMmYr: { min: 0, max: 300, minExclusive: true, unit: 'mm/yr' },
	overlapPct: { min: 0, max: 90, unit: '%' },
	axialDepthM: { min: 0, max: 11_000, unit: 'm' },
	swathAngleDeg: { min: 60, max: 160, unit: '°' },
	swathDepthFactor: { min: 1, max: 10, unit: '' },
	/** Depth-profile sampling step. */
	spacingKm: { min: 0.01, max: 100, unit: 'km' },
	dayRate: { min: 0, max: 10_000_000, unit: '' },
	enduranceDays: { min: 1, max: 365, unit: 'days' },
	scienceBerths: { min: 1, max: 200, unit: 'berths' },
	allocatedDays: { min: 1, max: 400, unit: 'days' },
	/** A station's own settings (durations in h, heights in m, speeds in m/min): none beyond this. */
	stationParam: { min: 0, max: 12_000, unit: '' },
	turnH: { min: 0, max: 24, unit: 'h' },
	mobilisationH: { min: 0, max: 240, unit: 'h' },
	portCallH: { min: 1, max: 480, unit: 'h' },
	weatherMarginPct: { min: 0, max: 100, unit: '%' },
	weatherMarginDays: { min: 0, max: 60, unit: 'days' }
} as const satisfies Record<string, Range>;

export type LimitName = keyof typeof LIMITS;

/** Sizes: vertices, samples, items. Chosen so the worst shape within them computes in ≲ 1 s. */
export const SIZES = {
	/** Vertices of one ridge axis. */
	axisVertices: 2000,
	/** Total geodesic length of one ridge axis (km): the nearest-point index grows with it. */
	axisLengthKm: 10_000,
	/** Vertices of one survey line. */
	lineVertices: 5000,
	/** Vertices of one survey area's ring. */
	ringVertices: 2000,
	/** Samples one depth profile may return (≈ 230 bytes each in JSON: ≤ 5 MB). */
	profileSamples: 20_000,
	/** Items of one kind in a plan (ridges, lines, areas, stations), per import and per cruise. */
	planItems: 2000,
	/** Own settings on one station. */
	stationParams: 20,
	/** Days a timeline may span (departure to return), and so its day rows. */
	timelineDays: 400
} as const;

/** "surveySpeedKn must be within 1–20 kn" — names the field and the allowed range. */
export function rangeMessage(field: string, r: Range): string {
	const unit = r.unit ? ` ${r.unit}` : '';
	return r.minExclusive
		? `${field} must be above ${r.min} and at most ${r.max}${unit}`
		: `${field} must be within ${r.min}–${r.max}${unit}`;
}

export function inRange(v: number, r: Range): boolean {
	return Number.isFinite(v) && (r.minExclusive ? v > r.min : v >= r.min) && v <= r.max;
}

const R_KM = 6371.0088;
const RAD = Math.PI / 180;

/** Great-circle distance (km) on the mean sphere: enough for a size limit. */
function arcKm(a: readonly number[], b: readonly number[]): number {
	const dLat = (b[1] - a[1]) * RAD;
	const dLon = (b[0] - a[0]) * RAD;
	const h =
		Math.sin(dLat / 2) ** 2 + Math.cos(a[1] * RAD) * Math.cos(b[1] * RAD) * Math.sin(dLon / 2) ** 2;
	return 2 * R_KM * Math.asin(Math.min(1, Math.sqrt(h)));
}

export interface ShapeProblem {
	/** Index of the offending vertex, when one is to blame. */
	vertex?: number;
	message: string;
}

/**
 * Problems of a ridge axis that the nearest-point search cannot answer in bounded time: too many
 * vertices, too long, a repeated vertex (a zero-length segment) or a segment that retraces an
 * earlier one (every point is then equally near to all the copies). Null when the axis is fine.
 */
export function axisProblem(coords: readonly (readonly number[])[]): ShapeProblem | null {
	if (coords.length > SIZES.axisVertices) {
		return {
			message: `an axis may have at most ${SIZES.axisVertices} vertices; this one has ${coords.length}`
		};
	}
	const seen = new Set<string>();
	// ~1 m: vertices closer than this are the same place for the search.
	const key = (p: readonly number[]) => `${p[0].toFixed(5)},${p[1].toFixed(5)}`;
	let lengthKm = 0;
	for (let i = 1; i < coords.length; i++) {
		const a = key(coords[i - 1]);
		const b = key(coords[i]);
		if (a === b) return { vertex: i, message: `vertex ${i} repeats vertex ${i - 1}` };
		const seg = a < b ? `${a}|${b}` : `${b}|${a}`;
		if (seen.has(seg))
			return { vertex: i, message: `segment ending at vertex ${i} retraces an earlier segment` };
		seen.add(seg);
		lengthKm += arcKm(coords[i - 1], coords[i]);
	}
	if (lengthKm > SIZES.axisLengthKm) {
		return {
			message: `an axis may be at most ${SIZES.axisLengthKm} km long; this one is ${Math.round(lengthKm)} km`
		};
	}
	return null;
}
