/**
 * CSV waypoint list of the plan layers (RFC 4180: the header is the first line, CRLF line ends,
 * fields quoted when needed): one row per station and one row per survey-line vertex, in the order
 * of work, with positions in decimal degrees (0.000001°) and degrees-decimal-minutes (0.001′).
 * A line's own values repeat on each of its rows so that a sorted or filtered spreadsheet still
 * reads right; `vertex` numbers rebuild the lines; each vertex carries its predicted depth.
 * Numbers are rounded to what they mean: depths 1 m, durations 0.01 h, lengths 0.01 km / nm.
 *
 * The caution rides in the `note` column of the first row and the plan name in `plan`, so no comment
 * line comes before the header (GDAL and spreadsheets would take it for the header). Files from
 * earlier versions began with "#" lines; the reader still skips them.
 * What CSV does not carry: ridges and survey areas (they are not waypoints).
 */
import Papa from 'papaparse';
import { formatDMM, normalizeLon, parseCoordinate, type Axis } from './coordinates';
import {
	EXPORT_CAUTION,
	ProblemLog,
	buildLine,
	buildStation,
	checkLonLat,
	decimal,
	emptyPlan,
	fixed,
	orderIfNeeded,
	routeSequence,
	stripBom,
	type RawFields
} from './shared';
import {
	STATION_KINDS,
	type ImportResult,
	type LonLat,
	type PlanDoc,
	type PlanOrderEntry
} from './types';

export const CSV_COLUMNS = [
	'no',
	'id',
	'name',
	'kind',
	'vertex',
	'latitude_dd',
	'longitude_dd',
	'latitude_dmm',
	'longitude_dmm',
	'predicted_depth_m',
	'planned_start_utc',
	'planned_end_utc',
	'duration_h',
	'purpose',
	'survey_speed_kn',
	'overlap_pct',
	'iho_order',
	'length_km',
	'length_nm',
	'min_depth_m',
	'max_depth_m',
	'params_json',
	'plan',
	'note'
] as const;

type Column = (typeof CSV_COLUMNS)[number];
type Row = Partial<Record<Column, string>>;

const PLAN_NAME_PREFIX = '# plan: ';

/** Text cells a spreadsheet would run as a formula get a leading apostrophe (CSV injection). */
const FORMULA_START = /^[=+\-@\t\r]/;

export function guardText(s: string): string {
	return FORMULA_START.test(s) ? `'${s}` : s;
}

function unguardText(s: string): string {
	return s.startsWith("'") && FORMULA_START.test(s.slice(1)) ? s.slice(1) : s;
}

export function quote(cell: string): string {
	return /[",\r\n]|^\s|\s$/.test(cell) ? `"${cell.replace(/"/g, '""')}"` : cell;
}

/** Rounded to what the number means; '' when unknown. */
function num(v: number | null | undefined, decimals: number): string {
	return v === undefined || v === null ? '' : fixed(v, decimals);
}

function positionCells([lon, lat]: LonLat): Row {
	return {
		latitude_dd: fixed(lat, 6),
		longitude_dd: fixed(lon, 6),
		latitude_dmm: formatDMM(lat, 'lat', { style: 'ascii', decimals: 3 }),
		longitude_dmm: formatDMM(lon, 'lon', { style: 'ascii', decimals: 3 })
	};
}

export function writeCsv(plan: PlanDoc): string {
	const rows: Row[] = [];
	for (const step of routeSequence(plan)) {
		if (step.kind === 'station') {
			const s = plan.stations[step.index];
			rows.push({
				id: guardText(s.id ?? ''),
				name: guardText(s.name),
				kind: s.kind,
				...positionCells(s.position),
				predicted_depth_m: num(s.computed?.depthM, 0),
				planned_start_utc: s.plannedStart ?? '',
				planned_end_utc: s.plannedEnd ?? '',
				duration_h: num(s.computed?.durationH, 2),
				params_json: Object.keys(s.params).length ? guardText(JSON.stringify(s.params)) : ''
			});
		} else {
			const l = plan.lines[step.index];
			l.coords.forEach((c, i) => {
				rows.push({
					id: guardText(l.id ?? ''),
					name: guardText(l.name),
					kind: 'line',
					vertex: String(i + 1),
					...positionCells(c),
					predicted_depth_m: num(l.vertexDepthsM?.[i], 0),
					planned_start_utc: l.plannedStart ?? '',
					planned_end_utc: l.plannedEnd ?? '',
					duration_h: num(l.computed?.durationH, 2),
					purpose: l.purpose,
					survey_speed_kn: decimal(l.surveySpeedKn),
					overlap_pct: decimal(l.overlapPct),
					iho_order: l.ihoOrder,
					length_km: num(l.computed?.lengthKm, 2),
					length_nm: num(l.computed ? l.computed.lengthKm / 1.852 : undefined, 2),
					min_depth_m: num(l.computed?.minDepthM, 0),
					max_depth_m: num(l.computed?.maxDepthM, 0)
				});
			});
		}
	}
	const planName = guardText(plan.name.replace(/[\r\n]+/g, ' '));
	const lines = [
		CSV_COLUMNS.join(','),
		...rows.map((r, i) =>
			CSV_COLUMNS.map((c) =>
				quote(
					c === 'no'
						? String(i + 1)
						: c === 'plan'
							? planName
							: c === 'note'
								? i === 0
									? EXPORT_CAUTION
									: ''
								: (r[c] ?? '')
				)
			).join(',')
		)
	];
	return lines.join('\r\n') + '\r\n';
}

// ---------------------------------------------------------------------------------------------
// Reading

/** Header spellings accepted from other programs' waypoint lists. */
const ALIASES: Partial<Record<Column, string[]>> = {
	latitude_dd: ['lat', 'latitude', 'lat_dd', 'latitude (dd)'],
	longitude_dd: ['lon', 'long', 'lng', 'longitude', 'lon_dd', 'longitude (dd)'],
	name: ['waypoint', 'label', 'title'],
	kind: ['type'],
	predicted_depth_m: ['depth_m', 'depth']
};

function headerIndex(header: string[]): Partial<Record<Column, number>> {
	const norm = header.map((h) => h.trim().toLowerCase());
	const out: Partial<Record<Column, number>> = {};
	for (const col of CSV_COLUMNS) {
		const names = [col, ...(ALIASES[col] ?? [])];
		const at = norm.findIndex((h) => names.includes(h));
		if (at >= 0) out[col] = at;
	}
	return out;
}

/** Start offset of each line, to turn parser offsets into 1-based line numbers. */
function lineStarts(text: string): number[] {
	const starts = [0];
	for (let i = text.indexOf('\n'); i >= 0; i = text.indexOf('\n', i + 1)) starts.push(i + 1);
	return starts;
}

function lineAt(starts: number[], offset: number): number {
	let lo = 0;
	let hi = starts.length - 1;
	while (lo < hi) {
		const mid = (lo + hi + 1) >> 1;
		if (starts[mid] <= offset) lo = mid;
		else hi = mid - 1;
	}
	return lo + 1;
}

function coordinate(
	dd: string | undefined,
	dmm: string | undefined,
	axis: Axis
): { value?: number; text: string; other?: number } {
	const parse = (s: string) => {
		const t = s.trim();
		if (t === '') return undefined;
		if (/^[+-]?(\d+\.?\d*|\.\d+)$/.test(t)) return Number(t);
		const r = parseCoordinate(t, axis);
		return r.ok ? r.value : Number.NaN;
	};
	const a = dd === undefined ? undefined : parse(dd);
	const b = dmm === undefined ? undefined : parse(dmm);
	if (a !== undefined) return { value: a, text: dd ?? '', other: b };
	return { value: b, text: dmm ?? '' };
}

interface LineDraft {
	raw: RawFields;
	coords: LonLat[];
	where: string;
	lastVertex: number;
	key: string;
}

export function readCsv(input: string): ImportResult {
	const log = new ProblemLog();
	const plan = emptyPlan();
	const text = stripBom(input);
	const starts = lineStarts(text);

	// Leading "#" lines are ours (caution, plan name); kept away from the delimiter detection.
	let base = 0;
	while (text.startsWith('#', base)) {
		const end = text.indexOf('\n', base);
		const comment = text.slice(base, end < 0 ? text.length : end).replace(/\r$/, '');
		if (comment.startsWith(PLAN_NAME_PREFIX)) plan.name = comment.slice(PLAN_NAME_PREFIX.length);
		base = end < 0 ? text.length : end + 1;
	}

	const rows: { cells: string[]; line: number }[] = [];
	let offset = base;
	Papa.parse<string[]>(text.slice(base), {
		skipEmptyLines: false,
		step: (result) => {
			rows.push({ cells: result.data, line: lineAt(starts, offset) });
			for (const e of result.errors)
				log.warn(`line ${lineAt(starts, offset)}`, `CSV: ${e.message}`);
			offset = base + result.meta.cursor;
		}
	});

	let header: Partial<Record<Column, number>> | null = null;
	const order: PlanOrderEntry[] = [];
	// A holder, not a bare variable, so narrowing does not hide that flush() resets it.
	const open: { draft: LineDraft | null } = { draft: null };

	const flush = () => {
		const d = open.draft;
		if (!d) return;
		open.draft = null;
		if (d.coords.length < 2)
			return log.error(d.where, 'a line needs at least 2 vertices', 'vertex');
		const l = buildLine(d.raw, d.coords, { log, where: d.where }, plan.lines.length + 1);
		if (l) {
			order.push({ kind: 'line', index: plan.lines.length });
			plan.lines.push(l);
		}
	};

	for (const { cells, line } of rows) {
		const first = (cells[0] ?? '').trim();
		if (cells.every((c) => c.trim() === '')) continue;
		if (first.startsWith('#')) continue;
		if (!header) {
			header = headerIndex(cells);
			if (header.latitude_dd === undefined && header.latitude_dmm === undefined) {
				log.error(`line ${line}`, 'no latitude column in the header (e.g. latitude_dd)');
				return { plan, problems: log.finish() };
			}
			continue;
		}
		const h = header;
		const row: Row = {};
		for (const col of CSV_COLUMNS) {
			const at = h[col];
			if (at !== undefined && cells[at] !== undefined) row[col] = cells[at];
		}
		const where = `line ${line}`;
		if (row.plan && plan.name === emptyPlan().name) plan.name = unguardText(row.plan);
		const lat = coordinate(row.latitude_dd, row.latitude_dmm, 'lat');
		const lon = coordinate(row.longitude_dd, row.longitude_dmm, 'lon');
		if (lat.value === undefined || lon.value === undefined) {
			log.error(where, 'empty geometry: latitude or longitude missing', 'latitude_dd');
			continue;
		}
		const c = checkLonLat(lon.value, lat.value, 'latitude and longitude columns');
		if (!c.ok) {
			log.error(where, c.message, 'latitude_dd');
			continue;
		}
		// A spreadsheet edit to one notation but not the other: trust decimal degrees, say so.
		const dmmTolerance = 0.0006 / 60;
		if (
			(lat.other !== undefined && Math.abs(lat.other - c.value[1]) > dmmTolerance) ||
			(lon.other !== undefined && Math.abs(normalizeLon(lon.other - c.value[0])) > dmmTolerance)
		) {
			log.warn(
				where,
				'decimal-degree and degree-minute columns disagree; decimal degrees used',
				'latitude_dmm'
			);
		}
		const kind = (row.kind ?? '').trim().toLowerCase();
		const raw: RawFields = {
			id: unguardText(row.id ?? ''),
			name: unguardText(row.name ?? ''),
			plannedStart: row.planned_start_utc,
			plannedEnd: row.planned_end_utc,
			durationH: row.duration_h
		};
		if (kind === 'line') {
			const vertex = Number(row.vertex);
			const key = `${raw.id}\u0000${raw.name}`;
			const cur = open.draft;
			const numbered = row.vertex !== undefined && row.vertex.trim() !== '';
			// Vertex 1, a gap in the numbering or another id/name starts a new line.
			const continues =
				cur !== null && cur.key === key && (!numbered || vertex === cur.lastVertex + 1);
			if (!continues) {
				flush();
				open.draft = {
					raw: {
						...raw,
						purpose: row.purpose,
						surveySpeedKn: row.survey_speed_kn,
						overlapPct: row.overlap_pct,
						ihoOrder: row.iho_order,
						lengthKm: row.length_km,
						minDepthM: row.min_depth_m,
						maxDepthM: row.max_depth_m
					},
					coords: [],
					where,
					lastVertex: 0,
					key
				};
			}
			const d = open.draft as LineDraft;
			d.coords.push(c.value);
			d.lastVertex = numbered && Number.isFinite(vertex) ? vertex : d.lastVertex + 1;
			continue;
		}
		flush();
		if (kind !== '' && !(STATION_KINDS as readonly string[]).includes(kind)) {
			log.error(
				where,
				`unknown kind "${row.kind}"; expected line or a station kind (${STATION_KINDS.join(', ')})`,
				'kind'
			);
			continue;
		}
		const s = buildStation(
			{
				...raw,
				kind: kind || undefined,
				depthM: row.predicted_depth_m,
				params: unguardText(row.params_json ?? '')
			},
			c.value,
			{ log, where },
			plan.stations.length + 1
		);
		if (s) {
			order.push({ kind: 'station', index: plan.stations.length });
			plan.stations.push(s);
		}
	}
	flush();
	if (!header) log.error('file', 'no header row found');
	const o = orderIfNeeded(order, plan);
	if (o) plan.order = o;
	return { plan, problems: log.finish() };
}
