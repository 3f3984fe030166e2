import { describe, expect, it } from 'vitest';
import {
	ProblemLog,
	checkImportSize,
	checkLonLat,
	closeRing,
	decimal,
	fileBaseName,
	openRing,
	orderIfNeeded,
	routeSequence,
	utf8ByteLength
} from './shared';
import { samplePlan } from './testing';

describe('decimal', () => {
	it('never uses exponent notation [published] XML Schema Part 2 §3.2.3 xsd:decimal', () => {
		expect(decimal(1e-7)).toBe('0.0000001');
		expect(decimal(-1.5e-10)).toBe('-0.00000000015');
		expect(decimal(1.2345e21)).toBe('1234500000000000000000');
		expect(decimal(52.4)).toBe('52.4');
		for (const v of [1e-7, 3.14159e-12, -2.5e-9, 1.7976931348623157e20])
			expect(Number(decimal(v))).toBe(v);
	});
});

describe('file names', () => {
	it('keeps letters, digits, dot, dash and underscore', () => {
		expect(fileBaseName('Cruise WL-24/1: Leg 2')).toBe('Cruise_WL-24_1_Leg_2');
		expect(fileBaseName('Ægir Ridge – Þór')).toBe('AEgir_Ridge_Thor');
		expect(fileBaseName('Reykjanes Ridge – Segment é')).toBe('Reykjanes_Ridge_Segment_e');
		expect(fileBaseName('///')).toBe('wakeline-plan');
		expect(fileBaseName('x'.repeat(100))).toHaveLength(64);
	});
});

describe('import size', () => {
	it('counts UTF-8 bytes', () => {
		expect(utf8ByteLength('abc')).toBe(3);
		expect(utf8ByteLength('°')).toBe(2);
		expect(utf8ByteLength('—')).toBe(3);
		expect(utf8ByteLength('🌊')).toBe(4);
	});

	it('guards at 10 MiB by default', () => {
		expect(checkImportSize(10 * 1024 * 1024)).toBeNull();
		expect(checkImportSize(10 * 1024 * 1024 + 1)?.message).toContain('limit is 10.0 MiB');
		expect(checkImportSize(2000, 1000)?.where).toBe('file');
	});
});

describe('coordinates and rings', () => {
	it('checks one position', () => {
		expect(checkLonLat(181, 10)).toEqual({ ok: true, value: [-179, 10] });
		expect(checkLonLat('10', '20')).toEqual({ ok: true, value: [10, 20] });
		expect(checkLonLat(40, 150)).toMatchObject({
			ok: false,
			message: expect.stringContaining('swapped')
		});
		expect(checkLonLat(140, 150)).toMatchObject({
			ok: false,
			message: expect.stringContaining('outside ±90')
		});
		expect(checkLonLat(600, 10)).toMatchObject({
			ok: false,
			message: expect.stringContaining('outside ±180')
		});
		expect(checkLonLat('', 10)).toMatchObject({
			ok: false,
			message: expect.stringContaining('not numbers')
		});
	});

	it('opens and closes rings', () => {
		const open: [number, number][] = [
			[0, 0],
			[1, 0],
			[1, 1]
		];
		expect(closeRing(open)).toEqual([...open, [0, 0]]);
		expect(openRing(closeRing(open))).toEqual(open);
		expect(closeRing(closeRing(open))).toEqual(closeRing(open));
	});
});

describe('route order', () => {
	it('takes plan.order, drops bad entries and appends what it left out', () => {
		const plan = samplePlan();
		plan.order = [
			{ kind: 'station', index: 3 },
			{ kind: 'line', index: 9 },
			{ kind: 'station', index: 3 }
		];
		expect(routeSequence(plan)).toEqual([
			{ kind: 'station', index: 3 },
			{ kind: 'line', index: 0 },
			{ kind: 'line', index: 1 },
			{ kind: 'station', index: 0 },
			{ kind: 'station', index: 1 },
			{ kind: 'station', index: 2 }
		]);
		expect(orderIfNeeded(routeSequence({ ...plan, order: undefined }), plan)).toBeUndefined();
	});
});

describe('ProblemLog', () => {
	it('summarises defaults once per field and caps the list', () => {
		const log = new ProblemLog();
		for (let i = 0; i < 3; i++) log.defaulted('line', 'surveySpeedKn', 8);
		for (let i = 0; i < 250; i++) log.error(`line ${i}`, 'bad');
		const out = log.finish();
		expect(out.filter((p) => p.field === 'surveySpeedKn')).toEqual([
			{
				where: '3 lines',
				field: 'surveySpeedKn',
				message: 'surveySpeedKn missing; used 8',
				severity: 'warning'
			}
		]);
		expect(out[out.length - 1].message).toBe('50 more problems not listed');
	});
});
