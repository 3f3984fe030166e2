/**
 * Residual depth along an observed track (SCIENCE.md §3, DESIGN.md §4 flow 9): for every fix the
 * predicted depth of the cruise's ridge model (the same RidgeDepthModel the chart uses), the plate
 * age, and residual = observed − predicted (positive = deeper than the model); statistics; what
 * the mean residual implies for crust (Airy) and mantle potential temperature (inverting the
 * melting model); and calibration of one segment's axial-depth anchor (least squares) and,
 * optionally, its full spreading rate (one-dimensional search minimising RMS).
 *
 * Pure and built on plain typed arrays so it can run as one task of a worker pool.
 */
import {
	DEFAULT_DEPTH_MODEL,
	curveShift,
	depthForModel,
	makeDepthPredictor,
	type DepthModelId
} from './depth';
import { MEAN_RADIUS_M } from './geodesy';
import {
	AIRY_DEFAULTS,
	DEFAULT_MELT_MODEL,
	airyShiftFromPotentialTemperatureM,
	crustFromDepthShiftKm,
	potentialTemperatureForCrust,
	type AiryParams,
	type MeltModelId
} from './melt';
import { EngineInputError, MAX_PLATE_AGE_MA, RidgeDepthModel, type RidgeInput } from './profile';

export interface TrackArrays {
	lon: ArrayLike<number>;
	lat: ArrayLike<number>;
	/** Observed depth (m, positive down); NaN = no sounding at this fix. */
	depthM: ArrayLike<number>;
}

export interface ResidualOptions {
	model?: DepthModelId;
	meltModel?: MeltModelId;
	airy?: AiryParams;
	/** Width of a histogram bin (m); default chosen from the spread. */
	binWidthM?: number;
}

export interface ResidualStats {
	/** Fixes with an observed depth. */
	n: number;
	meanM: number;
	medianM: number;
	rmsM: number;
	/** Sample standard deviation (n − 1). */
	stdM: number;
	minM: number;
	maxM: number;
}

export interface Histogram {
	/** Lower edge of the first bin (m). */
	startM: number;
	binWidthM: number;
	counts: number[];
}

export interface Implied {
	/** Change of crust vs what the prediction assumes (km, negative = thinner) for the mean residual. */
	crustalThicknessChangeKm: number;
	/** Crust implied for the fixes (km): the prediction's own crust plus the change. */
	crustKm: number;
	/** Potential temperature making that crust in the melting model; null outside its range. */
	potentialTemperatureC: number | null;
	meltModel: MeltModelId;
}

export interface TrackResiduals {
	count: number;
	/** Distance along the track (km), great circles on the mean sphere between fixes. */
	distanceKm: Float64Array;
	predictedM: Float64Array;
	lowM: Float64Array;
	highM: Float64Array;
	residualM: Float64Array;
	ageMa: Float64Array;
	axisDistanceKm: Float64Array;
	segment: Int32Array;
	stats: ResidualStats;
	histogram: Histogram;
	implied: Implied | null;
	model: DepthModelId;
}

const RAD = Math.PI / 180;

/** Cumulative haversine distance (m) on the mean sphere; antimeridian-safe. */
export function alongTrackM(lon: ArrayLike<number>, lat: ArrayLike<number>): Float64Array {
	const n = lon.length;
	const out = new Float64Array(n);
	let c0 = Math.cos(lat[0] * RAD);
	for (let i = 1; i < n; i++) {
		const c1 = Math.cos(lat[i] * RAD);
		const sLat = Math.sin(((lat[i] - lat[i - 1]) * RAD) / 2);
		const sLon = Math.sin(((lon[i] - lon[i - 1]) * RAD) / 2);
		const h = sLat * sLat + c0 * c1 * sLon * sLon;
		out[i] = out[i - 1] + 2 * MEAN_RADIUS_M * Math.asin(Math.min(1, Math.sqrt(h)));
		c0 = c1;
	}
	return out;
}

/** Statistics of the finite values of `r`. */
export function residualStats(r: ArrayLike<number>): ResidualStats {
	let n = 0;
	let sum = 0;
	let sum2 = 0;
	let min = Infinity;
	let max = -Infinity;
	for (let i = 0; i < r.length; i++) {
		const v = r[i];
		if (!Number.isFinite(v)) continue;
		n++;
		sum += v;
		sum2 += v * v;
		if (v < min) min = v;
		if (v > max) max = v;
	}
	if (n === 0) return { n, meanM: NaN, medianM: NaN, rmsM: NaN, stdM: NaN, minM: NaN, maxM: NaN };
	const finite = new Float64Array(n);
	for (let i = 0, k = 0; i < r.length; i++) if (Number.isFinite(r[i])) finite[k++] = r[i];
	finite.sort();
	const h = n >> 1;
	const median = n % 2 ? finite[h] : 0.5 * (finite[h - 1] + finite[h]);
	const mean = sum / n;
	// the two-pass form for the variance: Σ(v − mean)² without cancellation
	let ss = 0;
	for (let i = 0; i < n; i++) ss += (finite[i] - mean) * (finite[i] - mean);
	return {
		n,
		meanM: mean,
		medianM: median,
		rmsM: Math.sqrt(sum2 / n),
		stdM: n > 1 ? Math.sqrt(ss / (n - 1)) : 0,
		minM: min,
		maxM: max
	};
}

/** A round bin width (1, 2, 5 × 10^k m) giving about 30 bins over min…max. */
export function niceBinWidth(spanM: number, bins = 30): number {
	if (!(spanM > 0)) return 10;
	const raw = spanM / bins;
	const p = 10 ** Math.floor(Math.log10(raw));
	for (const m of [1, 2, 5, 10]) if (m * p >= raw) return Math.max(1, m * p);
	return 10 * p;
}

export function histogram(r: ArrayLike<number>, stats: ResidualStats, width?: number): Histogram {
	if (stats.n === 0) return { startM: 0, binWidthM: width ?? 10, counts: [] };
	const w = width ?? niceBinWidth(stats.maxM - stats.minM);
	const start = Math.floor(stats.minM / w) * w;
	const bins = Math.min(1000, Math.floor((stats.maxM - start) / w) + 1);
	const counts = new Array<number>(bins).fill(0);
	for (let i = 0; i < r.length; i++) {
		const v = r[i];
		if (!Number.isFinite(v)) continue;
		counts[Math.min(bins - 1, Math.floor((v - start) / w))]++;
	}
	return { startM: start, binWidthM: w, counts };
}

/** Depth shift (m) each segment's curve carries vs the reference-crust curve (anchor or Tp). */
function segmentShifts(ridges: readonly RidgeInput[], model: DepthModelId, melt: MeltModelId) {
	return ridges.map((r) =>
		curveShift(model, {
			axialDepthM: r.axialDepthM,
			airyShiftM:
				r.potentialTemperatureC === undefined
					? undefined
					: airyShiftFromPotentialTemperatureM(r.potentialTemperatureC, { model: melt })
		})
	);
}

/**
 * Crust and potential temperature implied by a mean residual (SCIENCE.md §3, Airy): the change
 * is −residual·(ρm − ρw)/(ρm − ρc) (+400 m ⇒ 2.27 km thinner); the implied crust is the crust the
 * prediction stands for (the reference crust shifted by the curve's own shift) plus that change,
 * and the potential temperature is the one whose melting column makes it.
 */
export function impliedByResidual(
	meanResidualM: number,
	meanCurveShiftM = 0,
	meltModel: MeltModelId = DEFAULT_MELT_MODEL,
	airy: AiryParams = AIRY_DEFAULTS
): Implied {
	const change =
		(-meanResidualM * (airy.rhoMantle - airy.rhoWater)) / (airy.rhoMantle - airy.rhoCrust) / 1000;
	const crustKm = crustFromDepthShiftKm(meanResidualM + meanCurveShiftM, airy);
	return {
		crustalThicknessChangeKm: change,
		crustKm,
		potentialTemperatureC:
			crustKm > 0 ? potentialTemperatureForCrust(crustKm, { model: meltModel }) : null,
		meltModel
	};
}

/** Residual depth for every fix of a track; see the module comment. */
export function trackResiduals(
	track: TrackArrays,
	ridges: readonly RidgeInput[],
	options: ResidualOptions = {}
): TrackResiduals {
	const n = track.lon.length;
	if (track.lat.length !== n || track.depthM.length !== n)
		throw new EngineInputError('track', 'lon, lat and depth must have the same length');
	if (n === 0) throw new EngineInputError('track', 'the track has no fixes');
	const model = options.model ?? DEFAULT_DEPTH_MODEL;
	const melt = options.meltModel ?? DEFAULT_MELT_MODEL;
	const depth = new RidgeDepthModel(ridges, { model, meltModel: melt });
	const along = alongTrackM(track.lon, track.lat);
	const d = depth.alongLine(track.lon, track.lat, along);
	const residualM = new Float64Array(n);
	const distanceKm = new Float64Array(n);
	const axisDistanceKm = new Float64Array(n);
	const shifts = segmentShifts(ridges, model, melt);
	let shiftSum = 0;
	let shiftN = 0;
	for (let i = 0; i < n; i++) {
		distanceKm[i] = along[i] / 1000;
		axisDistanceKm[i] = d.axisDistanceM[i] / 1000;
		const obs = track.depthM[i];
		residualM[i] = Number.isFinite(obs) ? obs - d.depthM[i] : NaN;
		if (Number.isFinite(obs)) {
			shiftSum += shifts[d.segment[i]];
			shiftN++;
		}
	}
	const stats = residualStats(residualM);
	return {
		count: n,
		distanceKm,
		predictedM: d.depthM,
		lowM: d.lowM,
		highM: d.highM,
		residualM,
		ageMa: d.ageMa,
		axisDistanceKm,
		segment: d.segment,
		stats,
		histogram: histogram(residualM, stats, options.binWidthM),
		implied:
			stats.n > 0 ? impliedByResidual(stats.meanM, shiftSum / shiftN, melt, options.airy) : null,
		model
	};
}

// --- Calibration -----------------------------------------------------------------------------

export interface CalibrationOptions {
	model?: DepthModelId;
	meltModel?: MeltModelId;
	/** Fixes within this distance of the segment's axis fit the anchor (km); default 15. */
	nearAxisKm?: number;
	/** Also search the full spreading rate (mm/yr) minimising the RMS; default false. */
	fitRate?: boolean;
	/** Rate search range (mm/yr); default [5, 200]. */
	rateRangeMmYr?: [number, number];
}

export interface CalibrationResult {
	segment: number;
	/** Fixes of the segment (its domain) with a depth, and how many of them are near the axis. */
	n: number;
	nNearAxis: number;
	before: { axialDepthM: number; fullRateMmYr: number; rmsM: number; rmsNearAxisM: number };
	after: { axialDepthM: number; fullRateMmYr: number; rmsM: number; rmsNearAxisM: number };
}

export const MIN_CALIBRATION_FIXES = 3;

/**
 * Fits segment `segment`'s axial-depth anchor A to the fixes near its axis by least squares:
 * with the curve anchored, predicted = f(t) − f(0) + A, so the residual is linear in A and the
 * best A is the mean of observed − f(t) + f(0) over those fixes. With `fitRate`, the full rate U
 * is found by golden-section search on log U minimising the RMS over all the segment's fixes,
 * refitting A at each trial; ages scale as 1/U (t = x/u), so the geometry is computed once.
 */
export function calibrateSegment(
	track: TrackArrays,
	ridges: readonly RidgeInput[],
	segment: number,
	options: CalibrationOptions = {}
): CalibrationResult {
	if (!(segment >= 0 && segment < ridges.length))
		throw new EngineInputError('segment', 'no such ridge segment');
	const model = options.model ?? DEFAULT_DEPTH_MODEL;
	const melt = options.meltModel ?? DEFAULT_MELT_MODEL;
	const near = (options.nearAxisKm ?? 15) * 1000;
	const r0 = trackResiduals(track, ridges, { model, meltModel: melt });
	// the segment's fixes: ages at the current rate, observed depths, near-axis flags
	const idx: number[] = [];
	for (let i = 0; i < r0.count; i++)
		if (r0.segment[i] === segment && Number.isFinite(track.depthM[i])) idx.push(i);
	const m = idx.length;
	const age0 = new Float64Array(m);
	const obs = new Float64Array(m);
	const isNear = new Uint8Array(m);
	let nNear = 0;
	idx.forEach((i, k) => {
		age0[k] = r0.ageMa[i];
		obs[k] = track.depthM[i];
		if (r0.axisDistanceKm[i] * 1000 <= near) {
			isNear[k] = 1;
			nNear++;
		}
	});
	if (nNear < MIN_CALIBRATION_FIXES)
		throw new EngineInputError(
			'track',
			`only ${nNear} fixes lie within ${near / 1000} km of the segment's axis; at least ` +
				`${MIN_CALIBRATION_FIXES} are needed to fit its axial depth`
		);
	const ridge = ridges[segment];
	const u0 = ridge.fullRateMmYr;
	const f0 = depthForModel(model, 0);
	const shift0 = segmentShifts([ridge], model, melt)[0];
	const anchor0 = f0 + shift0;

	/** Best anchor and RMS (all, near axis) for full rate u. */
	const fit = (u: number) => {
		const scale = u0 / u;
		let s = 0;
		for (let k = 0; k < m; k++) {
			if (!isNear[k]) continue;
			s += obs[k] - depthForModel(model, Math.min(age0[k] * scale, MAX_PLATE_AGE_MA)) + f0;
		}
		const anchor = s / nNear;
		const p = makeDepthPredictor(model, { axialDepthM: anchor });
		let ss = 0;
		let ssNear = 0;
		for (let k = 0; k < m; k++) {
			const e = obs[k] - p(Math.min(age0[k] * scale, MAX_PLATE_AGE_MA)).depthM;
			ss += e * e;
			if (isNear[k]) ssNear += e * e;
		}
		return { anchor, rms: Math.sqrt(ss / m), rmsNear: Math.sqrt(ssNear / nNear) };
	};
	let ssB = 0;
	let ssBN = 0;
	for (const [k, i] of idx.entries()) {
		const e = r0.residualM[i];
		ssB += e * e;
		if (isNear[k]) ssBN += e * e;
	}
	let u = u0;
	if (options.fitRate) {
		const [lo, hi] = options.rateRangeMmYr ?? [5, 200];
		let a = Math.log(lo);
		let b = Math.log(hi);
		const g = (Math.sqrt(5) - 1) / 2;
		let c = b - g * (b - a);
		let d = a + g * (b - a);
		let fc = fit(Math.exp(c)).rms;
		let fd = fit(Math.exp(d)).rms;
		for (let it = 0; it < 60 && b - a > 1e-5; it++) {
			if (fc < fd) {
				b = d;
				d = c;
				fd = fc;
				c = b - g * (b - a);
				fc = fit(Math.exp(c)).rms;
			} else {
				a = c;
				c = d;
				fc = fd;
				d = a + g * (b - a);
				fd = fit(Math.exp(d)).rms;
			}
		}
		u = Math.exp(0.5 * (a + b));
	}
	const best = fit(u);
	return {
		segment,
		n: m,
		nNearAxis: nNear,
		before: {
			axialDepthM: anchor0,
			fullRateMmYr: u0,
			rmsM: Math.sqrt(ssB / m),
			rmsNearAxisM: Math.sqrt(ssBN / nNear)
		},
		after: { axialDepthM: best.anchor, fullRateMmYr: u, rmsM: best.rms, rmsNearAxisM: best.rmsNear }
	};
}
