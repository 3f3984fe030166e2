import { describe, expect, it } from 'vitest';
import { deepFreeze } from './freeze';

describe('deepFreeze', () => {
	it('freezes nested objects and arrays so that writes throw in strict code', () => {
		const v = deepFreeze({ a: [{ b: 1 }], n: [3, 1, 2], c: { d: new Date(0) } });
		expect(() => {
			(v.a[0] as { b: number }).b = 2;
		}).toThrow(TypeError);
		expect(() => v.a.push({ b: 3 })).toThrow(TypeError);
		expect(() => v.n.sort()).toThrow(TypeError);
		expect(v.n).toEqual([3, 1, 2]);
		expect(v.a[0].b).toBe(1);
	});

	it('leaves typed arrays and primitives as they are', () => {
		const t = new Float64Array([1, 2]);
		expect(deepFreeze({ t }).t).toBe(t);
		expect(deepFreeze(3)).toBe(3);
		expect(deepFreeze(null)).toBe(null);
	});
});
