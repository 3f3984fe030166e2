/**
 * GeoJSON (RFC 7946) FeatureCollection: one feature per ridge, area, line and station, with
 * `properties.kind` saying which. Ridges and areas come first, then lines and stations in cruise
 * order (the reader takes that order back). Geometries crossing 180° are cut per RFC 7946 §3.1.9
 * and joined again on reading.
 */
import type { Feature, FeatureCollection, Geometry } from 'geojson';
import { joinPaths, joinRings, splitPath, splitRing } from './antimeridian';
import {
	EXPORT_CAUTION,
	GENERATOR,
	ProblemLog,
	buildArea,
	buildLine,
	buildRidge,
	buildStation,
	checkLonLat,
	checkPath,
	closeRing,
	emptyPlan,
	openRing,
	orderIfNeeded,
	routeSequence,
	stripBom,
	type RawFields
} from './shared';
import {
	ITEM_KINDS,
	type ImportResult,
	type LonLat,
	type PlanDoc,
	type PlanOrderEntry
} from './types';

type Props = Record<string, unknown>;

function lineGeometry(coords: LonLat[]): Geometry {
	const parts = splitPath(coords);
	return parts.length === 1
		? { type: 'LineString', coordinates: parts[0] }
		: { type: 'MultiLineString', coordinates: parts };
}

function areaGeometry(ring: LonLat[]): Geometry {
	const parts = splitRing(openRing(ring));
	return parts.length === 1
		? { type: 'Polygon', coordinates: [closeRing(parts[0])] }
		: { type: 'MultiPolygon', coordinates: parts.map((p) => [closeRing(p)]) };
}

function feature(id: string | undefined, geometry: Geometry, properties: Props): Feature {
	// Absent optional values stay absent rather than appearing as null (null means "cleared").
	const clean = Object.fromEntries(Object.entries(properties).filter(([, v]) => v !== undefined));
	return { type: 'Feature', ...(id !== undefined ? { id } : {}), geometry, properties: clean };
}

export function writeGeoJson(plan: PlanDoc): string {
	const features: Feature[] = [];
	for (const r of plan.ridges) {
		features.push(
			feature(r.id, lineGeometry(r.axis), {
				kind: 'ridge',
				name: r.name,
				fullRateMmYr: r.fullRateMmYr,
				asymmetry: r.asymmetry,
				potentialTemperatureC: r.potentialTemperatureC,
				axialDepthM: r.axialDepthM
			})
		);
	}
	for (const a of plan.areas) {
		features.push(
			feature(a.id, areaGeometry(a.ring), {
				kind: 'area',
				name: a.name,
				overlapPct: a.overlapPct,
				surveySpeedKn: a.surveySpeedKn
			})
		);
	}
	// `order`: the 1-based place in the order of work, when the plan has one.
	let orderNo = 1;
	for (const step of routeSequence(plan)) {
		if (step.kind === 'line') {
			const l = plan.lines[step.index];
			features.push(
				feature(l.id, lineGeometry(l.coords), {
					kind: 'line',
					name: l.name,
					purpose: l.purpose,
					surveySpeedKn: l.surveySpeedKn,
					overlapPct: l.overlapPct,
					ihoOrder: l.ihoOrder,
					...l.computed,
					vertexDepthsM: l.vertexDepthsM,
					order: plan.order ? orderNo++ : undefined,
					reversed: step.reversed || undefined,
					plannedStart: l.plannedStart,
					plannedEnd: l.plannedEnd
				})
			);
		} else {
			const s = plan.stations[step.index];
			features.push(
				feature(
					s.id,
					{ type: 'Point', coordinates: [s.position[0], s.position[1]] },
					{
						kind: 'station',
						name: s.name,
						stationKind: s.kind,
						params: s.params,
						...s.computed,
						order: plan.order ? orderNo++ : undefined,
						plannedStart: s.plannedStart,
						plannedEnd: s.plannedEnd
					}
				)
			);
		}
	}
	// RFC 7946 §6.1 allows foreign members; the caution and plan name travel as such.
	const fc: FeatureCollection & Props = {
		type: 'FeatureCollection',
		name: plan.name,
		caution: EXPORT_CAUTION,
		generator: GENERATOR,
		...(plan.meta
			? {
					cruise: plan.meta.cruise,
					vessel: plan.meta.vessel,
					depthModel: plan.meta.depthModel,
					departureAt: plan.meta.departureAt,
					backInPortAt: plan.meta.backInPortAt
				}
			: {}),
		features
	};
	return JSON.stringify(fc, null, 1) + '\n';
}

// ---------------------------------------------------------------------------------------------
// Reading

const GEOMETRY_KIND: Record<string, 'station' | 'line' | 'area'> = {
	Point: 'station',
	LineString: 'line',
	MultiLineString: 'line',
	Polygon: 'area',
	MultiPolygon: 'area'
};

function isObject(v: unknown): v is Props {
	return typeof v === 'object' && v !== null && !Array.isArray(v);
}

function jsonErrorWhere(text: string, message: string): string {
	const m = /position (\d+)/.exec(message);
	if (!m) return 'file';
	const line = text.slice(0, Number(m[1])).split('\n').length;
	return `line ${line}`;
}

/** Positions as loose pairs; false when the nesting is not an array of positions. */
function positions(v: unknown): [unknown, unknown][] | false {
	if (!Array.isArray(v)) return false;
	const out: [unknown, unknown][] = [];
	for (const p of v) {
		if (!Array.isArray(p) || p.length < 2) return false;
		out.push([p[0], p[1]]);
	}
	return out;
}

export function readGeoJson(input: string): ImportResult {
	const log = new ProblemLog();
	const plan = emptyPlan();
	const text = stripBom(input);
	let doc: unknown;
	try {
		doc = JSON.parse(text);
	} catch (e) {
		const message = e instanceof Error ? e.message : String(e);
		log.error(jsonErrorWhere(text, message), `not valid JSON: ${message}`);
		return { plan, problems: log.finish() };
	}

	let features: unknown[];
	if (isObject(doc) && doc.type === 'FeatureCollection') {
		if (!Array.isArray(doc.features)) {
			log.error('file', 'FeatureCollection has no "features" array');
			return { plan, problems: log.finish() };
		}
		features = doc.features;
		if (typeof doc.name === 'string' && doc.name.trim()) plan.name = doc.name;
	} else if (isObject(doc) && doc.type === 'Feature') {
		features = [doc];
	} else if (isObject(doc) && typeof doc.type === 'string' && doc.type in GEOMETRY_KIND) {
		features = [{ type: 'Feature', geometry: doc, properties: {} }];
	} else {
		log.error('file', 'not a GeoJSON FeatureCollection, Feature or Geometry');
		return { plan, problems: log.finish() };
	}

	const order: PlanOrderEntry[] = [];
	features.forEach((f, i) => readFeature(f, `feature ${i + 1}`, plan, order, log));
	const o = orderIfNeeded(order, plan);
	if (o) plan.order = o;
	return { plan, problems: log.finish() };
}

function readFeature(
	f: unknown,
	where: string,
	plan: PlanDoc,
	order: PlanOrderEntry[],
	log: ProblemLog
): void {
	if (!isObject(f) || f.type !== 'Feature') {
		log.error(where, 'not a GeoJSON Feature');
		return;
	}
	const g = f.geometry;
	if (!isObject(g)) {
		log.error(where, 'empty geometry (null)', 'geometry');
		return;
	}
	const gType = String(g.type);
	const props: Props = isObject(f.properties) ? f.properties : {};
	const expected = GEOMETRY_KIND[gType];
	if (!expected) {
		log.error(where, `geometry type ${gType} is not supported`, 'geometry');
		return;
	}
	let kind = props.kind;
	if (kind === undefined || kind === null || kind === '') {
		kind = expected;
		log.defaulted('feature', 'kind', 'from its geometry');
	}
	if (typeof kind !== 'string' || !(ITEM_KINDS as readonly string[]).includes(kind)) {
		log.error(
			where,
			`unknown kind "${String(kind)}"; expected ridge, line, area or station`,
			'kind'
		);
		return;
	}
	const wanted = kind === 'ridge' ? 'line' : kind;
	if (wanted !== expected) {
		log.error(where, `a ${kind} cannot have a ${gType} geometry`, 'geometry');
		return;
	}
	const raw: RawFields = { ...props, id: f.id ?? props.id };
	const ctx = { log, where };

	if (kind === 'station') {
		const c = positions([g.coordinates]);
		if (!Array.isArray(g.coordinates) || g.coordinates.length === 0 || !c) {
			log.error(where, 'empty geometry: a Point needs [lon, lat]', 'geometry');
			return;
		}
		const p = checkLonLat(c[0][0], c[0][1]);
		if (!p.ok) return log.error(where, p.message, 'geometry');
		const s = buildStation(
			{ ...raw, kind: props.stationKind },
			p.value,
			ctx,
			plan.stations.length + 1
		);
		if (s) {
			order.push({ kind: 'station', index: plan.stations.length });
			plan.stations.push(s);
		}
		return;
	}

	if (kind === 'area') {
		const polys =
			gType === 'Polygon' ? [g.coordinates] : Array.isArray(g.coordinates) ? g.coordinates : [];
		const rings: [unknown, unknown][][] = [];
		for (const poly of polys) {
			const outer = Array.isArray(poly) ? positions(poly[0]) : false;
			if (!outer)
				return log.error(where, 'empty geometry: a Polygon needs a ring of [lon, lat]', 'geometry');
			if (Array.isArray(poly) && poly.length > 1)
				log.warn(where, 'holes in the polygon were left out', 'geometry');
			rings.push(openRing(outer as LonLat[]));
		}
		if (rings.length === 0) return log.error(where, 'empty geometry: no polygon', 'geometry');
		const joined =
			rings.length === 2 ? joinRings(rings[0] as LonLat[], rings[1] as LonLat[]) : null;
		const pieces = joined ? [joined] : rings;
		if (pieces.length > 1)
			log.warn(where, `${pieces.length} separate polygons read as separate areas`, 'geometry');
		pieces.forEach((ring, k) => {
			const checked = checkPath(ring as [unknown, unknown][], 3, 'an area');
			if (!checked.ok) return log.error(where, checked.message, 'geometry');
			const a = buildArea(suffixName(raw, k), checked.value, ctx, plan.areas.length + 1);
			if (a) plan.areas.push(a);
		});
		return;
	}

	const parts =
		gType === 'LineString' ? [g.coordinates] : Array.isArray(g.coordinates) ? g.coordinates : [];
	const paths: [unknown, unknown][][] = [];
	for (const part of parts) {
		const p = positions(part);
		if (!p)
			return log.error(where, `empty geometry: a ${gType} needs [lon, lat] positions`, 'geometry');
		paths.push(p);
	}
	const joined = joinPaths(paths as LonLat[][]);
	if (joined.length === 0) return log.error(where, 'empty geometry', 'geometry');
	if (joined.length > 1)
		log.warn(where, `${joined.length} separate parts read as separate ${kind}s`, 'geometry');
	joined.forEach((path, k) => {
		const checked = checkPath(
			path as [unknown, unknown][],
			2,
			kind === 'ridge' ? 'a ridge axis' : 'a line'
		);
		if (!checked.ok) return log.error(where, checked.message, 'geometry');
		if (kind === 'ridge') {
			const r = buildRidge(suffixName(raw, k), checked.value, ctx, plan.ridges.length + 1);
			if (r) plan.ridges.push(r);
		} else {
			const l = buildLine(suffixName(raw, k), checked.value, ctx, plan.lines.length + 1);
			if (l) {
				order.push({ kind: 'line', index: plan.lines.length });
				plan.lines.push(l);
			}
		}
	});
}

function suffixName(raw: RawFields, k: number): RawFields {
	if (k === 0) return raw;
	return { ...raw, id: undefined, name: `${raw.name ?? 'part'} (part ${k + 1})` };
}
