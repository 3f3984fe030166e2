/**
 * Predicted depth along a line and over a grid: the computation behind
 * `POST /api/v1/depth-profile` (DESIGN.md §6) and the isobath layer.
 */
import { RidgeAgeModel, type AgesAlong, type RidgeSegment } from './age';
import {
	DEFAULT_DEPTH_MODEL,
	DEPTH_MODEL_IDS,
	makeDepthPredictor,
	type DepthModelId,
	type PredictedDepth
} from './depth';
import { normalizeLon, sampleLine, SampleCountError, type LonLat } from './geodesy';
import { axisProblem, SIZES } from './limits';
import {
	MAX_POTENTIAL_TEMPERATURE_C,
	airyShiftFromPotentialTemperatureM,
	type MeltModelId
} from './melt';
import { DEFAULT_SWATH_ANGLE_DEG, DEFAULT_WIDTH_FACTOR, swathWidthM } from './survey';

/** Bad input the engine cannot compute with; `field` names it (dotted path) for a 422 answer. */
export class EngineInputError extends Error {
	readonly field: string;
	constructor(field: string, message: string) {
		super(message);
		this.name = 'EngineInputError';
		this.field = field;
	}
}

/** Most samples one profile may return (the shared limit). */
export const MAX_PROFILE_SAMPLES = SIZES.profileSamples;
export const DEFAULT_SPACING_KM = 1;
/** Ages are capped here (older than any ocean floor), e.g. on a flank that does not spread. */
export const MAX_PLATE_AGE_MA = 300;

/** One ridge segment with its mantle and anchoring settings. */
export interface RidgeInput extends RidgeSegment {
	/** Mantle potential temperature (°C): shifts the curve by the Airy effect of its crust. */
	potentialTemperatureC?: number;
	/** Measured axial depth (m): anchors the curve (wins over the potential temperature). */
	axialDepthM?: number;
}

export interface RidgeDepthOptions {
	model?: DepthModelId;
	meltModel?: MeltModelId;
}

const EXACT = { exact: true };
const FAST = { exact: false };

export interface DepthsAlong extends AgesAlong {
	depthM: Float64Array;
	lowM: Float64Array;
	highM: Float64Array;
}

export interface DepthAt extends PredictedDepth {
	ageMa: number;
	axisDistanceM: number;
	segment: number;
}

function checkPositions(field: string, coords: readonly LonLat[]): void {
	if (!Array.isArray(coords) || coords.length < 2) {
		throw new EngineInputError(field, 'needs at least two positions');
	}
	coords.forEach((p, i) => {
		if (!Array.isArray(p) || p.length < 2 || !Number.isFinite(p[0]) || !Number.isFinite(p[1])) {
			throw new EngineInputError(`${field}.${i}`, 'a position is [longitude, latitude] in degrees');
		}
		if (Math.abs(p[1]) > 90) {
			const hint = Math.abs(p[0]) <= 90 ? ' (positions are [longitude, latitude]: swapped?)' : '';
			throw new EngineInputError(`${field}.${i}`, `latitude ${p[1]} is outside ±90°${hint}`);
		}
	});
}

function checkRidge(field: string, r: RidgeInput): void {
	checkPositions(`${field}.axis.coordinates`, r.axis);
	const shape = axisProblem(r.axis);
	if (shape) {
		const at = shape.vertex === undefined ? '' : `.${shape.vertex}`;
		throw new EngineInputError(`${field}.axis.coordinates${at}`, shape.message);
	}
	if (!(r.fullRateMmYr > 0) || !Number.isFinite(r.fullRateMmYr)) {
		throw new EngineInputError(`${field}.fullRateMmYr`, 'full spreading rate must be > 0 mm/yr');
	}
	if (r.asymmetry !== undefined && !(r.asymmetry >= 0 && r.asymmetry <= 1)) {
		throw new EngineInputError(`${field}.asymmetry`, 'asymmetry must be within 0..1');
	}
	const tp = r.potentialTemperatureC;
	if (tp !== undefined && !(Number.isFinite(tp) && tp <= MAX_POTENTIAL_TEMPERATURE_C)) {
		throw new EngineInputError(
			`${field}.potentialTemperatureC`,
			`potential temperature must be at most ${MAX_POTENTIAL_TEMPERATURE_C} °C`
		);
	}
	if (r.axialDepthM !== undefined && !(r.axialDepthM >= 0 && Number.isFinite(r.axialDepthM))) {
		throw new EngineInputError(`${field}.axialDepthM`, 'axial depth must be ≥ 0 m');
	}
}

/**
 * Predicted depth anywhere from one or more ridge segments: age from the segment the point
 * belongs to (see RidgeAgeModel), then that segment's age–depth curve, anchored to its measured
 * axial depth or shifted by the Airy effect of its potential temperature.
 */
export class RidgeDepthModel {
	readonly model: DepthModelId;
	private readonly ages: RidgeAgeModel;
	private readonly predictors: ((t: number, out?: PredictedDepth) => PredictedDepth)[];
	private readonly scratch: PredictedDepth = { depthM: 0, lowM: 0, highM: 0 };

	constructor(ridges: readonly RidgeInput[], options: RidgeDepthOptions = {}) {
		if (ridges.length === 0) throw new EngineInputError('ridge', 'at least one ridge segment');
		const model = options.model ?? DEFAULT_DEPTH_MODEL;
		if (!DEPTH_MODEL_IDS.includes(model)) {
			throw new EngineInputError('model', `model must be one of ${DEPTH_MODEL_IDS.join(', ')}`);
		}
		ridges.forEach((r, i) => checkRidge(ridges.length === 1 ? 'ridge' : `ridges.${i}`, r));
		this.model = model;
		try {
			this.ages = new RidgeAgeModel(ridges);
		} catch (e) {
			throw new EngineInputError('ridge.axis', (e as Error).message);
		}
		this.predictors = ridges.map((r) =>
			makeDepthPredictor(model, {
				axialDepthM: r.axialDepthM,
				airyShiftM:
					r.potentialTemperatureC === undefined
						? undefined
						: airyShiftFromPotentialTemperatureM(r.potentialTemperatureC, {
								model: options.meltModel
							})
			})
		);
	}

	/**
	 * Predictions for consecutive samples of a line (see RidgeAgeModel.agesAlong): the same as
	 * depthAt per sample to within 1 mm of axis distance, several times faster.
	 */
	alongLine(
		lon: ArrayLike<number>,
		lat: ArrayLike<number>,
		alongM: ArrayLike<number>
	): DepthsAlong {
		const a = this.ages.agesAlong(lon, lat, alongM);
		const n = lon.length;
		const depthM = new Float64Array(n);
		const lowM = new Float64Array(n);
		const highM = new Float64Array(n);
		for (let k = 0; k < n; k++) {
			const ageMa = Math.min(a.ageMa[k], MAX_PLATE_AGE_MA);
			a.ageMa[k] = ageMa;
			const p = this.predictors[a.segment[k]](ageMa, this.scratch);
			depthM[k] = p.depthM;
			lowM[k] = p.lowM;
			highM[k] = p.highM;
		}
		return { ...a, depthM, lowM, highM };
	}

	/** exact: geodesic refinement (default); false: the fast chord path for grids. */
	depthAt(lon: number, lat: number, exact = true): DepthAt {
		const a = this.ages.ageAt(lon, lat, exact ? EXACT : FAST);
		const ageMa = Math.min(a.ageMa, MAX_PLATE_AGE_MA);
		const p = this.predictors[a.segment](ageMa, this.scratch);
		return {
			depthM: p.depthM,
			lowM: p.lowM,
			highM: p.highM,
			ageMa,
			axisDistanceM: a.axisDistanceM,
			segment: a.segment
		};
	}
}

export interface DepthProfileSample {
	distanceKm: number;
	lon: number;
	lat: number;
	axisDistanceKm: number;
	ageMa: number;
	depthM: number;
	depthLowM: number;
	depthHighM: number;
	swathWidthM: number;
}

export interface DepthProfileResult {
	samples: DepthProfileSample[];
	lengthKm: number;
	model: DepthModelId;
}

export interface ProfileOptions extends RidgeDepthOptions {
	spacingKm?: number;
	swathAngleDeg?: number;
	widthFactor?: number;
}

/** A GeoJSON LineString (only its coordinates are read). */
export interface LineStringLike {
	type?: 'LineString';
	coordinates: readonly LonLat[];
}

/** The API body (DESIGN.md §6). */
export interface DepthProfileInput {
	line: LineStringLike;
	ridge: Omit<RidgeInput, 'axis'> & { axis: LineStringLike };
	model?: DepthModelId;
	spacingKm?: number;
	swathAngleDeg?: number;
}

/** Depth profile along a line (vertices joined by geodesics) from one or more ridge segments. */
export function depthProfileForRidges(
	line: readonly LonLat[],
	ridges: readonly RidgeInput[],
	options: ProfileOptions = {}
): DepthProfileResult {
	checkPositions('line.coordinates', line);
	const spacingKm = options.spacingKm ?? DEFAULT_SPACING_KM;
	if (!(spacingKm > 0) || !Number.isFinite(spacingKm)) {
		throw new EngineInputError('spacingKm', 'spacing must be a positive number of km');
	}
	const angle = options.swathAngleDeg ?? DEFAULT_SWATH_ANGLE_DEG;
	if (!(angle > 0 && angle < 180)) {
		throw new EngineInputError('swathAngleDeg', 'swath angle must be within (0, 180) degrees');
	}
	const k = options.widthFactor ?? DEFAULT_WIDTH_FACTOR;
	const depth = new RidgeDepthModel(ridges, options);
	let s: ReturnType<typeof sampleLine>;
	try {
		s = sampleLine(line, spacingKm * 1000, MAX_PROFILE_SAMPLES);
	} catch (e) {
		if (!(e instanceof SampleCountError)) throw e;
		const km = e.lengthM / 1000;
		const min = km / (MAX_PROFILE_SAMPLES - 1);
		throw new EngineInputError(
			'spacingKm',
			`a ${km.toFixed(1)} km line every ${spacingKm} km gives ${e.count} samples; ` +
				`at most ${MAX_PROFILE_SAMPLES} (use spacingKm ≥ ${min.toPrecision(3)})`
		);
	}
	const lengthKm = s.lengthM / 1000;
	const samples: DepthProfileSample[] = [];
	const d = depth.alongLine(s.lon, s.lat, s.distanceM);
	for (let i = 0; i < s.count; i++) {
		samples.push({
			distanceKm: s.distanceM[i] / 1000,
			lon: s.lon[i],
			lat: s.lat[i],
			axisDistanceKm: d.axisDistanceM[i] / 1000,
			ageMa: d.ageMa[i],
			depthM: d.depthM[i],
			depthLowM: d.lowM[i],
			depthHighM: d.highM[i],
			swathWidthM: swathWidthM(d.depthM[i], angle, k)
		});
	}
	return { samples, lengthKm, model: depth.model };
}

/** `POST /api/v1/depth-profile`: one ridge, GeoJSON LineStrings. Throws EngineInputError. */
export function depthProfile(input: DepthProfileInput): DepthProfileResult {
	if (!input?.line?.coordinates) throw new EngineInputError('line', 'a GeoJSON LineString');
	if (!input.ridge?.axis?.coordinates) {
		throw new EngineInputError('ridge.axis', 'a GeoJSON LineString');
	}
	const { axis, ...ridge } = input.ridge;
	return depthProfileForRidges(input.line.coordinates, [{ ...ridge, axis: axis.coordinates }], {
		model: input.model,
		spacingKm: input.spacingKm,
		swathAngleDeg: input.swathAngleDeg
	});
}

/** [west, south, east, north] in degrees; west > east crosses the antimeridian. */
export type BBox = readonly [number, number, number, number];

export interface GridOptions extends RidgeDepthOptions {
	/** Geodesic refinement per node (slower); default false (≈1e-5 relative in distance). */
	exact?: boolean;
}

/**
 * Predicted depths on an nx × ny lon/lat grid covering bbox, nodes on its edges. Row-major,
 * row 0 along the north edge, column 0 along the west edge (image order, as contouring expects).
 */
export function depthGrid(
	bbox: BBox,
	nx: number,
	ny: number,
	ridges: readonly RidgeInput[],
	options: GridOptions = {}
): Float32Array {
	const [west, south, east, north] = bbox;
	if (!(Number.isInteger(nx) && Number.isInteger(ny) && nx >= 2 && ny >= 2)) {
		throw new EngineInputError('grid', 'nx and ny must be integers ≥ 2');
	}
	if (!(south >= -90 && north <= 90 && south < north)) {
		throw new EngineInputError('bbox', 'bbox needs −90 ≤ south < north ≤ 90');
	}
	const span = east > west ? east - west : east + 360 - west;
	const depth = new RidgeDepthModel(ridges, options);
	const out = new Float32Array(nx * ny);
	const exact = options.exact ?? false;
	for (let j = 0; j < ny; j++) {
		const lat = north - ((north - south) * j) / (ny - 1);
		for (let i = 0; i < nx; i++) {
			const lon = normalizeLon(west + (span * i) / (nx - 1));
			out[j * nx + i] = depth.depthAt(lon, lat, exact).depthM;
		}
	}
	return out;
}
