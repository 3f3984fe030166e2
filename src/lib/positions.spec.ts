import { describe, expect, it } from 'vitest';
import { parsePositions } from './positions';

describe('typed positions', () => {
	it('reads rows in mixed notations as [lon, lat]', () => {
		const r = parsePositions('30°00.0′S 146°45.0′W\n-30.5, -145.25', 'line');
		expect(r).toEqual({
			ok: true,
			positions: [
				[-146.75, -30],
				[-145.25, -30.5]
			]
		});
	});
	it('reads a GeoJSON LineString', () => {
		const r = parsePositions('{"type":"LineString","coordinates":[[1,2],[3,4]]}', 'line');
		expect(r).toEqual({
			ok: true,
			positions: [
				[1, 2],
				[3, 4]
			]
		});
	});
	it('names the row that is wrong', () => {
		const r = parsePositions('10 N 20 E\n95 N 20 E', 'line');
		expect(r.ok).toBe(false);
		if (!r.ok) expect(r.message).toMatch(/row 2/);
	});
	it('refuses a single position and an empty text', () => {
		expect(parsePositions('10 N 20 E', 'line').ok).toBe(false);
		expect(parsePositions('  ', 'line')).toEqual({ ok: false, message: 'The line is empty.' });
	});
});
