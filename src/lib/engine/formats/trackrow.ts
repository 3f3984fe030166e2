/** Row-level pieces the track readers share (see track.ts). */

/** Thrown by a row parser; the reader adds the row number. */
export class RowError extends Error {
	constructor(
		readonly column: string,
		message: string
	) {
		super(message);
	}
}

/** One fix as a row parser fills it: NaN = missing (depth, time); lon/lat must be finite. */
export interface FixOut {
	lon: number;
	lat: number;
	depthM: number;
	/** Seconds since 1970-01-01T00:00Z (UTC). */
	timeS: number;
}

/** A format's row reader: true when the line made a fix, false when it holds none (a header). */
export interface RowParser {
	row(line: string, out: FixOut): boolean;
}

/** A number field: '' → NaN (missing); anything else not a finite number → RowError. */
export function numberField(text: string, column: string): number {
	if (text.length === 0) return NaN;
	// Number() ignores surrounding white space but reads a blank field as 0
	const v = Number(text);
	if (v === 0 && text.trim() === '') return NaN;
	if (!Number.isFinite(v))
		throw new RowError(column, `"${text.trim().slice(0, 40)}" is not a number`);
	return v;
}

/** A field that must be there: a position. */
export function requiredNumber(text: string, column: string): number {
	const v = numberField(text, column);
	if (Number.isNaN(v)) throw new RowError(column, 'a number is needed here, the field is empty');
	return v;
}

/** Seconds since 1970 UTC for a calendar date and time of day (UTC). */
export function utcSeconds(y: number, m: number, d: number, secondsOfDay: number): number {
	return Date.UTC(y, m - 1, d) / 1000 + secondsOfDay;
}
