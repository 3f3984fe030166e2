import { describe, expect, it } from 'vitest';
import { MGD77_FIELDS, mgd77Record, placeField } from './mgd77';
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

describe('MGD77 120-character records [memory] NGDC MGD77 format description (layout in mgd77.ts)', () => {
	/** Writes a record field by field from the published column table (not with the module's writer). */
	function record(f: Partial<Record<keyof typeof MGD77_FIELDS, string>>): string {
		const r = ('5' + 'TESTLEG1' + '9'.repeat(111)).split('');
		for (const [k, v] of Object.entries(f)) placeField(r, k as keyof typeof MGD77_FIELDS, v!);
		return r.join('');
	}
	const header = '4' + ' '.repeat(78) + '1';

	it('reads scaled fields; all nines are missing; header records are skipped', () => {
		const lines = [
			header,
			record({
				timeZone: '-05',
				year: '1985',
				month: '06',
				day: '12',
				hour: '14',
				minutesX1000: '30500',
				latitudeX1e5: '+4512345',
				longitudeX1e5: '+17999500',
				depthX10: '034567'
			}),
			record({ latitudeX1e5: '+4512000', longitudeX1e5: '-17999500' })
		];
		const r = readTrack(lines.join('\n'));
		expect(r.format).toBe('mgd77');
		expect(r.fixes.count).toBe(2);
		expect(r.fixes.lat[0]).toBeCloseTo(45.12345, 9);
		expect(r.fixes.lon[0]).toBeCloseTo(179.995, 9);
		expect(r.fixes.lon[1]).toBeCloseTo(-179.995, 9);
		expect(r.fixes.depthM[0]).toBeCloseTo(3456.7, 9);
		expect(Number.isNaN(r.fixes.depthM[1])).toBe(true);
		// 14:30.5 local, zone −5 h → 09:30:30 UTC
		expect(r.fixes.timeS[0]).toBe(T('1985-06-12T09:30:30Z'));
		expect(Number.isNaN(r.fixes.timeS[1])).toBe(true);
		expect(lines[1]).toHaveLength(120);
	});

	it('its own writer makes records the reader reads back', () => {
		const rec = mgd77Record(-45.5, -12.25, 4321.2, T('2001-02-03T04:05:06Z'));
		expect(rec).toHaveLength(120);
		const r = readTrack(rec + '\n', { format: 'mgd77' });
		expect(r.fixes.lon[0]).toBeCloseTo(-45.5, 9);
		expect(r.fixes.depthM[0]).toBeCloseTo(4321.2, 9);
		expect(r.fixes.timeS[0]).toBe(T('2001-02-03T04:05:06Z'));
	});

	it('refuses a letter in a number field, naming the row and field', () => {
		const bad = record({ latitudeX1e5: '+45A2345', longitudeX1e5: '+01000000' });
		const e = refusal(() => readTrack([header, bad].join('\n')));
		expect(e).toMatchObject({ code: 'invalid_row', row: 2, column: 'latitudeX1e5' });
	});

	it('refuses a latitude beyond 90°', () => {
		const bad = record({
			latitudeX1e5: '+9100000',
			longitudeX1e5: '+01000000',
			depthX10: '001000'
		});
		expect(refusal(() => readTrack(bad))).toMatchObject({ row: 1, column: 'latitude' });
	});
});
