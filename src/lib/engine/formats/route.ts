/**
 * The route for the bridge: the cruise as the ship sails it, built from the timeline (the plan's
 * one truth) — departure port → each line in its running direction (a reversed run comes out
 * reversed) and each station in the order of work → port calls → return port — with the planned
 * arrival (ETA) and departure (ETD) at every waypoint and the speed of the leg that reaches it
 * (transit speed between items, the line's survey speed along a line).
 *
 * The "plan layers" exports (geojson.ts, kml.ts, gpx.ts, csv.ts) carry the plan's features by kind
 * for GIS; this module writes the route in RTZ 1.2, GPX 1.1 (one <rte>) and CSV (one row per
 * waypoint). Times are whole UTC seconds; positions are rounded to 0.000001° (about 0.1 m).
 */
import { distanceM, type LonLat } from '../geodesy';
import type { Timeline, TimelineInput, TimelineItem } from '../timeline';
import { formatDMM } from './coordinates';
import { EXPORT_CAUTION, ExportError, GENERATOR, WAKELINE_NS, fileBaseName, fixed } from './shared';
import { renderXml, type XmlOut } from './xml';
import { GPX_NS } from './gpx';
import { RTZ_NS } from './rtz';

const NM_M = 1852;

export type RouteWaypointKind =
	'departure' | 'line_start' | 'line_vertex' | 'line_end' | 'station' | 'port_call' | 'arrival';

export interface RouteWaypoint {
	/** 1-based, in sailing order. */
	seq: number;
	name: string;
	kind: RouteWaypointKind;
	position: LonLat;
	/** Planned arrival, UTC ms; null at the departure port. */
	eta: number | null;
	/** Planned departure, UTC ms; null at the return port. */
	etd: number | null;
	/** The leg that reaches this waypoint: null for the first one. */
	leg: { kind: 'transit' | 'survey'; speedKn: number; lengthM: number } | null;
	/** The order-of-work item this waypoint belongs to (plan item id and name). */
	item?: { id: string; name: string; kind: 'line' | 'station' | 'port_call' };
	/** For line waypoints: the vertex in running order (1-based) and in the stored line. */
	vertex?: number;
	storedVertex?: number;
	reversed?: boolean;
	/** Predicted seafloor depth (m, positive down) where a ridge makes it known. */
	depthM?: number | null;
}

export interface RouteDoc {
	/** The cruise code; file names and the RTZ route name come from it. */
	name: string;
	title?: string;
	vessel?: { name: string; callSign?: string | null } | null;
	waypoints: RouteWaypoint[];
	/** Weather margin (h) the plan keeps after the arrival, and the return time with it. */
	marginH: number;
	backInPortAt: number | null;
}

export interface RouteOptions {
	name: string;
	title?: string;
	vessel?: RouteDoc['vessel'];
	/** Predicted depth at a position, or null where no ridge makes it known. */
	depthAt?: (lon: number, lat: number) => number | null;
}

/**
 * The waypoints of a built timeline in sailing order. ETAs and ETDs are the timeline's own instants:
 * a waypoint's ETD is when the next movement (transit or line) starts, so a turn after a line keeps
 * the ship at that line's end until the turn is done; intermediate line vertices are passed at the
 * time the survey speed brings the ship there (share of the line's geodesic length).
 */
export function buildRoute(t: Timeline, input: TimelineInput, options: RouteOptions): RouteDoc {
	const items = new Map<string, TimelineItem>(input.items.map((i) => [i.id, i]));
	const wps: RouteWaypoint[] = [];
	const depth = (p: LonLat) => (options.depthAt ? options.depthAt(p[0], p[1]) : undefined);
	const add = (w: Omit<RouteWaypoint, 'seq' | 'leg'>, leg: RouteWaypoint['leg']) => {
		const prev = wps.at(-1);
		const withLen =
			leg && prev ? { ...leg, lengthM: distanceM(prev.position, w.position) } : prev ? leg : null;
		wps.push({ ...w, seq: wps.length + 1, leg: withLen });
	};
	const leave = (at: number) => {
		const last = wps.at(-1);
		if (last && last.etd == null) last.etd = at;
	};

	add(
		{
			name: input.departure.name,
			kind: 'departure',
			position: input.departure.position,
			eta: null,
			etd: null,
			depthM: null
		},
		null
	);
	let pending: { eta: number } | null = null;
	const transit = (): RouteWaypoint['leg'] => ({
		kind: 'transit',
		speedKn: input.transitSpeedKn,
		lengthM: 0
	});

	for (const e of t.events) {
		if (e.kind === 'transit') {
			leave(e.start);
			pending = { eta: e.end };
		} else if (e.kind === 'line') {
			const it = e.refId ? items.get(e.refId) : undefined;
			if (!it || it.kind !== 'line') continue;
			leave(e.start);
			const stored = it.coords;
			const running = it.reversed ? [...stored].reverse() : [...stored];
			const cum = [0];
			for (let i = 1; i < running.length; i++)
				cum.push(cum[i - 1] + distanceM(running[i - 1], running[i]));
			const total = cum.at(-1)! || 1;
			const last = running.length - 1;
			running.forEach((p, i) => {
				const at = i === last ? e.end : e.start + ((e.end - e.start) * cum[i]) / total;
				add(
					{
						name:
							i === 0 ? `${it.name} SOL` : i === last ? `${it.name} EOL` : `${it.name} WP${i + 1}`,
						kind: i === 0 ? 'line_start' : i === last ? 'line_end' : 'line_vertex',
						position: p,
						eta: i === 0 ? (pending?.eta ?? e.start) : at,
						etd: i === last ? null : at,
						item: { id: it.id, name: it.name, kind: 'line' },
						vertex: i + 1,
						storedVertex: it.reversed ? stored.length - i : i + 1,
						reversed: !!it.reversed,
						depthM: depth(p)
					},
					i === 0 ? transit() : { kind: 'survey', speedKn: it.surveySpeedKn, lengthM: 0 }
				);
			});
			pending = null;
		} else if (e.kind === 'station' || e.kind === 'port') {
			const it = e.refId ? items.get(e.refId) : undefined;
			if (!it || it.kind === 'line') continue;
			leave(e.start);
			add(
				{
					name: it.name,
					kind: it.kind === 'port_call' ? 'port_call' : 'station',
					position: it.position,
					eta: pending?.eta ?? e.start,
					etd: e.end,
					item: { id: it.id, name: it.name, kind: it.kind },
					depthM: it.kind === 'station' ? depth(it.position) : null
				},
				transit()
			);
			pending = null;
		}
	}
	const lastWp = wps.at(-1)!;
	add(
		{
			name: input.arrival.name,
			kind: 'arrival',
			position: input.arrival.position,
			eta: pending?.eta ?? lastWp.etd ?? lastWp.eta ?? input.departure.at,
			etd: null,
			depthM: null
		},
		transit()
	);
	// A waypoint the ship leaves without a movement (the last line end before a skipped transit).
	for (const w of wps.slice(0, -1)) if (w.etd == null) w.etd = w.eta;
	if (wps[0].etd == null) wps[0].etd = input.departure.at;

	const margin = t.events.find((e) => e.kind === 'margin');
	const sea = t.events.filter((e) => e.kind !== 'mobilisation' && e.kind !== 'demobilisation');
	return {
		name: options.name,
		title: options.title,
		vessel: options.vessel ?? null,
		waypoints: wps,
		marginH: margin?.durationH ?? 0,
		backInPortAt: sea.length ? sea[sea.length - 1].end : null
	};
}

// ---------------------------------------------------------------------------------------------
// Spelling numbers and times as the trade reads them

/** UTC ISO 8601 to the whole second: "2027-05-03T08:00:00Z". */
export function isoSecond(ms: number): string {
	return new Date(Math.round(ms / 1000) * 1000).toISOString().replace('.000Z', 'Z');
}

/** Positions to 0.000001° (about 0.11 m of latitude). */
export const deg6 = (x: number) => fixed(x, 6);
/** Depths and elevations to 1 m. */
export const metres = (x: number | null | undefined) => (x == null ? '' : fixed(x, 0));
/** Durations to 0.01 h. */
export const hours2 = (x: number) => fixed(x, 2);

const ROUTE_KIND_WORD: Record<RouteWaypointKind, string> = {
	departure: 'departure port',
	line_start: 'line start',
	line_vertex: 'line vertex',
	line_end: 'line end',
	station: 'station',
	port_call: 'port call',
	arrival: 'return port'
};

export function routeFileBase(doc: Pick<RouteDoc, 'name'>): string {
	return `${fileBaseName(doc.name)}_route`;
}

function assertRoute(doc: RouteDoc) {
	if (doc.waypoints.length < 2)
		throw new ExportError('a route needs at least two waypoints (a departure and a return port)');
	for (const w of doc.waypoints) {
		const [lon, lat] = w.position;
		if (!Number.isFinite(lon) || !Number.isFinite(lat) || Math.abs(lat) > 90)
			throw new ExportError(
				`waypoint ${w.seq} "${w.name}": position (${lon}, ${lat}) is impossible`
			);
	}
}

// ---------------------------------------------------------------------------------------------
// RTZ 1.2 (IEC 61174 ed. 4 Annex S): waypoints with orthodrome legs; the schedule carries ETA/ETD
// and the planned speed per waypoint. A waypoint's <leg> describes the leg that reaches it, so the
// first waypoint has none.

export function writeRouteRtz(doc: RouteDoc): string {
	assertRoute(doc);
	const routeName = routeFileBase(doc);
	const root: XmlOut = {
		name: 'route',
		attrs: { version: '1.2', xmlns: RTZ_NS, 'xmlns:wl': WAKELINE_NS },
		children: [
			{
				name: 'routeInfo',
				attrs: {
					routeName,
					routeAuthor: GENERATOR,
					routeStatus: 'Planning proposal - not for navigation',
					vesselName: doc.vessel?.name,
					vesselVoyage: doc.name
				},
				children: [
					{
						name: 'extensions',
						children: [
							{
								name: 'extension',
								attrs: {
									manufacturer: GENERATOR,
									name: 'plan',
									version: '1',
									planName: doc.name,
									kind: 'route',
									weatherMarginH: hours2(doc.marginH),
									backInPortWithMargin: doc.backInPortAt ? isoSecond(doc.backInPortAt) : undefined,
									caution: EXPORT_CAUTION
								}
							}
						]
					}
				]
			},
			{
				name: 'waypoints',
				children: [
					{
						name: 'defaultWaypoint',
						children: [{ name: 'leg', attrs: { geometryType: 'Orthodrome' } }]
					},
					...doc.waypoints.map((w) => ({
						name: 'waypoint',
						attrs: { id: w.seq, name: w.name },
						children: [
							{ name: 'position', attrs: { lat: deg6(w.position[1]), lon: deg6(w.position[0]) } },
							w.leg
								? {
										name: 'leg',
										attrs: { geometryType: 'Orthodrome', legInfo: w.leg.kind }
									}
								: null,
							{
								name: 'extensions',
								children: [
									{
										name: 'extension',
										attrs: {
											manufacturer: GENERATOR,
											name: 'waypoint',
											version: '1',
											item:
												w.item?.kind === 'line'
													? 'line'
													: w.item?.kind === 'station'
														? 'station'
														: 'port',
											itemId: w.item?.id,
											itemName: w.item?.name ?? w.name,
											vertex: w.vertex,
											storedVertex: w.storedVertex,
											reversed: w.reversed ? 'true' : undefined,
											surveySpeedKn:
												w.kind === 'line_start' ? doc.waypoints[w.seq]?.leg?.speedKn : undefined,
											predictedDepthM: w.depthM == null ? undefined : metres(w.depthM)
										}
									}
								]
							}
						]
					}))
				]
			},
			{
				name: 'schedules',
				children: [
					{
						name: 'schedule',
						attrs: { id: 1, name: 'Wakeline plan' },
						children: [
							{
								name: 'calculated',
								children: doc.waypoints.map((w) => ({
									name: 'scheduleElement',
									attrs: {
										waypointId: w.seq,
										etd: w.etd != null ? isoSecond(w.etd) : undefined,
										eta: w.eta != null ? isoSecond(w.eta) : undefined,
										speed: w.leg ? fixed(w.leg.speedKn, 1) : undefined
									}
								}))
							}
						]
					}
				]
			}
		]
	};
	return renderXml(root, EXPORT_CAUTION);
}

// ---------------------------------------------------------------------------------------------
// GPX 1.1: one <rte>; each <rtept> has its time (the ETA; the ETD at the departure port) and, in
// our namespace, ETA, ETD and the leg's speed. Element order follows the GPX 1.1 wptType.

export function writeRouteGpx(doc: RouteDoc, options: { exportedAt?: string } = {}): string {
	assertRoute(doc);
	const rtept = (w: RouteWaypoint): XmlOut => {
		const when = w.eta ?? w.etd;
		const desc = [
			ROUTE_KIND_WORD[w.kind],
			w.eta != null ? `ETA ${isoSecond(w.eta)}` : '',
			w.etd != null ? `ETD ${isoSecond(w.etd)}` : '',
			w.leg ? `${w.leg.kind} at ${fixed(w.leg.speedKn, 1)} kn` : '',
			w.depthM != null ? `predicted depth ${metres(w.depthM)} m (model estimate)` : ''
		]
			.filter(Boolean)
			.join('; ');
		return {
			name: 'rtept',
			attrs: { lat: deg6(w.position[1]), lon: deg6(w.position[0]) },
			children: [
				when != null ? { name: 'time', text: isoSecond(when) } : null,
				{ name: 'name', text: w.name },
				{ name: 'desc', text: desc },
				{ name: 'type', text: ROUTE_KIND_WORD[w.kind] },
				{
					name: 'extensions',
					children: [
						{ name: 'wl:seq', text: String(w.seq) },
						w.eta != null ? { name: 'wl:eta', text: isoSecond(w.eta) } : null,
						w.etd != null ? { name: 'wl:etd', text: isoSecond(w.etd) } : null,
						w.leg ? { name: 'wl:leg', text: w.leg.kind } : null,
						w.leg ? { name: 'wl:speedKn', text: fixed(w.leg.speedKn, 1) } : null,
						w.reversed ? { name: 'wl:reversed', text: 'true' } : null,
						w.depthM != null ? { name: 'wl:predictedDepthM', text: metres(w.depthM) } : null
					]
				}
			]
		};
	};
	const root: XmlOut = {
		name: 'gpx',
		attrs: {
			version: '1.1',
			creator: GENERATOR,
			xmlns: GPX_NS,
			'xmlns:xsi': 'http://www.w3.org/2001/XMLSchema-instance',
			'xmlns:wl': WAKELINE_NS,
			'xsi:schemaLocation': `${GPX_NS} http://www.topografix.com/GPX/1/1/gpx.xsd`
		},
		children: [
			{
				name: 'metadata',
				children: [
					{ name: 'name', text: `${doc.name} route` },
					{ name: 'desc', text: EXPORT_CAUTION },
					options.exportedAt ? { name: 'time', text: options.exportedAt } : null
				]
			},
			{
				name: 'rte',
				children: [
					{ name: 'name', text: `${doc.name} route` },
					{ name: 'desc', text: doc.title ? `${doc.title}. ${EXPORT_CAUTION}` : EXPORT_CAUTION },
					{ name: 'type', text: 'cruise route' },
					...doc.waypoints.map(rtept)
				]
			}
		]
	};
	return renderXml(root, EXPORT_CAUTION);
}

// ---------------------------------------------------------------------------------------------
// CSV (RFC 4180): header first, CRLF, one row per waypoint; the caution rides in the `note` column.

export const ROUTE_CSV_COLUMNS = [
	'seq',
	'name',
	'kind',
	'item',
	'vertex',
	'reversed',
	'latitude_dd',
	'longitude_dd',
	'latitude_dmm',
	'longitude_dmm',
	'eta_utc',
	'etd_utc',
	'stay_h',
	'leg',
	'leg_speed_kn',
	'leg_length_nm',
	'leg_length_km',
	'predicted_depth_m',
	'note'
] as const;

export function csvCell(cell: string): string {
	// Text a spreadsheet would run as a formula gets a leading apostrophe (CSV injection).
	const safe = /^[=+\-@\t\r]/.test(cell) && !/^-?\d/.test(cell) ? `'${cell}` : cell;
	return /[",\r\n]|^\s|\s$/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

export function writeRouteCsv(doc: RouteDoc): string {
	assertRoute(doc);
	const rows = doc.waypoints.map((w, i) => {
		const cells: Record<(typeof ROUTE_CSV_COLUMNS)[number], string> = {
			seq: String(w.seq),
			name: w.name,
			kind: ROUTE_KIND_WORD[w.kind],
			item: w.item?.name ?? '',
			vertex: w.vertex != null ? String(w.vertex) : '',
			reversed: w.item?.kind === 'line' ? (w.reversed ? 'yes' : 'no') : '',
			latitude_dd: deg6(w.position[1]),
			longitude_dd: deg6(w.position[0]),
			latitude_dmm: formatDMM(w.position[1], 'lat', { style: 'ascii', decimals: 3 }),
			longitude_dmm: formatDMM(w.position[0], 'lon', { style: 'ascii', decimals: 3 }),
			eta_utc: w.eta != null ? isoSecond(w.eta) : '',
			etd_utc: w.etd != null ? isoSecond(w.etd) : '',
			stay_h: w.eta != null && w.etd != null ? hours2((w.etd - w.eta) / 3_600_000) : '',
			leg: w.leg?.kind ?? '',
			leg_speed_kn: w.leg ? fixed(w.leg.speedKn, 1) : '',
			leg_length_nm: w.leg ? fixed(w.leg.lengthM / NM_M, 2) : '',
			leg_length_km: w.leg ? fixed(w.leg.lengthM / 1000, 2) : '',
			predicted_depth_m: metres(w.depthM),
			note: i === 0 ? EXPORT_CAUTION : ''
		};
		return ROUTE_CSV_COLUMNS.map((c) => csvCell(cells[c])).join(',');
	});
	return [ROUTE_CSV_COLUMNS.join(','), ...rows].join('\r\n') + '\r\n';
}

export type RouteFormat = 'rtz' | 'gpx' | 'csv';
export const ROUTE_FORMATS: readonly RouteFormat[] = ['rtz', 'gpx', 'csv'];

export function exportRoute(
	doc: RouteDoc,
	format: RouteFormat,
	options: { exportedAt?: string } = {}
): { filename: string; mimeType: string; body: string } {
	const base = routeFileBase(doc);
	if (format === 'rtz')
		return { filename: `${base}.rtz`, mimeType: 'application/xml', body: writeRouteRtz(doc) };
	if (format === 'gpx')
		return {
			filename: `${base}.gpx`,
			mimeType: 'application/gpx+xml',
			body: writeRouteGpx(doc, options)
		};
	return {
		filename: `${base}.csv`,
		mimeType: 'text/csv; charset=utf-8; header=present',
		body: writeRouteCsv(doc)
	};
}
