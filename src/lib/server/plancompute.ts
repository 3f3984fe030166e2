// Server-side computation of a plan's derived values with the shared engine: predicted depths along
// lines and at stations, line lengths and times, station durations. Authoritative for saved plans.
import { DEFAULT_VESSEL } from '$lib/defaults';
import type { DepthModelId, PredictedDepth } from '$lib/engine/depth';
import { lineLengthM, sampleLine } from '$lib/engine/geodesy';
import { RidgeDepthModel, type RidgeInput } from '$lib/engine/profile';
import { hoursAt } from '$lib/engine/time';
import { stationHours, stationSettings } from '$lib/engine/stations';
import type { Cruise, RidgeSegment, Station, SurveyLine, Vessel } from './db/schema';

export { DEFAULT_VESSEL };

export interface PlanSettings {
	model: DepthModelId;
	vessel: { [K in keyof typeof DEFAULT_VESSEL]: number };
	/** Predicted depth (with band) and age at a position; null when the cruise has no ridge. */
	depthAt: (lon: number, lat: number) => (PredictedDepth & { ageMa: number }) | null;
	/** Depths at consecutive samples of a line (the engine's fast along-line path); null without ridge. */
	depthsAlong: (lon: Float64Array, lat: Float64Array, alongM: Float64Array) => Float64Array | null;
}

/** Lines are sampled every kilometre, but never more than this many samples per line. */
const MAX_SAMPLES = 2000;

/** The engine's ridge settings for a cruise's stored segments (every prediction uses these). */
export function ridgeInputs(ridges: RidgeSegment[]): RidgeInput[] {
	return ridges.map((x) => ({
		axis: x.axis,
		fullRateMmYr: x.fullRateMmYr,
		asymmetry: x.asymmetry,
		potentialTemperatureC: x.potentialTemperatureC ?? undefined,
		axialDepthM: x.axialDepthM ?? undefined
	}));
}

export function planSettings(r: {
	cruise: Pick<Cruise, 'depthModel'>;
	vessel: Vessel | null;
	ridges: RidgeSegment[];
}): PlanSettings {
	const v = r.vessel;
	const vessel = v
		? {
				swathAngleDeg: v.swathAngleDeg,
				swathDepthFactor: v.swathDepthFactor,
				surveySpeedKn: v.surveySpeedKn,
				transitSpeedKn: v.transitSpeedKn,
				winchSpeedMPerMin: v.winchSpeedMPerMin
			}
		: DEFAULT_VESSEL;
	const model = r.cruise.depthModel;
	if (r.ridges.length === 0) return { model, vessel, depthAt: () => null, depthsAlong: () => null };

	const depth = new RidgeDepthModel(ridgeInputs(r.ridges), { model });
	return {
		model,
		vessel,
		depthAt: (lon, lat) => depth.depthAt(lon, lat),
		depthsAlong: (lon, lat, alongM) => depth.alongLine(lon, lat, alongM).depthM
	};
}

export interface LineValues {
	lengthKm: number;
	durationH: number;
	minDepthM: number | null;
	maxDepthM: number | null;
}

export function computeLine(
	line: Pick<SurveyLine, 'coords' | 'surveySpeedKn'>,
	s: PlanSettings
): LineValues {
	const lengthM = lineLengthM(line.coords);
	const durationH = hoursAt(lengthM / 1000, line.surveySpeedKn);
	if (lengthM === 0) return { lengthKm: 0, durationH: 0, minDepthM: null, maxDepthM: null };
	const samples = sampleLine(line.coords, Math.max(1000, lengthM / MAX_SAMPLES));
	const depths = s.depthsAlong(samples.lon, samples.lat, samples.distanceM);
	if (!depths) return { lengthKm: lengthM / 1000, durationH, minDepthM: null, maxDepthM: null };
	let min = Infinity;
	let max = -Infinity;
	for (let i = 0; i < samples.count; i++) {
		if (depths[i] < min) min = depths[i];
		if (depths[i] > max) max = depths[i];
	}
	return { lengthKm: lengthM / 1000, durationH, minDepthM: min, maxDepthM: max };
}

export interface StationValues {
	depthM: number | null;
	durationH: number | null;
}

export function computeStation(
	st: Pick<Station, 'kind' | 'lon' | 'lat' | 'params'>,
	s: PlanSettings
): StationValues {
	const d = s.depthAt(st.lon, st.lat);
	const settings = stationSettings(st.kind, st.params, s.vessel.winchSpeedMPerMin);
	// A dive is a fixed block; wire stations need a depth.
	if (st.kind === 'dive')
		return { depthM: d?.depthM ?? null, durationH: stationHours('dive', 0, settings) };
	if (!d) return { depthM: null, durationH: null };
	return { depthM: d.depthM, durationH: stationHours(st.kind, d.depthM, settings) };
}
