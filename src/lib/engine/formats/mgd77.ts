/**
 * MGD77 data records (NGDC, "MGD77 format description", revised for four-digit years): fixed
 * columns in a 120-character record; header records (80 characters, record type "4") are skipped.
 * A field of all nines is a missing value. Columns (1-based, inclusive) and scaling we read:
 *   1       record type, "5" for a data record ("3" in pre-1977 files is read the same)
 *   10–12   time-zone correction, hours to ADD to get UTC
 *   13–16   year        17–18 month      19–20 day      21–22 hour
 *   23–27   minutes × 1000
 *   28–35   latitude × 100000 (north positive)
 *   36–44   longitude × 100000 (east positive)
 *   52–57   corrected depth × 10 (metres, positive down)
 * [memory] of the published layout; the spec writes records from this same table.
 */
import { RowError, numberField, utcSeconds, type FixOut, type RowParser } from './trackrow';

export const MGD77_RECORD_LENGTH = 120;

/** [first column, last column] (1-based, inclusive) of each field we read. */
export const MGD77_FIELDS = {
	recordType: [1, 1],
	timeZone: [10, 12],
	year: [13, 16],
	month: [17, 18],
	day: [19, 20],
	hour: [21, 22],
	minutesX1000: [23, 27],
	latitudeX1e5: [28, 35],
	longitudeX1e5: [36, 44],
	depthX10: [52, 57]
} as const;

type Field = keyof typeof MGD77_FIELDS;

export function looksLikeMgd77(line: string): boolean {
	const t = line.trimEnd();
	return (
		(t.length > 57 && t.length <= MGD77_RECORD_LENGTH && (t[0] === '5' || t[0] === '3')) ||
		(t[0] === '4' && line.length === 80)
	);
}

/** The value of a field; NaN for blanks or all nines (the format's missing value). */
function field(line: string, name: Field): number {
	const [a, b] = MGD77_FIELDS[name];
	const s = line.slice(a - 1, b).trim();
	if (s === '' || /^[+-]?9+$/.test(s)) return NaN;
	if (!/^[+-]?\d+$/.test(s)) throw new RowError(name, `"${s}" is not a whole number`);
	return numberField(s, name);
}

export class Mgd77Rows implements RowParser {
	row(line: string, out: FixOut): boolean {
		const type = line[0];
		if (type === '4' || line.trimEnd().length <= 80) return false; // a header record
		if (type !== '5' && type !== '3')
			throw new RowError('recordType', `"${type}" is not a data record type (5)`);
		const lat = field(line, 'latitudeX1e5');
		const lon = field(line, 'longitudeX1e5');
		out.lat = lat / 1e5;
		out.lon = lon / 1e5;
		out.depthM = field(line, 'depthX10') / 10;
		const y = field(line, 'year');
		const mo = field(line, 'month');
		const d = field(line, 'day');
		const h = field(line, 'hour');
		const minX = field(line, 'minutesX1000');
		if (![y, mo, d].some(Number.isNaN)) {
			if (!(mo >= 1 && mo <= 12)) throw new RowError('month', `${mo} is not a month`);
			if (!(d >= 1 && d <= 31)) throw new RowError('day', `${d} is not a day of the month`);
			const hh = Number.isNaN(h) ? 0 : h;
			const mm = Number.isNaN(minX) ? 0 : minX / 1000;
			if (!(hh < 24 && mm < 60)) throw new RowError('hour', 'not a time of day');
			const tz = field(line, 'timeZone');
			out.timeS = utcSeconds(y, mo, d, hh * 3600 + mm * 60) + (Number.isNaN(tz) ? 0 : tz) * 3600;
		}
		return true;
	}
}

/** Puts `value` right-aligned into columns [a, b] of a record (for writers and tests). */
export function placeField(record: string[], name: Field, value: string): void {
	const [a, b] = MGD77_FIELDS[name];
	const width = b - a + 1;
	if (value.length > width) throw new RangeError(`${name}: "${value}" wider than ${width}`);
	const padded = value.padStart(width, ' ');
	for (let i = 0; i < width; i++) record[a - 1 + i] = padded[i];
}

/** One 120-character data record with position, time and depth; other fields all nines. */
export function mgd77Record(lon: number, lat: number, depthM: number, timeS: number): string {
	const r = ('5' + 'WAKELINE' + '9'.repeat(111)).split('');
	const sign = (v: number, width: number) =>
		(v < 0 ? '-' : '+') + String(Math.abs(Math.round(v))).padStart(width - 1, '0');
	placeField(r, 'timeZone', '+00');
	if (Number.isFinite(timeS)) {
		const t = new Date(Math.round(timeS * 1000));
		placeField(r, 'year', String(t.getUTCFullYear()));
		placeField(r, 'month', String(t.getUTCMonth() + 1).padStart(2, '0'));
		placeField(r, 'day', String(t.getUTCDate()).padStart(2, '0'));
		placeField(r, 'hour', String(t.getUTCHours()).padStart(2, '0'));
		const minX = Math.round((t.getUTCMinutes() + t.getUTCSeconds() / 60) * 1000);
		placeField(r, 'minutesX1000', String(minX).padStart(5, '0'));
	}
	placeField(r, 'latitudeX1e5', sign(lat * 1e5, 8));
	placeField(r, 'longitudeX1e5', sign(lon * 1e5, 9));
	if (Number.isFinite(depthM))
		placeField(r, 'depthX10', String(Math.round(depthM * 10)).padStart(6, '0'));
	return r.join('');
}
