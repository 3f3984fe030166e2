/**
 * Seafloor depth from plate age: the published age–depth curves, the half-space and plate
 * cooling models they come from, anchoring to a measured axial depth and the uncertainty band.
 *
 * Depth in metres, positive down; age t in Myr (Ma).
 */

export type DepthModelId = 'parsons-sclater-1977' | 'stein-stein-1992' | 'half-space';

export const DEPTH_MODEL_IDS: readonly DepthModelId[] = [
	'parsons-sclater-1977',
	'stein-stein-1992',
	'half-space'
];

/** GDH1 is the default: it fits old seafloor better than Parsons & Sclater. */
export const DEFAULT_DEPTH_MODEL: DepthModelId = 'stein-stein-1992';

/** Seconds in one million years (Julian year, 365.25 d). */
export const SECONDS_PER_MYR = 3.15576e13;

function checkAge(t: number): void {
	if (!(t >= 0) || !Number.isFinite(t)) throw new RangeError(`age must be ≥ 0 Myr, got ${t}`);
}

// --- Parsons & Sclater (1977), J. Geophys. Res. 82, 803 ------------------------------------

/** Young branch: d = 2500 + 350·√t (Parsons & Sclater 1977). */
export function depthParsonsSclaterYoung(t: number): number {
	return 2500 + 350 * Math.sqrt(t);
}

/** Old branch: d = 6400 − 3200·exp(−t/62.8) (Parsons & Sclater 1977). */
export function depthParsonsSclaterOld(t: number): number {
	return 6400 - 3200 * Math.exp(-t / 62.8);
}

/**
 * Age where the two Parsons & Sclater branches cross (≈ 26.27 Myr). The paper's fitting ranges
 * overlap (0–70 and > 20 Myr); switching at the crossing keeps the curve continuous, where a
 * switch at 70 Myr would leave a 78 m step. Found by bisection on the difference of the branches.
 */
export const PS77_SWITCH_AGE_MA: number = (() => {
	const f = (t: number) => depthParsonsSclaterYoung(t) - depthParsonsSclaterOld(t);
	let lo = 1;
	let hi = 70;
	for (let i = 0; i < 200 && hi - lo > 1e-13; i++) {
		const mid = 0.5 * (lo + hi);
		if (f(mid) < 0) lo = mid;
		else hi = mid;
	}
	return 0.5 * (lo + hi);
})();

export function depthParsonsSclater(t: number): number {
	checkAge(t);
	return t < PS77_SWITCH_AGE_MA ? depthParsonsSclaterYoung(t) : depthParsonsSclaterOld(t);
}

// --- Stein & Stein (1992) GDH1, Nature 359, 123 ----------------------------------------------

/** GDH1 switches branches at 20 Myr, where they meet within 0.4 m (Stein & Stein 1992). */
export const GDH1_SWITCH_AGE_MA = 20;

export function depthGdh1Young(t: number): number {
	return 2600 + 365 * Math.sqrt(t);
}

export function depthGdh1Old(t: number): number {
	return 5651 - 2473 * Math.exp(-0.0278 * t);
}

export function depthGdh1(t: number): number {
	checkAge(t);
	return t < GDH1_SWITCH_AGE_MA ? depthGdh1Young(t) : depthGdh1Old(t);
}

// --- Half-space cooling (Turcotte & Schubert, Geodynamics) ---------------------------------

export interface HalfSpaceParams {
	/** Depth at zero age, d_r (m). */
	ridgeDepthM: number;
	/** Mantle density ρm (kg/m³). */
	rhoMantle: number;
	/** Seawater density ρw (kg/m³). */
	rhoWater: number;
	/** Volumetric thermal expansion α (1/K). */
	alpha: number;
	/** Mantle minus seawater temperature Tm − Tw (K). */
	deltaT: number;
	/** Thermal diffusivity κ (m²/s). */
	kappa: number;
}

/** SCIENCE.md §1 parameters; d_r 2500 m as in the check table. */
export const HALF_SPACE_DEFAULTS: Readonly<HalfSpaceParams> = Object.freeze({
	ridgeDepthM: 2500,
	rhoMantle: 3300,
	rhoWater: 1000,
	alpha: 3e-5,
	deltaT: 1300,
	kappa: 1e-6
});

/** Subsidence per √Myr: 2ρm·α·(Tm − Tw)/(ρm − ρw)·√(κ·t/π) with t = 1 Myr in seconds. */
export function halfSpaceCoefficient(p: Readonly<HalfSpaceParams> = HALF_SPACE_DEFAULTS): number {
	return (
		((2 * p.rhoMantle * p.alpha * p.deltaT) / (p.rhoMantle - p.rhoWater)) *
		Math.sqrt((p.kappa * SECONDS_PER_MYR) / Math.PI)
	);
}

/** d = d_r + [2ρm·α·(Tm − Tw)/(ρm − ρw)]·√(κt/π). */
export function depthHalfSpace(
	t: number,
	p: Readonly<HalfSpaceParams> = HALF_SPACE_DEFAULTS
): number {
	checkAge(t);
	return p.ridgeDepthM + halfSpaceCoefficient(p) * Math.sqrt(t);
}

// --- Plate model (general series) ----------------------------------------------------------

export interface PlateParams {
	ridgeDepthM: number;
	/** Plate thickness a (m). */
	plateThicknessM: number;
	/** Basal temperature Tm (°C, relative to seawater at 0 °C). */
	mantleTempC: number;
	alpha: number;
	/** Thermal conductivity k (W/m/K). */
	conductivity: number;
	/** Specific heat cp (J/kg/K). */
	heatCapacity: number;
	rhoMantle: number;
	rhoWater: number;
}

/** The plate behind GDH1 (Stein & Stein 1992): a 95 km, Tm 1450 °C, α 3.1e-5, k 3.138, cp 1171. */
export const GDH1_PLATE: Readonly<PlateParams> = Object.freeze({
	ridgeDepthM: 2600,
	plateThicknessM: 95e3,
	mantleTempC: 1450,
	alpha: 3.1e-5,
	conductivity: 3.138,
	heatCapacity: 1171,
	rhoMantle: 3330,
	rhoWater: 1000
});

/**
 * Plate-model depth (e.g. Parsons & Sclater 1977; Stein & Stein 1992):
 * d = d_r + (ρm·α·Tm·a/(ρm − ρw))·[½ − (4/π²)·Σ_{n odd} n⁻²·exp(−n²π²κt/a²)], κ = k/(ρm·cp).
 * The series is summed until its terms vanish (≈ √(40/c) terms, c = π²κt/a²); below c = 1e-10
 * (seconds-old floor) the bracket takes its half-space limit 2√(κt/π)/a.
 */
export function depthPlate(t: number, p: Readonly<PlateParams> = GDH1_PLATE): number {
	checkAge(t);
	const kappa = p.conductivity / (p.rhoMantle * p.heatCapacity);
	const c = (Math.PI * Math.PI * kappa * t * SECONDS_PER_MYR) / p.plateThicknessM ** 2;
	const amp =
		(p.rhoMantle * p.alpha * p.mantleTempC * p.plateThicknessM) / (p.rhoMantle - p.rhoWater);
	if (c < 1e-10) return p.ridgeDepthM + amp * ((2 * Math.sqrt(c)) / Math.PI ** 1.5);
	let sum = 0;
	for (let n = 1; ; n += 2) {
		const e = Math.exp(-n * n * c);
		sum += e / (n * n);
		if (e < 1e-18) break;
	}
	return p.ridgeDepthM + amp * (0.5 - (4 / (Math.PI * Math.PI)) * sum);
}

// --- Model dispatch, anchoring, uncertainty band ---------------------------------------------

export function depthForModel(model: DepthModelId, t: number): number {
	switch (model) {
		case 'parsons-sclater-1977':
			return depthParsonsSclater(t);
		case 'stein-stein-1992':
			return depthGdh1(t);
		case 'half-space':
			return depthHalfSpace(t);
	}
}

/** Our convention (SCIENCE.md §1): envelope of the three published curves widened by ±200 m. */
export const BAND_WIDEN_M = 200;

export interface DepthShift {
	/**
	 * Measured axial depth: every curve is shifted so its depth at t = 0 equals it. Takes
	 * precedence over airyShiftM.
	 */
	axialDepthM?: number;
	/** Isostatic shift of the whole curve (negative = shallower), e.g. from crustal thickness. */
	airyShiftM?: number;
}

/** Shift (m) applied to `model` by anchoring or by an Airy correction. */
export function curveShift(model: DepthModelId, shift: DepthShift = {}): number {
	if (shift.axialDepthM !== undefined) return shift.axialDepthM - depthForModel(model, 0);
	return shift.airyShiftM ?? 0;
}

export interface PredictedDepth {
	depthM: number;
	/** Shallow edge of the band. */
	lowM: number;
	/** Deep edge of the band. */
	highM: number;
}

/**
 * Predicted depth at age t with the band. Each of the three curves gets the same treatment as the
 * chosen one (anchored to the same axial depth, or the same Airy shift), so the band moves with it.
 */
export function predictDepth(
	t: number,
	model: DepthModelId = DEFAULT_DEPTH_MODEL,
	shift: DepthShift = {}
): PredictedDepth {
	const depthM = depthForModel(model, t) + curveShift(model, shift);
	let lo = depthM;
	let hi = depthM;
	for (const m of DEPTH_MODEL_IDS) {
		const d = depthForModel(m, t) + curveShift(m, shift);
		if (d < lo) lo = d;
		if (d > hi) hi = d;
	}
	return { depthM, lowM: lo - BAND_WIDEN_M, highM: hi + BAND_WIDEN_M };
}

/** Precomputed shifts for repeated predictions (profiles, grids); writes into `out` if given. */
export function makeDepthPredictor(
	model: DepthModelId = DEFAULT_DEPTH_MODEL,
	shift: DepthShift = {}
): (t: number, out?: PredictedDepth) => PredictedDepth {
	const sPs = curveShift('parsons-sclater-1977', shift);
	const sGdh = curveShift('stein-stein-1992', shift);
	const sHs = curveShift('half-space', shift);
	const hsCoefficient = halfSpaceCoefficient();
	const hsRidge = HALF_SPACE_DEFAULTS.ridgeDepthM;
	return (t: number, out?: PredictedDepth) => {
		checkAge(t);
		const a =
			(t < PS77_SWITCH_AGE_MA ? depthParsonsSclaterYoung(t) : depthParsonsSclaterOld(t)) + sPs;
		const b = (t < GDH1_SWITCH_AGE_MA ? depthGdh1Young(t) : depthGdh1Old(t)) + sGdh;
		const c = hsRidge + hsCoefficient * Math.sqrt(t) + sHs;
		const depthM = model === 'parsons-sclater-1977' ? a : model === 'stein-stein-1992' ? b : c;
		const lowM = Math.min(a, b, c) - BAND_WIDEN_M;
		const highM = Math.max(a, b, c) + BAND_WIDEN_M;
		if (!out) return { depthM, lowM, highM };
		out.depthM = depthM;
		out.lowM = lowM;
		out.highM = highM;
		return out;
	};
}
