/**
 * MGD77T, the tab-separated exchange form of marine geophysical trackline data (NGDC/NCEI, 2010,
 * "MGD77T format description"): a first row of column names, then one row per fix with the
 * fields separated by tabs; an empty field is a missing value. The columns we read:
 *   TIMEZONE  hours to ADD to the time to get UTC (0 = UTC), like the MGD77 time-zone correction
 *   DATE      yyyymmdd
 *   TIME      hhmm.mmm — hours and decimal minutes
 *   LAT, LON  decimal degrees, north and east positive
 *   CORR_DEPTH corrected depth, metres, positive down
 * Other columns (magnetics, gravity, codes) are ignored. Columns are found by name, so a file
 * with extra or reordered columns reads the same.
 */
import { RowError, numberField, utcSeconds, type FixOut, type RowParser } from './trackrow';

/** The 26 columns of the format description, in its order (the writer emits all of them). */
export const MGD77T_COLUMNS = [
	'SURVEY_ID',
	'TIMEZONE',
	'DATE',
	'TIME',
	'LAT',
	'LON',
	'POS_TYPE',
	'NAV_QUALCO',
	'BAT_TTIME',
	'CORR_DEPTH',
	'BAT_CPCO',
	'BAT_TYPCO',
	'BAT_QUALCO',
	'MAG_TOT',
	'MAG_TOT2',
	'MAG_RES',
	'MAG_RESSEN',
	'MAG_DICORR',
	'MAG_SDEPTH',
	'MAG_QUALCO',
	'GRA_OBS',
	'EOTVOS',
	'FREEAIR',
	'GRA_QUALCO',
	'LINEID',
	'POINTID'
] as const;

export function looksLikeMgd77t(line: string): boolean {
	const names = line.toUpperCase().split('\t');
	return names.includes('SURVEY_ID') && names.includes('LAT') && names.includes('LON');
}

/** Seconds of day from MGD77T TIME hhmm.mmm (e.g. 1430.5 → 14:30:30). */
export function mgd77tTimeOfDay(v: number, column = 'TIME'): number {
	const h = Math.floor(v / 100);
	const min = v - h * 100;
	if (!(v >= 0 && h < 24 && min < 60))
		throw new RowError(column, `${v} is not a time hhmm.mmm (hours 0–23, minutes under 60)`);
	return h * 3600 + min * 60;
}

/** UTC seconds from a DATE yyyymmdd (a number) or NaN when missing. */
export function yyyymmdd(v: number, column = 'DATE'): [number, number, number] {
	const y = Math.floor(v / 10000);
	const m = Math.floor(v / 100) % 100;
	const d = v % 100;
	if (!(Number.isInteger(v) && m >= 1 && m <= 12 && d >= 1 && d <= 31))
		throw new RowError(column, `${v} is not a date yyyymmdd`);
	return [y, m, d];
}

const WANTED = ['TIMEZONE', 'DATE', 'TIME', 'LAT', 'LON', 'CORR_DEPTH'] as const;

export class Mgd77tRows implements RowParser {
	private idx: Record<string, number> | null = null;
	/** Fields up to the last column we read (the rest of the row is never split). */
	private last = 0;
	private readonly f: string[] = [];
	private dayKey = NaN;
	private dayS = 0;

	/** Splits the row at tabs up to column `last` only. */
	private split(line: string): string[] {
		const f = this.f;
		let start = 0;
		for (let k = 0; k <= this.last; k++) {
			const tab = line.indexOf('\t', start);
			f[k] = tab < 0 ? line.slice(start) : line.slice(start, tab);
			if (tab < 0) {
				for (let j = k + 1; j <= this.last; j++) f[j] = '';
				break;
			}
			start = tab + 1;
		}
		return f;
	}

	row(line: string, out: FixOut): boolean {
		if (!this.idx) {
			const f = line.split('\t');
			const names = f.map((s) => s.trim().toUpperCase());
			const idx: Record<string, number> = {};
			for (const c of WANTED) idx[c] = names.indexOf(c);
			const missing = ['LAT', 'LON', 'CORR_DEPTH'].filter((c) => idx[c] < 0);
			if (missing.length) throw new RowError(missing[0], `the header has no ${missing.join(', ')}`);
			this.idx = idx;
			this.last = Math.max(...WANTED.map((c) => idx[c]));
			return false;
		}
		const f = this.split(line);
		const x = this.idx;
		const get = (c: string) => (x[c] >= 0 ? (f[x[c]] ?? '') : '');
		out.lat = numberField(get('LAT'), 'LAT');
		out.lon = numberField(get('LON'), 'LON');
		out.depthM = numberField(get('CORR_DEPTH'), 'CORR_DEPTH');
		const date = numberField(get('DATE'), 'DATE');
		const time = numberField(get('TIME'), 'TIME');
		if (!Number.isNaN(date) && !Number.isNaN(time)) {
			if (date !== this.dayKey) {
				const [y, m, d] = yyyymmdd(date);
				this.dayS = utcSeconds(y, m, d, 0);
				this.dayKey = date;
			}
			const tz = numberField(get('TIMEZONE'), 'TIMEZONE');
			out.timeS = this.dayS + mgd77tTimeOfDay(time) + (Number.isNaN(tz) ? 0 : tz) * 3600;
		}
		return true;
	}
}

function fixed(v: number, digits: number): string {
	return Number.isFinite(v) ? v.toFixed(digits) : '';
}

/** One MGD77T row (all 26 columns; only position, time and depth filled). */
export function mgd77tRow(
	surveyId: string,
	lon: number,
	lat: number,
	depthM: number,
	timeS: number
): string {
	let date = '';
	let time = '';
	if (Number.isFinite(timeS)) {
		const t = new Date(Math.round(timeS * 1000));
		date = String(t.getUTCFullYear() * 10000 + (t.getUTCMonth() + 1) * 100 + t.getUTCDate());
		const min = t.getUTCMinutes() + (t.getUTCSeconds() + t.getUTCMilliseconds() / 1000) / 60;
		time = (t.getUTCHours() * 100 + min).toFixed(3);
	}
	const row: string[] = new Array(MGD77T_COLUMNS.length).fill('');
	row[0] = surveyId;
	row[1] = '0';
	row[2] = date;
	row[3] = time;
	row[4] = fixed(lat, 5);
	row[5] = fixed(lon, 5);
	row[6] = '1';
	row[9] = fixed(depthM, 1);
	return row.join('\t');
}

/** A whole MGD77T text (header and rows, CRLF-free). */
export function writeMgd77t(
	surveyId: string,
	fixes: {
		lon: ArrayLike<number>;
		lat: ArrayLike<number>;
		depthM: ArrayLike<number>;
		timeS: ArrayLike<number>;
	}
): string {
	const out = [MGD77T_COLUMNS.join('\t')];
	for (let i = 0; i < fixes.lon.length; i++)
		out.push(mgd77tRow(surveyId, fixes.lon[i], fixes.lat[i], fixes.depthM[i], fixes.timeS[i]));
	return out.join('\n') + '\n';
}
