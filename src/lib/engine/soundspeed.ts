/**
 * Sound speed in seawater and the ping timing that follows from it.
 */

/**
 * Mackenzie (1981), J. Acoust. Soc. Am. 70, 807 — nine-term equation.
 * T °C, S (practical salinity), D depth in metres; valid 2–30 °C, 25–40, 0–8000 m.
 */
export function soundSpeedMackenzie(tC: number, salinity: number, depthM: number): number {
	const t = tC;
	const s = salinity - 35;
	const d = depthM;
	return (
		1448.96 +
		4.591 * t -
		5.304e-2 * t * t +
		2.374e-4 * t * t * t +
		1.34 * s +
		1.63e-2 * d +
		1.675e-7 * d * d -
		1.025e-2 * t * s -
		7.139e-13 * t * d * d * d
	);
}

/**
 * UNESCO 1983 (Chen & Millero 1977; Fofonoff & Millard 1983, Unesco Tech. Pap. Mar. Sci. 44,
 * eqns 33–37) with the original IPTS-68 coefficients. Pressure in dbar (converted to bar inside).
 * Valid 0–40 °C, salinity 0–40, 0–10 000 dbar.
 */
export function soundSpeedUnesco(salinity: number, tC: number, pressureDbar: number): number {
	const s = salinity;
	const t = tC;
	const p = pressureDbar / 10; // bar, as the published algorithm uses
	const sr = Math.sqrt(Math.abs(s));
	// S² term
	const d = 1.727e-3 - 7.9836e-6 * p;
	// S^(3/2) term
	const b1 = 7.3637e-5 + 1.7945e-7 * t;
	const b0 = -1.922e-2 - 4.42e-5 * t;
	const b = b0 + b1 * p;
	// S¹ term
	const a3 = (-3.389e-13 * t + 6.649e-12) * t + 1.1e-10;
	const a2 = ((7.988e-12 * t - 1.6002e-10) * t + 9.1041e-9) * t - 3.9064e-7;
	const a1 = (((-2.0122e-10 * t + 1.0507e-8) * t - 6.4885e-8) * t - 1.258e-5) * t + 9.4742e-5;
	const a0 = (((-3.21e-8 * t + 2.006e-6) * t + 7.164e-5) * t - 1.262e-2) * t + 1.389;
	const a = ((a3 * p + a2) * p + a1) * p + a0;
	// S⁰ term (pure water)
	const c3 = (-2.3643e-12 * t + 3.8504e-10) * t - 9.7729e-9;
	const c2 = (((1.0405e-12 * t - 2.5335e-10) * t + 2.5974e-8) * t - 1.7107e-6) * t + 3.126e-5;
	const c1 = (((-6.1185e-10 * t + 1.3621e-7) * t - 8.1788e-6) * t + 6.8982e-4) * t + 0.153563;
	const c0 =
		((((3.1464e-9 * t - 1.478e-6) * t + 3.342e-4) * t - 5.80852e-2) * t + 5.03711) * t + 1402.388;
	const c = ((c3 * p + c2) * p + c1) * p + c0;
	return c + (a + b * sr + d * s) * s;
}

/** Nominal sound speed for planning (m/s). */
export const NOMINAL_SOUND_SPEED = 1500;

/** Two-way travel time to the seafloor, the shortest ping interval (s): 2·d/c. */
export function pingIntervalS(depthM: number, soundSpeed = NOMINAL_SOUND_SPEED): number {
	return (2 * depthM) / soundSpeed;
}

/** Along-track distance between pings (m) at a speed over ground in knots. */
export function alongTrackSpacingM(
	speedKn: number,
	depthM: number,
	soundSpeed = NOMINAL_SOUND_SPEED
): number {
	return ((speedKn * 1852) / 3600) * pingIntervalS(depthM, soundSpeed);
}

/** Fastest speed (kn) that keeps pings at most `spacingM` apart along track. */
export function maxSpeedForSpacingKn(
	spacingM: number,
	depthM: number,
	soundSpeed = NOMINAL_SOUND_SPEED
): number {
	return (spacingM / pingIntervalS(depthM, soundSpeed)) * (3600 / 1852);
}
