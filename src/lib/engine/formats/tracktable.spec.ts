import { describe, expect, it } from 'vitest';
import { TrackFileError, readTrack } from './track';

const T = (iso: string) => Date.parse(iso) / 1000;

function refusal(f: () => unknown): TrackFileError {
	try {
		f();
	} catch (e) {
		if (e instanceof TrackFileError) return e;
		throw e;
	}
	throw new Error('expected the file to be refused');
}

describe('CSV/TSV with named columns [published] RFC 4180', () => {
	it('finds columns by name in any order, with units and quotes', () => {
		const text = [
			'"Depth (m)",Time,Latitude,Longitude',
			'3000.5,2024-05-01T10:00:00Z,-20.5,179.95',
			'3010,2024-05-01 10:01:00,-20.5,-179.95',
			',,-20.4,-179.9',
			'"3020",1714557720,-20.3,-179.85'
		].join('\n');
		const r = readTrack(text, { filename: 'line.csv' });
		expect(r.format).toBe('csv');
		expect(r.fixes.count).toBe(4);
		expect([...r.fixes.lon]).toEqual([179.95, -179.95, -179.9, -179.85]);
		expect(r.fixes.depthM[0]).toBe(3000.5);
		expect(Number.isNaN(r.fixes.depthM[2])).toBe(true);
		expect(r.fixes.timeS[0]).toBe(T('2024-05-01T10:00:00Z'));
		expect(r.fixes.timeS[1]).toBe(T('2024-05-01T10:01:00Z'));
		expect(r.fixes.timeS[3]).toBe(1714557720);
	});

	it('reads TSV and semicolon tables', () => {
		expect(readTrack('lon\tlat\tdepth\n1\t2\t3\n').fixes.depthM[0]).toBe(3);
		expect(readTrack('lon;lat;depth\n1;2;3\n').fixes.lat[0]).toBe(2);
	});

	it('refuses a header without the needed columns', () => {
		const e = refusal(() => readTrack('name,when\nA,B\n'));
		expect(e.code).toBe('invalid_row');
		expect(e.row).toBe(1);
		expect(e.message).toMatch(/longitude, latitude and depth/);
	});

	it('refuses a non-number naming the header’s own column name', () => {
		const e = refusal(() => readTrack('lon,lat,depth\n1,2,3\n1,north,3\n'));
		expect(e).toMatchObject({ row: 3, column: 'lat' });
		const t = refusal(() => readTrack('lon,lat,depth,time\n1,2,3,yesterday\n'));
		expect(t).toMatchObject({ row: 2, column: 'time' });
	});

	it('hints at swapped columns when the latitude is out of range but the longitude would fit', () => {
		const e = refusal(() => readTrack('lat,lon,depth\n-120.5,45,3000\n'));
		expect(e.message).toMatch(/swapped/);
	});
});

describe('plain XYZ', () => {
	it('reads lon lat depth separated by spaces, tabs or commas; skips comments and blank lines', () => {
		const r = readTrack(
			'# sounding export\n179.9 -10 4000\n\n-179.9\t-10\t4010\n-179.8,-10,4020\n'
		);
		expect(r.format).toBe('xyz');
		expect([...r.fixes.lon]).toEqual([179.9, -179.9, -179.8]);
		expect([...r.fixes.depthM]).toEqual([4000, 4010, 4020]);
	});

	it('refuses a short row or a non-number, naming the row', () => {
		expect(refusal(() => readTrack('1 2 3\n1 2\n'))).toMatchObject({ row: 2 });
		expect(refusal(() => readTrack('1 2 3\n1 2 x\n'))).toMatchObject({
			row: 2,
			column: 'depth (z)'
		});
	});
});
