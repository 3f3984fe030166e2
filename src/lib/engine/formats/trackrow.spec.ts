import { describe, expect, it } from 'vitest';
import { RowError, numberField, requiredNumber, utcSeconds } from './trackrow';

describe('track row fields', () => {
	it('an empty field is missing (NaN); text that is not a number is refused', () => {
		expect(Number.isNaN(numberField('  ', 'x'))).toBe(true);
		expect(numberField(' -12.5 ', 'x')).toBe(-12.5);
		expect(() => numberField('12,5', 'x')).toThrow(RowError);
		expect(() => numberField('Infinity', 'x')).toThrow(/not a number/);
		expect(() => requiredNumber('', 'x')).toThrow(/empty/);
	});

	it('UTC seconds from a calendar date [derived] 2000-01-01T00:00Z is 946684800 s', () => {
		expect(utcSeconds(2000, 1, 1, 0)).toBe(946684800);
		expect(utcSeconds(2000, 1, 1, 3600.5)).toBe(946688400.5);
	});
});
