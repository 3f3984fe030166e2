// Graticule lines for the chart: meridians and parallels at a step that suits the view, labelled
// in degrees and whole minutes. Longitudes may run past ±180 (an unwrapped view across the
// antimeridian); labels always show the normalised longitude.
import type { Feature, FeatureCollection, LineString } from 'geojson';
import { formatDMM, normalizeLon } from '$lib/engine/formats/coordinates';

/** Steps in degrees, coarse to fine: 30°, 20°, 10°, 5°, 2°, 1°, 30′, 15′, 10′, 5′, 2′, 1′. */
export const GRATICULE_STEPS = [30, 20, 10, 5, 2, 1, 1 / 2, 1 / 4, 1 / 6, 1 / 12, 1 / 30, 1 / 60];

/** Web Mercator's latitude limit; the globe view can go to the poles. */
export const MERCATOR_MAX_LAT = 85.0511;

export interface ViewBounds {
	west: number;
	south: number;
	east: number;
	north: number;
}

/** The finest step that keeps at most `maxLines` lines across the wider side of the view. */
export function graticuleStep(bounds: ViewBounds, maxLines = 8): number {
	const span = Math.max(bounds.east - bounds.west, bounds.north - bounds.south);
	for (let i = GRATICULE_STEPS.length - 1; i >= 0; i--) {
		if (span / GRATICULE_STEPS[i] <= maxLines) return GRATICULE_STEPS[i];
	}
	return GRATICULE_STEPS[0];
}

/** "30°S", "145°15′W": degrees, with whole minutes only when the value has them. */
export function graticuleLabel(value: number, axis: 'lat' | 'lon'): string {
	const v = axis === 'lon' ? normalizeLon(value) : value;
	if (Math.abs(v) < 1e-9 && axis === 'lat') return '0°';
	if (axis === 'lon' && (Math.abs(v) < 1e-9 || Math.abs(Math.abs(v) - 180) < 1e-9)) {
		return Math.abs(v) < 1e-9 ? '0°' : '180°';
	}
	return formatDMM(v, axis, { decimals: 0 }).replace('°00′', '°');
}

/** Points per parallel, so it curves on the globe and is not cut short on Mercator. */
const PARALLEL_POINTS = 64;

/**
 * Meridians and parallels covering `bounds` (with one step of margin) at `step` degrees; at most
 * 400 lines whatever is asked.
 */
export function graticule(
	bounds: ViewBounds,
	step: number,
	maxLat = MERCATOR_MAX_LAT
): FeatureCollection<LineString, { axis: 'lat' | 'lon'; label: string }> {
	const features: Feature<LineString, { axis: 'lat' | 'lon'; label: string }>[] = [];
	const south = Math.max(-maxLat, bounds.south - step);
	const north = Math.min(maxLat, bounds.north + step);
	const west = Math.max(bounds.west - step, bounds.east - step - 720);
	const east = bounds.east + step;
	const first = (x: number) => Math.ceil(x / step - 1e-9);
	const last = (x: number) => Math.floor(x / step + 1e-9);
	const i0 = first(west);
	const i1 = Math.min(last(east), i0 + 200);
	for (let i = i0; i <= i1; i++) {
		const lon = round(i * step);
		features.push({
			type: 'Feature',
			properties: { axis: 'lon', label: graticuleLabel(lon, 'lon') },
			geometry: {
				type: 'LineString',
				coordinates: [
					[lon, south],
					[lon, north]
				]
			}
		});
	}
	const j0 = first(south);
	const j1 = Math.min(last(north), j0 + 200);
	for (let j = j0; j <= j1; j++) {
		const lat = round(j * step);
		if (Math.abs(lat) > maxLat) continue;
		const coordinates: number[][] = [];
		for (let k = 0; k <= PARALLEL_POINTS; k++) {
			coordinates.push([round(west + ((east - west) * k) / PARALLEL_POINTS), lat]);
		}
		features.push({
			type: 'Feature',
			properties: { axis: 'lat', label: graticuleLabel(lat, 'lat') },
			geometry: { type: 'LineString', coordinates }
		});
	}
	return { type: 'FeatureCollection', features };
}

/** Trim float noise from multiples of a fractional step (e.g. 7 × 1/12). */
function round(x: number): number {
	return Math.round(x * 1e9) / 1e9;
}
