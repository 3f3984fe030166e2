/**
 * Pieces every reader and writer shares: the export caution, import limits, number spelling,
 * coordinate checks and the validation that turns loosely typed file fields into plan items,
 * so all five formats accept and reject the same things with the same words.
 */
import { LIMITS, type Range } from '../limits';
import { normalizeLon } from './coordinates';
import {
	IHO_ORDERS,
	LINE_PURPOSES,
	STATION_KINDS,
	type ImportProblem,
	type LonLat,
	type PlanArea,
	type PlanDoc,
	type PlanLine,
	type PlanOrderEntry,
	type PlanRidge,
	type PlanStation
} from './types';

/** Written into every export where the format keeps a comment or description (DESIGN §9). */
export const EXPORT_CAUTION =
	"Wakeline planning proposal for the ship's master, who decides. NOT FOR NAVIGATION. " +
	'Check every coordinate against official charts. Predicted depths are model estimates, ' +
	'not soundings.';

export const GENERATOR = 'Wakeline';

/** Our own XML namespace for settings GPX, KML and RTZ have no place for. */
export const WAKELINE_NS = 'https://wakeline.example/gpx/1';

export const MAX_IMPORT_BYTES = 10 * 1024 * 1024;

/** Settings a foreign file may lack. Survey speed and overlap follow SCIENCE.md §4 and §6. */
export const IMPORT_DEFAULTS = {
	/** [trade] deep-water multibeam survey 8–10 kn. */
	surveySpeedKn: 8,
	/** [published] Lucieer et al. 2018 (AusSeabed): ≥30 % overlap for baseline mapping. */
	overlapPct: 30,
	/** Deep-water ridge surveys rarely aim above IHO S-44 Order 2. */
	ihoOrder: '2',
	purpose: 'multibeam',
	stationKind: 'ctd'
} as const;

/** At most this many problems are listed; a flood of them helps nobody. */
const MAX_PROBLEMS = 200;

export function emptyPlan(name = 'Imported plan'): PlanDoc {
	return { name, ridges: [], lines: [], areas: [], stations: [] };
}

/** UTF-8 size of a string without allocating a copy of it. */
export function utf8ByteLength(text: string): number {
	let bytes = 0;
	for (let i = 0; i < text.length; i++) {
		const c = text.charCodeAt(i);
		if (c < 0x80) bytes += 1;
		else if (c < 0x800) bytes += 2;
		else if (c >= 0xd800 && c <= 0xdbff && i + 1 < text.length) {
			bytes += 4;
			i++;
		} else bytes += 3;
	}
	return bytes;
}

/** A problem if an upload of `bytes` is over the limit, else null. */
export function checkImportSize(bytes: number, limit = MAX_IMPORT_BYTES): ImportProblem | null {
	if (bytes <= limit) return null;
	const mib = (n: number) => (n / 1024 / 1024).toFixed(1);
	return {
		where: 'file',
		message: `the file is ${mib(bytes)} MiB; the limit is ${mib(limit)} MiB`,
		severity: 'error'
	};
}

export function stripBom(text: string): string {
	return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}

/**
 * A number as a plain decimal string: shortest round-trip digits, never exponent notation,
 * because xsd:decimal (GPX, RTZ) and KML coordinates do not allow "1e-7".
 */
export function decimal(n: number): string {
	const s = String(n);
	if (!/e/i.test(s)) return s;
	const m = /^(-?)(\d)(?:\.(\d+))?e([+-]\d+)$/i.exec(s);
	if (!m) return s;
	const [, sign, lead, frac = '', expText] = m;
	const exp = Number(expText);
	const digits = lead + frac;
	if (exp < 0) return `${sign}0.${'0'.repeat(-exp - 1)}${digits}`;
	const point = 1 + exp;
	return (
		sign +
		(digits.length > point
			? `${digits.slice(0, point)}.${digits.slice(point)}`
			: digits.padEnd(point, '0'))
	);
}

/** Fixed decimals, never "-0": numbers rounded to what they mean (0.000001°, 1 m, 0.01 h). */
export function fixed(x: number, decimals: number): string {
	const s = x.toFixed(decimals);
	return /^-0(\.0*)?$/.test(s) ? s.slice(1) : s;
}

/** Letters that Unicode decomposition does not reduce to ASCII. */
const TRANSLITERATE: Record<string, string> = {
	Æ: 'AE',
	æ: 'ae',
	Ø: 'O',
	ø: 'o',
	ß: 'ss',
	Þ: 'Th',
	þ: 'th',
	Ð: 'D',
	ð: 'd',
	Œ: 'OE',
	œ: 'oe',
	Ł: 'L',
	ł: 'l'
};

/** A file-system and ECDIS friendly base name: letters, digits, dot, dash, underscore. */
export function fileBaseName(name: string): string {
	const base = name
		.replace(/[ÆæØøßÞþÐðŒœŁł]/g, (c) => TRANSLITERATE[c] ?? c)
		.normalize('NFKD')
		.replace(/[\u0300-\u036f]/g, '')
		.replace(/[^A-Za-z0-9._-]+/g, '_')
		.replace(/_+/g, '_')
		.replace(/^[._-]+|[._-]+$/g, '')
		.slice(0, 64);
	return base || 'wakeline-plan';
}

/** The cruise order of lines and stations: `plan.order` checked, then anything it left out. */
export function routeSequence(plan: PlanDoc): PlanOrderEntry[] {
	const seen = new Set<string>();
	const out: PlanOrderEntry[] = [];
	const add = (e: PlanOrderEntry) => {
		const key = `${e.kind}:${e.index}`;
		const list = e.kind === 'line' ? plan.lines : plan.stations;
		if (seen.has(key) || !Number.isInteger(e.index) || e.index < 0 || e.index >= list.length) {
			return;
		}
		seen.add(key);
		out.push({ kind: e.kind, index: e.index, ...(e.reversed ? { reversed: true } : {}) });
	};
	for (const e of plan.order ?? []) add(e);
	plan.lines.forEach((_, index) => add({ kind: 'line', index }));
	plan.stations.forEach((_, index) => add({ kind: 'station', index }));
	return out;
}

/** The order to store on an imported plan: left out when it is the default (lines, then stations). */
export function orderIfNeeded(
	order: PlanOrderEntry[],
	plan: PlanDoc
): PlanOrderEntry[] | undefined {
	const def = routeSequence({ ...plan, order: undefined });
	const same =
		order.length === def.length &&
		order.every((e, i) => e.kind === def[i].kind && e.index === def[i].index);
	return same ? undefined : order;
}

// ---------------------------------------------------------------------------------------------
// Problems

export class ProblemLog {
	readonly problems: ImportProblem[] = [];
	private dropped = 0;
	private readonly defaults = new Map<string, { count: number; message: string }>();

	add(problem: ImportProblem): void {
		if (this.problems.length < MAX_PROBLEMS) this.problems.push(problem);
		else this.dropped++;
	}

	error(where: string, message: string, field?: string): void {
		this.add({ where, ...(field ? { field } : {}), message, severity: 'error' });
	}

	warn(where: string, message: string, field?: string): void {
		this.add({ where, ...(field ? { field } : {}), message, severity: 'warning' });
	}

	/** Count a default filled in; reported once per field at the end instead of per item. */
	defaulted(what: string, field: string, value: unknown): void {
		const key = `${what}.${field}`;
		const entry = this.defaults.get(key) ?? { count: 0, message: '' };
		entry.count++;
		entry.message = `${field} missing; used ${JSON.stringify(value)}`;
		this.defaults.set(key, entry);
	}

	finish(): ImportProblem[] {
		const out = [...this.problems];
		for (const [key, { count, message }] of this.defaults) {
			const what = key.split('.')[0];
			out.push({
				where: `${count} ${what}${count === 1 ? '' : 's'}`,
				field: key.split('.')[1],
				message,
				severity: 'warning'
			});
		}
		if (this.dropped > 0) {
			out.push({
				where: 'file',
				message: `${this.dropped} more problems not listed`,
				severity: 'error'
			});
		}
		return out;
	}
}

// ---------------------------------------------------------------------------------------------
// Coordinates

export type Checked<T> = { ok: true; value: T } | { ok: false; message: string };

function toNumber(v: unknown): number {
	if (typeof v === 'number') return v;
	if (typeof v === 'string' && v.trim() !== '') return Number(v.trim());
	return Number.NaN;
}

/** One position given as lon, lat. Catches the classic lat,lon mix-up. */
export function checkLonLat(
	lonRaw: unknown,
	latRaw: unknown,
	expected = 'lon,lat'
): Checked<LonLat> {
	const lon = toNumber(lonRaw);
	const lat = toNumber(latRaw);
	if (!Number.isFinite(lon) || !Number.isFinite(lat)) {
		return {
			ok: false,
			message: `coordinates are not numbers (${String(lonRaw)}, ${String(latRaw)})`
		};
	}
	if (Math.abs(lat) > 90) {
		if (Math.abs(lon) <= 90) {
			return {
				ok: false,
				message: `coordinates look swapped, expected ${expected} (got lon ${lonRaw}, lat ${latRaw})`
			};
		}
		return { ok: false, message: `latitude ${lat} is outside ±90°` };
	}
	// Unwrapped longitudes (e.g. 181) come from some drawing tools; ±540 covers them.
	if (Math.abs(lon) > 540) return { ok: false, message: `longitude ${lon} is outside ±180°` };
	return { ok: true, value: [normalizeLon(lon), lat] };
}

/** A list of positions; the message names the first bad vertex (1-based). */
export function checkPath(
	points: [unknown, unknown][],
	minPoints: number,
	what: string
): Checked<LonLat[]> {
	if (points.length === 0)
		return { ok: false, message: `${what} has no coordinates (empty geometry)` };
	const out: LonLat[] = [];
	for (let i = 0; i < points.length; i++) {
		const c = checkLonLat(points[i][0], points[i][1]);
		if (!c.ok)
			return {
				ok: false,
				message: points.length > 1 ? `vertex ${i + 1}: ${c.message}` : c.message
			};
		out.push(c.value);
	}
	if (out.length < minPoints) {
		return { ok: false, message: `${what} needs at least ${minPoints} points, has ${out.length}` };
	}
	return { ok: true, value: out };
}

/** An area ring without its closing vertex. */
export function openRing(ring: LonLat[]): LonLat[] {
	const n = ring.length;
	if (n > 1 && ring[0][0] === ring[n - 1][0] && ring[0][1] === ring[n - 1][1])
		return ring.slice(0, -1);
	return ring;
}

export function closeRing(ring: LonLat[]): LonLat[] {
	const open = openRing(ring);
	return open.length ? [...open, open[0]] : open;
}

// ---------------------------------------------------------------------------------------------
// Building plan items from loosely typed fields

/** Field values as files give them: JSON values, or strings from XML/CSV ('' meaning null). */
export type RawFields = Record<string, unknown>;

interface Ctx {
	log: ProblemLog;
	where: string;
}

interface NumberRule {
	min?: number;
	max?: number;
	/** The lower bound itself is not allowed. */
	above?: number;
	below?: number;
}

function describeRange(r: NumberRule): string {
	const lo = r.above !== undefined ? `> ${r.above}` : r.min !== undefined ? `≥ ${r.min}` : '';
	const hi = r.below !== undefined ? `< ${r.below}` : r.max !== undefined ? `≤ ${r.max}` : '';
	return [lo, hi].filter(Boolean).join(' and ');
}

/** undefined: absent; null: explicitly empty; 'bad': reported. */
function readNumber(
	raw: RawFields,
	field: string,
	rule: NumberRule,
	ctx: Ctx,
	severity: 'error' | 'warning' = 'error'
): number | null | undefined | 'bad' {
	const v = raw[field];
	if (v === undefined) return undefined;
	if (v === null || (typeof v === 'string' && v.trim() === '')) return null;
	const n = toNumber(v);
	if (!Number.isFinite(n)) {
		ctx.log.add({
			where: ctx.where,
			field,
			message: `${field} is not a number: ${JSON.stringify(v)}`,
			severity
		});
		return 'bad';
	}
	const tooLow =
		(rule.min !== undefined && n < rule.min) || (rule.above !== undefined && n <= rule.above);
	const tooHigh =
		(rule.max !== undefined && n > rule.max) || (rule.below !== undefined && n >= rule.below);
	if (tooLow || tooHigh) {
		ctx.log.add({
			where: ctx.where,
			field,
			message: `${field} must be ${describeRange(rule)}, got ${n}`,
			severity
		});
		return 'bad';
	}
	return n;
}

/** A required setting: default filled in (and counted) when absent; false when invalid. */
function requiredNumber(
	raw: RawFields,
	field: string,
	rule: NumberRule,
	ctx: Ctx,
	what: string,
	def?: number
): number | false {
	const n = readNumber(raw, field, rule, ctx);
	if (n === 'bad') return false;
	if (n === undefined || n === null) {
		if (def === undefined) {
			ctx.log.error(ctx.where, `${field} is required`, field);
			return false;
		}
		ctx.log.defaulted(what, field, def);
		return def;
	}
	return n;
}

/** Optional setting: absent stays absent; invalid is warned about and left out. */
function optionalNumber(
	raw: RawFields,
	field: string,
	rule: NumberRule,
	ctx: Ctx
): number | null | undefined {
	const n = readNumber(raw, field, rule, ctx, 'warning');
	return n === 'bad' ? undefined : n;
}

function readChoice<T extends string>(
	raw: RawFields,
	field: string,
	choices: readonly T[],
	ctx: Ctx,
	what: string,
	def: T
): T | false {
	const v = raw[field];
	if (v === undefined || v === null || v === '') {
		ctx.log.defaulted(what, field, def);
		return def;
	}
	const s = String(v).trim().toLowerCase();
	const hit = choices.find((c) => c === s);
	if (!hit) {
		ctx.log.error(
			ctx.where,
			`unknown ${field} "${String(v)}"; expected one of ${choices.join(', ')}`,
			field
		);
		return false;
	}
	return hit;
}

function readName(raw: RawFields, fallback: string): string {
	const v = raw.name;
	if (typeof v === 'string' && v.trim() !== '') return v;
	if (typeof v === 'number') return String(v);
	return fallback;
}

function readId(raw: RawFields): { id?: string } {
	const v = raw.id;
	if (typeof v === 'string' && v !== '') return { id: v };
	if (typeof v === 'number' && Number.isFinite(v)) return { id: String(v) };
	return {};
}

const ISO_UTC = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(?::\d{2}(?:\.\d+)?)?(?:Z|[+-]\d{2}:?\d{2})$/;

function readTimes(raw: RawFields, ctx: Ctx): { plannedStart?: string; plannedEnd?: string } {
	const out: { plannedStart?: string; plannedEnd?: string } = {};
	for (const field of ['plannedStart', 'plannedEnd'] as const) {
		const v = raw[field];
		if (v === undefined || v === null || v === '') continue;
		const s = String(v).trim();
		if (!ISO_UTC.test(s) || Number.isNaN(Date.parse(s))) {
			ctx.log.warn(
				ctx.where,
				`${field} is not an ISO 8601 date-time with a zone: "${s}"; left out`,
				field
			);
			continue;
		}
		out[field] = s;
	}
	if (
		out.plannedStart &&
		out.plannedEnd &&
		Date.parse(out.plannedEnd) < Date.parse(out.plannedStart)
	) {
		ctx.log.warn(ctx.where, 'plannedEnd is before plannedStart', 'plannedEnd');
	}
	return out;
}

// The shared limits (engine/limits.ts): an import accepts exactly what the API and forms accept.
const rule = (r: Range): NumberRule =>
	r.minExclusive ? { above: r.min, max: r.max } : { min: r.min, max: r.max };
const SPEED = rule(LIMITS.surveySpeedKn);
const OVERLAP = rule(LIMITS.overlapPct);
const DEPTH = rule(LIMITS.axialDepthM);
const POSITIVE: NumberRule = { min: 0 };

export function buildRidge(raw: RawFields, axis: LonLat[], ctx: Ctx, n: number): PlanRidge | null {
	const fullRateMmYr = requiredNumber(raw, 'fullRateMmYr', rule(LIMITS.fullRateMmYr), ctx, 'ridge');
	if (fullRateMmYr === false) return null;
	const ridge: PlanRidge = {
		...readId(raw),
		name: readName(raw, `Ridge ${n}`),
		axis,
		fullRateMmYr
	};
	const asymmetry = optionalNumber(raw, 'asymmetry', { min: 0, max: 1 }, ctx);
	if (typeof asymmetry === 'number') ridge.asymmetry = asymmetry;
	const temp = optionalNumber(raw, 'potentialTemperatureC', { min: 0, max: 2500 }, ctx);
	if (temp !== undefined) ridge.potentialTemperatureC = temp;
	const depth = optionalNumber(raw, 'axialDepthM', DEPTH, ctx);
	if (depth !== undefined) ridge.axialDepthM = depth;
	return ridge;
}

export function buildLine(raw: RawFields, coords: LonLat[], ctx: Ctx, n: number): PlanLine | null {
	const purpose = readChoice(raw, 'purpose', LINE_PURPOSES, ctx, 'line', IMPORT_DEFAULTS.purpose);
	const surveySpeedKn = requiredNumber(
		raw,
		'surveySpeedKn',
		SPEED,
		ctx,
		'line',
		IMPORT_DEFAULTS.surveySpeedKn
	);
	const overlapPct = requiredNumber(
		raw,
		'overlapPct',
		OVERLAP,
		ctx,
		'line',
		IMPORT_DEFAULTS.overlapPct
	);
	const ihoOrder = readChoice(raw, 'ihoOrder', IHO_ORDERS, ctx, 'line', IMPORT_DEFAULTS.ihoOrder);
	if (purpose === false || surveySpeedKn === false || overlapPct === false || ihoOrder === false)
		return null;
	const line: PlanLine = {
		...readId(raw),
		name: readName(raw, `Line ${n}`),
		coords,
		purpose,
		surveySpeedKn,
		overlapPct,
		ihoOrder
	};
	const computed = readComputed(raw, ['lengthKm', 'durationH', 'minDepthM', 'maxDepthM'], ctx);
	if (computed) line.computed = computed as unknown as PlanLine['computed'];
	return Object.assign(line, readTimes(raw, ctx));
}

export function buildArea(raw: RawFields, ring: LonLat[], ctx: Ctx, n: number): PlanArea | null {
	const overlapPct = requiredNumber(
		raw,
		'overlapPct',
		OVERLAP,
		ctx,
		'area',
		IMPORT_DEFAULTS.overlapPct
	);
	const surveySpeedKn = requiredNumber(
		raw,
		'surveySpeedKn',
		SPEED,
		ctx,
		'area',
		IMPORT_DEFAULTS.surveySpeedKn
	);
	if (overlapPct === false || surveySpeedKn === false) return null;
	return { ...readId(raw), name: readName(raw, `Area ${n}`), ring, overlapPct, surveySpeedKn };
}

export function buildStation(
	raw: RawFields,
	position: LonLat,
	ctx: Ctx,
	n: number
): PlanStation | null {
	const kind = readChoice(raw, 'kind', STATION_KINDS, ctx, 'station', IMPORT_DEFAULTS.stationKind);
	if (kind === false) return null;
	const params = readParams(raw.params, ctx);
	const station: PlanStation = {
		...readId(raw),
		name: readName(raw, `Station ${n}`),
		kind,
		position,
		params
	};
	const computed = readComputed(raw, ['depthM', 'durationH'], ctx);
	if (computed) station.computed = computed as unknown as PlanStation['computed'];
	return Object.assign(station, readTimes(raw, ctx));
}

/** Computed values travel together: all present and valid, or the set is left out. */
function readComputed(raw: RawFields, fields: string[], ctx: Ctx): Record<string, number> | null {
	const out: Record<string, number> = {};
	for (const f of fields) {
		const v = optionalNumber(
			raw,
			f,
			f.endsWith('DepthM') || f === 'depthM' ? DEPTH : POSITIVE,
			ctx
		);
		if (typeof v !== 'number') return null;
		out[f] = v;
	}
	return out;
}

/** Station parameters: a JSON object (or its text) of numbers and strings. */
export function readParams(v: unknown, ctx: Ctx): Record<string, number | string> {
	let obj = v;
	if (typeof v === 'string') {
		if (v.trim() === '') return {};
		try {
			obj = JSON.parse(v);
		} catch {
			ctx.log.warn(ctx.where, 'params is not valid JSON; left out', 'params');
			return {};
		}
	}
	if (obj === undefined || obj === null) return {};
	if (typeof obj !== 'object' || Array.isArray(obj)) {
		ctx.log.warn(ctx.where, 'params must be an object of numbers and strings; left out', 'params');
		return {};
	}
	const out: Record<string, number | string> = {};
	for (const [k, val] of Object.entries(obj as Record<string, unknown>)) {
		if ((typeof val === 'number' && Number.isFinite(val)) || typeof val === 'string') out[k] = val;
		else
			ctx.log.warn(
				ctx.where,
				`params.${k} is neither a number nor a text; left out`,
				`params.${k}`
			);
	}
	return out;
}

/** Station params as typed XML-friendly entries, and back (GPX, RTZ). */
export function paramEntries(
	params: Record<string, number | string>
): { name: string; type: 'number' | 'string'; value: string }[] {
	return Object.entries(params).map(([name, v]) =>
		typeof v === 'number'
			? { name, type: 'number', value: decimal(v) }
			: { name, type: 'string', value: v }
	);
}

/** A plan a format cannot express (e.g. an RTZ route needs two waypoints). */
export class ExportError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'ExportError';
	}
}
