import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { CSV_COLUMNS, readCsv, writeCsv } from './csv';
import { EXPORT_CAUTION } from './shared';
import { antimeridianPlan, pathLengthKm, roundedAsCsv, samplePlan } from './testing';

describe('CSV waypoint list', () => {
	it('round-trips lines and stations to their stated rounding; ridges and areas are not carried', () => {
		const plan = samplePlan();
		const back = readCsv(writeCsv(plan));
		expect(back.problems).toEqual([]);
		expect(back.plan).toEqual(roundedAsCsv({ ...plan, ridges: [], areas: [] }));
	});

	it('writes RFC 4180 records: CRLF, a header, quotes where needed [published] RFC 4180 §2', () => {
		const text = writeCsv(samplePlan());
		// The header is the first line: no byte order mark, no comment lines before it.
		const lines = text.split('\r\n');
		expect(lines[0]).toBe(CSV_COLUMNS.join(','));
		expect(text.replace(/\r\n/g, '')).not.toContain('\n');
		// A name with a comma and quotes is quoted with doubled quotes.
		expect(text).toContain('"Mag tie, ""B"""');
		const rows = Papa.parse<string[]>(lines.join('\r\n'), { skipEmptyLines: true }).data;
		expect(rows.every((r) => r.length === CSV_COLUMNS.length)).toBe(true);
		const col = (name: string) => CSV_COLUMNS.indexOf(name as (typeof CSV_COLUMNS)[number]);
		const ctd = rows.find((r) => r[col('name')] === 'CTD 1')!;
		// Positions to 0.000001°, depths to 1 m, durations to 0.01 h (issue 13's rounding rule).
		expect(ctd[col('latitude_dd')]).toBe('52.400000');
		expect(ctd[col('latitude_dmm')]).toBe('52 24.000 N');
		expect(ctd[col('longitude_dmm')]).toBe('31 15.000 W');
		expect(ctd[col('predicted_depth_m')]).toBe('2900');
		expect(ctd[col('planned_start_utc')]).toBe('2027-03-02T14:00:00Z');
		expect(ctd[col('duration_h')]).toBe('2.75');
		// The caution rides in the note column of the first row, the plan name in every row.
		expect(rows[1][col('note')]).toBe(EXPORT_CAUTION);
		expect(rows[2][col('note')]).toBe('');
		expect(rows[1][col('plan')]).toBe(samplePlan().name);
		const first = rows.find((r) => r[col('name')] === 'Line 01')!;
		expect(first[col('length_km')]).toBe('111.12');
		// [derived] 111.123456789 km / 1.852 = 60.0018 nm.
		expect(first[col('length_nm')]).toBe('60.00');
		// Cruise order: line 01 (3 vertices), CTD 1, D-2, mag tie (2), core, dive.
		expect(rows.slice(1).map((r) => r[col('kind')])).toEqual([
			'line',
			'line',
			'line',
			'ctd',
			'dredge',
			'line',
			'line',
			'core',
			'dive'
		]);
		expect(rows.slice(1).map((r) => r[col('no')])).toEqual([
			'1',
			'2',
			'3',
			'4',
			'5',
			'6',
			'7',
			'8',
			'9'
		]);
		// The sign of 0° is kept in the DMM column: −0.0000001° is west.
		const core = rows.find((r) => r[col('name')] === 'Core 3')!;
		expect(core[col('longitude_dmm')]).toBe('0 00.000 W');
		expect(core[col('latitude_dmm')]).toBe('0 30.000 S');
	});

	it('keeps a line across 180° one short line', () => {
		const plan = antimeridianPlan();
		const back = readCsv(writeCsv(plan));
		expect(back.plan.lines).toEqual(plan.lines);
		expect(pathLengthKm(back.plan.lines[0].coords)).toBeLessThan(110);
	});

	it('guards against spreadsheet formulas and restores the text on import', () => {
		const plan = samplePlan();
		plan.stations[0].name = '=HYPERLINK("x")';
		plan.lines[0].name = '-L1';
		const text = writeCsv(plan);
		expect(text).toContain(`"'=HYPERLINK(""x"")"`);
		const back = readCsv(text);
		expect(back.plan.stations[0].name).toBe('=HYPERLINK("x")');
		expect(back.plan.lines[0].name).toBe('-L1');
	});

	it('reads a foreign list: aliases, semicolons, notation in the position columns', () => {
		const text = 'Name;Lat;Lon\n"A";48 07.038 N;011 31.000 E\nB;-12.5;130.25\n';
		const r = readCsv(text);
		expect(r.plan.stations).toHaveLength(2);
		expect(r.plan.stations[0].position[1]).toBeCloseTo(48 + 7.038 / 60, 12);
		expect(r.plan.stations[1]).toMatchObject({ name: 'B', kind: 'ctd', position: [130.25, -12.5] });
	});

	it('reports bad rows by file line number', () => {
		const header = CSV_COLUMNS.join(',');
		const text = [
			'# comment',
			header,
			'1,,"multi\nline name",ctd,,10,20,,,,,,,,,,,,,,',
			'2,,swapped,ctd,,150,40,,,,,,,,,,,,,,',
			'3,,nolat,ctd,,,20,,,,,,,,,,,,,,',
			'4,,buoy,buoy,,1,2,,,,,,,,,,,,,,',
			'5,,nan,ctd,,1,2,,,deep,,,,,,,,,,,',
			'6,,L,line,1,1,2,,,,,,,,fast,,,,,,',
			'7,,L,line,2,1,3,,,,,,,,fast,,,,,,',
			'8,,odd,dredge,,10,20,10 00.000 N,50 00.000 E,,,,,,,,,,,,'
		].join('\r\n');
		const r = readCsv(text);
		const where = Object.fromEntries(r.problems.map((p) => [p.where, p]));
		expect(r.plan.stations[0].name).toBe('multi\nline name');
		expect(where['line 5'].message).toContain('coordinates look swapped');
		expect(where['line 6'].message).toContain('empty geometry');
		expect(where['line 7'].message).toContain('unknown kind "buoy"');
		expect(where['line 8']).toMatchObject({ field: 'depthM', severity: 'warning' });
		expect(where['line 9']).toMatchObject({ field: 'surveySpeedKn', severity: 'error' });
		expect(where['line 11']).toMatchObject({ severity: 'warning' });
		expect(where['line 11'].message).toContain('disagree');
		expect(readCsv('name,depth\nx,3').problems[0].message).toContain('no latitude column');
		expect(readCsv('').problems[0].message).toContain('no header');
	});
});
