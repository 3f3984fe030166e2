// Reads a list of positions typed or pasted by a user: one "lat, lon" per row in any notation the
// coordinate parser knows, or a GeoJSON LineString / coordinate array. Says which row is wrong.
import { parseLatLon } from '$lib/engine/formats/coordinates';

export type Positions =
	{ ok: true; positions: [number, number][] } | { ok: false; message: string };

export function parsePositions(text: string, what: string): Positions {
	const trimmed = text.trim();
	if (!trimmed) return { ok: false, message: `The ${what} is empty.` };
	if (trimmed.startsWith('{') || trimmed.startsWith('[')) {
		try {
			const v = JSON.parse(trimmed);
			const coords = Array.isArray(v)
				? v
				: v?.type === 'LineString'
					? v.coordinates
					: v?.geometry?.coordinates;
			if (!Array.isArray(coords))
				return { ok: false, message: `The ${what}: expected a GeoJSON LineString.` };
			return { ok: true, positions: coords.map((c: number[]) => [c[0], c[1]] as [number, number]) };
		} catch (e) {
			return { ok: false, message: `The ${what} is not valid JSON: ${(e as Error).message}` };
		}
	}
	const positions: [number, number][] = [];
	const rows = trimmed.split(/\r?\n/);
	for (let i = 0; i < rows.length; i++) {
		const row = rows[i].trim();
		if (!row) continue;
		const r = parseLatLon(row);
		if (!r.ok) return { ok: false, message: `The ${what}, row ${i + 1}: ${r.error.message}` };
		positions.push([r.value.lon, r.value.lat]);
	}
	if (positions.length < 2)
		return { ok: false, message: `The ${what} needs at least two positions.` };
	return { ok: true, positions };
}
