/**
 * Observed tracks (underway soundings): a streaming reader for MGD77T, MGD77 (120-character data
 * records), CSV/TSV with named columns and plain XYZ. Text arrives in chunks of any size; fixes are
 * kept in growing typed arrays (lon, lat, depth, time), never as one object per row, so memory is
 * the fixes themselves plus one chunk.
 *
 * Rules every format shares: depth in metres, positive down (a file whose depths are mostly
 * negative is refused with the code `negative_depths` so the caller can ask and read it again
 * with `flipDepths`); a bad row (latitude outside ±90°, a non-number where a number must be)
 * refuses the whole file naming its row (the line number in the file) and column; time running
 * backwards is a warning, not an error.
 */
import { normalizeLon } from '../geodesy';
import { RowError, type FixOut, type RowParser } from './trackrow';
import { Mgd77Rows, looksLikeMgd77 } from './mgd77';
import { Mgd77tRows, looksLikeMgd77t } from './mgd77t';
import { TableRows, XyzRows, looksLikeXyz } from './tracktable';

export { RowError, numberField, requiredNumber, utcSeconds } from './trackrow';
export type { FixOut, RowParser } from './trackrow';

export const TRACK_FORMATS = ['mgd77t', 'mgd77', 'csv', 'xyz'] as const;
export type TrackFormat = (typeof TRACK_FORMATS)[number];

export const TRACK_FORMAT_LABELS: Record<TrackFormat, string> = {
	mgd77t: 'MGD77T (tab-separated exchange)',
	mgd77: 'MGD77 (120-character records)',
	csv: 'CSV/TSV with named columns',
	xyz: 'plain XYZ (lon lat depth)'
};

/** Most fixes one track may hold. */
export const MAX_TRACK_FIXES = 1_000_000;

export type TrackErrorCode =
	| 'invalid_row'
	| 'unknown_format'
	| 'missing_columns'
	| 'too_many_fixes'
	| 'no_fixes'
	| 'negative_depths';

/** A file the reader refuses; `row` is the line number in the file (1-based) when one is to blame. */
export class TrackFileError extends Error {
	readonly code: TrackErrorCode;
	readonly row?: number;
	readonly column?: string;
	constructor(code: TrackErrorCode, message: string, row?: number, column?: string) {
		super(message);
		this.name = 'TrackFileError';
		this.code = code;
		this.row = row;
		this.column = column;
	}
}

export interface TrackFixes {
	count: number;
	lon: Float64Array;
	lat: Float64Array;
	/** Metres, positive down; NaN where the file has no depth. */
	depthM: Float64Array;
	/** Seconds since 1970 UTC; NaN where the file has no time. */
	timeS: Float64Array;
}

export interface TrackWarning {
	code: 'time_backwards' | 'no_position' | 'no_depth';
	message: string;
	/** First row it happened on and how many rows in all. */
	row: number;
	count: number;
}

export interface TrackReadResult {
	format: TrackFormat;
	fixes: TrackFixes;
	warnings: TrackWarning[];
}

export interface TrackReaderOptions {
	/** Force a format; otherwise detected from the first line (and the file name's extension). */
	format?: TrackFormat;
	filename?: string;
	/** Depths in the file are heights (negative down): negate them. */
	flipDepths?: boolean;
	maxFixes?: number;
}

/** Format from the file name's extension alone, when it says. */
export function formatFromFilename(name?: string): TrackFormat | null {
	const ext = /\.([a-z0-9]+)$/i.exec(name ?? '')?.[1]?.toLowerCase();
	if (ext === 'm77t') return 'mgd77t';
	if (ext === 'mgd77' || ext === 'a77' || ext === 'm77') return 'mgd77';
	if (ext === 'xyz') return 'xyz';
	return null;
}

/** Format from the first non-empty line (and the name's extension when the line cannot say). */
export function detectTrackFormat(firstLine: string, filename?: string): TrackFormat {
	if (looksLikeMgd77t(firstLine)) return 'mgd77t';
	const byName = formatFromFilename(filename);
	if (byName) return byName;
	if (looksLikeMgd77(firstLine)) return 'mgd77';
	if (looksLikeXyz(firstLine)) return 'xyz';
	return 'csv';
}

function parserFor(format: TrackFormat): RowParser {
	switch (format) {
		case 'mgd77t':
			return new Mgd77tRows();
		case 'mgd77':
			return new Mgd77Rows();
		case 'csv':
			return new TableRows();
		case 'xyz':
			return new XyzRows();
	}
}

class Column {
	data: Float64Array;
	constructor(capacity: number) {
		this.data = new Float64Array(capacity);
	}
	grow(capacity: number) {
		const next = new Float64Array(capacity);
		next.set(this.data);
		this.data = next;
	}
}

/**
 * Feed text with `push(chunk)` (any split, even inside a line or a CRLF) and call `end()`.
 * Throws TrackFileError at the first bad row; nothing is kept from a refused file.
 */
export class TrackReader {
	private readonly options: TrackReaderOptions;
	private readonly maxFixes: number;
	private carry = '';
	private lineNo = 0;
	private started = false;
	private format: TrackFormat | null;
	private parser: RowParser | null = null;
	private count = 0;
	private capacity = 1024;
	private readonly cols = [0, 1, 2, 3].map(() => new Column(1024));
	private readonly fix: FixOut = { lon: 0, lat: 0, depthM: NaN, timeS: NaN };
	private lastTime = NaN;
	private readonly warned = new Map<TrackWarning['code'], TrackWarning>();
	private negRow = 0;
	private posRow = 0;
	private negCount = 0;
	private posCount = 0;

	constructor(options: TrackReaderOptions = {}) {
		this.options = options;
		this.format = options.format ?? null;
		this.maxFixes = options.maxFixes ?? MAX_TRACK_FIXES;
	}

	/** Rows read so far (for progress). */
	get rows(): number {
		return this.lineNo;
	}

	push(chunk: string): void {
		let text = this.carry + chunk;
		if (!this.started && text.length > 0) {
			if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
		}
		let start = 0;
		for (;;) {
			const nl = text.indexOf('\n', start);
			if (nl < 0) break;
			const end = nl > start && text.charCodeAt(nl - 1) === 13 ? nl - 1 : nl;
			this.line(text.slice(start, end));
			start = nl + 1;
		}
		this.carry = text.slice(start);
	}

	end(): TrackReadResult {
		if (this.carry.length > 0) {
			const last = this.carry.endsWith('\r') ? this.carry.slice(0, -1) : this.carry;
			this.carry = '';
			this.line(last);
		}
		if (!this.format) throw new TrackFileError('no_fixes', 'The file is empty.');
		if (this.count === 0)
			throw new TrackFileError('no_fixes', 'The file holds no fixes with a position.');
		this.checkSigns();
		const n = this.count;
		const [lon, lat, depthM, timeS] = this.cols.map((c) => c.data.subarray(0, n));
		if (this.options.flipDepths) for (let i = 0; i < n; i++) depthM[i] = -depthM[i];
		return {
			format: this.format,
			fixes: { count: n, lon, lat, depthM, timeS },
			warnings: [...this.warned.values()]
		};
	}

	private checkSigns() {
		const flip = !!this.options.flipDepths;
		// after flipping, the file's positive depths are the ones above sea level
		const up = flip ? this.posCount : this.negCount;
		const down = flip ? this.negCount : this.posCount;
		const upRow = flip ? this.posRow : this.negRow;
		if (up === 0) return;
		if (!flip && up > down)
			throw new TrackFileError(
				'negative_depths',
				`${up} of ${up + down} depths are negative (first on row ${upRow}). Wakeline reads depth ` +
					'as metres positive down; if the file holds heights (negative down), read it again ' +
					'with its depths flipped.'
			);
		throw new TrackFileError(
			'invalid_row',
			`Row ${upRow}, column depth: ${flip ? 'a positive height' : 'a negative depth'} puts the ` +
				`seafloor above sea level (${up} row${up === 1 ? '' : 's'} like this).`,
			upRow,
			'depth'
		);
	}

	private warn(code: TrackWarning['code'], message: string) {
		const w = this.warned.get(code);
		if (w) w.count++;
		else this.warned.set(code, { code, message, row: this.lineNo, count: 1 });
	}

	private line(line: string) {
		this.lineNo++;
		if (line.length === 0 || (line.charCodeAt(0) <= 32 && line.trim() === '')) return;
		if (!this.started) {
			this.started = true;
			this.format ??= detectTrackFormat(line, this.options.filename);
			this.parser = parserFor(this.format);
		}
		const f = this.fix;
		f.depthM = NaN;
		f.timeS = NaN;
		f.lon = NaN;
		f.lat = NaN;
		let made: boolean;
		try {
			made = this.parser!.row(line, f);
		} catch (e) {
			if (e instanceof RowError)
				throw new TrackFileError(
					'invalid_row',
					`Row ${this.lineNo}, column ${e.column}: ${e.message}. Nothing was stored.`,
					this.lineNo,
					e.column
				);
			throw e;
		}
		if (!made) return;
		if (Number.isNaN(f.lon) || Number.isNaN(f.lat)) {
			this.warn('no_position', 'Rows without a position were left out.');
			return;
		}
		if (!(f.lat >= -90 && f.lat <= 90)) {
			const hint = Math.abs(f.lon) <= 90 ? ' (longitude and latitude swapped?)' : '';
			throw new TrackFileError(
				'invalid_row',
				`Row ${this.lineNo}, column latitude: ${f.lat} is outside ±90°${hint}. Nothing was stored.`,
				this.lineNo,
				'latitude'
			);
		}
		if (!(f.lon >= -180 && f.lon <= 360))
			throw new TrackFileError(
				'invalid_row',
				`Row ${this.lineNo}, column longitude: ${f.lon} is outside −180…360°. Nothing was stored.`,
				this.lineNo,
				'longitude'
			);
		if (Number.isNaN(f.depthM)) this.warn('no_depth', 'Some fixes have no depth.');
		else if (f.depthM < 0) {
			if (this.negCount++ === 0) this.negRow = this.lineNo;
		} else if (f.depthM > 0) {
			if (this.posCount++ === 0) this.posRow = this.lineNo;
		}
		if (!Number.isNaN(f.timeS)) {
			if (f.timeS < this.lastTime)
				this.warn('time_backwards', 'Time runs backwards here; the fixes are kept in file order.');
			this.lastTime = f.timeS;
		}
		if (this.count >= this.maxFixes)
			throw new TrackFileError(
				'too_many_fixes',
				`The file holds more than ${this.maxFixes.toLocaleString('en')} fixes; split it or thin it.`,
				this.lineNo
			);
		if (this.count === this.capacity) {
			this.capacity = Math.min(this.capacity * 2, this.maxFixes);
			for (const c of this.cols) c.grow(this.capacity);
		}
		const i = this.count++;
		this.cols[0].data[i] = normalizeLon(f.lon);
		this.cols[1].data[i] = f.lat;
		this.cols[2].data[i] = f.depthM;
		this.cols[3].data[i] = f.timeS;
	}
}

/** Reads a whole text at once (tests, small files). */
export function readTrack(text: string, options: TrackReaderOptions = {}): TrackReadResult {
	const r = new TrackReader(options);
	r.push(text);
	return r.end();
}
