/**
 * Distances, speeds and durations. Kilometres and hours inside; nautical miles and knots at the
 * edges (1 nm = 1852 m exactly, 1 kn = 1.852 km/h exactly).
 */
import { lineLengthM, type LonLat } from './geodesy';

export const KM_PER_NM = 1.852;

export function kmToNm(km: number): number {
	return km / KM_PER_NM;
}

export function nmToKm(nm: number): number {
	return nm * KM_PER_NM;
}

export function knotsToKmH(kn: number): number {
	return kn * KM_PER_NM;
}

/** Hours to cover distanceKm at speedKn (transit, survey line, turn). */
export function hoursAt(distanceKm: number, speedKn: number): number {
	if (!(speedKn > 0)) throw new RangeError('speed must be positive');
	return distanceKm / knotsToKmH(speedKn);
}

/** Length (km) of a route along geodesics and the hours to run it. */
export function routeTime(
	coords: readonly LonLat[],
	speedKn: number
): { km: number; hours: number } {
	const km = lineLengthM(coords) / 1000;
	return { km, hours: hoursAt(km, speedKn) };
}
