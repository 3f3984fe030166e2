/**
 * Mantle potential temperature → decompression melting → crustal thickness → axial depth
 * (SCIENCE.md §3), and the inverse: a depth anomaly → implied crust and potential temperature.
 *
 * Pressure P in GPa at the interfaces (Pa inside the thermodynamics), temperature in °C at the
 * interfaces (kelvin inside logarithms), thickness in km.
 */

export type MeltModelId = 'mckenzie-bickle-1988' | 'katz-2003';

export const DEFAULT_MELT_MODEL: MeltModelId = 'mckenzie-bickle-1988';

const K0 = 273.15;
const GPA = 1e9;

interface Thermo {
	/** Specific heat cp (J/kg/K). */
	cp: number;
	/** Entropy of fusion ΔS (J/kg/K). */
	deltaS: number;
	/** Thermal expansion of solid and melt (1/K). */
	alphaS: number;
	alphaF: number;
	/** Densities of solid and melt (kg/m³). */
	rhoS: number;
	rhoF: number;
}

/** Melt fraction as a function of T at one fixed pressure (set up once per pressure step). */
interface MeltAtPressure {
	solidusC: number;
	fraction(tC: number): number;
}

interface MeltModel extends Thermo {
	solidusC(pGPa: number): number;
	atPressure(pGPa: number): MeltAtPressure;
}

// --- McKenzie & Bickle (1988), J. Petrology 29, 625 ------------------------------------------

/** M&B88 solidus as published, P (GPa) from T (°C): P = (Ts − 1100)/136 + 4.968e-4·e^{0.012(Ts − 1100)}. */
export function mckenzieBickleSolidusPressure(tC: number): number {
	return (tC - 1100) / 136 + 4.968e-4 * Math.exp(1.2e-2 * (tC - 1100));
}

/** The M&B88 solidus inverted for T(P) by Newton's method (P(T) is increasing and convex). */
export function mckenzieBickleSolidus(pGPa: number): number {
	let t = 1100 + 136 * pGPa;
	for (let i = 0; i < 50; i++) {
		const e = 4.968e-4 * Math.exp(1.2e-2 * (t - 1100));
		const f = (t - 1100) / 136 + e - pGPa;
		const step = f / (1 / 136 + 1.2e-2 * e);
		t -= step;
		if (Math.abs(step) < 1e-10) break;
	}
	return t;
}

/** M&B88 liquidus: Tl = 1736 + 4.343·P + 180·atan(P/2.2169). */
export function mckenzieBickleLiquidus(pGPa: number): number {
	return 1736 + 4.343 * pGPa + 180 * Math.atan(pGPa / 2.2169);
}

/** M&B88 melt fraction: x − 0.5 = T' + (T'² − 0.25)·(0.4256 + 2.988·T'). */
export function mckenzieBickleFraction(pGPa: number, tC: number): number {
	return mbAtPressure(pGPa).fraction(tC);
}

function mbAtPressure(pGPa: number): MeltAtPressure {
	const ts = mckenzieBickleSolidus(pGPa);
	const tl = mckenzieBickleLiquidus(pGPa);
	const mid = 0.5 * (ts + tl);
	const span = tl - ts;
	return {
		solidusC: ts,
		fraction(tC: number): number {
			const tp = (tC - mid) / span;
			if (tp <= -0.5) return 0;
			if (tp >= 0.5) return 1;
			return 0.5 + tp + (tp * tp - 0.25) * (0.4256 + 2.988 * tp);
		}
	};
}

const MCKENZIE_BICKLE: MeltModel = {
	cp: 1120,
	deltaS: 250,
	alphaS: 4e-5,
	alphaF: 6.8e-5,
	rhoS: 3300,
	rhoF: 2800,
	solidusC: mckenzieBickleSolidus,
	atPressure: mbAtPressure
};

// --- Katz, Spiegelman & Langmuir (2003), G³ 4, 1073 (anhydrous) -------------------------------

export function katzSolidus(pGPa: number): number {
	return 1085.7 + 132.9 * pGPa - 5.1 * pGPa * pGPa;
}

export function katzLherzoliteLiquidus(pGPa: number): number {
	return 1475 + 80 * pGPa - 3.2 * pGPa * pGPa;
}

export function katzLiquidus(pGPa: number): number {
	return 1780 + 45 * pGPa - 2.0 * pGPa * pGPa;
}

/** Katz 2003 dry melt fraction, with clinopyroxene exhausted at F = 0.17/(0.5 + 0.08·P). */
export function katzFraction(pGPa: number, tC: number): number {
	return katzAtPressure(pGPa).fraction(tC);
}

function katzAtPressure(pGPa: number): MeltAtPressure {
	const tsol = katzSolidus(pGPa);
	const tlz = katzLherzoliteLiquidus(pGPa);
	const tliq = katzLiquidus(pGPa);
	const fcpx = Math.min(1, 0.17 / (0.5 + 0.08 * pGPa));
	const tcpx = tsol + Math.pow(fcpx, 1 / 1.5) * (tlz - tsol);
	return {
		solidusC: tsol,
		fraction(tC: number): number {
			if (tC <= tsol) return 0;
			if (tC < tcpx) {
				const x = (tC - tsol) / (tlz - tsol);
				return x * Math.sqrt(x); // x^1.5
			}
			if (tC >= tliq) return 1;
			const y = (tC - tcpx) / (tliq - tcpx);
			return fcpx + (1 - fcpx) * y * Math.sqrt(y);
		}
	};
}

const KATZ: MeltModel = {
	cp: 1000,
	deltaS: 300,
	alphaS: 4e-5,
	alphaF: 6.8e-5,
	rhoS: 3300,
	rhoF: 2900,
	solidusC: katzSolidus,
	atPressure: katzAtPressure
};

const MODELS: Record<MeltModelId, MeltModel> = {
	'mckenzie-bickle-1988': MCKENZIE_BICKLE,
	'katz-2003': KATZ
};

/** Hirschmann (2000) peridotite solidus, for comparison only: −5.104P² + 132.899P + 1120.661. */
export function hirschmannSolidus(pGPa: number): number {
	return -5.104 * pGPa * pGPa + 132.899 * pGPa + 1120.661;
}

// --- Melting column -------------------------------------------------------------------------

/** Density and gravity that turn the melt column into crust (SCIENCE.md §3: ρ 3300, g 9.81). */
export const CRUST_COLUMN = Object.freeze({ rho: 3300, g: 9.81 });

/** Solid adiabat: T(P) = (Tp + 273.15)·exp(α·P/(ρ·cp)) − 273.15. */
export function solidAdiabat(
	tpC: number,
	pGPa: number,
	model: MeltModelId = DEFAULT_MELT_MODEL
): number {
	const m = MODELS[model];
	return (tpC + K0) * Math.exp((m.alphaS * pGPa * GPA) / (m.rhoS * m.cp)) - K0;
}

export interface MeltColumnOptions {
	model?: MeltModelId;
	/** Pressure step (GPa), default 1e-3. */
	stepGPa?: number;
}

export interface MeltColumn {
	model: MeltModelId;
	potentialTemperatureC: number;
	/** Where the adiabat meets the solidus (GPa); NaN if the mantle never melts. */
	solidusPressureGPa: number;
	/** Melt fraction at the surface (P = 0). */
	surfaceMeltFraction: number;
	/** Crustal thickness (km) for passive upwelling under a ridge. */
	crustKm: number;
	/** Pressure (GPa) at the top of the melting region, where the crust's load equals P. */
	topPressureGPa: number;
	/** Melt fraction at the top of the melting region. */
	topMeltFraction: number;
}

/**
 * Hottest potential temperature accepted (°C). Hotter adiabats first meet the solidus deeper than
 * ~5–7 GPa, beyond the calibration of both parameterisations (the M&B88 solidus then flattens and
 * the Katz quadratic turns over, so the adiabat may never cross it).
 */
export const MAX_POTENTIAL_TEMPERATURE_C = 1600;

const cache = new Map<string, MeltColumn>();
const CACHE_LIMIT = 512;

/**
 * Decompression melting along the adiabat (SCIENCE.md §3): start where the adiabat meets the
 * solidus and step the pressure down; each step finds T' conserving entropy,
 * cp·ln(T'/T) − v·ΔP + ΔS·(F(P',T') − F) = 0 with v = (1 − F)·αs/ρs + F·αf/ρf, by bisection
 * (robust at clinopyroxene exhaustion); F never decreases. Crust: h = (1/(ρg))·∫ F/(1 − F) dP
 * upward from the solidus (trapezoids), stopping where the crust's own load ρ·g·h equals P.
 * Results are memoised per (model, Tp, step).
 */
export function meltColumn(tpC: number, options: MeltColumnOptions = {}): MeltColumn {
	const modelId = options.model ?? DEFAULT_MELT_MODEL;
	const step = options.stepGPa ?? 1e-3;
	if (!Number.isFinite(tpC) || tpC > MAX_POTENTIAL_TEMPERATURE_C) {
		throw new RangeError(`potential temperature must be at most ${MAX_POTENTIAL_TEMPERATURE_C} °C`);
	}
	if (!(step > 0 && step <= 0.1)) throw new RangeError('pressure step must be within (0, 0.1] GPa');
	const key = `${modelId}|${tpC}|${step}`;
	const hit = cache.get(key);
	if (hit) return hit;
	const result = runColumn(tpC, modelId, step);
	if (cache.size >= CACHE_LIMIT) cache.delete(cache.keys().next().value as string);
	cache.set(key, result);
	return result;
}

export interface MeltPath {
	pressureGPa: number[];
	temperatureC: number[];
	meltFraction: number[];
}

/** The melting path itself (solidus to surface), for plots and checks; not memoised. */
export function meltPath(tpC: number, options: MeltColumnOptions = {}): MeltPath {
	const path: MeltPath = { pressureGPa: [], temperatureC: [], meltFraction: [] };
	runColumn(tpC, options.model ?? DEFAULT_MELT_MODEL, options.stepGPa ?? 1e-3, path);
	return path;
}

function runColumn(tpC: number, modelId: MeltModelId, dP: number, path?: MeltPath): MeltColumn {
	const m = MODELS[modelId];
	const { rho, g } = CRUST_COLUMN;
	const none: MeltColumn = {
		model: modelId,
		potentialTemperatureC: tpC,
		solidusPressureGPa: NaN,
		surfaceMeltFraction: 0,
		crustKm: 0,
		topPressureGPa: NaN,
		topMeltFraction: 0
	};
	// adiabat above solidus at the surface? then it crosses the solidus at some depth
	const excess = (p: number) => solidAdiabat(tpC, p, modelId) - m.solidusC(p);
	if (excess(0) <= 0) return none;
	let lo = 0;
	let hi = 1;
	while (excess(hi) > 0) {
		hi += 1;
		if (hi > 10) throw new RangeError('potential temperature too high for the melting model');
	}
	for (let i = 0; i < 100 && hi - lo > 1e-12; i++) {
		const mid = 0.5 * (lo + hi);
		if (excess(mid) > 0) lo = mid;
		else hi = mid;
	}
	const p0 = 0.5 * (lo + hi);

	let p = p0;
	let t = m.solidusC(p0);
	let f = 0;
	let integral = 0; // ∫ F/(1−F) dP in Pa
	let topP = NaN;
	let topF = NaN;
	let ratio = 0; // F/(1−F) at the current step
	const record = (pp: number, tt: number, ff: number) => {
		path?.pressureGPa.push(pp);
		path?.temperatureC.push(tt);
		path?.meltFraction.push(ff);
	};
	record(p, t, f);
	while (p > 0) {
		const pNew = Math.max(0, p - dP);
		const dPa = (pNew - p) * GPA; // negative
		const mp = m.atPressure(pNew);
		const v = ((1 - f) * m.alphaS) / m.rhoS + (f * m.alphaF) / m.rhoF;
		const tK = t + K0;
		const gfun = (tc: number) =>
			m.cp * Math.log((tc + K0) / tK) - v * dPa + m.deltaS * (mp.fraction(tc) - f);
		// g rises with T'; the root lies a fraction of a kelvin below T for steps of 1e-3 GPa
		let a = t - 1;
		while (gfun(a) > 0) a -= 1;
		let b = t;
		for (let i = 0; i < 60 && b - a > 1e-6; i++) {
			const mid = 0.5 * (a + b);
			if (gfun(mid) > 0) b = mid;
			else a = mid;
		}
		const tNew = 0.5 * (a + b);
		const fNew = Math.max(f, mp.fraction(tNew));
		const ratioNew = fNew >= 1 ? Infinity : fNew / (1 - fNew);
		const integralNew = integral + 0.5 * (ratio + ratioNew) * -dPa;
		// crust top: the load ρ·g·h = ∫F/(1−F)dP reaches the pressure itself
		if (Number.isNaN(topP) && integralNew >= pNew * GPA) {
			const pa = p * GPA;
			const pb = pNew * GPA;
			const s = (pa - integral) / (pa - integral - (pb - integralNew));
			topP = (pa + s * (pb - pa)) / GPA;
			topF = f + s * (fNew - f);
		}
		p = pNew;
		t = tNew;
		f = fNew;
		ratio = ratioNew;
		integral = integralNew;
		if (path) record(p, t, f);
	}
	if (Number.isNaN(topP)) {
		topP = 0;
		topF = f;
	}
	return {
		model: modelId,
		potentialTemperatureC: tpC,
		solidusPressureGPa: p0,
		surfaceMeltFraction: f,
		crustKm: (topP * GPA) / (rho * g) / 1000,
		topPressureGPa: topP,
		topMeltFraction: topF
	};
}

/** Crustal thickness (km) from potential temperature (°C). */
export function crustThicknessKm(tpC: number, options: MeltColumnOptions = {}): number {
	return meltColumn(tpC, options).crustKm;
}

// --- Airy isostasy ----------------------------------------------------------------------------

export interface AiryParams {
	rhoWater: number;
	rhoCrust: number;
	rhoMantle: number;
	/** Crust the age–depth curves belong to (km). */
	referenceCrustKm: number;
}

export const AIRY_DEFAULTS: Readonly<AiryParams> = Object.freeze({
	rhoWater: 1030,
	rhoCrust: 2900,
	rhoMantle: 3300,
	referenceCrustKm: 7
});

/**
 * Depth change of the axis (m, positive = deeper) for crust h vs the reference (Airy):
 * −(h − h_ref)·(ρm − ρc)/(ρm − ρw); thicker crust stands shallower.
 */
export function airyDepthShiftM(crustKm: number, p: Readonly<AiryParams> = AIRY_DEFAULTS): number {
	return (
		(-(crustKm - p.referenceCrustKm) * 1000 * (p.rhoMantle - p.rhoCrust)) /
		(p.rhoMantle - p.rhoWater)
	);
}

/** Crust (km) implied by a depth anomaly (m, positive = deeper than the reference-crust curve). */
export function crustFromDepthShiftKm(
	shiftM: number,
	p: Readonly<AiryParams> = AIRY_DEFAULTS
): number {
	return (
		p.referenceCrustKm - (shiftM * (p.rhoMantle - p.rhoWater)) / (p.rhoMantle - p.rhoCrust) / 1000
	);
}

/** Shift of the whole age–depth curve for an entered potential temperature. */
export function airyShiftFromPotentialTemperatureM(
	tpC: number,
	options: MeltColumnOptions = {},
	airy: Readonly<AiryParams> = AIRY_DEFAULTS
): number {
	return airyDepthShiftM(crustThicknessKm(tpC, options), airy);
}

// --- Inverse: depth anomaly → crust → potential temperature -----------------------------------

/** Potential temperatures searched by the inverse (°C): the whole range the models accept. */
export const TP_SEARCH_RANGE_C: readonly [number, number] = [1100, 1600];

export interface ImpliedMantle {
	crustKm: number;
	/**
	 * Potential temperature whose melting column makes that crust; null when the crust is outside
	 * what the model makes over TP_SEARCH_RANGE_C (thinner than at its low end, thicker than at
	 * its high end).
	 */
	potentialTemperatureC: number | null;
}

/** Potential temperature (°C) that makes `crustKm` of crust, by bisection on the forward model. */
export function potentialTemperatureForCrust(
	crustKm: number,
	options: MeltColumnOptions = {}
): number | null {
	let [lo, hi] = TP_SEARCH_RANGE_C;
	if (!(crustKm > crustThicknessKm(lo, options)) || crustKm > crustThicknessKm(hi, options)) {
		return null;
	}
	// crust grows monotonically with Tp; 0.01 °C is far below the model's accuracy
	while (hi - lo > 0.01) {
		const mid = 0.5 * (lo + hi);
		if (crustThicknessKm(mid, options) < crustKm) lo = mid;
		else hi = mid;
	}
	return 0.5 * (lo + hi);
}

/** Residual depth (observed − predicted for reference crust, m) → implied crust and Tp. */
export function impliedFromResidualDepth(
	residualM: number,
	options: MeltColumnOptions = {},
	airy: Readonly<AiryParams> = AIRY_DEFAULTS
): ImpliedMantle {
	const crustKm = crustFromDepthShiftKm(residualM, airy);
	return { crustKm, potentialTemperatureC: potentialTemperatureForCrust(crustKm, options) };
}

/** Measured axial depth vs the model's zero-age depth (reference crust) → crust and Tp. */
export function impliedFromAxialDepth(
	axialDepthM: number,
	modelZeroAgeDepthM: number,
	options: MeltColumnOptions = {},
	airy: Readonly<AiryParams> = AIRY_DEFAULTS
): ImpliedMantle {
	return impliedFromResidualDepth(axialDepthM - modelZeroAgeDepthM, options, airy);
}

// --- Sediment ---------------------------------------------------------------------------------

export interface SedimentParams {
	rhoSediment: number;
	rhoWater: number;
	rhoMantle: number;
}

export const SEDIMENT_DEFAULTS: Readonly<SedimentParams> = Object.freeze({
	rhoSediment: 2000,
	rhoWater: 1030,
	rhoMantle: 3300
});

/** Basement deepening under a sediment load (Airy): h·(ρs − ρw)/(ρm − ρw). */
export function sedimentLoadingM(
	thicknessM: number,
	p: Readonly<SedimentParams> = SEDIMENT_DEFAULTS
): number {
	return (thicknessM * (p.rhoSediment - p.rhoWater)) / (p.rhoMantle - p.rhoWater);
}

/** Seafloor depth = basement depth (unloaded) − h + loading. */
export function seafloorWithSedimentM(
	basementDepthM: number,
	thicknessM: number,
	p: Readonly<SedimentParams> = SEDIMENT_DEFAULTS
): number {
	return basementDepthM - thicknessM + sedimentLoadingM(thicknessM, p);
}
