import { describe, expect, it } from 'vitest';
import {
	TRACK_UPLOAD_LIMIT,
	checkTrackFile,
	histogramBars,
	paddedDomain,
	refusal,
	residualDomain,
	signedM,
	unwrapLon
} from './tracks';

describe('track page helpers', () => {
	it('refuses empty and oversize files before sending them', () => {
		expect(checkTrackFile({ name: 'a.xyz', size: 0 })).toMatch(/empty/);
		expect(checkTrackFile({ name: 'a.xyz', size: TRACK_UPLOAD_LIMIT + 1 })).toMatch(/60\.0 MiB/);
		expect(checkTrackFile({ name: 'a.xyz', size: 10 })).toBeNull();
	});

	it('offers to flip depths only when the server asks', () => {
		expect(refusal(422, { error: { code: 'negative_depths', message: 'neg' } })).toEqual({
			text: 'neg',
			askFlip: true
		});
		expect(refusal(422, { error: { code: 'invalid_track', message: 'Row 4' } }).askFlip).toBe(
			false
		);
		expect(refusal(413, null).text).toMatch(/larger than/);
	});

	it('colours residuals on a symmetric domain rounded to 50 m', () => {
		expect(residualDomain([10, -20, 30, null])).toEqual([-50, 50]);
		expect(residualDomain(Array.from({ length: 100 }, (_, i) => i * 3))).toEqual([-300, 300]);
		expect(residualDomain([])).toEqual([-100, 100]);
	});

	it('unwraps longitudes across the antimeridian in either direction', () => {
		expect(unwrapLon([179.5, -179.5, -179])).toEqual([179.5, 180.5, 181]);
		expect(unwrapLon([-179.5, 179.5])).toEqual([-179.5, -180.5]);
	});

	it('turns a histogram into bars and writes signed metres', () => {
		expect(histogramBars({ startM: -100, binWidthM: 50, counts: [1, 2] })).toEqual([
			{ fromM: -100, toM: -50, count: 1 },
			{ fromM: -50, toM: 0, count: 2 }
		]);
		expect(signedM(180)).toBe('+180 m');
		expect(signedM(-42.4)).toBe('−42 m');
		expect(signedM(null)).toBe('—');
	});

	it('pads a plotting domain, also for a track along one parallel', () => {
		expect(paddedDomain([-29.6, -29.6])).toEqual([-29.655, -29.545]);
		expect(paddedDomain([0, 10])).toEqual([-0.5, 10.5]);
	});
});
