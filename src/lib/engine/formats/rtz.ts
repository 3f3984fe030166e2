/**
 * RTZ route exchange format, schema version 1.2 (IEC 61174 ed. 4, Annex S): the whole cruise as
 * one ordered route for the ship's ECDIS — each survey line's vertices and each station, in
 * cruise order. Every leg is an orthodrome (great circle), matching the geodesic distances and
 * times Wakeline computes.
 *
 * Schema rules kept here: <route version="1.2"> holds routeInfo, waypoints, then optional
 * schedules; routeInfo@routeName is required and must equal the file name; <waypoints> holds an
 * optional defaultWaypoint and at least two <waypoint>, each with a unique non-negative integer
 * id, a <position lat lon> (lon in [−180, 180)) and then an optional <leg>.
 *
 * Wakeline data ride in manufacturer extensions (<extension manufacturer="Wakeline" …>): on
 * routeInfo the plan name; on each waypoint the item it belongs to and, on an item's first
 * waypoint, its settings. Without them (a route made elsewhere) the reader falls back on the
 * waypoint names it writes: "<line> SOL", "<line> WP<n>", "<line> EOL" and "<station> [<kind>]".
 * Ridges and survey areas are not route content and are not carried.
 */
import {
	EXPORT_CAUTION,
	ExportError,
	GENERATOR,
	ProblemLog,
	WAKELINE_NS,
	buildLine,
	buildStation,
	checkLonLat,
	decimal,
	emptyPlan,
	fileBaseName,
	orderIfNeeded,
	paramEntries,
	routeSequence,
	type RawFields
} from './shared';
import {
	STATION_KINDS,
	type ImportResult,
	type LonLat,
	type PlanDoc,
	type PlanOrderEntry
} from './types';
import { childNamed, childrenNamed, parseXml, renderXml, type XmlNode, type XmlOut } from './xml';

export const RTZ_NS = 'http://www.cirm.org/RTZ/1/2';
const OLDER_RTZ_NS = ['http://www.cirm.org/RTZ/1/0', 'http://www.cirm.org/RTZ/1/1'];
const EXTENSION_VERSION = '1';
const XSD_DATETIME = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}(?:\.\d+)?(?:Z|[+-]\d{2}:\d{2})$/;

/** routeName, which the standard requires to match the file name. */
export function rtzRouteName(plan: Pick<PlanDoc, 'name'>): string {
	return fileBaseName(plan.name);
}

export function rtzFileName(plan: Pick<PlanDoc, 'name'>): string {
	return `${rtzRouteName(plan)}.rtz`;
}

type Attrs = Record<string, string | number | null | undefined>;

function extension(name: string, attrs: Attrs, children: XmlOut[] = []): XmlOut {
	return {
		name: 'extensions',
		children: [
			{
				name: 'extension',
				attrs: { manufacturer: GENERATOR, name, version: EXTENSION_VERSION, ...attrs },
				children
			}
		]
	};
}

interface Stop {
	id: number;
	name: string;
	position: LonLat;
	ext: Attrs;
	params?: XmlOut[];
	eta?: string;
	etd?: string;
	speed?: number;
}

export function writeRtz(plan: PlanDoc): string {
	const stops: Stop[] = [];
	for (const step of routeSequence(plan)) {
		if (step.kind === 'line') {
			const l = plan.lines[step.index];
			const last = l.coords.length - 1;
			l.coords.forEach((c, i) => {
				stops.push({
					id: stops.length + 1,
					name: i === 0 ? `${l.name} SOL` : i === last ? `${l.name} EOL` : `${l.name} WP${i + 1}`,
					position: c,
					ext:
						i === 0
							? {
									item: 'line',
									vertex: 1,
									itemId: l.id,
									itemName: l.name,
									purpose: l.purpose,
									surveySpeedKn: decimal(l.surveySpeedKn),
									overlapPct: decimal(l.overlapPct),
									ihoOrder: l.ihoOrder,
									lengthKm: l.computed ? decimal(l.computed.lengthKm) : undefined,
									durationH: l.computed ? decimal(l.computed.durationH) : undefined,
									minDepthM: l.computed ? decimal(l.computed.minDepthM) : undefined,
									maxDepthM: l.computed ? decimal(l.computed.maxDepthM) : undefined,
									plannedStart: l.plannedStart,
									plannedEnd: l.plannedEnd
								}
							: { item: 'line', vertex: i + 1 },
					etd: i === 0 ? l.plannedStart : undefined,
					eta: i === last ? l.plannedEnd : undefined,
					speed: i > 0 ? l.surveySpeedKn : undefined
				});
			});
		} else {
			const s = plan.stations[step.index];
			stops.push({
				id: stops.length + 1,
				name: `${s.name} [${s.kind}]`,
				position: s.position,
				ext: {
					item: 'station',
					itemId: s.id,
					itemName: s.name,
					kind: s.kind,
					depthM: s.computed ? decimal(s.computed.depthM) : undefined,
					durationH: s.computed ? decimal(s.computed.durationH) : undefined,
					plannedStart: s.plannedStart,
					plannedEnd: s.plannedEnd
				},
				params: paramEntries(s.params).map((p) => ({
					name: 'wl:param',
					attrs: { name: p.name, type: p.type },
					text: p.value
				})),
				eta: s.plannedStart,
				etd: s.plannedEnd
			});
		}
	}
	if (stops.length < 2) {
		throw new ExportError(
			`an RTZ route needs at least two waypoints; this plan has ${stops.length}. ` +
				'Add a line or another station.'
		);
	}

	const timed = stops.filter(
		(s) => (s.eta && XSD_DATETIME.test(s.eta)) || (s.etd && XSD_DATETIME.test(s.etd)) || s.speed
	);
	const schedules: XmlOut | null = timed.length
		? {
				name: 'schedules',
				children: [
					{
						name: 'schedule',
						attrs: { id: 1, name: 'Wakeline plan' },
						children: [
							{
								name: 'calculated',
								children: timed.map((s) => ({
									name: 'scheduleElement',
									attrs: {
										waypointId: s.id,
										etd: s.etd && XSD_DATETIME.test(s.etd) ? s.etd : undefined,
										eta: s.eta && XSD_DATETIME.test(s.eta) ? s.eta : undefined,
										speed: s.speed !== undefined ? decimal(s.speed) : undefined
									}
								}))
							}
						]
					}
				]
			}
		: null;

	const root: XmlOut = {
		name: 'route',
		attrs: { version: '1.2', xmlns: RTZ_NS, 'xmlns:wl': WAKELINE_NS },
		children: [
			{
				name: 'routeInfo',
				attrs: {
					routeName: rtzRouteName(plan),
					routeAuthor: GENERATOR,
					routeStatus: 'Planning proposal - not for navigation'
				},
				children: [extension('plan', { planName: plan.name, caution: EXPORT_CAUTION })]
			},
			{
				name: 'waypoints',
				children: [
					{
						name: 'defaultWaypoint',
						children: [{ name: 'leg', attrs: { geometryType: 'Orthodrome' } }]
					},
					...stops.map((s) => ({
						name: 'waypoint',
						attrs: { id: s.id, name: s.name },
						children: [
							{
								name: 'position',
								attrs: { lat: decimal(s.position[1]), lon: decimal(s.position[0]) }
							},
							{ name: 'leg', attrs: { geometryType: 'Orthodrome' } },
							extension('waypoint', s.ext, s.params)
						]
					}))
				]
			},
			schedules
		]
	};
	return renderXml(root, EXPORT_CAUTION);
}

// ---------------------------------------------------------------------------------------------
// Reading

function wakelineExtension(node: XmlNode | undefined, ns: string): XmlNode | undefined {
	const ext = node ? childNamed(node, 'extensions', ns) : undefined;
	return ext
		? childrenNamed(ext, 'extension', ns).find((e) => e.attrs.manufacturer === GENERATOR)
		: undefined;
}

interface Wpt {
	where: string;
	name: string;
	position: LonLat;
	ext?: XmlNode;
}

const LINE_NAME = /^(.*) (SOL|EOL|WP(\d+))$/;
const STATION_NAME = new RegExp(`^(.*) \\[(${STATION_KINDS.join('|')})\\]$`, 'i');

export function readRtz(input: string, options: { filename?: string } = {}): ImportResult {
	const log = new ProblemLog();
	const plan = emptyPlan();
	const parsed = parseXml(input);
	if (!parsed.ok) {
		log.error('file', parsed.message);
		return { plan, problems: log.finish() };
	}
	const root = parsed.root;
	if (root.local !== 'route') {
		log.error('file', `not an RTZ route: the root element is <${root.name}>`);
		return { plan, problems: log.finish() };
	}
	const ns = root.ns;
	if (ns !== RTZ_NS) {
		if (OLDER_RTZ_NS.includes(ns))
			log.warn('file', `RTZ version ${root.attrs.version} read as 1.2`);
		else log.warn('file', `unexpected RTZ namespace "${ns}"`);
	}
	const info = childNamed(root, 'routeInfo', ns);
	const routeName = info?.attrs.routeName;
	if (!info || !routeName) log.warn('routeInfo', 'routeInfo@routeName is missing', 'routeName');
	if (routeName && options.filename) {
		const base = options.filename.replace(/^.*[\\/]/, '').replace(/\.rtz$/i, '');
		if (base !== routeName) {
			log.warn(
				'routeInfo',
				`routeName "${routeName}" does not match the file name "${base}"`,
				'routeName'
			);
		}
	}
	const planExt = wakelineExtension(info, ns);
	plan.name = planExt?.attrs.planName || routeName || plan.name;

	const waypointsNode = childNamed(root, 'waypoints', ns);
	const nodes = waypointsNode ? childrenNamed(waypointsNode, 'waypoint', ns) : [];
	if (nodes.length === 0) {
		log.error('waypoints', 'empty geometry: the route has no waypoints');
		return { plan, problems: log.finish() };
	}
	const ids = new Set<string>();
	const wpts: Wpt[] = [];
	nodes.forEach((w, i) => {
		const where = `waypoint ${i + 1}`;
		const id = w.attrs.id;
		if (id === undefined || !/^\d+$/.test(id.trim()))
			log.warn(where, 'id must be a non-negative integer', 'id');
		else if (ids.has(id.trim())) log.warn(where, `id ${id} is used twice`, 'id');
		else ids.add(id.trim());
		const pos = childNamed(w, 'position', ns);
		if (!pos) return log.error(where, 'empty geometry: no <position>', 'position');
		const c = checkLonLat(pos.attrs.lon, pos.attrs.lat, 'lat/lon attributes');
		if (!c.ok) return log.error(where, c.message, 'position');
		wpts.push({
			where,
			name: w.attrs.name ?? '',
			position: c.value,
			ext: wakelineExtension(w, ns)
		});
	});

	const order: PlanOrderEntry[] = [];
	const addStation = (raw: RawFields, w: Wpt) => {
		const s = buildStation(raw, w.position, { log, where: w.where }, plan.stations.length + 1);
		if (!s) return;
		if (w.ext) s.params = params(w.ext, w.where, log);
		order.push({ kind: 'station', index: plan.stations.length });
		plan.stations.push(s);
	};
	const addLine = (raw: RawFields, group: Wpt[]) => {
		const where = group[0].where;
		if (group.length < 2) return log.error(where, 'a line needs at least 2 waypoints', 'waypoint');
		const l = buildLine(
			raw,
			group.map((w) => w.position),
			{ log, where },
			plan.lines.length + 1
		);
		if (!l) return;
		order.push({ kind: 'line', index: plan.lines.length });
		plan.lines.push(l);
	};

	const ours = wpts.some((w) => w.ext);
	const named = wpts.some((w) => LINE_NAME.test(w.name) || STATION_NAME.test(w.name));
	if (!ours && !named) {
		// A route drawn elsewhere: take it whole as one survey line.
		log.warn('file', 'no Wakeline waypoint data or names; the whole route was read as one line');
		addLine({ name: plan.name }, wpts);
	} else {
		let i = 0;
		while (i < wpts.length) {
			const w = wpts[i];
			const a = w.ext?.attrs;
			const byName = STATION_NAME.exec(w.name);
			if (a?.item === 'station' || (!a && byName)) {
				addStation(
					a
						? { ...a, id: a.itemId, name: a.itemName ?? w.name }
						: { name: byName![1], kind: byName![2].toLowerCase() },
					w
				);
				i++;
				continue;
			}
			const lineMatch = LINE_NAME.exec(w.name);
			const isLine = a?.item === 'line' || (!a && lineMatch);
			if (!isLine) {
				log.warn(w.where, `waypoint "${w.name}" is neither a line vertex nor a station; left out`);
				i++;
				continue;
			}
			// A line runs from its first waypoint through those that continue it.
			const group = [w];
			const lineName = lineMatch?.[1];
			let j = i + 1;
			for (; j < wpts.length; j++) {
				const n = wpts[j];
				const na = n.ext?.attrs;
				const continues = a
					? na?.item === 'line' && Number(na.vertex) === group.length + 1
					: !na && LINE_NAME.exec(n.name)?.[1] === lineName && !n.name.endsWith(' SOL');
				if (!continues) break;
				group.push(n);
				if (!a && n.name.endsWith(' EOL')) {
					j++;
					break;
				}
			}
			addLine(a ? { ...a, id: a.itemId, name: a.itemName ?? lineName } : { name: lineName }, group);
			i = j;
		}
	}
	const o = orderIfNeeded(order, plan);
	if (o) plan.order = o;
	return { plan, problems: log.finish() };
}

function params(ext: XmlNode, where: string, log: ProblemLog): Record<string, number | string> {
	const out: Record<string, number | string> = {};
	for (const p of childrenNamed(ext, 'param', WAKELINE_NS)) {
		const name = p.attrs.name;
		if (!name) continue;
		if (p.attrs.type === 'number') {
			const n = Number(p.text.trim());
			if (p.text.trim() !== '' && Number.isFinite(n)) out[name] = n;
			else log.warn(where, `params.${name} is not a number; left out`, `params.${name}`);
		} else out[name] = p.text;
	}
	return out;
}
