// Live feedback while drawing: everything is computed by the shared engine (the same functions the
// server uses for saved plans); this file only gathers the inputs from the chart's state and
// shapes the answers for the panel, the profile chart and the map.
import type { Feature, FeatureCollection, LineString, Polygon } from 'geojson';
import {
	coverageGaps,
	depthGrid,
	depthProfileForRidges,
	direct,
	hoursAt,
	initialBearingDeg,
	kmToNm,
	lineLengthM,
	planSurvey,
	polarityAlongProfile,
	PolylineIndex,
	RidgeDepthModel,
	stationHours,
	stationSettings,
	thuMaxM,
	tvuMaxM,
	type CoverageGap,
	type DepthModelId,
	type DepthProfileSample,
	type ProfileStripe,
	type RidgeInput,
	type SurveyPlan
} from '$lib/engine';
import type { IhoOrder, StationKind } from '$lib/engine/formats/types';
import { DEFAULT_VESSEL } from '$lib/defaults';
import type { SettingsForm } from './form';
import type { ViewBounds } from './graticule';
import { depthFeatures, gridRange, isobathLevels, type GridSpec } from './isobaths';
import type { Bounds } from './shape';
import type { Draft, PlanFeature, PlanVessel } from './types';

/** Used when the cruise has no vessel yet; the server falls back to the same numbers. */
export const FALLBACK_VESSEL: PlanVessel = { ...DEFAULT_VESSEL };

const DEPTH_MODELS: DepthModelId[] = ['parsons-sclater-1977', 'stein-stein-1992', 'half-space'];

export function depthModelOf(id: string | undefined): DepthModelId {
	return DEPTH_MODELS.includes(id as DepthModelId) ? (id as DepthModelId) : 'stein-stein-1992';
}

/** The ridge segments the predictions come from, including a ridge being drawn or edited. */
export function ridgeInputs(
	features: readonly PlanFeature[],
	draft: Draft | null = null,
	form: SettingsForm | null = null
): RidgeInput[] {
	const out: RidgeInput[] = [];
	for (const f of features) {
		if (f.properties.kind !== 'ridge' || f.id === draft?.featureId) continue;
		if (f.geometry.type !== 'LineString') continue;
		const p = f.properties;
		out.push({
			axis: f.geometry.coordinates,
			fullRateMmYr: p.fullRateMmYr,
			asymmetry: p.asymmetry,
			potentialTemperatureC: p.potentialTemperatureC ?? undefined,
			axialDepthM: p.axialDepthM ?? undefined
		});
	}
	if (draft?.kind === 'ridge' && draft.geometry.type === 'LineString' && form) {
		const rate = form.fullRateMmYr;
		if (rate !== null && rate > 0 && draft.geometry.coordinates.length >= 2) {
			out.push({
				axis: draft.geometry.coordinates,
				fullRateMmYr: rate,
				asymmetry: form.asymmetry ?? 0.5,
				potentialTemperatureC: form.potentialTemperatureC ?? undefined,
				axialDepthM: form.axialDepthM ?? undefined
			});
		}
	}
	return out;
}

/** The engine's model, or null (with the reason) when it cannot be built from these inputs. */
export function depthModel(
	ridges: readonly RidgeInput[],
	model: DepthModelId
): { ok: true; model: RidgeDepthModel } | { ok: false; message: string } {
	if (ridges.length === 0)
		return { ok: false, message: 'Draw or import a ridge axis to predict depths.' };
	try {
		return { ok: true, model: new RidgeDepthModel(ridges, { model }) };
	} catch (e) {
		return { ok: false, message: (e as Error).message };
	}
}

// ------------------------------------------------------------------------------ lines

export interface LineSettings {
	speedKn: number;
	overlapPct: number;
	ihoOrder: IhoOrder;
}

export interface LineFeedback {
	lengthKm: number;
	lengthNm: number;
	hours: number | null;
	samples: DepthProfileSample[];
	stripes: ProfileStripe[];
	minDepthM: number;
	maxDepthM: number;
	minAgeMa: number;
	maxAgeMa: number;
	minSwathM: number;
	maxSwathM: number;
	/** IHO S-44 allowed uncertainties at the shallowest and deepest predicted depth (m, 95 %). */
	tvuShallowM: number;
	tvuDeepM: number;
	thuDeepM: number;
	gaps: { neighbour: string; gaps: CoverageGap[] }[];
}

function spacingFor(lengthKm: number): number {
	// about 400 samples per line, never finer than 250 m
	return Math.max(0.25, lengthKm / 400);
}

/** Profile, times, swath and IHO values for a line; gaps against neighbouring multibeam lines. */
export function lineFeedback(
	coords: readonly number[][],
	ridges: readonly RidgeInput[],
	model: DepthModelId,
	settings: LineSettings,
	vessel: PlanVessel,
	neighbours: readonly { name: string; coords: readonly number[][] }[] = []
): { ok: true; value: LineFeedback } | { ok: false; message: string } {
	if (ridges.length === 0)
		return { ok: false, message: 'Draw or import a ridge axis to predict depths.' };
	try {
		const options = {
			model,
			swathAngleDeg: vessel.swathAngleDeg,
			widthFactor: vessel.swathDepthFactor
		};
		const spacingKm = spacingFor(lineLengthM(coords) / 1000);
		const p = depthProfileForRidges(coords, ridges, { ...options, spacingKm });
		const s = p.samples;
		const depths = s.map((x) => x.depthM);
		const ages = s.map((x) => x.ageMa);
		const swaths = s.map((x) => x.swathWidthM);
		const minDepthM = Math.min(...depths);
		const maxDepthM = Math.max(...depths);
		const track = {
			lon: s.map((x) => x.lon),
			lat: s.map((x) => x.lat),
			distanceM: s.map((x) => x.distanceKm * 1000),
			swathWidthM: swaths
		};
		const reach = Math.max(...swaths);
		const gaps: LineFeedback['gaps'] = [];
		const heading = initialBearingDeg(coords[0], coords[coords.length - 1]);
		for (const n of neighbours) {
			if (n.coords.length < 2) continue;
			// Neighbours run alongside: within 30° of this line's direction, either way round.
			const turn =
				Math.abs(initialBearingDeg(n.coords[0], n.coords[n.coords.length - 1]) - heading) % 180;
			if (Math.min(turn, 180 - turn) > 30) continue;
			const index = new PolylineIndex([n.coords]);
			const mid = s[Math.floor(s.length / 2)];
			const near = index.nearest(mid.lon, mid.lat, { exact: false });
			// ... and within about two swaths of it.
			if (near.atEnd || near.distanceM > 2 * reach) continue;
			const q = depthProfileForRidges(n.coords, ridges, { ...options, spacingKm }).samples;
			const found = coverageGaps(track, {
				lon: q.map((x) => x.lon),
				lat: q.map((x) => x.lat),
				distanceM: q.map((x) => x.distanceKm * 1000),
				swathWidthM: q.map((x) => x.swathWidthM)
			});
			gaps.push({ neighbour: n.name, gaps: found });
		}
		return {
			ok: true,
			value: {
				lengthKm: p.lengthKm,
				lengthNm: kmToNm(p.lengthKm),
				hours: settings.speedKn > 0 ? hoursAt(p.lengthKm, settings.speedKn) : null,
				samples: s,
				stripes: polarityAlongProfile(
					s.map((x) => x.distanceKm),
					ages
				),
				minDepthM,
				maxDepthM,
				minAgeMa: Math.min(...ages),
				maxAgeMa: Math.max(...ages),
				minSwathM: Math.min(...swaths),
				maxSwathM: reach,
				tvuShallowM: tvuMaxM(settings.ihoOrder, minDepthM),
				tvuDeepM: tvuMaxM(settings.ihoOrder, maxDepthM),
				thuDeepM: thuMaxM(settings.ihoOrder, maxDepthM),
				gaps
			}
		};
	} catch (e) {
		return { ok: false, message: (e as Error).message };
	}
}

/** The swath footprint of a profiled line: each sample pushed out half a swath to either side. */
export function swathFootprint(samples: readonly DepthProfileSample[]): Polygon | null {
	if (samples.length < 2) return null;
	const left: number[][] = [];
	const right: number[][] = [];
	for (let i = 0; i < samples.length; i++) {
		const a = samples[Math.max(0, i - 1)];
		const b = samples[Math.min(samples.length - 1, i + 1)];
		const heading = initialBearingDeg([a.lon, a.lat], [b.lon, b.lat]);
		const p = [samples[i].lon, samples[i].lat];
		const half = samples[i].swathWidthM / 2;
		const l = direct(p, heading - 90, half);
		const r = direct(p, heading + 90, half);
		left.push([l.lon, l.lat]);
		right.push([r.lon, r.lat]);
	}
	const ring = [...left, ...right.reverse()];
	ring.push(ring[0]);
	return { type: 'Polygon', coordinates: [ring] };
}

// ------------------------------------------------------------------------------ stations

export { stationSettings };

export interface StationFeedback {
	depthM: number | null;
	lowM: number | null;
	highM: number | null;
	ageMa: number | null;
	hours: number | null;
}

export function stationFeedback(
	position: readonly number[],
	kind: StationKind,
	params: Record<string, number | string | null>,
	ridges: readonly RidgeInput[],
	model: DepthModelId,
	vessel: PlanVessel
): StationFeedback {
	const settings = stationSettings(kind, params, vessel.winchSpeedMPerMin);
	const m = depthModel(ridges, model);
	if (!m.ok) {
		return {
			depthM: null,
			lowM: null,
			highM: null,
			ageMa: null,
			hours: kind === 'dive' ? stationHours('dive', 0, settings) : null
		};
	}
	const d = m.model.depthAt(position[0], position[1]);
	return {
		depthM: d.depthM,
		lowM: d.lowM,
		highM: d.highM,
		ageMa: d.ageMa,
		hours: stationHours(kind, d.depthM, settings)
	};
}

// ------------------------------------------------------------------------------ depth layer

export interface DepthLayer {
	features: FeatureCollection;
	levels: number[];
	step: number;
	majorStep: number;
	range: [number, number];
}

/** The work area: the plan's box grown by a quarter on each side (at least half a degree). */
export function workArea(b: Bounds): Bounds {
	const [[w, s], [e, n]] = b;
	const dx = Math.max(0.5, (e - w) * 0.25);
	const dy = Math.max(0.5, (n - s) * 0.25);
	return [
		[w - dx, Math.max(-89, s - dy)],
		[e + dx, Math.min(89, n + dy)]
	];
}

/** Isobaths over the work area (only the part in view, so zooming in adds detail). */
export function depthLayer(
	ridges: readonly RidgeInput[],
	model: DepthModelId,
	area: Bounds,
	view: ViewBounds | null,
	cells = 140
): DepthLayer | null {
	if (ridges.length === 0) return null;
	let [[west, south], [east, north]] = area;
	if (view && view.east - view.west < 360) {
		// bring the view to the same 360° copy as the area
		const shift = 360 * Math.round((west + east - view.west - view.east) / 720);
		const vw = view.west + shift;
		const ve = view.east + shift;
		if (vw < east && ve > west && view.south < north && view.north > south) {
			west = Math.max(west, vw);
			east = Math.min(east, ve);
			south = Math.max(south, view.south);
			north = Math.min(north, view.north);
		}
	}
	const aspect =
		((east - west) * Math.cos((((south + north) / 2) * Math.PI) / 180)) / (north - south);
	const nx = Math.max(8, Math.round(aspect >= 1 ? cells : cells * aspect));
	const ny = Math.max(8, Math.round(aspect >= 1 ? cells / aspect : cells));
	try {
		const values = depthGrid([west, south, east, north], nx, ny, ridges, { model });
		// the engine's rows run from the north edge down
		const grid: GridSpec = {
			lon0: west,
			lat0: north,
			dLon: (east - west) / (nx - 1),
			dLat: -(north - south) / (ny - 1),
			nx,
			ny,
			values
		};
		const range = gridRange(grid);
		if (!range) return null;
		const { levels, step, majorStep } = isobathLevels(range[0], range[1]);
		return { features: depthFeatures(grid, levels, majorStep), levels, step, majorStep, range };
	} catch {
		return null;
	}
}

// ------------------------------------------------------------------------------ survey areas

export interface GeneratedSurvey {
	plan: SurveyPlan;
	lines: LineString[];
	coverage: Feature<Polygon>[];
}

/** Parallel lines over an area, spaced for the target overlap at the predicted depth. */
export function generateSurvey(
	ring: readonly number[][],
	ridges: readonly RidgeInput[],
	model: DepthModelId,
	settings: { overlapPct: number; speedKn: number; headingDeg?: number },
	vessel: PlanVessel
): { ok: true; value: GeneratedSurvey } | { ok: false; message: string } {
	const m = depthModel(ridges, model);
	if (!m.ok) return m;
	try {
		const plan = planSurvey(ring, (lon, lat) => m.model.depthAt(lon, lat, false).depthM, {
			overlap: settings.overlapPct / 100,
			speedKn: settings.speedKn,
			swathAngleDeg: vessel.swathAngleDeg,
			widthFactor: vessel.swathDepthFactor,
			headingDeg: settings.headingDeg
		});
		const lines: LineString[] = plan.lines.map((l) => ({
			type: 'LineString',
			coordinates: l.coords.map((c) => [c[0], c[1]])
		}));
		const coverage: Feature<Polygon>[] = [];
		for (const l of lines) {
			const p = depthProfileForRidges(l.coordinates, ridges, {
				model,
				spacingKm: 2,
				swathAngleDeg: vessel.swathAngleDeg,
				widthFactor: vessel.swathDepthFactor
			});
			const poly = swathFootprint(p.samples);
			if (poly) coverage.push({ type: 'Feature', properties: { kind: 'swath' }, geometry: poly });
		}
		return { ok: true, value: { plan, lines, coverage } };
	} catch (e) {
		return { ok: false, message: (e as Error).message };
	}
}
