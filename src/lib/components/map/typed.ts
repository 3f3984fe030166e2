// Positions typed by hand, one per row, in any notation the engine's coordinate parser reads
// (decimal degrees, degrees-decimal-minutes, degrees-minutes-seconds, NMEA), turned into the
// geometry of the kind being placed. Errors name the row and the field.
import type { LineString, Point, Polygon } from 'geojson';
import { formatDMM, parseLatLon } from '$lib/engine/formats/coordinates';
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
	if (kind === 'area') {
		const ring = [...positions];
		const [a, b] = [ring[0], ring[ring.length - 1]];
		if (a[0] !== b[0] || a[1] !== b[1]) ring.push([a[0], a[1]]);
		if (ring.length < 4) return { ok: false, message: 'An area needs three distinct corners.' };
		return { ok: true, positions, geometry: { type: 'Polygon', coordinates: [ring] } };
	}
	return { ok: true, positions, geometry: { type: 'LineString', coordinates: positions } };
}

/** A position read back in degrees-decimal-minutes, e.g. "30°12.500′S 145°24.000′W". */
export function formatPosition(lon: number, lat: number): string {
	return `${formatDMM(lat, 'lat')} ${formatDMM(lon, 'lon')}`;
}
