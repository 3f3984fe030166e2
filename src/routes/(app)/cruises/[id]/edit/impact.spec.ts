import { describe, expect, it } from 'vitest';
import { impactList } from './impact';

describe('impactList', () => {
	it('names every count, singular or plural', () => {
		const list = impactList({
			legs: 2,
			lines: 1,
			stations: 0,
			areas: 1,
			ridges: 2,
			members: 5,
			applications: 0,
			documents: 3,
			invoices: 1,
			clearances: 1,
			deadlines: 12
		});
		expect(list).toContain('2 legs');
		expect(list).toContain('1 survey line');
		expect(list).toContain('0 stations');
		expect(list).toContain('2 ridge axes');
		expect(list).toContain('1 invoice (with its payments)');
		expect(list).toContain('12 deadlines');
		expect(list.at(-1)).toMatch(/order of work/);
	});
});
