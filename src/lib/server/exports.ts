// What leaves Wakeline as files, built from the one timeline: the route for the bridge (sailing
// order, ETA/ETD, leg speeds) and the plan layers for GIS (features by kind, with the order of work
// and planned times). Export URLs: /api/v1/cruises/{id}/export/route/{rtz,gpx,csv} and
// …/export/layers/{geojson,kml,gpx,csv}; the older …/export/{format} answer as documented in
// FORMAT_ALIASES.
import {
	ExportError,
	FORMATS,
	exportPlan,
	type FormatId,
	type PlanDoc,
	type PlanOrderEntry
} from '$lib/engine/formats';
import {
	buildRoute,
	exportRoute,
	isoSecond,
	ROUTE_FORMATS,
	type RouteDoc,
	type RouteFormat
} from '$lib/engine/formats/route';
import { ApiError } from './api';
import * as plan from './plan';
import { planSettings } from './plancompute';
import * as timelines from './timeline';

export type ExportKind = 'route' | 'layers';

/** Layer formats: RTZ is a route format only. */
export const LAYER_FORMATS = [
	'geojson',
	'kml',
	'gpx',
	'csv'
] as const satisfies readonly FormatId[];

/** The first export URLs, kept: the bridge's formats give the route, the GIS formats the layers. */
export const FORMAT_ALIASES: Record<FormatId, ExportKind> = {
	rtz: 'route',
	gpx: 'route',
	csv: 'route',
	geojson: 'layers',
	kml: 'layers'
};

export interface ExportFile {
	filename: string;
	mimeType: string;
	body: string;
}

function built(cruiseId: string) {
	const b = timelines.build(cruiseId);
	return b;
}

/** The route as the timeline sails it. 409 until the timeline can be built. */
export function routeDoc(cruiseId: string): RouteDoc {
	const { data, timeline } = built(cruiseId);
	if (!data.input || !timeline)
		throw new ApiError(
			409,
			`The route needs the timeline, and the timeline needs ${data.missing.join(', ')}.`,
			'timeline_incomplete'
		);
	const r = plan.rows(cruiseId);
	const s = planSettings(r);
	return buildRoute(timeline, data.input, {
		name: data.cruise.code,
		title: data.cruise.title,
		vessel: r.vessel ? { name: r.vessel.name, callSign: r.vessel.callSign } : null,
		depthAt: (lon, lat) => s.depthAt(lon, lat)?.depthM ?? null
	});
}

/** The plan's features with the order of work, planned times and per-vertex depths of the timeline. */
export async function layersDoc(cruiseId: string): Promise<PlanDoc> {
	const doc = await plan.toPlanDoc(cruiseId);
	const { data, timeline } = built(cruiseId);
	const r = plan.rows(cruiseId);
	const s = planSettings(r);
	const lineIndex = new Map(doc.lines.map((l, i) => [l.id, i]));
	const stationIndex = new Map(doc.stations.map((x, i) => [x.id, i]));
	const order: PlanOrderEntry[] = [];
	const refOfItem = new Map<string, { kind: 'line' | 'station'; index: number }>();
	for (const o of data.order) {
		const index = o.kind === 'line' ? lineIndex.get(o.refId) : stationIndex.get(o.refId);
		if (index === undefined || o.kind === 'port_call') continue;
		const kind = o.kind;
		order.push({ kind, index, ...(o.reversed ? { reversed: true } : {}) });
		refOfItem.set(o.id, { kind, index });
	}
	if (timeline)
		for (const e of timeline.events) {
			const ref = e.refId ? refOfItem.get(e.refId) : undefined;
			if (!ref || (e.kind !== 'line' && e.kind !== 'station')) continue;
			const target = ref.kind === 'line' ? doc.lines[ref.index] : doc.stations[ref.index];
			target.plannedStart = isoSecond(e.start);
			target.plannedEnd = isoSecond(e.end);
		}
	for (const l of doc.lines)
		l.vertexDepthsM = l.coords.map(([lon, lat]) => s.depthAt(lon, lat)?.depthM ?? null);
	const home = timeline ? timelines.returnAt(timeline) : null;
	return {
		...doc,
		order,
		meta: {
			cruise: { code: data.cruise.code, title: data.cruise.title },
			vessel: r.vessel ? { name: r.vessel.name, callSign: r.vessel.callSign } : null,
			depthModel: data.cruise.depthModel,
			departureAt: data.input ? isoSecond(data.input.departure.at) : undefined,
			backInPortAt: home ? isoSecond(home) : undefined
		}
	};
}

export async function file(
	cruiseId: string,
	kind: ExportKind,
	format: string
): Promise<ExportFile> {
	try {
		// The build the documents below read, made off the event loop when it is not at hand.
		await timelines.buildOffLoop(cruiseId);
		if (kind === 'route') {
			if (!(ROUTE_FORMATS as readonly string[]).includes(format))
				throw new ApiError(
					404,
					`The route comes as ${ROUTE_FORMATS.join(', ')}; "${format}" is not one of them.`
				);
			return exportRoute(routeDoc(cruiseId), format as RouteFormat);
		}
		if (!(LAYER_FORMATS as readonly string[]).includes(format))
			throw new ApiError(
				404,
				`The plan layers come as ${LAYER_FORMATS.join(', ')}; "${format}" is not one of them.`
			);
		return exportPlan(await layersDoc(cruiseId), format as FormatId);
	} catch (e) {
		if (e instanceof ExportError) throw new ApiError(422, e.message, 'not_exportable');
		throw e;
	}
}

/** The older URL …/export/{format}. */
export function legacy(cruiseId: string, format: string): Promise<ExportFile> {
	if (!(FORMATS as readonly string[]).includes(format))
		throw new ApiError(404, `Unknown export format "${format}"; use one of ${FORMATS.join(', ')}.`);
	return file(cruiseId, FORMAT_ALIASES[format as FormatId], format);
}

export function response(f: ExportFile): Response {
	return new Response(f.body, {
		headers: {
			'content-type': f.mimeType.includes('charset') ? f.mimeType : `${f.mimeType}; charset=utf-8`,
			'content-disposition': `attachment; filename="${f.filename}"`,
			'cache-control': 'no-store'
		}
	});
}
