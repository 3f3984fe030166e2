/**
 * Plan import and export in the open formats of DESIGN §4 flow 4: GeoJSON, GPX 1.1, KML 2.2, CSV
 * waypoint list and RTZ 1.2. Readers never throw: whatever is wrong comes back as problems with
 * where and which field, next to the parts that were valid.
 */
import { axisProblem, inRange, LIMITS, rangeMessage, SIZES } from '../limits';
import { readCsv, writeCsv } from './csv';
import { readGeoJson, writeGeoJson } from './geojson';
import { readGpx, writeGpx } from './gpx';
import { readKml, writeKml } from './kml';
import { readRtz, rtzFileName, writeRtz } from './rtz';
import {
	ExportError,
	MAX_IMPORT_BYTES,
	checkImportSize,
	emptyPlan,
	fileBaseName,
	stripBom,
	utf8ByteLength
} from './shared';
import {
	FORMATS,
	type ExportedFile,
	type FormatId,
	type ImportProblem,
	type ImportResult,
	type LonLat,
	type PlanDoc
} from './types';

export * from './types';
export * from './coordinates';
export {
	EXPORT_CAUTION,
	ExportError,
	IMPORT_DEFAULTS,
	MAX_IMPORT_BYTES,
	WAKELINE_NS,
	checkImportSize,
	fileBaseName,
	routeSequence,
	utf8ByteLength
} from './shared';
export { rtzFileName, rtzRouteName } from './rtz';
export { CSV_COLUMNS } from './csv';

const EXTENSION: Record<FormatId, string> = {
	geojson: 'geojson',
	gpx: 'gpx',
	kml: 'kml',
	csv: 'csv',
	rtz: 'rtz'
};

export const MIME_TYPES: Record<FormatId, string> = {
	// [published] RFC 7946 §12
	geojson: 'application/geo+json',
	gpx: 'application/gpx+xml',
	kml: 'application/vnd.google-earth.kml+xml',
	// [published] RFC 4180 §3
	csv: 'text/csv; charset=utf-8; header=present',
	// IEC 61174 registers no media type; RTZ is plain XML.
	rtz: 'application/xml'
};

export interface ExportOptions {
	/** ISO 8601 UTC time stamped into formats that have a place for it (GPX metadata). */
	exportedAt?: string;
}

/**
 * The plan as a file. Throws ExportError only when the format cannot express the plan at all
 * (an RTZ route with fewer than two waypoints).
 */
export function exportPlan(
	plan: PlanDoc,
	format: FormatId,
	options: ExportOptions = {}
): ExportedFile {
	assertExportable(plan);
	const filename =
		format === 'rtz' ? rtzFileName(plan) : `${fileBaseName(plan.name)}.${EXTENSION[format]}`;
	const body =
		format === 'geojson'
			? writeGeoJson(plan)
			: format === 'gpx'
				? writeGpx(plan, options)
				: format === 'kml'
					? writeKml(plan)
					: format === 'csv'
						? writeCsv(plan)
						: writeRtz(plan);
	return { filename, mimeType: MIME_TYPES[format], body };
}

export interface ImportOptions {
	/** Checked against RTZ routeName; also a fallback plan name. */
	filename?: string;
	maxBytes?: number;
}

/** A file for the bridge must not carry a position that cannot exist; say which item has it. */
function assertExportable(plan: PlanDoc): void {
	const check = (what: string, name: string, coords: LonLat[]) => {
		for (const [lon, lat] of coords) {
			if (!Number.isFinite(lon) || !Number.isFinite(lat) || Math.abs(lat) > 90) {
				throw new ExportError(
					`${what} "${name}": position (lon ${lon}, latitude ${lat}) is impossible`
				);
			}
		}
	};
	plan.ridges.forEach((r) => check('ridge', r.name, r.axis));
	plan.lines.forEach((l) => check('line', l.name, l.coords));
	plan.areas.forEach((a) => check('area', a.name, a.ring));
	plan.stations.forEach((s) => check('station', s.name, [s.position]));
}

/**
 * The shared size and value limits (engine/limits.ts) applied to what a file holds, so an import
 * cannot store what the API would refuse: item counts, vertices, axis shape, station settings.
 */
export function sizeProblems(plan: PlanDoc): ImportProblem[] {
	const out: ImportProblem[] = [];
	const err = (where: string, message: string, field?: string) => {
		out.push({ where, message, severity: 'error', ...(field ? { field } : {}) });
		return false;
	};
	for (const kind of ['ridges', 'lines', 'areas', 'stations'] as const) {
		if (plan[kind].length > SIZES.planItems) {
			err(
				'file',
				`at most ${SIZES.planItems} ${kind} in one plan; this file has ${plan[kind].length}`
			);
			plan[kind].length = SIZES.planItems;
		}
	}
	// Items over a limit are left out (as items with a bad value are), each with its problem.
	plan.ridges = plan.ridges.filter((r) => {
		const p = axisProblem(r.axis);
		return p ? err(`ridge "${r.name}"`, p.message, 'axis') : true;
	});
	plan.lines = plan.lines.filter((l) =>
		l.coords.length > SIZES.lineVertices
			? err(
					`line "${l.name}"`,
					`a line may have at most ${SIZES.lineVertices} positions; this one has ${l.coords.length}`,
					'coords'
				)
			: true
	);
	plan.areas = plan.areas.filter((a) =>
		a.ring.length > SIZES.ringVertices
			? err(
					`area "${a.name}"`,
					`a ring may have at most ${SIZES.ringVertices} positions; this one has ${a.ring.length}`,
					'ring'
				)
			: true
	);
	plan.stations = plan.stations.filter((st) => {
		const entries = Object.entries(st.params);
		if (entries.length > SIZES.stationParams)
			return err(`station "${st.name}"`, `at most ${SIZES.stationParams} settings`, 'params');
		for (const [k, v] of entries)
			if (typeof v === 'number' && !inRange(v, LIMITS.stationParam))
				return err(
					`station "${st.name}"`,
					rangeMessage(`params.${k}`, LIMITS.stationParam),
					`params.${k}`
				);
		return true;
	});
	return out;
}

/** Read a file of the given format. Never throws. */
export function importPlan(
	text: string,
	format: FormatId,
	options: ImportOptions = {}
): ImportResult {
	const limit = options.maxBytes ?? MAX_IMPORT_BYTES;
	// UTF-8 takes at least one byte per UTF-16 unit, so a long string is refused before counting.
	const tooBig = checkImportSize(text.length > limit ? text.length : utf8ByteLength(text), limit);
	if (tooBig) return { plan: emptyPlan(), problems: [tooBig] };
	if (!(FORMATS as readonly string[]).includes(format)) {
		return {
			plan: emptyPlan(),
			problems: [{ where: 'file', message: `unknown format "${format}"`, severity: 'error' }]
		};
	}
	let result: ImportResult;
	try {
		result =
			format === 'geojson'
				? readGeoJson(text)
				: format === 'gpx'
					? readGpx(text)
					: format === 'kml'
						? readKml(text)
						: format === 'csv'
							? readCsv(text)
							: readRtz(text, { filename: options.filename });
	} catch (e) {
		// Readers are written not to throw; this is the net under a parser surprise.
		return {
			plan: emptyPlan(),
			problems: [
				{
					where: 'file',
					message: `could not read the file: ${e instanceof Error ? e.message : String(e)}`,
					severity: 'error'
				}
			]
		};
	}
	result.problems.push(...sizeProblems(result.plan));
	if (result.plan.name === emptyPlan().name && options.filename) {
		result.plan.name = options.filename.replace(/^.*[\\/]/, '').replace(/\.[^.]+$/, '');
	}
	return result;
}

/** Guess the format from the content, then from the file name; null when neither tells. */
export function detectFormat(text: string, filename?: string): FormatId | null {
	const head = stripBom(text.slice(0, 4096)).trimStart();
	if (head.startsWith('{') || head.startsWith('[')) return 'geojson';
	if (head.startsWith('<')) {
		// The first element after the declaration, comments and doctype names the format.
		const root = /<(?![?!])(?:[\w.-]+:)?([\w.-]+)/.exec(head)?.[1]?.toLowerCase();
		if (root === 'gpx') return 'gpx';
		if (root === 'kml') return 'kml';
		if (root === 'route') return 'rtz';
	}
	const ext = filename?.toLowerCase().match(/\.([a-z0-9]+)$/)?.[1];
	if (ext === 'geojson' || ext === 'json') return 'geojson';
	if (ext === 'gpx' || ext === 'kml' || ext === 'rtz' || ext === 'csv') return ext;
	if (ext === 'txt' || ext === 'tsv') return 'csv';
	if (
		head &&
		!head.startsWith('<') &&
		/[,;\t]/.test(head.split('\n').find((l) => l.trim() && !l.startsWith('#')) ?? '')
	) {
		return 'csv';
	}
	return null;
}
