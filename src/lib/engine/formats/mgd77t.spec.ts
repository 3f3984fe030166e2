import { describe, expect, it } from 'vitest';
import { MGD77T_COLUMNS, mgd77tRow, writeMgd77t } from './mgd77t';
import { TrackFileError, TrackReader, readTrack } from './track';

const T = (iso: string) => Date.parse(iso) / 1000;

/**
 * MGD77T written by hand from the format description (NGDC/NCEI MGD77T): 26 tab-separated columns
 * named in the first row, empty fields missing, DATE yyyymmdd, TIME hhmm.mmm, TIMEZONE hours to
 * add for UTC.
 */
function mgd77tText(rows: Partial<Record<(typeof MGD77T_COLUMNS)[number], string>>[]): string {
	const lines = [MGD77T_COLUMNS.join('\t')];
	for (const r of rows) lines.push(MGD77T_COLUMNS.map((c) => r[c] ?? '').join('\t'));
	return lines.join('\r\n') + '\r\n';
}

function refusal(f: () => unknown): TrackFileError {
	try {
		f();
	} catch (e) {
		if (e instanceof TrackFileError) return e;
		throw e;
	}
	throw new Error('expected the file to be refused');
}

describe('MGD77T [published] NGDC/NCEI MGD77T format description', () => {
	const text = mgd77tText([
		{
			SURVEY_ID: 'WL0001',
			TIMEZONE: '0',
			DATE: '19980312',
			TIME: '1430.500',
			LAT: '-30.12345',
			LON: '179.99000',
			CORR_DEPTH: '3012.4'
		},
		// across the antimeridian; the time zone +2 h makes local 12:31 → 14:31 UTC
		{
			SURVEY_ID: 'WL0001',
			TIMEZONE: '2',
			DATE: '19980312',
			TIME: '1231.000',
			LAT: '-30.12000',
			LON: '-179.99000',
			CORR_DEPTH: '3020'
		},
		// missing depth and time: kept, depth NaN
		{ SURVEY_ID: 'WL0001', LAT: '-30.11', LON: '-179.98' }
	]);

	it('reads position, corrected depth and UTC time; empty fields are missing', () => {
		const r = readTrack(text);
		expect(r.format).toBe('mgd77t');
		expect(r.fixes.count).toBe(3);
		expect([...r.fixes.lat]).toEqual([-30.12345, -30.12, -30.11]);
		expect([...r.fixes.lon]).toEqual([179.99, -179.99, -179.98]);
		expect(r.fixes.depthM[0]).toBe(3012.4);
		expect(r.fixes.depthM[1]).toBe(3020);
		expect(Number.isNaN(r.fixes.depthM[2])).toBe(true);
		expect(r.fixes.timeS[0]).toBe(T('1998-03-12T14:30:30Z'));
		expect(r.fixes.timeS[1]).toBe(T('1998-03-12T14:31:00Z'));
		expect(Number.isNaN(r.fixes.timeS[2])).toBe(true);
		expect(r.warnings.map((w) => w.code)).toEqual(['no_depth']);
	});

	it('reads the same whatever the chunking (a chunk may split a line or a CRLF)', () => {
		for (const size of [1, 7, 64]) {
			const reader = new TrackReader();
			for (let i = 0; i < text.length; i += size) reader.push(text.slice(i, i + size));
			const r = reader.end();
			expect(r.fixes.count).toBe(3);
			expect(r.fixes.depthM[0]).toBe(3012.4);
		}
	});

	it('writes rows the reader reads back (longitude normalised to −180…180)', () => {
		const fixes = {
			lon: [10.5, 190],
			lat: [1, 2],
			depthM: [4000, NaN],
			timeS: [T('2020-01-01T00:00:00Z'), NaN]
		};
		const r = readTrack(writeMgd77t('X', fixes));
		expect([...r.fixes.lon]).toEqual([10.5, -170]);
		expect(r.fixes.timeS[0]).toBe(fixes.timeS[0]);
		expect(mgd77tRow('X', 1, 2, 3, NaN).split('\t')).toHaveLength(26);
	});

	it('refuses a latitude beyond 90° naming row and column, and stores nothing', () => {
		const e = refusal(() =>
			readTrack(
				mgd77tText([
					{ LAT: '10', LON: '20', CORR_DEPTH: '100' },
					{ LAT: '95', LON: '20', CORR_DEPTH: '100' }
				])
			)
		);
		expect(e.code).toBe('invalid_row');
		expect(e.row).toBe(3);
		expect(e.column).toBe('latitude');
		expect(e.message).toMatch(/Row 3, column latitude: 95 is outside ±90°/);
	});

	it('refuses a non-number where a number must be', () => {
		const e = refusal(() => readTrack(mgd77tText([{ LAT: '10', LON: '20', CORR_DEPTH: 'deep' }])));
		expect(e).toMatchObject({ code: 'invalid_row', row: 2, column: 'CORR_DEPTH' });
		const t = refusal(() =>
			readTrack(
				mgd77tText([{ LAT: '10', LON: '20', DATE: '19981312', TIME: '1200', CORR_DEPTH: '1' }])
			)
		);
		expect(t).toMatchObject({ row: 2, column: 'DATE' });
	});

	it('refuses a header without LAT, LON or CORR_DEPTH', () => {
		const e = refusal(() => readTrack('SURVEY_ID\tLAT\tLON\tDATE\nA\t1\t2\t20000101\n'));
		expect(e).toMatchObject({ row: 1, column: 'CORR_DEPTH' });
	});

	it('warns when time runs backwards and keeps the fixes', () => {
		const r = readTrack(
			mgd77tText([
				{ LAT: '1', LON: '1', DATE: '20000101', TIME: '1200', CORR_DEPTH: '10' },
				{ LAT: '1', LON: '1.1', DATE: '20000101', TIME: '1100', CORR_DEPTH: '10' },
				{ LAT: '1', LON: '1.2', DATE: '20000101', TIME: '1300', CORR_DEPTH: '10' }
			])
		);
		expect(r.fixes.count).toBe(3);
		expect(r.warnings).toEqual([
			expect.objectContaining({ code: 'time_backwards', row: 3, count: 1 })
		]);
	});
});
