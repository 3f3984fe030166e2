import { describe, expect, it } from 'vitest';
import {
	formatDD,
	formatDMM,
	formatDMS,
	formatLatLon,
	formatNmea,
	normalizeLon,
	parseCoordinate,
	parseLatLon,
	type Axis,
	type CoordinateResult
} from './coordinates';
import { mulberry32 } from './testing';

function value<T>(r: CoordinateResult<T>): T {
	if (!r.ok) throw new Error(`expected ok, got ${r.error.field}: ${r.error.message}`);
	return r.value;
}

function error<T>(r: CoordinateResult<T>) {
	if (r.ok) throw new Error(`expected an error, got ${JSON.stringify(r.value)}`);
	return r.error;
}

describe('parseCoordinate', () => {
	it('reads the NMEA 0183 GGA example fields', () => {
		// [published, NMEA 0183 GGA example] "4807.038,N" = 48°07.038′N, "01131.000,E" = 11°31.000′E
		expect(value(parseCoordinate('4807.038,N', 'lat'))).toBeCloseTo(48 + 7.038 / 60, 12);
		expect(value(parseCoordinate('01131.000,E', 'lon'))).toBeCloseTo(11 + 31 / 60, 12);
		expect(value(parseCoordinate('4807.038,S', 'lat'))).toBeCloseTo(-(48 + 7.038 / 60), 12);
		expect(value(parseCoordinate('01131.000,W', 'lon'))).toBeCloseTo(-(11 + 31 / 60), 12);
	});

	it.each([
		['12.5', 12.5],
		['-12.5', -12.5],
		['+12.5', 12.5],
		['12.5 S', -12.5],
		['S12.5', -12.5],
		['12.5°S', -12.5],
		['12°30′S', -12.5],
		["12°30'S", -12.5],
		['12 30 S', -12.5],
		['s 12 30', -12.5],
		['12°30.000′N', 12.5],
		['12° 30′ 00″ N', 12.5],
		["12°30'0''N", 12.5],
		['12 30 36', 12 + 30 / 60 + 36 / 3600],
		['N 12°34.567′', 12 + 34.567 / 60],
		['−12°30′', -12.5],
		['12º30′S', -12.5],
		['12.5 s', -12.5]
	])('latitude %s → %d', (text, expected) => {
		expect(value(parseCoordinate(text, 'lat'))).toBeCloseTo(expected, 12);
	});

	it('keeps the sign of 0° (−0°30.0′ is south/west)', () => {
		expect(value(parseCoordinate('-0°30.0′', 'lat'))).toBe(-0.5);
		expect(value(parseCoordinate('−0°30.0′', 'lon'))).toBe(-0.5);
		expect(value(parseCoordinate("-00°30.000'", 'lat'))).toBe(-0.5);
		expect(value(parseCoordinate('-0 30 0', 'lat'))).toBe(-0.5);
		expect(Object.is(value(parseCoordinate('-0', 'lat')), -0)).toBe(true);
	});

	it('normalises longitudes to [−180, 180)', () => {
		expect(value(parseCoordinate('180°00.000′E', 'lon'))).toBe(-180);
		expect(value(parseCoordinate('180', 'lon'))).toBe(-180);
		expect(value(parseCoordinate('179°30′W', 'lon'))).toBe(-179.5);
	});

	it.each([
		['12°60.0′N', 'lat', 'minutes must be below 60'],
		['12°30′60″N', 'lat', 'seconds must be below 60'],
		['91', 'lat', 'within ±90°'],
		['90°00.1′N', 'lat', 'within ±90°'],
		['181', 'lon', 'within ±180°'],
		['-12.5 N', 'lat', 'disagree'],
		['+12.5 W', 'lon', 'disagree'],
		['12.5 E', 'lat', 'look swapped'],
		['12.5 N', 'lon', 'look swapped'],
		['01131.000,E', 'lat', 'look swapped'],
		['01131.000', 'lat', 'look swapped'],
		['N12.5S', 'lat', 'two hemisphere letters'],
		['12.5°30′', 'lat', 'only the last part'],
		["12'30°", 'lat', 'out of place'],
		['12 30 15 5', 'lat', 'more than three numbers'],
		['abc', 'lat', 'cannot read'],
		['', 'lat', 'empty']
	] as const)('rejects %s as %s: %s', (text, axis, message) => {
		const e = error(parseCoordinate(text, axis as Axis));
		expect(e.field).toBe(axis === 'lat' ? 'latitude' : 'longitude');
		expect(e.message).toContain(message);
	});
});

describe('parseLatLon', () => {
	it.each([
		['48.1173, 11.5167', 48.1173, 11.5167],
		['48.1173 11.5167', 48.1173, 11.5167],
		['-33.5; 151.25', -33.5, 151.25],
		['4807.038,N,01131.000,E', 48 + 7.038 / 60, 11 + 31 / 60],
		['4807.038,N 01131.000,E', 48 + 7.038 / 60, 11 + 31 / 60],
		['48°07.038′N 11°31.000′E', 48 + 7.038 / 60, 11 + 31 / 60],
		['N48 07.038 E11 31.000', 48 + 7.038 / 60, 11 + 31 / 60],
		['0°30.000′S, 179°30.000′W', -0.5, -179.5],
		['12 34 56 N, 123 45 6 W', 12 + 34 / 60 + 56 / 3600, -(123 + 45 / 60 + 6 / 3600)]
	])('%s', (text, lat, lon) => {
		const p = value(parseLatLon(text));
		expect(p.lat).toBeCloseTo(lat, 12);
		expect(p.lon).toBeCloseTo(lon, 12);
	});

	it('says the order looks swapped for lat=150, lon=40', () => {
		const e = error(parseLatLon('150, 40'));
		expect(e.field).toBe('position');
		expect(e.message).toContain('swapped');
	});

	it('says the order looks swapped when the hemisphere letters are E then N', () => {
		const e = error(parseLatLon('11°31.000′E, 48°07.038′N'));
		expect(e.field).toBe('position');
		expect(e.message).toContain('swapped');
	});

	it('reports the failing half when the order is not the problem', () => {
		const e = error(parseLatLon('48°61′N, 11°E'));
		expect(e.field).toBe('latitude');
		expect(e.message).toContain('minutes');
		expect(error(parseLatLon('12 34 56 78')).message).toContain('comma');
	});
});

describe('formatting', () => {
	it('writes DMM in the three styles', () => {
		expect(formatDMM(12 + 34.567 / 60, 'lat')).toBe('12°34.567′N');
		expect(formatDMM(12 + 34.567 / 60, 'lat', { style: 'ascii' })).toBe('12 34.567 N');
		expect(formatDMM(-(11 + 31 / 60), 'lon', { style: 'ascii' })).toBe('11 31.000 W');
	});

	it('keeps the hemisphere of −0.5 (0°30.000′S / "-00°30.000\'")', () => {
		expect(formatDMM(-0.5, 'lat')).toBe('0°30.000′S');
		expect(formatDMM(-0.5, 'lat', { style: 'signed' })).toBe("-00°30.000'");
		expect(formatDMM(-0.5, 'lon', { style: 'signed' })).toBe("-000°30.000'");
		expect(formatDMM(-0, 'lon')).toBe('0°00.000′W');
		expect(formatDD(-0.0000001, 'lat')).toBe('-0.000000');
	});

	it('carries rounded minutes and seconds into the next unit', () => {
		expect(formatDMM(12 + 59.9996 / 60, 'lat')).toBe('13°00.000′N');
		expect(formatDMS(12 + 59 / 60 + 59.96 / 3600, 'lat')).toBe('13°00′00.0″N');
	});

	it('writes DD and DMS', () => {
		expect(formatDD(-12.3456789, 'lat')).toBe('-12.345679');
		expect(formatDD(-12.3456789, 'lat', { style: 'symbols', decimals: 4 })).toBe('12.3457°S');
		expect(formatDMS(12 + 34 / 60 + 56.7 / 3600, 'lat')).toBe('12°34′56.7″N');
		expect(formatDMS(-(123 + 4 / 60 + 5.6 / 3600), 'lon', { style: 'ascii' })).toBe(
			'123 04 05.6 W'
		);
		expect(formatDMS(-(1 + 4 / 60 + 5.6 / 3600), 'lon', { style: 'signed' })).toBe(
			'-001°04\'05.6"'
		);
	});

	it('writes the NMEA 0183 GGA example fields', () => {
		// [published, NMEA 0183 GGA example] 48°07.038′N → "4807.038,N", 11°31.000′E → "01131.000,E"
		expect(formatNmea(48 + 7.038 / 60, 'lat')).toBe('4807.038,N');
		expect(formatNmea(11 + 31 / 60, 'lon')).toBe('01131.000,E');
	});

	it('normalises longitudes before formatting', () => {
		expect(formatDD(190, 'lon')).toBe('-170.000000');
		expect(formatDMM(180, 'lon')).toBe('180°00.000′W');
		expect(normalizeLon(540)).toBe(-180);
		expect(normalizeLon(-180)).toBe(-180);
		expect(normalizeLon(179.999)).toBe(179.999);
		expect(normalizeLon(-190)).toBe(170);
	});

	it('refuses impossible latitudes instead of printing them', () => {
		expect(() => formatDMM(91, 'lat')).toThrow(RangeError);
		expect(() => formatDD(Number.NaN, 'lon')).toThrow(RangeError);
	});

	it('formats a position latitude first', () => {
		expect(formatLatLon(48 + 7.038 / 60, 11 + 31 / 60)).toBe('48°07.038′N, 11°31.000′E');
	});
});

describe('round trip: format → parse within the printed precision', () => {
	const random = mulberry32(20240611);
	const samples = Array.from({ length: 400 }, (_, i) => {
		const axis: Axis = i % 2 ? 'lat' : 'lon';
		const limit = axis === 'lat' ? 90 : 180;
		// Include exact zeros, negative zeros and values next to the limits.
		const special = [0, -0, -0.5, limit, -limit, limit - 1e-9, 1e-9, -1e-9][i % 40];
		return { axis, v: special ?? (random() * 2 - 1) * limit };
	});
	const angleDiff = (a: number, b: number) => Math.abs(normalizeLon(a - b));

	const cases: [string, (v: number, axis: Axis) => string, number][] = [
		['DD 6 decimals', (v, a) => formatDD(v, a), 0.5e-6],
		['DD symbols', (v, a) => formatDD(v, a, { style: 'symbols' }), 0.5e-6],
		['DD ascii 3 decimals', (v, a) => formatDD(v, a, { style: 'ascii', decimals: 3 }), 0.5e-3],
		['DMM symbols', (v, a) => formatDMM(v, a), 0.5e-3 / 60],
		['DMM ascii', (v, a) => formatDMM(v, a, { style: 'ascii' }), 0.5e-3 / 60],
		['DMM signed', (v, a) => formatDMM(v, a, { style: 'signed' }), 0.5e-3 / 60],
		['DMM 5 decimals', (v, a) => formatDMM(v, a, { decimals: 5 }), 0.5e-5 / 60],
		['DMS symbols', (v, a) => formatDMS(v, a), 0.05 / 3600],
		['DMS ascii', (v, a) => formatDMS(v, a, { style: 'ascii' }), 0.05 / 3600],
		['DMS signed', (v, a) => formatDMS(v, a, { style: 'signed' }), 0.05 / 3600],
		['NMEA', (v, a) => formatNmea(v, a, 4), 0.5e-4 / 60]
	];

	it.each(cases)('%s', (_, format, tolerance) => {
		for (const { axis, v } of samples) {
			const text = format(v, axis);
			const back = value(parseCoordinate(text, axis));
			const diff = axis === 'lon' ? angleDiff(back, v) : Math.abs(back - v);
			expect(diff, `${v} → ${text} → ${back}`).toBeLessThanOrEqual(tolerance + 1e-12);
			// The hemisphere survives even when the printed value rounds to zero.
			if (v !== 0 && Math.abs(normalizeLon(v)) < 180 && Math.abs(v) < limitOf(axis)) {
				expect(Math.sign(1 / back) === Math.sign(1 / v) || back === v, text).toBe(true);
			}
		}
	});

	it('pairs round-trip through formatLatLon and parseLatLon', () => {
		for (let i = 0; i < 200; i++) {
			const lat = (random() * 2 - 1) * 90;
			const lon = (random() * 2 - 1) * 180;
			for (const notation of ['dd', 'dmm', 'dms'] as const) {
				const text = formatLatLon(lat, lon, notation);
				const p = value(parseLatLon(text));
				expect(Math.abs(p.lat - lat), text).toBeLessThan(2e-5);
				expect(angleDiff(p.lon, lon), text).toBeLessThan(2e-5);
			}
		}
	});
});

function limitOf(axis: Axis): number {
	return axis === 'lat' ? 90 : 180;
}
