// Positions typed by hand, one per row, in any notation the engine's coordinate parser reads
// (decimal degrees, degrees-decimal-minutes, degrees-minutes-seconds, NMEA), turned into the
// geometry of the kind being placed. Errors name the row and the field.
import type { LineString, Point, Polygon } from 'geojson';
import { formatDMM, parseLatLon } from '$lib/engine/formats/coordinates';
import { distanceM } from '$lib/engine/geodesy';
import type { PlanKind } from './types';

export type Typed =
	| { ok: true; geometry: LineString | Polygon | Point; positions: [number, number][] }
	| { ok: false; message: string; row?: number };

const NEEDS: Record<PlanKind, number> = { station: 1, line: 2, ridge: 2, area: 3 };

export function parseTyped(text: string, kind: PlanKind): Typed {
	const rows = text.split(/\r?\n/);
	const positions: [number, number][] = [];
	for (let i = 0; i < rows.length; i++) {
		const row = rows[i].trim();
		if (!row) continue;
		const r = parseLatLon(row);
		if (!r.ok)
			return {
				ok: false,
				row: i + 1,
				message: `Row ${i + 1}, ${r.error.field}: ${r.error.message}`
			};
		positions.push([r.value.lon, r.value.lat]);
	}
	const need = NEEDS[kind];
	if (positions.length < need) {
		const what = need === 1 ? 'one position' : `at least ${need} positions`;
		return { ok: false, message: `Type ${what}, one per row.` };
	}
	if (kind === 'station') {
		if (positions.length > 1) return { ok: false, message: 'A station takes one position.' };
		return { ok: true, positions, geometry: { type: 'Point', coordinates: positions[0] } };
	}
	const geometry = withPositions(kind, positions);
	if (geometry.type === 'Polygon' && geometry.coordinates[0].length < 4)
		return { ok: false, message: 'An area needs three distinct corners.' };
	return { ok: true, positions, geometry };
}

/** A position read back in degrees-decimal-minutes, e.g. "30°12.500′S 145°24.000′W". */
export function formatPosition(lon: number, lat: number): string {
	return `${formatDMM(lat, 'lat')} ${formatDMM(lon, 'lon')}`;
}

/** Typed positions farther than this from everything else on the cruise are questioned. */
export const FAR_KM = 1000;

export type Flip = 'E' | 'W' | 'N' | 'S';

export interface HemisphereDoubt {
	/** How far the typed positions lie from the nearest other position of the cruise (km). */
	distanceKm: number;
	/** The hemisphere letter the flipped positions would carry, e.g. "W". */
	flip: Flip;
	/** The typed positions with that hemisphere flipped, and how far they then lie (km). */
	positions: [number, number][];
	flippedKm: number;
}

function farthestKm(positions: readonly [number, number][], others: readonly number[][]): number {
	// each typed position's distance to its nearest other position; the worst of them counts
	let worst = 0;
	for (const p of positions) {
		let near = Infinity;
		for (const o of others) near = Math.min(near, distanceM(p, o) / 1000);
		worst = Math.max(worst, near);
	}
	return worst;
}

/**
 * A typed position more than FAR_KM from everything else on the cruise is most often a hemisphere
 * slip (E for W, N for S). Returns the flip that brings all the positions within FAR_KM of the
 * rest, the nearest such flip first, or null when the positions are near or no flip helps.
 */
export function hemisphereDoubt(
	positions: readonly [number, number][],
	others: readonly number[][]
): HemisphereDoubt | null {
	if (!others.length || !positions.length) return null;
	const distanceKm = farthestKm(positions, others);
	if (distanceKm <= FAR_KM) return null;
	const [lon0, lat0] = positions[0];
	const flips: { flip: Flip; positions: [number, number][] }[] = [];
	if (lon0 !== 0)
		flips.push({
			flip: lon0 > 0 ? 'W' : 'E',
			positions: positions.map(([lon, lat]) => [-lon, lat])
		});
	if (lat0 !== 0)
		flips.push({
			flip: lat0 > 0 ? 'S' : 'N',
			positions: positions.map(([lon, lat]) => [lon, -lat])
		});
	let best: HemisphereDoubt | null = null;
	for (const f of flips) {
		const flippedKm = farthestKm(f.positions, others);
		if (flippedKm <= FAR_KM && (!best || flippedKm < best.flippedKm))
			best = { distanceKm, flip: f.flip, positions: f.positions, flippedKm };
	}
	return best;
}

/** The same kind of geometry through other positions (used to apply a flip). */
export function withPositions(
	kind: PlanKind,
	positions: [number, number][]
): LineString | Polygon | Point {
	if (kind === 'station') return { type: 'Point', coordinates: positions[0] };
	if (kind === 'area') {
		const ring = [...positions];
		const [a, b] = [ring[0], ring[ring.length - 1]];
		if (a[0] !== b[0] || a[1] !== b[1]) ring.push([a[0], a[1]]);
		return { type: 'Polygon', coordinates: [ring] };
	}
	return { type: 'LineString', coordinates: positions };
}
