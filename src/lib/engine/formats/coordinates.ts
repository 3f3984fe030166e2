/**
 * Coordinate notation: parse and format decimal degrees (DD), degrees-decimal-minutes (DMM),
 * degrees-minutes-seconds (DMS) and NMEA 0183 fixed-width fields (ddmm.mmm / dddmm.mmm).
 *
 * Values are signed decimal degrees, north and east positive. A negative zero is meaningful here:
 * "−0°30.0′" is half a degree south, so the sign is applied to the whole value, never to the
 * degrees alone, and formatting keeps the hemisphere of −0.5 (0°30.000′S).
 */

import { normalizeLon } from '../geodesy';

/** Longitude into [−180, 180), one definition for the whole engine. */
export { normalizeLon };

export type Axis = 'lat' | 'lon';

export interface CoordinateError {
	field: 'latitude' | 'longitude' | 'position';
	message: string;
}

export type CoordinateResult<T> = { ok: true; value: T } | { ok: false; error: CoordinateError };

export interface LatLon {
	lat: number;
	lon: number;
}

/** How a notation is written: with degree/minute/second symbols and a hemisphere letter,
 * plain ASCII with spaces (for CSV), or signed with fixed-width degrees and ASCII marks. */
export type NotationStyle = 'symbols' | 'ascii' | 'signed';

const FIELD: Record<Axis, CoordinateError['field']> = { lat: 'latitude', lon: 'longitude' };
const LIMIT: Record<Axis, number> = { lat: 90, lon: 180 };
/** NMEA 0183 writes latitude as ddmm.mmm and longitude as dddmm.mmm, zero-padded. */
const NMEA_DEGREE_DIGITS: Record<Axis, number> = { lat: 2, lon: 3 };

function negative(value: number): boolean {
	return value < 0 || Object.is(value, -0);
}

function hemisphere(value: number, axis: Axis): string {
	if (axis === 'lat') return negative(value) ? 'S' : 'N';
	return negative(value) ? 'W' : 'E';
}

function prepare(value: number, axis: Axis): number {
	if (!Number.isFinite(value)) throw new RangeError(`${FIELD[axis]} is not a finite number`);
	if (axis === 'lon') return normalizeLon(value);
	if (Math.abs(value) > 90) throw new RangeError('latitude outside ±90°');
	return value;
}

function pad(n: number | string, width: number): string {
	return String(n).padStart(width, '0');
}

/** Split |value| into whole degrees and rounded sub-units (minutes or seconds) as integers, so that
 * 12°59.9996′ rounds up to 13°00.000′ instead of printing 60 minutes. */
function splitUnits(abs: number, perDegree: number, decimals: number) {
	const scale = 10 ** decimals;
	const total = Math.round(abs * perDegree * scale);
	const deg = Math.floor(total / (perDegree * scale));
	const rest = total - deg * perDegree * scale;
	return { deg, rest, scale };
}

function fixed(units: number, scale: number, decimals: number, intWidth: number): string {
	const whole = Math.floor(units / scale);
	const frac = units - whole * scale;
	return decimals > 0 ? `${pad(whole, intWidth)}.${pad(frac, decimals)}` : pad(whole, intWidth);
}

export interface FormatOptions {
	/** Digits after the decimal point of the last component. */
	decimals?: number;
	style?: NotationStyle;
}

/** Decimal degrees. signed (default): "-12.345678"; symbols: "12.345678°S"; ascii: "12.345678 S". */
export function formatDD(value: number, axis: Axis, options: FormatOptions = {}): string {
	const { decimals = 6, style = 'signed' } = options;
	const v = prepare(value, axis);
	const abs = Math.abs(v).toFixed(decimals);
	if (style === 'signed') return (negative(v) ? '-' : '') + abs;
	if (style === 'ascii') return `${abs} ${hemisphere(v, axis)}`;
	return `${abs}°${hemisphere(v, axis)}`;
}

/** Degrees and decimal minutes. symbols (default): "12°34.567′N"; ascii: "12 34.567 N";
 * signed: "-00°30.000'" with fixed-width degrees (2 for latitude, 3 for longitude). */
export function formatDMM(value: number, axis: Axis, options: FormatOptions = {}): string {
	const { decimals = 3, style = 'symbols' } = options;
	const v = prepare(value, axis);
	const { deg, rest, scale } = splitUnits(Math.abs(v), 60, decimals);
	const min = fixed(rest, scale, decimals, 2);
	if (style === 'ascii') return `${deg} ${min} ${hemisphere(v, axis)}`;
	if (style === 'signed') {
		return `${negative(v) ? '-' : ''}${pad(deg, NMEA_DEGREE_DIGITS[axis])}°${min}'`;
	}
	return `${deg}°${min}′${hemisphere(v, axis)}`;
}

/** Degrees, minutes and seconds. symbols (default): "12°34′56.7″N"; ascii: "12 34 56.7 N";
 * signed: "-012°34'56.7\"". */
export function formatDMS(value: number, axis: Axis, options: FormatOptions = {}): string {
	const { decimals = 1, style = 'symbols' } = options;
	const v = prepare(value, axis);
	const { deg, rest, scale } = splitUnits(Math.abs(v), 3600, decimals);
	const min = Math.floor(rest / (60 * scale));
	const sec = fixed(rest - min * 60 * scale, scale, decimals, 2);
	const mm = pad(min, 2);
	if (style === 'ascii') return `${deg} ${mm} ${sec} ${hemisphere(v, axis)}`;
	if (style === 'signed') {
		return `${negative(v) ? '-' : ''}${pad(deg, NMEA_DEGREE_DIGITS[axis])}°${mm}'${sec}"`;
	}
	return `${deg}°${mm}′${sec}″${hemisphere(v, axis)}`;
}

/** NMEA 0183 field pair, e.g. "4807.038,N" and "01131.000,E" [published, NMEA 0183 GGA]. */
export function formatNmea(value: number, axis: Axis, decimals = 3): string {
	const v = prepare(value, axis);
	const { deg, rest, scale } = splitUnits(Math.abs(v), 60, decimals);
	return `${pad(deg, NMEA_DEGREE_DIGITS[axis])}${fixed(rest, scale, decimals, 2)},${hemisphere(v, axis)}`;
}

// ---------------------------------------------------------------------------------------------
// Parsing

function fail<T>(field: CoordinateError['field'], message: string): CoordinateResult<T> {
	return { ok: false, error: { field, message } };
}

/** Fold the many ways people type signs and marks into one spelling. */
function normalizeText(text: string): string {
	// No Unicode NFKC here: it would turn ″ into two ′ and º into "o".
	return text
		.replace(/[\u2212\u2012\u2013\u2014\u2010\u2011]/g, '-')
		.replace(/[\u00BA\u02DA\u2218]/g, '°')
		.replace(/[\u2033\u201C\u201D\u02DD]/g, '"')
		.replace(/[\u2032\u2019\u2018\u00B4\u02B9`]/g, "'")
		.replace(/''/g, '"')
		.replace(/\u00A0/g, ' ')
		.trim();
}

const HEMI_AXIS: Record<string, Axis> = { N: 'lat', S: 'lat', E: 'lon', W: 'lon' };
const OTHER: Record<Axis, Axis> = { lat: 'lon', lon: 'lat' };

/**
 * Parse one latitude or longitude. Accepts DD, DMM, DMS with °, ′/', ″/" or spaces, a
 * hemisphere letter before or after, or a sign, and NMEA fields such as "4807.038,N".
 * Longitudes come back normalised to [−180, 180).
 */
export function parseCoordinate(text: string, axis: Axis): CoordinateResult<number> {
	const field = FIELD[axis];
	const s = normalizeText(text);
	if (s === '') return fail(field, `${field} is empty`);

	const m = /^([NSEWnsew])?\s*([+-])?\s*(.*?)\s*(?:,\s*)?([NSEWnsew])?$/.exec(s);
	if (!m) return fail(field, `cannot read "${text}" as a ${field}`);
	const [, lead, sign, body, trail] = m;
	if (lead && trail) return fail(field, `"${text}" has two hemisphere letters; use one`);
	const letter = (lead ?? trail)?.toUpperCase();
	if (letter && HEMI_AXIS[letter] !== axis) {
		return fail(
			field,
			`${field} has the hemisphere letter ${letter}, which belongs to a ${FIELD[OTHER[axis]]}; ` +
				'latitude and longitude look swapped'
		);
	}
	const letterNegative = letter === 'S' || letter === 'W';
	if (letter && sign === '+' && letterNegative) {
		return fail(field, `"${text}" has a + sign and the hemisphere ${letter}; they disagree`);
	}
	if (letter && sign === '-' && !letterNegative) {
		return fail(field, `"${text}" has a minus sign and the hemisphere ${letter}; they disagree`);
	}
	const isNegative = sign === '-' || letterNegative;

	const parts = tokenize(body);
	if (!parts.ok) return fail(field, `cannot read "${text}" as a ${field}: ${parts.message}`);
	let { numbers } = parts;

	// NMEA fixed width: exactly 2 (lat) or 3 (lon) degree digits before the two minute digits.
	if (numbers.length === 1 && !parts.symbols) {
		const intPart = numbers[0].split('.')[0];
		const width = NMEA_DEGREE_DIGITS[axis] + 2;
		if (intPart.length === width) {
			numbers = [intPart.slice(0, width - 2), numbers[0].slice(width - 2)];
		} else if (intPart.length === NMEA_DEGREE_DIGITS[OTHER[axis]] + 2) {
			// A 5-digit dddmm in the latitude slot (or ddmm in the longitude slot) is impossible as
			// decimal degrees; the likeliest cause is the two fields in the wrong order.
			return fail(
				field,
				`"${text}" looks like an NMEA ${FIELD[OTHER[axis]]} in the ${field} slot; ` +
					'latitude and longitude look swapped'
			);
		}
	}

	for (let i = 0; i < numbers.length - 1; i++) {
		if (numbers[i].includes('.')) {
			return fail(field, `only the last part of "${text}" may have decimals`);
		}
	}
	const [deg, min = 0, sec = 0] = numbers.map(Number);
	if (numbers.length >= 2 && min >= 60) return fail(field, `minutes must be below 60 in "${text}"`);
	if (numbers.length === 3 && sec >= 60)
		return fail(field, `seconds must be below 60 in "${text}"`);
	const abs = deg + min / 60 + sec / 3600;
	if (!Number.isFinite(abs)) return fail(field, `cannot read "${text}" as a ${field}`);
	if (abs > LIMIT[axis]) {
		return fail(field, `${field} must be within ±${LIMIT[axis]}°, got ${abs}°`);
	}
	const value = isNegative ? -abs : abs;
	return { ok: true, value: axis === 'lon' ? normalizeLon(value) : value };
}

const SYMBOLS = ['°', "'", '"'];

function tokenize(
	body: string
): { ok: true; numbers: string[]; symbols: boolean } | { ok: false; message: string } {
	const numbers: string[] = [];
	let symbols = false;
	let expectSymbolFor = -1;
	const re = /(\d+(?:\.\d*)?|\.\d+)|([°'"])|(\s+)|(.)/g;
	for (let t = re.exec(body); t; t = re.exec(body)) {
		const [, num, sym, , other] = t;
		if (other !== undefined) return { ok: false, message: `unexpected "${other}"` };
		if (num !== undefined) {
			if (numbers.length === 3) return { ok: false, message: 'more than three numbers' };
			numbers.push(num);
			expectSymbolFor = numbers.length - 1;
		} else if (sym !== undefined) {
			const index = SYMBOLS.indexOf(sym);
			if (expectSymbolFor !== numbers.length - 1 || index !== numbers.length - 1) {
				return { ok: false, message: `"${sym}" is out of place` };
			}
			symbols = true;
			expectSymbolFor = -1;
		}
	}
	if (numbers.length === 0) return { ok: false, message: 'no number found' };
	return { ok: true, numbers, symbols };
}

export function parseLatitude(text: string): CoordinateResult<number> {
	return parseCoordinate(text, 'lat');
}

export function parseLongitude(text: string): CoordinateResult<number> {
	return parseCoordinate(text, 'lon');
}

/** Split "lat, lon" written in any notation into its two halves, or say why not. */
function splitPair(s: string): [string, string] | string {
	// NMEA sentence fields: "4807.038,N,01131.000,E".
	const nmea = s.split(',').map((p) => p.trim());
	if (nmea.length === 4 && /^[NSEW]$/i.test(nmea[1]) && /^[NSEW]$/i.test(nmea[3])) {
		return [`${nmea[0]},${nmea[1]}`, `${nmea[2]},${nmea[3]}`];
	}
	for (const sep of [';', ',', '/', '\t']) {
		const parts = s.split(sep);
		if (parts.length === 2) return [parts[0], parts[1]];
	}
	const letters = [...s.matchAll(/[NSEW]/gi)];
	if (letters.length === 2) {
		const [a, b] = letters;
		const leading = s.slice(0, a.index).trim() === '';
		const cut = leading ? b.index : a.index + 1;
		return [s.slice(0, cut), s.slice(cut)];
	}
	const words = s.split(/\s+/);
	if (words.length === 2) return [words[0], words[1]];
	return 'separate latitude and longitude with a comma, e.g. "48°07.038′N, 11°31.000′E"';
}

/** Parse a position written "latitude, longitude" in any notation parseCoordinate accepts. */
export function parseLatLon(text: string): CoordinateResult<LatLon> {
	const s = normalizeText(text);
	if (s === '') return fail('position', 'position is empty');
	const halves = splitPair(s);
	if (typeof halves === 'string') return fail('position', halves);
	const [a, b] = halves;
	const lat = parseCoordinate(a, 'lat');
	const lon = parseCoordinate(b, 'lon');
	if (lat.ok && lon.ok) return { ok: true, value: { lat: lat.value, lon: lon.value } };
	// If the halves read cleanly the other way round, say so rather than report a bare range error.
	const swappedLat = parseCoordinate(b, 'lat');
	const swappedLon = parseCoordinate(a, 'lon');
	if (swappedLat.ok && swappedLon.ok) {
		return fail(
			'position',
			`the order looks swapped: "${a.trim()}" reads as a longitude and "${b.trim()}" as a ` +
				'latitude; write latitude first'
		);
	}
	if (!lat.ok) return lat;
	return lon.ok ? fail('position', `cannot read "${text}"`) : lon;
}

/** A position as one line, latitude first, e.g. "48°07.038′N, 11°31.000′E". */
export function formatLatLon(
	lat: number,
	lon: number,
	notation: 'dd' | 'dmm' | 'dms' = 'dmm',
	options: FormatOptions = {}
): string {
	const f = notation === 'dd' ? formatDD : notation === 'dms' ? formatDMS : formatDMM;
	return `${f(lat, 'lat', options)}, ${f(lon, 'lon', options)}`;
}
