/**
 * GPX 1.1: stations as <wpt>, survey lines as <rte> with <rtept>, following the element order
 * of the GPX 1.1 schema (gpx: metadata, wpt, rte, trk, extensions; wpt: ele, time, …, name, cmt,
 * desc, …, type, …, extensions; rte: name, cmt, desc, …, type, extensions, rtept).
 *
 * Wakeline settings ride in <extensions> in our own namespace: <wl:station>, <wl:line> (with
 * `seq`, the position in the cruise order, since GPX puts all waypoints before all routes), and
 * ridges and areas as <wl:ridge>/<wl:area> under the document's own <extensions>.
 */
import {
	EXPORT_CAUTION,
	GENERATOR,
	ProblemLog,
	WAKELINE_NS,
	buildArea,
	buildLine,
	buildRidge,
	buildStation,
	checkLonLat,
	decimal,
	emptyPlan,
	openRing,
	orderIfNeeded,
	paramEntries,
	routeSequence,
	type RawFields
} from './shared';
import {
	LINE_PURPOSES,
	STATION_KINDS,
	type ImportResult,
	type LonLat,
	type PlanDoc,
	type PlanLine,
	type PlanOrderEntry,
	type PlanStation
} from './types';
import { childNamed, childrenNamed, parseXml, renderXml, type XmlNode, type XmlOut } from './xml';

export const GPX_NS = 'http://www.topografix.com/GPX/1/1';
const GPX10_NS = 'http://www.topografix.com/GPX/1/0';
const XSI_NS = 'http://www.w3.org/2001/XMLSchema-instance';

/** xsd:dateTime needs seconds; anything else stays in our extension only. */
const XSD_DATETIME = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}(?:\.\d+)?(?:Z|[+-]\d{2}:\d{2})$/;

type Attrs = Record<string, string | number | null | undefined>;

/** Optional numbers: absent stays absent, null is written as an empty attribute. */
function opt(v: number | null | undefined): string | undefined {
	if (v === undefined) return undefined;
	return v === null ? '' : decimal(v);
}

function el(name: string, text: string | undefined): XmlOut | null {
	return text === undefined || text === '' ? null : { name, text };
}

function pt(name: string, [lon, lat]: LonLat): XmlOut {
	return { name, attrs: { lat: decimal(lat), lon: decimal(lon) } };
}

function stationDesc(s: PlanStation): string {
	const bits = [`${s.kind.toUpperCase()} station`];
	if (s.computed) {
		bits.push(`predicted depth ${Math.round(s.computed.depthM)} m`);
		bits.push(`${s.computed.durationH.toFixed(1)} h`);
	}
	return bits.join(', ');
}

function lineDesc(l: PlanLine): string {
	const bits = [`${l.purpose} line at ${l.surveySpeedKn} kn`];
	if (l.computed) {
		bits.push(`${l.computed.lengthKm.toFixed(1)} km`, `${l.computed.durationH.toFixed(1)} h`);
		const lo = Math.round(l.computed.minDepthM);
		const hi = Math.round(l.computed.maxDepthM);
		bits.push(`predicted depth ${lo}–${hi} m`);
	}
	return bits.join(', ');
}

function wpt(s: PlanStation, seq: number): XmlOut {
	const ext: Attrs = {
		id: s.id,
		seq,
		kind: s.kind,
		depthM: s.computed ? decimal(s.computed.depthM) : undefined,
		durationH: s.computed ? decimal(s.computed.durationH) : undefined,
		plannedStart: s.plannedStart,
		plannedEnd: s.plannedEnd
	};
	return {
		name: 'wpt',
		attrs: { lat: decimal(s.position[1]), lon: decimal(s.position[0]) },
		children: [
			// GPX <ele> is the elevation of the point: for a station, the predicted seafloor.
			s.computed ? { name: 'ele', text: decimal(-s.computed.depthM) } : null,
			s.plannedStart && XSD_DATETIME.test(s.plannedStart) ? el('time', s.plannedStart) : null,
			{ name: 'name', text: s.name },
			el('desc', stationDesc(s)),
			{ name: 'type', text: s.kind },
			{
				name: 'extensions',
				children: [
					{
						name: 'wl:station',
						attrs: ext,
						children: paramEntries(s.params).map((p) => ({
							name: 'wl:param',
							attrs: { name: p.name, type: p.type },
							text: p.value
						}))
					}
				]
			}
		]
	};
}

function rte(l: PlanLine, seq: number, number: number): XmlOut {
	const ext: Attrs = {
		id: l.id,
		seq,
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
	};
	const last = l.coords.length - 1;
	return {
		name: 'rte',
		children: [
			{ name: 'name', text: l.name },
			el('desc', lineDesc(l)),
			{ name: 'number', text: String(number) },
			{ name: 'type', text: l.purpose },
			{ name: 'extensions', children: [{ name: 'wl:line', attrs: ext }] },
			...l.coords.map((c, i) => ({
				...pt('rtept', c),
				children: [
					{
						name: 'name',
						text: i === 0 ? `${l.name} SOL` : i === last ? `${l.name} EOL` : `${l.name} WP${i + 1}`
					}
				]
			}))
		]
	};
}

export function writeGpx(plan: PlanDoc, options: { exportedAt?: string } = {}): string {
	const sequence = routeSequence(plan);
	const seqOf = (kind: 'line' | 'station', index: number) =>
		sequence.findIndex((e) => e.kind === kind && e.index === index) + 1;
	const extras: XmlOut[] = [
		...plan.ridges.map((r) => ({
			name: 'wl:ridge',
			attrs: {
				id: r.id,
				name: r.name,
				fullRateMmYr: decimal(r.fullRateMmYr),
				asymmetry: opt(r.asymmetry),
				potentialTemperatureC: opt(r.potentialTemperatureC),
				axialDepthM: opt(r.axialDepthM)
			},
			children: r.axis.map((c) => pt('wl:pt', c))
		})),
		...plan.areas.map((a) => ({
			name: 'wl:area',
			attrs: {
				id: a.id,
				name: a.name,
				overlapPct: decimal(a.overlapPct),
				surveySpeedKn: decimal(a.surveySpeedKn)
			},
			children: openRing(a.ring).map((c) => pt('wl:pt', c))
		}))
	];
	const root: XmlOut = {
		name: 'gpx',
		attrs: {
			version: '1.1',
			creator: GENERATOR,
			xmlns: GPX_NS,
			'xmlns:xsi': XSI_NS,
			'xmlns:wl': WAKELINE_NS,
			'xsi:schemaLocation': `${GPX_NS} http://www.topografix.com/GPX/1/1/gpx.xsd`
		},
		children: [
			{
				name: 'metadata',
				children: [
					{ name: 'name', text: plan.name },
					{ name: 'desc', text: EXPORT_CAUTION },
					options.exportedAt ? { name: 'time', text: options.exportedAt } : null
				]
			},
			...plan.stations.map((s, i) => wpt(s, seqOf('station', i))),
			...plan.lines.map((l, i) => rte(l, seqOf('line', i), i + 1)),
			extras.length ? { name: 'extensions', children: extras } : null
		]
	};
	return renderXml(root, EXPORT_CAUTION);
}

// ---------------------------------------------------------------------------------------------
// Reading

function attrFields(node: XmlNode | undefined): RawFields {
	return node ? { ...node.attrs } : {};
}

function wakeline(node: XmlNode, local: string): XmlNode | undefined {
	const ext = node.children.find((c) => c.local === 'extensions');
	return ext ? childNamed(ext, local, WAKELINE_NS) : undefined;
}

function params(
	node: XmlNode | undefined,
	where: string,
	log: ProblemLog
): Record<string, number | string> {
	const out: Record<string, number | string> = {};
	for (const p of node ? childrenNamed(node, 'param', WAKELINE_NS) : []) {
		const name = p.attrs.name;
		if (!name) continue;
		if (p.attrs.type === 'number') {
			const n = Number(p.text.trim());
			if (Number.isFinite(n) && p.text.trim() !== '') out[name] = n;
			else log.warn(where, `params.${name} is not a number; left out`, `params.${name}`);
		} else out[name] = p.text;
	}
	return out;
}

/** Points with lat/lon attributes; the message names the first bad one. */
function points(
	nodes: XmlNode[],
	label: string
): { ok: true; value: LonLat[] } | { ok: false; message: string; at: number } {
	const out: LonLat[] = [];
	for (let i = 0; i < nodes.length; i++) {
		const c = checkLonLat(nodes[i].attrs.lon, nodes[i].attrs.lat, 'lat/lon attributes');
		if (!c.ok) return { ok: false, message: c.message, at: i + 1 };
		out.push(c.value);
	}
	if (out.length === 0) return { ok: false, message: `empty geometry: no ${label}`, at: 0 };
	return { ok: true, value: out };
}

export function readGpx(input: string): ImportResult {
	const log = new ProblemLog();
	const plan = emptyPlan();
	const parsed = parseXml(input);
	if (!parsed.ok) {
		log.error('file', parsed.message);
		return { plan, problems: log.finish() };
	}
	const root = parsed.root;
	if (root.local !== 'gpx') {
		log.error('file', `not a GPX file: the root element is <${root.name}>`);
		return { plan, problems: log.finish() };
	}
	if (root.ns !== GPX_NS) {
		log.warn(
			'file',
			root.ns === GPX10_NS
				? 'GPX 1.0 file read as GPX 1.1'
				: `unexpected GPX namespace "${root.ns}"`
		);
	}
	const ns = root.ns;
	const metadata = childNamed(root, 'metadata', ns);
	const planName = metadata ? childNamed(metadata, 'name', ns)?.text : undefined;
	if (planName?.trim()) plan.name = planName;

	const steps: { seq: number; entry: PlanOrderEntry }[] = [];
	const seqOf = (v: string | undefined) => (v && Number.isFinite(Number(v)) ? Number(v) : Infinity);

	childrenNamed(root, 'wpt', ns).forEach((w, i) => {
		const where = `wpt ${i + 1}`;
		const c = checkLonLat(w.attrs.lon, w.attrs.lat, 'lat/lon attributes');
		if (!c.ok) return log.error(where, c.message, 'lat/lon');
		const ext = wakeline(w, 'station');
		// A foreign <type> ("Waypoint", "Flag") is not a station kind; the default applies then.
		const type = childNamed(w, 'type', ns)?.text.trim().toLowerCase();
		const raw: RawFields = {
			...attrFields(ext),
			name: childNamed(w, 'name', ns)?.text,
			kind: ext ? ext.attrs.kind : STATION_KINDS.find((k) => k === type)
		};
		const s = buildStation(raw, c.value, { log, where }, plan.stations.length + 1);
		if (!s) return;
		s.params = params(ext, where, log);
		steps.push({
			seq: seqOf(ext?.attrs.seq),
			entry: { kind: 'station', index: plan.stations.length }
		});
		plan.stations.push(s);
	});

	childrenNamed(root, 'rte', ns).forEach((r, i) => {
		const where = `rte ${i + 1}`;
		const pts = points(childrenNamed(r, 'rtept', ns), 'rtept');
		if (!pts.ok)
			return log.error(pts.at ? `${where}, rtept ${pts.at}` : where, pts.message, 'lat/lon');
		if (pts.value.length < 2) return log.error(where, 'a line needs at least 2 points', 'rtept');
		const ext = wakeline(r, 'line');
		const type = childNamed(r, 'type', ns)?.text.trim().toLowerCase();
		const raw: RawFields = { ...attrFields(ext), name: childNamed(r, 'name', ns)?.text };
		if (!ext) raw.purpose = LINE_PURPOSES.find((p) => p === type);
		const l = buildLine(raw, pts.value, { log, where }, plan.lines.length + 1);
		if (!l) return;
		steps.push({ seq: seqOf(ext?.attrs.seq), entry: { kind: 'line', index: plan.lines.length } });
		plan.lines.push(l);
	});

	const trk = childrenNamed(root, 'trk', ns).length;
	if (trk)
		log.warn(
			'file',
			`${trk} track(s) <trk> not read: Wakeline imports planned routes (<rte>) and waypoints`
		);

	const ext = childNamed(root, 'extensions', ns);
	childrenNamed(ext ?? root, 'ridge', WAKELINE_NS).forEach((r, i) => {
		const where = `wl:ridge ${i + 1}`;
		const pts = points(childrenNamed(r, 'pt', WAKELINE_NS), 'wl:pt');
		if (!pts.ok) return log.error(where, pts.message, 'axis');
		if (pts.value.length < 2)
			return log.error(where, 'a ridge axis needs at least 2 points', 'axis');
		const ridge = buildRidge(attrFields(r), pts.value, { log, where }, plan.ridges.length + 1);
		if (ridge) plan.ridges.push(ridge);
	});
	childrenNamed(ext ?? root, 'area', WAKELINE_NS).forEach((a, i) => {
		const where = `wl:area ${i + 1}`;
		const pts = points(childrenNamed(a, 'pt', WAKELINE_NS), 'wl:pt');
		if (!pts.ok) return log.error(where, pts.message, 'ring');
		const ring = openRing(pts.value);
		if (ring.length < 3) return log.error(where, 'an area needs at least 3 points', 'ring');
		const area = buildArea(attrFields(a), ring, { log, where }, plan.areas.length + 1);
		if (area) plan.areas.push(area);
	});

	// Stable sort: items without a seq keep their document order after the numbered ones.
	const order = steps
		.map((s, i) => ({ ...s, i }))
		.sort((a, b) => a.seq - b.seq || a.i - b.i)
		.map((s) => s.entry);
	const o = orderIfNeeded(order, plan);
	if (o) plan.order = o;
	return { plan, problems: log.finish() };
}
