// The cruise plan: ridge segments, survey lines, survey areas and stations, as GeoJSON features.
// Geometry is stored as [lon, lat] arrays; area rings are stored open (first vertex not repeated).
// Computed values (lengths, depths, durations) come from the engine here, on the server, which is
// authoritative; the browser computes the same with the same engine while drawing.
import { and, asc, eq, inArray } from 'drizzle-orm';
import type { Feature, FeatureCollection, Geometry } from 'geojson';
import type { PlanDoc } from '$lib/engine/formats';
import {
	areaProps,
	axisLineString,
	lineProps,
	ridgeProps,
	stationProps,
	lineString,
	point,
	polygon,
	type AreaWithLines,
	type FeaturePatch,
	type NewFeature
} from '$lib/schemas/plan';
import { ApiError } from './api';
import { deepFreeze } from '../freeze';
import { audit } from './audit';
import { db } from './db';
import type { Db } from './db/client';
import {
	cruise,
	ridgeSegment,
	station,
	surveyArea,
	surveyLine,
	vessel,
	type Cruise,
	type LonLat,
	type RidgeSegment,
	type Station,
	type SurveyArea,
	type SurveyLine,
	type Vessel
} from './db/schema';
import { RevisionMemo } from './db/revision';
import { newId } from './ids';
import {
	planSettings,
	type LineValues,
	type PlanSettings,
	type StationValues
} from './plancompute';
import * as plancache from './plancache';
import * as timelines from './timeline';

export type PlanKind = 'ridge' | 'line' | 'area' | 'station';

export interface PlanRows {
	cruise: Cruise;
	vessel: Vessel | null;
	ridges: RidgeSegment[];
	lines: SurveyLine[];
	areas: SurveyArea[];
	stations: Station[];
}

export function rows(cruiseId: string): PlanRows {
	const c = db.select().from(cruise).where(eq(cruise.id, cruiseId)).get();
	if (!c) throw new ApiError(404, 'No such cruise.');
	const v = c.vesselId
		? (db.select().from(vessel).where(eq(vessel.id, c.vesselId)).get() ?? null)
		: null;
	return {
		cruise: c,
		vessel: v,
		ridges: db
			.select()
			.from(ridgeSegment)
			.where(eq(ridgeSegment.cruiseId, cruiseId))
			.orderBy(asc(ridgeSegment.createdAt))
			.all(),
		lines: db
			.select()
			.from(surveyLine)
			.where(eq(surveyLine.cruiseId, cruiseId))
			.orderBy(asc(surveyLine.createdAt), asc(surveyLine.name))
			.all(),
		areas: db
			.select()
			.from(surveyArea)
			.where(eq(surveyArea.cruiseId, cruiseId))
			.orderBy(asc(surveyArea.createdAt))
			.all(),
		stations: db
			.select()
			.from(station)
			.where(eq(station.cruiseId, cruiseId))
			.orderBy(asc(station.createdAt), asc(station.name))
			.all()
	};
}

const closeRing = (ring: LonLat[]): LonLat[] => [...ring, ring[0]];
const openRing = (ring: LonLat[]): LonLat[] => {
	const [a, b] = [ring[0], ring[ring.length - 1]];
	return a[0] === b[0] && a[1] === b[1] ? ring.slice(0, -1) : ring;
};

function ridgeFeature(r: RidgeSegment): Feature {
	return {
		type: 'Feature',
		id: r.id,
		geometry: { type: 'LineString', coordinates: r.axis },
		properties: {
			kind: 'ridge',
			name: r.name,
			fullRateMmYr: r.fullRateMmYr,
			asymmetry: r.asymmetry,
			potentialTemperatureC: r.potentialTemperatureC,
			axialDepthM: r.axialDepthM
		}
	};
}

function lineFeature(l: SurveyLine, v: LineValues): Feature {
	return {
		type: 'Feature',
		id: l.id,
		geometry: { type: 'LineString', coordinates: l.coords },
		properties: {
			kind: 'line',
			name: l.name,
			purpose: l.purpose,
			surveySpeedKn: l.surveySpeedKn,
			overlapPct: l.overlapPct,
			ihoOrder: l.ihoOrder,
			areaId: l.areaId,
			...v
		}
	};
}

function areaFeature(a: SurveyArea): Feature {
	return {
		type: 'Feature',
		id: a.id,
		geometry: { type: 'Polygon', coordinates: [closeRing(a.ring)] },
		properties: {
			kind: 'area',
			name: a.name,
			overlapPct: a.overlapPct,
			surveySpeedKn: a.surveySpeedKn
		}
	};
}

function stationFeature(st: Station, v: StationValues): Feature {
	return {
		type: 'Feature',
		id: st.id,
		geometry: { type: 'Point', coordinates: [st.lon, st.lat] },
		properties: {
			kind: 'station',
			name: st.name,
			stationKind: st.kind,
			params: st.params,
			...v
		}
	};
}

export interface PlanCollection extends FeatureCollection {
	cruise: {
		id: string;
		code: string;
		depthModel: Cruise['depthModel'];
		canEdit: boolean;
		vessel: PlanSettings['vessel'];
		/** How the plan sits in its allocation, from the timeline (null until it can be built). */
		fit: ReturnType<typeof timelines.fitToApi>;
	};
}

/** The timeline's fit for the plan API: the chart shows when an edit pushes the plan past it. */
export async function fit(cruiseId: string) {
	return timelines.fitToApi(timelines.fit(await timelines.buildOffLoop(cruiseId)));
}

/**
 * The plan as GeoJSON, one per cruise, edit right and database revision: readers of an unchanged
 * plan share one answer (read-only), computed off the event loop.
 */
const collections = new RevisionMemo<Promise<PlanCollection>>(64);

export function collection(cruiseId: string, canEdit: boolean): Promise<PlanCollection> {
	return collections.get(db, `${cruiseId}:${canEdit}`, () => readCollection(cruiseId, canEdit));
}

/** The collection as JSON text, serialised once per shared answer. */
const serialised = new WeakMap<PlanCollection, string>();

export async function collectionJson(cruiseId: string, canEdit: boolean): Promise<string> {
	const doc = await collection(cruiseId, canEdit);
	let text = serialised.get(doc);
	if (text === undefined) serialised.set(doc, (text = JSON.stringify(doc)));
	return text;
}

async function readCollection(cruiseId: string, canEdit: boolean): Promise<PlanCollection> {
	const r = rows(cruiseId);
	const s = planSettings({ ...r, ridges: [] });
	const v = await plancache.values(r);
	return deepFreeze({
		type: 'FeatureCollection',
		cruise: {
			id: r.cruise.id,
			code: r.cruise.code,
			depthModel: r.cruise.depthModel,
			canEdit,
			vessel: s.vessel,
			fit: await fit(cruiseId)
		},
		features: [
			...r.ridges.map(ridgeFeature),
			...r.areas.map(areaFeature),
			...r.lines.map((l) => lineFeature(l, v.lines[l.id])),
			...r.stations.map((st) => stationFeature(st, v.stations[st.id]))
		]
	});
}

/** Finds which table holds a feature id on this cruise. */
function locate(cruiseId: string, id: string): { kind: PlanKind } {
	const probes: [PlanKind, () => unknown][] = [
		[
			'ridge',
			() =>
				db
					.select({ id: ridgeSegment.id })
					.from(ridgeSegment)
					.where(and(eq(ridgeSegment.id, id), eq(ridgeSegment.cruiseId, cruiseId)))
					.get()
		],
		[
			'line',
			() =>
				db
					.select({ id: surveyLine.id })
					.from(surveyLine)
					.where(and(eq(surveyLine.id, id), eq(surveyLine.cruiseId, cruiseId)))
					.get()
		],
		[
			'area',
			() =>
				db
					.select({ id: surveyArea.id })
					.from(surveyArea)
					.where(and(eq(surveyArea.id, id), eq(surveyArea.cruiseId, cruiseId)))
					.get()
		],
		[
			'station',
			() =>
				db
					.select({ id: station.id })
					.from(station)
					.where(and(eq(station.id, id), eq(station.cruiseId, cruiseId)))
					.get()
		]
	];
	for (const [kind, probe] of probes) if (probe()) return { kind };
	throw new ApiError(404, 'No such feature on this cruise.');
}

export async function feature(cruiseId: string, id: string): Promise<Feature> {
	const { kind } = locate(cruiseId, id);
	const r = rows(cruiseId);
	const v = kind === 'line' || kind === 'station' ? await plancache.values(r) : null;
	switch (kind) {
		case 'ridge':
			return ridgeFeature(r.ridges.find((x) => x.id === id)!);
		case 'line':
			return lineFeature(
				r.lines.find((x) => x.id === id)!,
				v!.lines[id]
			);
		case 'area':
			return areaFeature(r.areas.find((x) => x.id === id)!);
		case 'station':
			return stationFeature(
				r.stations.find((x) => x.id === id)!,
				v!.stations[id]
			);
	}
}

function touch(cruiseId: string) {
	db.update(cruise).set({ updatedAt: new Date() }).where(eq(cruise.id, cruiseId)).run();
}

function assertArea(cruiseId: string, areaId: string | null | undefined) {
	if (!areaId) return;
	const found = db
		.select({ id: surveyArea.id })
		.from(surveyArea)
		.where(and(eq(surveyArea.id, areaId), eq(surveyArea.cruiseId, cruiseId)))
		.get();
	if (!found)
		throw new ApiError(422, 'properties.areaId: no such survey area on this cruise.', 'invalid', [
			{ field: 'properties.areaId', message: 'no such survey area on this cruise' }
		]);
}

type Tx = Pick<Db, 'insert'>;

/** Inserts one feature inside the caller's transaction. */
function insertFeature(tx: Tx, cruiseId: string, id: string, f: NewFeature) {
	switch (f.kind) {
		case 'ridge':
			tx.insert(ridgeSegment)
				.values({ id, cruiseId, name: f.name, axis: f.geometry.coordinates, ...f.properties })
				.run();
			break;
		case 'line':
			tx.insert(surveyLine)
				.values({ id, cruiseId, name: f.name, coords: f.geometry.coordinates, ...f.properties })
				.run();
			break;
		case 'area':
			tx.insert(surveyArea)
				.values({
					id,
					cruiseId,
					name: f.name,
					ring: openRing(f.geometry.coordinates[0]),
					...f.properties
				})
				.run();
			break;
		case 'station': {
			const [lon, lat] = f.geometry.coordinates;
			tx.insert(station)
				.values({
					id,
					cruiseId,
					name: f.name,
					kind: f.properties.stationKind,
					lon,
					lat,
					params: f.properties.params
				})
				.run();
			break;
		}
	}
}

export function create(actorId: string, cruiseId: string, f: NewFeature): Promise<Feature> {
	if (f.kind === 'line') assertArea(cruiseId, f.properties.areaId);
	const id = newId();
	db.transaction((tx) => {
		insertFeature(tx, cruiseId, id, f);
		// A new line or station joins the order of work at its cheapest place (timeline.joinOrder).
		if (f.kind === 'line' || f.kind === 'station')
			timelines.joinOrder(tx, cruiseId, [{ kind: f.kind, id }]);
		audit(tx, {
			userId: actorId,
			cruiseId,
			action: `plan.${f.kind}.created`,
			detail: { id, name: f.name }
		});
	});
	touch(cruiseId);
	return feature(cruiseId, id);
}

/**
 * A survey area and the lines generated over it, saved together in one transaction: all of them or,
 * when any part is refused, none. Either a new area is given or the id of one already on the cruise;
 * every line remembers the area it covers.
 */
export async function createAreaWithLines(
	actorId: string,
	cruiseId: string,
	input: AreaWithLines
): Promise<{ area: Feature; lines: Feature[] }> {
	const areaId = input.areaId ?? newId();
	if (input.areaId) assertArea(cruiseId, input.areaId);
	const lineIds = input.lines.map(() => newId());
	db.transaction((tx) => {
		if (input.area) insertFeature(tx, cruiseId, areaId, { kind: 'area', ...input.area });
		input.lines.forEach((l, i) =>
			insertFeature(tx, cruiseId, lineIds[i], {
				kind: 'line',
				name: l.name,
				geometry: l.geometry,
				properties: { ...l.properties, areaId }
			})
		);
		// The lines made together over the area join the order of work together, at their cheapest place.
		timelines.joinOrder(
			tx,
			cruiseId,
			lineIds.map((id) => ({ kind: 'line' as const, id }))
		);
		audit(tx, {
			userId: actorId,
			cruiseId,
			action: 'plan.area.lines.created',
			detail: { areaId, newArea: Boolean(input.area), lineIds }
		});
	});
	touch(cruiseId);
	const all = (await collection(cruiseId, true)).features as Feature[];
	const byId = new Map(all.map((f) => [f.id, f]));
	return { area: byId.get(areaId)!, lines: lineIds.map((id) => byId.get(id)!) };
}

function fieldError(
	e: { issues: { path: PropertyKey[]; message: string }[] },
	prefix: string
): never {
	const details = e.issues.map((i) => ({
		field: [prefix, ...i.path.map(String)].join('.'),
		message: i.message
	}));
	throw new ApiError(
		422,
		details.map((d) => `${d.field}: ${d.message}`).join('; '),
		'invalid',
		details
	);
}

function parseOr<T>(
	schema: {
		safeParse(
			v: unknown
		):
			| { success: true; data: T }
			| { success: false; error: { issues: { path: PropertyKey[]; message: string }[] } };
	},
	value: unknown,
	prefix: string
): T {
	const r = schema.safeParse(value);
	if (!r.success) fieldError(r.error, prefix);
	return r.data;
}

export async function update(
	actorId: string,
	cruiseId: string,
	id: string,
	patch: FeaturePatch
): Promise<Feature> {
	const { kind } = locate(cruiseId, id);
	const current = await feature(cruiseId, id);
	const props = { ...(current.properties as Record<string, unknown>), ...(patch.properties ?? {}) };
	const name = patch.name ?? (current.properties as { name: string }).name;
	db.transaction((tx) => {
		switch (kind) {
			case 'ridge': {
				const geometry = patch.geometry
					? parseOr(axisLineString, patch.geometry, 'geometry')
					: undefined;
				const p = parseOr(ridgeProps, props, 'properties');
				tx.update(ridgeSegment)
					.set({ name, ...p, ...(geometry ? { axis: geometry.coordinates } : {}) })
					.where(eq(ridgeSegment.id, id))
					.run();
				break;
			}
			case 'line': {
				const geometry = patch.geometry
					? parseOr(lineString, patch.geometry, 'geometry')
					: undefined;
				const p = parseOr(lineProps, props, 'properties');
				assertArea(cruiseId, p.areaId);
				tx.update(surveyLine)
					.set({ name, ...p, ...(geometry ? { coords: geometry.coordinates } : {}) })
					.where(eq(surveyLine.id, id))
					.run();
				break;
			}
			case 'area': {
				const geometry = patch.geometry ? parseOr(polygon, patch.geometry, 'geometry') : undefined;
				const p = parseOr(areaProps, props, 'properties');
				tx.update(surveyArea)
					.set({ name, ...p, ...(geometry ? { ring: openRing(geometry.coordinates[0]) } : {}) })
					.where(eq(surveyArea.id, id))
					.run();
				break;
			}
			case 'station': {
				const geometry = patch.geometry ? parseOr(point, patch.geometry, 'geometry') : undefined;
				const p = parseOr(stationProps, props, 'properties');
				tx.update(station)
					.set({
						name,
						kind: p.stationKind,
						params: p.params,
						...(geometry ? { lon: geometry.coordinates[0], lat: geometry.coordinates[1] } : {})
					})
					.where(eq(station.id, id))
					.run();
				break;
			}
		}
		audit(tx, { userId: actorId, cruiseId, action: `plan.${kind}.updated`, detail: { id } });
	});
	touch(cruiseId);
	return feature(cruiseId, id);
}

export function remove(actorId: string, cruiseId: string, id: string) {
	const { kind } = locate(cruiseId, id);
	db.transaction((tx) => {
		const table = { ridge: ridgeSegment, line: surveyLine, area: surveyArea, station }[kind];
		tx.delete(table).where(eq(table.id, id)).run();
		audit(tx, { userId: actorId, cruiseId, action: `plan.${kind}.deleted`, detail: { id } });
	});
	touch(cruiseId);
}

export function bulkEditLines(
	actorId: string,
	cruiseId: string,
	ids: string[],
	props: { surveySpeedKn?: number; overlapPct?: number }
): number {
	const unique = [...new Set(ids)];
	return db.transaction((tx) => {
		const where = and(eq(surveyLine.cruiseId, cruiseId), inArray(surveyLine.id, unique));
		const found = tx.select({ id: surveyLine.id }).from(surveyLine).where(where).all().length;
		if (found !== unique.length)
			throw new ApiError(
				404,
				`${unique.length - found} of the lines are not on this cruise; nothing was changed.`
			);
		tx.update(surveyLine).set(props).where(where).run();
		audit(tx, {
			userId: actorId,
			cruiseId,
			action: 'plan.lines.bulk',
			detail: { ids: unique, props }
		});
		tx.update(cruise).set({ updatedAt: new Date() }).where(eq(cruise.id, cruiseId)).run();
		return found;
	});
}

// ---------------------------------------------------------------- interchange with the formats

export async function toPlanDoc(cruiseId: string): Promise<PlanDoc> {
	const r = rows(cruiseId);
	const v = await plancache.values(r);
	return {
		name: r.cruise.code,
		ridges: r.ridges.map((x) => ({
			id: x.id,
			name: x.name,
			axis: x.axis,
			fullRateMmYr: x.fullRateMmYr,
			asymmetry: x.asymmetry,
			potentialTemperatureC: x.potentialTemperatureC,
			axialDepthM: x.axialDepthM
		})),
		lines: r.lines.map((x) => ({
			id: x.id,
			name: x.name,
			coords: x.coords,
			purpose: x.purpose,
			surveySpeedKn: x.surveySpeedKn,
			overlapPct: x.overlapPct,
			ihoOrder: x.ihoOrder,
			computed: lineComputed(v.lines[x.id])
		})),
		areas: r.areas.map((x) => ({
			id: x.id,
			name: x.name,
			ring: x.ring,
			overlapPct: x.overlapPct,
			surveySpeedKn: x.surveySpeedKn
		})),
		stations: r.stations.map((x) => ({
			id: x.id,
			name: x.name,
			kind: x.kind,
			position: [x.lon, x.lat],
			params: x.params,
			computed: stationComputed(v.stations[x.id])
		}))
	};
}

// Exports carry computed values only where a ridge makes them known.
function lineComputed(v: LineValues) {
	return v.minDepthM == null || v.maxDepthM == null
		? undefined
		: {
				lengthKm: v.lengthKm,
				durationH: v.durationH,
				minDepthM: v.minDepthM,
				maxDepthM: v.maxDepthM
			};
}
function stationComputed(v: StationValues) {
	return v.depthM == null || v.durationH == null
		? undefined
		: { depthM: v.depthM, durationH: v.durationH };
}

export interface ImportSummary {
	ridges: number;
	lines: number;
	areas: number;
	stations: number;
}

/**
 * Adds the plan document's items to the cruise in one transaction: either all of them are added or,
 * on any failure, none. Items keep their names; ids are new.
 */
export function importDoc(actorId: string, cruiseId: string, doc: PlanDoc): ImportSummary {
	db.transaction((tx) => {
		for (const x of doc.ridges)
			tx.insert(ridgeSegment)
				.values({
					id: newId(),
					cruiseId,
					name: x.name,
					axis: x.axis,
					fullRateMmYr: x.fullRateMmYr,
					asymmetry: x.asymmetry ?? 0.5,
					potentialTemperatureC: x.potentialTemperatureC ?? null,
					axialDepthM: x.axialDepthM ?? null
				})
				.run();
		for (const x of doc.areas)
			tx.insert(surveyArea)
				.values({
					id: newId(),
					cruiseId,
					name: x.name,
					ring: x.ring,
					overlapPct: x.overlapPct,
					surveySpeedKn: x.surveySpeedKn
				})
				.run();
		const joined: { kind: 'line' | 'station'; id: string }[] = [];
		for (const x of doc.lines) {
			const id = newId();
			joined.push({ kind: 'line', id });
			tx.insert(surveyLine)
				.values({
					id,
					cruiseId,
					name: x.name,
					coords: x.coords,
					purpose: x.purpose,
					surveySpeedKn: x.surveySpeedKn,
					overlapPct: x.overlapPct,
					ihoOrder: x.ihoOrder
				})
				.run();
		}
		for (const x of doc.stations) {
			const id = newId();
			joined.push({ kind: 'station', id });
			tx.insert(station)
				.values({
					id,
					cruiseId,
					name: x.name,
					kind: x.kind,
					lon: x.position[0],
					lat: x.position[1],
					params: x.params
				})
				.run();
		}
		// Imported lines and stations join the order of work one by one, each at its cheapest place.
		for (const j of joined) timelines.joinOrder(tx, cruiseId, [j]);
		audit(tx, {
			userId: actorId,
			cruiseId,
			action: 'plan.imported',
			detail: {
				ridges: doc.ridges.length,
				lines: doc.lines.length,
				areas: doc.areas.length,
				stations: doc.stations.length
			}
		});
	});
	touch(cruiseId);
	return {
		ridges: doc.ridges.length,
		lines: doc.lines.length,
		areas: doc.areas.length,
		stations: doc.stations.length
	};
}

export type { Geometry };
