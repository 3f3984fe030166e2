import { describe, expect, it } from 'vitest';
import { safeNext } from './links';

const O = 'https://wakeline.test';

describe('safeNext', () => {
	it('keeps same-origin paths with their query', () => {
		expect(safeNext('/cruises/abc/chart?x=1#a', O, '/cruises')).toBe('/cruises/abc/chart?x=1#a');
	});
	it('refuses every way off-site', () => {
		for (const bad of [
			'/\\evil.example',
			'/%5Cevil.example',
			'//evil.example',
			'/\\/evil.example',
			'https://evil.example/',
			'javascript:alert(1)',
			'\\\\evil.example',
			'/\t/evil.example'
		])
			expect(safeNext(decodeURIComponent(bad), O, '/cruises'), bad).toBe('/cruises');
		expect(safeNext(null, O, '/cruises')).toBe('/cruises');
	});
});
