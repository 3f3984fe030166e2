/**
 * Predicted magnetic polarity stripes: distance from the axis = age × half rate (SCIENCE.md §7).
 * Boundary ages (Ma) as tabulated in the PmagPy library; intervals alternate from normal at 0 Ma.
 */

export type TimescaleId = 'gts2020' | 'ck95';
export type Polarity = 'normal' | 'reversed';

/** Geologic Time Scale 2020 (Ogg 2020), via PmagPy. */
export const GTS2020_BOUNDARIES_MA: readonly number[] = Object.freeze([
	0.773, 0.99, 1.07, 1.18, 1.215, 1.775, 1.934, 2.116, 2.14, 2.595, 3.032, 3.116, 3.207, 3.33,
	3.596, 4.187, 4.3, 4.493, 4.631, 4.799, 4.896, 4.997, 5.235, 6.023, 6.272, 6.386, 6.727, 7.104,
	7.214, 7.262, 7.305, 7.456, 7.499, 7.537, 7.65, 7.701, 8.125, 8.257, 8.3, 8.771, 9.105, 9.311,
	9.426, 9.647, 9.721, 9.786, 9.937, 9.984, 11.056
]);

/** Cande & Kent (1995), J. Geophys. Res. 100, 6093, via PmagPy. */
export const CK95_BOUNDARIES_MA: readonly number[] = Object.freeze([
	0.78, 0.99, 1.07, 1.77, 1.95, 2.14, 2.15, 2.581, 3.04, 3.11, 3.22, 3.33, 3.58, 4.18, 4.29, 4.48,
	4.62, 4.8, 4.89, 4.98, 5.23, 5.894, 6.137, 6.269, 6.567, 6.935, 7.091, 7.135, 7.17, 7.341, 7.375,
	7.432, 7.562, 7.65, 8.072, 8.225, 8.257, 8.699, 9.025, 9.23, 9.308, 9.58, 9.642, 9.74, 9.88, 9.92,
	10.949
]);

export const DEFAULT_TIMESCALE: TimescaleId = 'gts2020';

export function timescale(id: TimescaleId = DEFAULT_TIMESCALE): readonly number[] {
	return id === 'ck95' ? CK95_BOUNDARIES_MA : GTS2020_BOUNDARIES_MA;
}

/** Polarity at an age, or null beyond the tabulated interval. */
export function polarityAt(ageMa: number, id: TimescaleId = DEFAULT_TIMESCALE): Polarity | null {
	const b = timescale(id);
	if (!(ageMa >= 0)) return null;
	let i = 0;
	while (i < b.length && ageMa >= b[i]) i++;
	if (i >= b.length) return null;
	return i % 2 === 0 ? 'normal' : 'reversed';
}

export interface Chron {
	fromMa: number;
	toMa: number;
	polarity: Polarity;
}

/** The timescale as intervals from 0 Ma. */
export function polarityIntervals(id: TimescaleId = DEFAULT_TIMESCALE): Chron[] {
	const b = timescale(id);
	return b.map((toMa, i) => ({
		fromMa: i === 0 ? 0 : b[i - 1],
		toMa,
		polarity: i % 2 === 0 ? 'normal' : 'reversed'
	}));
}

export interface Stripe extends Chron {
	/** Distance from the axis on one flank (km). */
	fromKm: number;
	toKm: number;
}

/** Stripes on one flank spreading at halfRateMmYr (1 mm/yr = 1 km/Myr). */
export function flankStripes(halfRateMmYr: number, id: TimescaleId = DEFAULT_TIMESCALE): Stripe[] {
	return polarityIntervals(id).map((c) => ({
		...c,
		fromKm: c.fromMa * halfRateMmYr,
		toKm: c.toMa * halfRateMmYr
	}));
}

export interface ProfileStripe {
	/** Along the profile (km). */
	fromKm: number;
	toKm: number;
	/** null where the floor is older than the timescale covers. */
	polarity: Polarity | null;
}

/**
 * Polarity stripes along a sampled line from its ages: boundaries are placed where the age
 * crosses a reversal age, interpolated linearly between samples.
 */
export function polarityAlongProfile(
	distanceKm: ArrayLike<number>,
	ageMa: ArrayLike<number>,
	id: TimescaleId = DEFAULT_TIMESCALE
): ProfileStripe[] {
	const n = distanceKm.length;
	if (n === 0) return [];
	const b = timescale(id);
	// code = how many boundaries lie at or below the age; b.length means beyond the table
	const code = (age: number) => {
		let i = 0;
		while (i < b.length && age >= b[i]) i++;
		return i;
	};
	const pol = (c: number): Polarity | null =>
		c >= b.length ? null : c % 2 === 0 ? 'normal' : 'reversed';
	const out: ProfileStripe[] = [];
	let cur = code(ageMa[0]);
	let start = distanceKm[0];
	for (let k = 1; k < n; k++) {
		const next = code(ageMa[k]);
		if (next === cur) continue;
		const a0 = ageMa[k - 1];
		const a1 = ageMa[k];
		const d0 = distanceKm[k - 1];
		const d1 = distanceKm[k];
		const at = (age: number) =>
			Number.isFinite(a1) && a1 !== a0 ? d0 + ((age - a0) / (a1 - a0)) * (d1 - d0) : d1;
		if (next > cur) {
			for (let j = cur; j < next; j++) {
				const x = at(b[j]);
				out.push({ fromKm: start, toKm: x, polarity: pol(j) });
				start = x;
			}
		} else {
			for (let j = cur - 1; j >= next; j--) {
				const x = at(b[j]);
				out.push({ fromKm: start, toKm: x, polarity: pol(j + 1) });
				start = x;
			}
		}
		cur = next;
	}
	out.push({ fromKm: start, toKm: distanceKm[n - 1], polarity: pol(cur) });
	return out;
}
