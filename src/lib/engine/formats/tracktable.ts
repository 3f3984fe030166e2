/**
 * Tables of fixes: CSV/TSV with a header row naming the columns (RFC 4180 quoting, read with
 * papaparse; the delimiter is a tab, semicolon or comma, whichever the header uses), and plain XYZ
 * (longitude, latitude, depth separated by spaces, tabs or commas, no header; "#" starts a
 * comment line). Columns are found by name, case-insensitive, units in brackets ignored:
 * longitude (lon, long, longitude, x), latitude (lat, latitude, y), depth (depth, depth_m,
 * corr_depth, z) and optional time (time, datetime, timestamp, time_utc, date_time): ISO 8601
 * (UTC when it names no offset) or seconds since 1970.
 */
import Papa from 'papaparse';
import { RowError, numberField, requiredNumber, type FixOut, type RowParser } from './trackrow';

const NAMES = {
	lon: ['lon', 'long', 'longitude', 'x', 'lon_dd', 'longitude_dd'],
	lat: ['lat', 'latitude', 'y', 'lat_dd', 'latitude_dd'],
	depth: ['depth', 'depth_m', 'corr_depth', 'z', 'water_depth'],
	time: ['time', 'datetime', 'timestamp', 'time_utc', 'date_time', 'utc']
} as const;

function clean(name: string): string {
	return name
		.trim()
		.toLowerCase()
		.replace(/\s*[([].*?[)\]]\s*/g, '')
		.replace(/[\s-]+/g, '_');
}

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

export function looksLikeXyz(line: string): boolean {
	const t = line.trim();
	if (t.startsWith('#')) return true;
	const parts = t.split(/[\s,;]+/);
	return parts.length >= 3 && parts.slice(0, 3).every((p) => NUMBER.test(p));
}

/** ISO 8601 (UTC when no offset is written) or epoch seconds → seconds since 1970 UTC. */
export function parseTime(text: string, column: string): number {
	const s = text.trim();
	if (s === '') return NaN;
	if (NUMBER.test(s)) return Number(s);
	const iso = /^\d{4}-\d{2}-\d{2}([ T]\d{2}:\d{2}(:\d{2}(\.\d+)?)?)?$/.test(s)
		? s.replace(' ', 'T') + (s.length > 10 ? 'Z' : 'T00:00Z')
		: s;
	const ms = Date.parse(iso);
	if (!Number.isFinite(ms)) throw new RowError(column, `"${s.slice(0, 40)}" is not a time`);
	return ms / 1000;
}

export class TableRows implements RowParser {
	private cols: { lon: number; lat: number; depth: number; time: number } | null = null;
	private names: string[] = [];
	private delimiter = ',';

	row(line: string, out: FixOut): boolean {
		if (!this.cols) {
			if (line.trimStart().startsWith('#')) return false;
			this.delimiter = line.includes('\t')
				? '\t'
				: line.includes(';') && !line.includes(',')
					? ';'
					: ',';
			const header = Papa.parse<string[]>(line, { delimiter: this.delimiter }).data[0] ?? [];
			this.names = header.map((h) => h.trim());
			const cleaned = header.map(clean);
			const find = (k: keyof typeof NAMES) =>
				cleaned.findIndex((h) => (NAMES[k] as readonly string[]).includes(h));
			const cols = { lon: find('lon'), lat: find('lat'), depth: find('depth'), time: find('time') };
			const missing = (['lon', 'lat', 'depth'] as const).filter((k) => cols[k] < 0);
			if (missing.length)
				throw new RowError(
					missing.map((k) => NAMES[k][1]).join(', '),
					`the header row needs columns for longitude, latitude and depth (found: ${this.names.join(', ') || 'nothing'})`
				);
			this.cols = cols;
			return false;
		}
		if (line.trimStart().startsWith('#')) return false;
		const f = line.includes('"')
			? (Papa.parse<string[]>(line, { delimiter: this.delimiter }).data[0] ?? [])
			: line.split(this.delimiter);
		const c = this.cols;
		const name = (i: number) => this.names[i];
		out.lon = numberField(f[c.lon] ?? '', name(c.lon));
		out.lat = numberField(f[c.lat] ?? '', name(c.lat));
		out.depthM = numberField(f[c.depth] ?? '', name(c.depth));
		if (c.time >= 0) out.timeS = parseTime(f[c.time] ?? '', name(c.time));
		return true;
	}
}

export class XyzRows implements RowParser {
	row(line: string, out: FixOut): boolean {
		const t = line.trim();
		if (t.startsWith('#')) return false;
		const parts = t.split(/[\s,;]+/);
		if (parts.length < 3)
			throw new RowError(
				'depth',
				`an XYZ row is longitude latitude depth; found ${parts.length} field(s)`
			);
		out.lon = requiredNumber(parts[0], 'longitude (x)');
		out.lat = requiredNumber(parts[1], 'latitude (y)');
		out.depthM = requiredNumber(parts[2], 'depth (z)');
		return true;
	}
}
