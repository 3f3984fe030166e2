import { describe, expect, it } from 'vitest';
import { mgd77Record } from './mgd77';
import { MGD77T_COLUMNS } from './mgd77t';
import { TrackFileError, detectTrackFormat, readTrack } from './track';

function refusal(f: () => unknown): TrackFileError {
	try {
		f();
	} catch (e) {
		if (e instanceof TrackFileError) return e;
		throw e;
	}
	throw new Error('expected the file to be refused');
}

describe('depth sign, limits and detection', () => {
	it('asks when depths are negative, and reads them flipped when told', () => {
		const text = 'lon,lat,depth\n1,2,-3000\n1,2.1,-3100\n';
		expect(refusal(() => readTrack(text)).code).toBe('negative_depths');
		expect([...readTrack(text, { flipDepths: true }).fixes.depthM]).toEqual([3000, 3100]);
	});

	it('refuses a stray negative depth among positive ones, naming its row', () => {
		const e = refusal(() => readTrack('lon,lat,depth\n1,2,3000\n1,2,3000\n1,2,-5\n'));
		expect(e).toMatchObject({ code: 'invalid_row', row: 4, column: 'depth' });
	});

	it('refuses more fixes than allowed and an empty file', () => {
		expect(refusal(() => readTrack('1 2 3\n1 2 3\n1 2 3\n', { maxFixes: 2 })).code).toBe(
			'too_many_fixes'
		);
		expect(refusal(() => readTrack('\n\n')).code).toBe('no_fixes');
		expect(refusal(() => readTrack('lon,lat,depth\n')).code).toBe('no_fixes');
	});

	it('detects the format from the first line or the file name', () => {
		expect(detectTrackFormat(MGD77T_COLUMNS.join('\t'))).toBe('mgd77t');
		expect(detectTrackFormat('1 2 3')).toBe('xyz');
		expect(detectTrackFormat('lon,lat,depth')).toBe('csv');
		expect(detectTrackFormat('anything', 'leg.a77')).toBe('mgd77');
		expect(detectTrackFormat(mgd77Record(1, 2, 3, NaN))).toBe('mgd77');
	});

	it('strips a UTF-8 byte order mark', () => {
		expect(readTrack('\uFEFFlon,lat,depth\n1,2,3\n').fixes.count).toBe(1);
	});
});
