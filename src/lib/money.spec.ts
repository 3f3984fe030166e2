import { describe, expect, it } from 'vitest';
import {
	divRoundHalfUp,
	exponentOf,
	formatMoney,
	lineAmounts,
	parseMajor,
	toMajorString,
	totalMinor
} from './money';

describe('ISO 4217 minor units', () => {
	// [published] ISO 4217 List One, "Minor unit" column: JPY 0, EUR 2, KWD 3, BHD 3, ISK 0.
	it.each([
		['JPY', 0],
		['EUR', 2],
		['KWD', 3],
		['BHD', 3],
		['ISK', 0],
		['usd', 2]
	])('%s has %i decimals', (code, e) => expect(exponentOf(code)).toBe(e));

	it('refuses a currency it does not know instead of guessing', () => {
		expect(() => exponentOf('XYZ')).toThrow(/Unsupported currency/);
	});

	it('writes amounts with the exponent of the currency', () => {
		expect(toMajorString(123456, 'EUR')).toBe('1234.56');
		expect(toMajorString(123456, 'JPY')).toBe('123456');
		expect(toMajorString(123456, 'KWD')).toBe('123.456');
		expect(toMajorString(5, 'EUR')).toBe('0.05');
		expect(toMajorString(-5, 'KWD')).toBe('-0.005');
		expect(formatMoney(385000000, 'EUR')).toBe('EUR 3,850,000.00');
		expect(formatMoney(48000, 'JPY')).toBe('JPY 48,000');
	});

	it('reads typed amounts exactly and refuses more decimals than the currency has', () => {
		expect(parseMajor('38500.00', 'EUR')).toBe(3_850_000);
		expect(parseMajor('1,234.5', 'EUR')).toBe(123_450);
		expect(parseMajor('48000', 'JPY')).toBe(48_000);
		expect(parseMajor('48000.5', 'JPY')).toBeNull();
		expect(parseMajor('1.234', 'KWD')).toBe(1234);
		expect(parseMajor('1.2345', 'KWD')).toBeNull();
		expect(parseMajor('0.1', 'EUR')).toBe(10); // no binary-float drift (0.1 * 100 is fine, 1.005 below)
		expect(parseMajor('1.005', 'KWD')).toBe(1005);
		expect(parseMajor('abc', 'EUR')).toBeNull();
	});
});

describe('rounding half-up', () => {
	// [published] Council Regulation (EC) No 1103/97, art. 5: amounts are rounded to the nearest
	// cent, and an exact half is rounded up. [reference library] Java BigDecimal RoundingMode.HALF_UP
	// documentation table: 5.5 → 6, 2.5 → 3, 1.6 → 2, 1.1 → 1, 1.0 → 1, −1.0 → −1, −1.1 → −1,
	// −1.6 → −2, −2.5 → −3, −5.5 → −6.
	it.each([
		[55n, 10n, 6n],
		[25n, 10n, 3n],
		[16n, 10n, 2n],
		[11n, 10n, 1n],
		[10n, 10n, 1n],
		[-10n, 10n, -1n],
		[-11n, 10n, -1n],
		[-16n, 10n, -2n],
		[-25n, 10n, -3n],
		[-55n, 10n, -6n]
	])('%i / %i → %i', (n, d, q) => expect(divRoundHalfUp(n, d)).toBe(q));

	it('rounds each line once: 2.5 × 0.01 is 0.03, not banker’s 0.02', () => {
		// [derived] 2.5 × 1 cent = 2.5 cents → half-up 3 cents (half-even would give 2).
		expect(lineAmounts({ quantity: '2.5', unitMinor: 1, taxPct: '0' }).amountMinor).toBe(3);
	});

	it('taxes the rounded net and rounds the tax half-up', () => {
		// [derived] 3 × EUR 0.35 = EUR 1.05 net; 25 % of 1.05 = 0.2625 → 0.26; total 1.31.
		expect(lineAmounts({ quantity: '3', unitMinor: 35, taxPct: '25' })).toEqual({
			netMinor: 105,
			taxMinor: 26,
			amountMinor: 131
		});
		// [derived] 1 × EUR 0.10 at 25 %: tax 0.025 → 0.03 (exact half rounds up).
		expect(lineAmounts({ quantity: '1', unitMinor: 10, taxPct: '25' }).taxMinor).toBe(3);
	});

	it('is exact where binary floating point is not', () => {
		// [derived] 1.005 × 100 = 100.49999999999999 in IEEE 754 doubles; exact arithmetic gives 100.5
		// cents of net → 101 cents half-up.
		expect(Math.round(1.005 * 100)).toBe(100);
		expect(lineAmounts({ quantity: '1.005', unitMinor: 100, taxPct: '0' }).amountMinor).toBe(101);
	});

	it('keeps zero-decimal currencies whole: JPY 12,345 × 1.5 days at 10 %', () => {
		// [derived] 12,345 × 1.5 = 18,517.5 → 18,518 yen; 10 % = 1,851.8 → 1,852; total 20,370.
		expect(lineAmounts({ quantity: '1.5', unitMinor: 12_345, taxPct: '10' })).toEqual({
			netMinor: 18_518,
			taxMinor: 1_852,
			amountMinor: 20_370
		});
	});

	it('keeps three-decimal currencies to the fils: KWD 1.2345 is not representable', () => {
		// [derived] 3 × KWD 0.415 = 1.245; 5 % = 0.06225 → 0.062; total 1.307 KWD.
		expect(lineAmounts({ quantity: '3', unitMinor: 415, taxPct: '5' }).amountMinor).toBe(1307);
	});

	it('sums totals from rounded lines, so the printed lines add up to the printed total', () => {
		// [derived] three lines of 1 × EUR 0.333… can't exist; use 3 lines of 0.5 × 1 cent:
		// each rounds to 1 cent, total 3 cents (rounding the exact sum 1.5 would give 2).
		const lines = [1, 2, 3].map(() => lineAmounts({ quantity: '0.5', unitMinor: 1, taxPct: '0' }));
		expect(totalMinor(lines)).toBe(3);
	});

	it('refuses malformed quantities, rates and prices with a clear reason', () => {
		expect(() => lineAmounts({ quantity: '1.2345', unitMinor: 1, taxPct: '0' })).toThrow(
			/Quantity/
		);
		expect(() => lineAmounts({ quantity: '1', unitMinor: 1, taxPct: '150' })).toThrow(/above 100/);
		expect(() => lineAmounts({ quantity: '1', unitMinor: 1.5, taxPct: '0' })).toThrow(/whole/);
		expect(() => lineAmounts({ quantity: '999999999', unitMinor: 1e12, taxPct: '0' })).toThrow(
			/larger/
		);
	});
});
