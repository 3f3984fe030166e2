// Money: integer minor units of an ISO 4217 currency. Line amounts are computed exactly (BigInt)
// and rounded half-up once per line; invoice totals are sums of rounded lines, so the printed lines
// always add up to the printed total.

/**
 * Minor-unit exponents from ISO 4217 (the "Minor unit" column of the currency code list, List One,
 * maintained by SIX on behalf of ISO). Only currencies Wakeline invoices in are listed; anything
 * else is refused rather than guessed.
 */
export const CURRENCY_EXPONENTS: Readonly<Record<string, number>> = {
	EUR: 2,
	USD: 2,
	GBP: 2,
	NOK: 2,
	SEK: 2,
	DKK: 2,
	CHF: 2,
	CAD: 2,
	AUD: 2,
	NZD: 2,
	JPY: 0,
	KRW: 0,
	ISK: 0,
	CLP: 0,
	KWD: 3,
	BHD: 3,
	OMR: 3,
	JOD: 3,
	TND: 3
};

export const CURRENCIES = Object.keys(CURRENCY_EXPONENTS);

export function exponentOf(currency: string): number {
	const e = CURRENCY_EXPONENTS[currency.toUpperCase()];
	if (e === undefined) throw new RangeError(`Unsupported currency "${currency}".`);
	return e;
}

/**
 * Divides and rounds half-up, i.e. a tie goes away from zero (as Council Regulation (EC) No 1103/97
 * art. 5 rounds euro amounts: "if the result is exactly half, the sum shall be rounded up"; the same
 * rule as Java's RoundingMode.HALF_UP). Exact for any integer inputs.
 */
export function divRoundHalfUp(numerator: bigint, denominator: bigint): bigint {
	if (denominator === 0n) throw new RangeError('Division by zero.');
	if (denominator < 0n) return divRoundHalfUp(-numerator, -denominator);
	const negative = numerator < 0n;
	const n = negative ? -numerator : numerator;
	const q = (2n * n + denominator) / (2n * denominator);
	return negative ? -q : q;
}

/** Largest amount on one line or invoice: well inside Number.MAX_SAFE_INTEGER for every exponent. */
export const MAX_AMOUNT_MINOR = 1_000_000_000_000; // 10 billion EUR in cents

export interface LineInput {
	description: string;
	/** Decimal quantity as typed, up to 3 decimals (e.g. "14", "2.5", "0.125"). */
	quantity: string;
	/** Unit price in minor units of the invoice currency (may be negative on a credit note). */
	unitMinor: number;
	/** Tax rate in percent, up to 2 decimals (e.g. "25", "12.5", "0"). */
	taxPct: string;
}

export interface LineAmounts {
	netMinor: number;
	taxMinor: number;
	amountMinor: number;
}

const QTY = /^-?\d{1,9}(\.\d{1,3})?$/;
const PCT = /^\d{1,3}(\.\d{1,2})?$/;

/** A decimal string as an integer count of 10^-places. */
function scaled(text: string, places: number): bigint {
	const [whole, frac = ''] = text.split('.');
	const sign = whole.startsWith('-') ? -1n : 1n;
	const digits = whole.replace('-', '') + frac.padEnd(places, '0');
	return sign * BigInt(digits);
}

/**
 * One line: net = quantity × unit price, rounded half-up to the minor unit; tax = net × rate,
 * rounded half-up; amount = net + tax. Throws RangeError on malformed input.
 */
export function lineAmounts(
	line: Pick<LineInput, 'quantity' | 'unitMinor' | 'taxPct'>
): LineAmounts {
	if (!QTY.test(line.quantity))
		throw new RangeError(`Quantity "${line.quantity}" is not a number with up to 3 decimals.`);
	if (!PCT.test(line.taxPct))
		throw new RangeError(`Tax rate "${line.taxPct}" is not a percentage with up to 2 decimals.`);
	if (!Number.isSafeInteger(line.unitMinor))
		throw new RangeError('The unit price must be a whole number of minor units.');
	const qtyMilli = scaled(line.quantity, 3);
	const pctCenti = scaled(line.taxPct, 2);
	if (pctCenti > 10000n) throw new RangeError('A tax rate above 100 % is not accepted.');
	const net = divRoundHalfUp(qtyMilli * BigInt(line.unitMinor), 1000n);
	const tax = divRoundHalfUp(net * pctCenti, 10000n);
	const amount = net + tax;
	const max = BigInt(MAX_AMOUNT_MINOR);
	if (amount > max || amount < -max)
		throw new RangeError('The line amount is larger than Wakeline accepts on one invoice.');
	return { netMinor: Number(net), taxMinor: Number(tax), amountMinor: Number(amount) };
}

/** The sum of already-rounded line amounts. */
export function totalMinor(lines: readonly { amountMinor: number }[]): number {
	return lines.reduce((s, l) => s + l.amountMinor, 0);
}

/** "1234.5" in major units → minor units of the currency; null when it has too many decimals. */
export function parseMajor(text: string, currency: string): number | null {
	const e = exponentOf(currency);
	const t = text.trim().replace(/[\s,_]/g, '');
	const re = e === 0 ? /^-?\d{1,13}$/ : new RegExp(`^-?\\d{1,13}(\\.\\d{1,${e}})?$`);
	if (!re.test(t)) return null;
	return Number(scaled(t, e));
}

/** Minor units → "1234.50" (plain, for forms and CSV). */
export function toMajorString(amountMinor: number, currency: string): string {
	const e = exponentOf(currency);
	const neg = amountMinor < 0;
	const s = String(Math.abs(amountMinor)).padStart(e + 1, '0');
	const out = e === 0 ? s : `${s.slice(0, -e)}.${s.slice(-e)}`;
	return neg ? `-${out}` : out;
}

/** Minor units → "EUR 1,234.50" for people (grouping by thousands, ISO code first). */
export function formatMoney(amountMinor: number, currency: string): string {
	const plain = toMajorString(amountMinor, currency);
	const neg = plain.startsWith('-');
	const [whole, frac] = plain.replace('-', '').split('.');
	const grouped = whole.replace(/\B(?=(\d{3})+(?!\d))/g, ',');
	return `${neg ? '−' : ''}${currency.toUpperCase()} ${grouped}${frac ? '.' + frac : ''}`;
}
