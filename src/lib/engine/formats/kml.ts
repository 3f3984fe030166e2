/**
 * KML 2.2 (OGC 07-147r2): a Document with one Folder each for ridges, areas and the cruise route
 * (lines and stations in cruise order). Placemarks hold Point / LineString / Polygon with
 * "lon,lat" coordinate tuples; settings go in ExtendedData <Data>, planned times in a TimeSpan.
 */
import {
	EXPORT_CAUTION,
	ProblemLog,
	buildArea,
	buildLine,
	buildRidge,
	buildStation,
	checkLonLat,
	closeRing,
	decimal,
	emptyPlan,
	openRing,
	orderIfNeeded,
	routeSequence,
	type RawFields
} from './shared';
import {
	ITEM_KINDS,
	type ImportResult,
	type LonLat,
	type PlanDoc,
	type PlanLine,
	type PlanOrderEntry,
	type PlanStation
} from './types';
import { childNamed, childrenNamed, parseXml, renderXml, type XmlNode, type XmlOut } from './xml';

export const KML_NS = 'http://www.opengis.net/kml/2.2';

type DataValue = string | number | null | undefined;

function coordinates(coords: LonLat[]): XmlOut {
	return {
		name: 'coordinates',
		text: coords.map(([lon, lat]) => `${decimal(lon)},${decimal(lat)}`).join(' ')
	};
}

/** ExtendedData: absent values are left out, null is an empty <value/>. */
function extendedData(data: Record<string, DataValue>): XmlOut {
	return {
		name: 'ExtendedData',
		children: Object.entries(data)
			.filter(([, v]) => v !== undefined)
			.map(([name, v]) => ({
				name: 'Data',
				attrs: { name },
				children: [
					{ name: 'value', text: v === null ? '' : typeof v === 'number' ? decimal(v) : v }
				]
			}))
	};
}

/** One shared style per kind (KML 2.2 §10.7), colours as aabbggrr; placemarks point at it. */
const STYLES: Record<string, { line?: string; width?: number; poly?: string; icon?: string }> = {
	ridge: { line: 'ff2a2ad6', width: 3 },
	area: { line: 'ff1f7a3d', width: 2, poly: '401f7a3d' },
	line: { line: 'ffc26a1a', width: 2 },
	station: { icon: 'ff0d8fe0' }
};

function styles(): XmlOut[] {
	return Object.entries(STYLES).map(([kind, st]) => ({
		name: 'Style',
		attrs: { id: `wl-${kind}` },
		children: [
			st.icon
				? {
						name: 'IconStyle',
						children: [
							{ name: 'color', text: st.icon },
							{ name: 'scale', text: '1.1' }
						]
					}
				: null,
			st.line
				? {
						name: 'LineStyle',
						children: [
							{ name: 'color', text: st.line },
							{ name: 'width', text: String(st.width ?? 2) }
						]
					}
				: null,
			st.poly
				? {
						name: 'PolyStyle',
						children: [{ name: 'color', text: st.poly }]
					}
				: null
		]
	}));
}

function placemark(
	name: string,
	description: string | undefined,
	times: { plannedStart?: string; plannedEnd?: string } | undefined,
	data: Record<string, DataValue>,
	geometry: XmlOut
): XmlOut {
	const span =
		times && (times.plannedStart || times.plannedEnd)
			? {
					name: 'TimeSpan',
					children: [
						times.plannedStart ? { name: 'begin', text: times.plannedStart } : null,
						times.plannedEnd ? { name: 'end', text: times.plannedEnd } : null
					]
				}
			: null;
	// KML 2.2 schema order inside a Placemark: name, description, TimePrimitive, styleUrl,
	// ExtendedData, Geometry.
	return {
		name: 'Placemark',
		children: [
			{ name: 'name', text: name },
			description ? { name: 'description', text: description } : null,
			span,
			typeof data.kind === 'string' ? { name: 'styleUrl', text: `#wl-${data.kind}` } : null,
			extendedData(data),
			geometry
		]
	};
}

function lineString(coords: LonLat[]): XmlOut {
	// tessellate: draw each segment along the surface rather than as a straight chord.
	return { name: 'LineString', children: [{ name: 'tessellate', text: '1' }, coordinates(coords)] };
}

function lineDescription(l: PlanLine): string {
	const c = l.computed;
	const parts = [`${l.purpose} line, ${l.surveySpeedKn} kn, IHO order ${l.ihoOrder}`];
	if (c)
		parts.push(
			`${c.lengthKm.toFixed(1)} km, ${c.durationH.toFixed(1)} h, predicted depth ${Math.round(c.minDepthM)}–${Math.round(c.maxDepthM)} m`
		);
	return parts.join('; ');
}

function stationDescription(s: PlanStation): string {
	const c = s.computed;
	return `${s.kind.toUpperCase()} station${c ? `; predicted depth ${Math.round(c.depthM)} m, ${c.durationH.toFixed(1)} h` : ''}`;
}

export function writeKml(plan: PlanDoc): string {
	const ridges = plan.ridges.map((r) =>
		placemark(
			r.name,
			`Ridge axis, full spreading rate ${r.fullRateMmYr} mm/yr`,
			undefined,
			{
				kind: 'ridge',
				id: r.id,
				fullRateMmYr: r.fullRateMmYr,
				asymmetry: r.asymmetry,
				potentialTemperatureC: r.potentialTemperatureC,
				axialDepthM: r.axialDepthM
			},
			lineString(r.axis)
		)
	);
	const areas = plan.areas.map((a) =>
		placemark(
			a.name,
			`Survey area, ${a.overlapPct} % overlap at ${a.surveySpeedKn} kn`,
			undefined,
			{ kind: 'area', id: a.id, overlapPct: a.overlapPct, surveySpeedKn: a.surveySpeedKn },
			{
				name: 'Polygon',
				children: [
					{ name: 'tessellate', text: '1' },
					{
						name: 'outerBoundaryIs',
						children: [{ name: 'LinearRing', children: [coordinates(closeRing(a.ring))] }]
					}
				]
			}
		)
	);
	const route = routeSequence(plan).map((step) => {
		if (step.kind === 'line') {
			const l = plan.lines[step.index];
			return placemark(
				l.name,
				lineDescription(l),
				l,
				{
					kind: 'line',
					id: l.id,
					purpose: l.purpose,
					surveySpeedKn: l.surveySpeedKn,
					overlapPct: l.overlapPct,
					ihoOrder: l.ihoOrder,
					...l.computed
				},
				lineString(l.coords)
			);
		}
		const s = plan.stations[step.index];
		return placemark(
			s.name,
			stationDescription(s),
			s,
			{
				kind: 'station',
				id: s.id,
				stationKind: s.kind,
				params: JSON.stringify(s.params),
				...s.computed
			},
			{ name: 'Point', children: [coordinates([s.position])] }
		);
	});
	const folder = (name: string, items: XmlOut[]): XmlOut | null =>
		items.length ? { name: 'Folder', children: [{ name: 'name', text: name }, ...items] } : null;
	const root: XmlOut = {
		name: 'kml',
		attrs: { xmlns: KML_NS },
		children: [
			{
				name: 'Document',
				children: [
					{ name: 'name', text: plan.name },
					{ name: 'description', text: EXPORT_CAUTION },
					...styles(),
					folder('Ridge axes', ridges),
					folder('Survey areas', areas),
					folder('Cruise route: lines and stations', route)
				]
			}
		]
	};
	return renderXml(root, EXPORT_CAUTION);
}

// ---------------------------------------------------------------------------------------------
// Reading

function collectPlacemarks(node: XmlNode, out: XmlNode[]): void {
	for (const c of node.children) {
		if (c.local === 'Placemark') out.push(c);
		else if (c.local === 'Document' || c.local === 'Folder') collectPlacemarks(c, out);
	}
}

function readData(pm: XmlNode): RawFields {
	const out: RawFields = {};
	const ext = childNamed(pm, 'ExtendedData');
	if (!ext) return out;
	for (const d of childrenNamed(ext, 'Data')) {
		const name = d.attrs.name;
		if (name) out[name] = childNamed(d, 'value')?.text ?? '';
	}
	// Foreign files often use typed SchemaData/SimpleData instead.
	for (const sd of childrenNamed(ext, 'SchemaData')) {
		for (const s of childrenNamed(sd, 'SimpleData')) if (s.attrs.name) out[s.attrs.name] = s.text;
	}
	return out;
}

/** "lon,lat[,alt] lon,lat …" → positions; a message for the first bad tuple. */
function parseCoordinates(
	text: string | undefined
): { ok: true; value: LonLat[] } | { ok: false; message: string } {
	const tuples = (text ?? '').trim().split(/\s+/).filter(Boolean);
	if (tuples.length === 0) return { ok: false, message: 'empty geometry: no coordinates' };
	const out: LonLat[] = [];
	for (let i = 0; i < tuples.length; i++) {
		const parts = tuples[i].split(',');
		const at = tuples.length > 1 ? `coordinate ${i + 1}: ` : '';
		if (parts.length < 2) return { ok: false, message: `${at}"${tuples[i]}" is not lon,lat[,alt]` };
		const c = checkLonLat(parts[0], parts[1]);
		if (!c.ok) return { ok: false, message: at + c.message };
		out.push(c.value);
	}
	return { ok: true, value: out };
}

interface Geom {
	type: 'Point' | 'LineString' | 'Polygon';
	node: XmlNode;
}

function geometries(node: XmlNode): Geom[] {
	const out: Geom[] = [];
	for (const c of node.children) {
		if (c.local === 'Point' || c.local === 'LineString' || c.local === 'Polygon')
			out.push({ type: c.local, node: c });
		else if (c.local === 'MultiGeometry') out.push(...geometries(c));
	}
	return out;
}

const GEOMETRY_KIND = { Point: 'station', LineString: 'line', Polygon: 'area' } as const;

export function readKml(input: string): ImportResult {
	const log = new ProblemLog();
	const plan = emptyPlan();
	const parsed = parseXml(input);
	if (!parsed.ok) {
		log.error('file', parsed.message);
		return { plan, problems: log.finish() };
	}
	const root = parsed.root;
	if (root.local !== 'kml') {
		log.error('file', `not a KML file: the root element is <${root.name}>`);
		return { plan, problems: log.finish() };
	}
	if (root.ns !== KML_NS) log.warn('file', `KML namespace "${root.ns}" read as KML 2.2`);
	const doc = childNamed(root, 'Document');
	const docName = doc ? childNamed(doc, 'name')?.text : undefined;
	if (docName?.trim()) plan.name = docName;

	const placemarks: XmlNode[] = [];
	collectPlacemarks(root, placemarks);
	const order: PlanOrderEntry[] = [];
	placemarks.forEach((pm, i) => {
		const where = `Placemark ${i + 1}`;
		const geoms = geometries(pm);
		if (geoms.length === 0)
			return log.error(where, 'empty geometry: no Point, LineString or Polygon', 'geometry');
		if (geoms.length > 1)
			log.warn(
				where,
				`MultiGeometry with ${geoms.length} parts read as separate items`,
				'geometry'
			);
		const data = readData(pm);
		const span = childNamed(pm, 'TimeSpan');
		const base: RawFields = {
			...data,
			name: childNamed(pm, 'name')?.text,
			plannedStart: span ? childNamed(span, 'begin')?.text.trim() : undefined,
			plannedEnd: span ? childNamed(span, 'end')?.text.trim() : undefined
		};
		geoms.forEach((g, k) => {
			const raw =
				k === 0 ? base : { ...base, id: undefined, name: `${base.name ?? 'part'} (part ${k + 1})` };
			readGeometry(g, raw, where, plan, order, log);
		});
	});
	const o = orderIfNeeded(order, plan);
	if (o) plan.order = o;
	return { plan, problems: log.finish() };
}

function readGeometry(
	g: Geom,
	raw: RawFields,
	where: string,
	plan: PlanDoc,
	order: PlanOrderEntry[],
	log: ProblemLog
): void {
	const expected = GEOMETRY_KIND[g.type];
	let kind = raw.kind;
	if (kind === undefined || kind === '') {
		kind = expected;
		log.defaulted('Placemark', 'kind', 'from its geometry');
	}
	if (typeof kind !== 'string' || !(ITEM_KINDS as readonly string[]).includes(kind)) {
		return log.error(
			where,
			`unknown kind "${String(kind)}"; expected ridge, line, area or station`,
			'kind'
		);
	}
	if ((kind === 'ridge' ? 'line' : kind) !== expected) {
		return log.error(where, `a ${kind} cannot have a ${g.type} geometry`, 'geometry');
	}
	const ring =
		g.type === 'Polygon'
			? childNamed(childNamed(g.node, 'outerBoundaryIs') ?? g.node, 'LinearRing')
			: undefined;
	const coordsNode = childNamed(ring ?? g.node, 'coordinates');
	const c = parseCoordinates(coordsNode?.text);
	if (!c.ok) return log.error(where, c.message, 'coordinates');
	const ctx = { log, where };
	if (kind === 'station') {
		const s = buildStation(
			{ ...raw, kind: raw.stationKind },
			c.value[0],
			ctx,
			plan.stations.length + 1
		);
		if (s) {
			order.push({ kind: 'station', index: plan.stations.length });
			plan.stations.push(s);
		}
	} else if (kind === 'area') {
		if (childrenNamed(g.node, 'innerBoundaryIs').length)
			log.warn(where, 'holes in the polygon were left out', 'geometry');
		const open = openRing(c.value);
		if (open.length < 3) return log.error(where, 'an area needs at least 3 points', 'coordinates');
		const a = buildArea(raw, open, ctx, plan.areas.length + 1);
		if (a) plan.areas.push(a);
	} else {
		if (c.value.length < 2)
			return log.error(where, `a ${kind} needs at least 2 points`, 'coordinates');
		if (kind === 'ridge') {
			const r = buildRidge(raw, c.value, ctx, plan.ridges.length + 1);
			if (r) plan.ridges.push(r);
		} else {
			const l = buildLine(raw, c.value, ctx, plan.lines.length + 1);
			if (l) {
				order.push({ kind: 'line', index: plan.lines.length });
				plan.lines.push(l);
			}
		}
	}
}
