// The chart's MapLibre style: sea, Natural Earth land and coastline (world-atlas, shipped with the
// app), predicted-depth shading and isobaths, graticule, and the plan. Labels are drawn from the
// app's own Inter web font through the style's "font-faces", so no glyph server is asked.
import type { FeatureCollection, MultiPolygon, Polygon } from 'geojson';
import type { ExpressionSpecification, LayerSpecification, StyleSpecification } from 'maplibre-gl';
import { feature } from 'topojson-client';
import type { GeometryCollection, Topology } from 'topojson-specification';

export const FONT = 'Inter';

export const EMPTY: FeatureCollection = { type: 'FeatureCollection', features: [] };

/**
 * Source ids the component updates when props change. The plan's labels have their own source
 * (the same data), so lines and stations are drawn without waiting for the label font's glyphs.
 */
export const SOURCES = ['land', 'depth', 'graticule', 'plan', 'plan-labels', 'draft'] as const;

/** Colours of the plan by line purpose and station kind (our own choice). */
export const PURPOSE_COLOURS: Record<string, string> = {
	multibeam: '#1f5d8c',
	magnetics: '#7a3fa0',
	gravity: '#0f7c74',
	seismic: '#9a5a14'
};
export const STATION_COLOURS: Record<string, string> = {
	ctd: '#0b7fb3',
	dredge: '#8a3b12',
	core: '#5b6b1f',
	dive: '#b3124f'
};
export const RIDGE_COLOUR = '#c23a1e';
export const DRAFT_COLOUR = '#e07b00';

/** Land polygons from a world-atlas TopoJSON file (object "land"). */
export function landFromTopology(topology: unknown): FeatureCollection<Polygon | MultiPolygon> {
	const topo = topology as Topology<{ land: GeometryCollection }>;
	const land = feature(topo, topo.objects.land);
	if (land.type === 'FeatureCollection') return land as FeatureCollection<Polygon | MultiPolygon>;
	return { type: 'FeatureCollection', features: [land] } as unknown as FeatureCollection<
		Polygon | MultiPolygon
	>;
}

function match(prop: string, colours: Record<string, string>, fallback: string) {
	return [
		'match',
		['get', prop],
		...Object.entries(colours).flat(),
		fallback
	] as unknown as ExpressionSpecification;
}

const isKind = (kind: string): ExpressionSpecification => ['==', ['get', 'kind'], kind];

/** Predicted depth → shade, shallow pale to deep dark (m). */
export const DEPTH_RAMP: [number, string][] = [
	[2000, '#e3f0f8'],
	[3000, '#b9d7ea'],
	[4000, '#86b6d6'],
	[5000, '#5b93bd'],
	[6000, '#3d6f98']
];

/**
 * The style, with any sources whose data is already known (the saved plan) filled in, so the
 * first frame after the style loads draws them without a second round to the worker.
 */
export function chartStyle(
	fontUrl: string,
	initial: Partial<Record<(typeof SOURCES)[number], FeatureCollection>> = {}
): StyleSpecification {
	const text: { 'text-font': string[]; 'text-size': number } = {
		'text-font': [FONT],
		'text-size': 11
	};
	const layers: LayerSpecification[] = [
		{ id: 'sea', type: 'background', paint: { 'background-color': '#f1f7fb' } },
		{
			id: 'depth-shade',
			type: 'fill',
			source: 'depth',
			filter: isKind('shade'),
			layout: { visibility: 'none' },
			paint: {
				'fill-color': [
					'interpolate',
					['linear'],
					['get', 'depthM'],
					...DEPTH_RAMP.flat()
				] as unknown as ExpressionSpecification,
				'fill-opacity': 0.75
			}
		},
		{
			id: 'isobath',
			type: 'line',
			source: 'depth',
			filter: isKind('isobath'),
			layout: { visibility: 'visible' },
			paint: {
				'line-color': '#2c76ab',
				'line-width': ['case', ['get', 'major'], 1.2, 0.6],
				'line-opacity': 0.8
			}
		},
		{
			id: 'isobath-label',
			type: 'symbol',
			source: 'depth',
			filter: ['all', isKind('isobath'), ['get', 'major']],
			layout: {
				visibility: 'visible',
				...text,
				'text-size': 10,
				'symbol-placement': 'line',
				'text-field': ['get', 'label']
			},
			paint: { 'text-color': '#1f5d8c', 'text-halo-color': '#ffffff', 'text-halo-width': 1.5 }
		},
		{ id: 'land', type: 'fill', source: 'land', paint: { 'fill-color': '#ebe5d6' } },
		{
			id: 'coast',
			type: 'line',
			source: 'land',
			paint: { 'line-color': '#7d735f', 'line-width': 0.8 }
		},
		{
			id: 'graticule',
			type: 'line',
			source: 'graticule',
			paint: { 'line-color': '#667285', 'line-width': 0.5, 'line-opacity': 0.45 }
		},
		{
			id: 'graticule-label',
			type: 'symbol',
			source: 'graticule',
			layout: {
				...text,
				'text-size': 10,
				'symbol-placement': 'line',
				'symbol-spacing': 400,
				'text-field': ['get', 'label']
			},
			paint: { 'text-color': '#434a58', 'text-halo-color': '#f1f7fb', 'text-halo-width': 1.5 }
		},
		{
			id: 'area-fill',
			type: 'fill',
			source: 'plan',
			filter: isKind('area'),
			paint: { 'fill-color': '#2c76ab', 'fill-opacity': 0.08 }
		},
		{
			id: 'area-line',
			type: 'line',
			source: 'plan',
			filter: isKind('area'),
			paint: {
				'line-color': '#1b4b71',
				'line-width': ['case', ['get', 'selected'], 2.5, 1.2],
				'line-dasharray': [3, 2]
			}
		},
		{
			id: 'line-halo',
			type: 'line',
			source: 'plan',
			filter: ['all', ['any', isKind('line'), isKind('ridge')], ['get', 'selected']],
			layout: { 'line-cap': 'round', 'line-join': 'round' },
			paint: { 'line-color': '#fde68a', 'line-width': 9, 'line-opacity': 0.9 }
		},
		{
			id: 'ridge',
			type: 'line',
			source: 'plan',
			filter: isKind('ridge'),
			layout: { 'line-cap': 'round', 'line-join': 'round' },
			paint: { 'line-color': RIDGE_COLOUR, 'line-width': 4 }
		},
		{
			id: 'line',
			type: 'line',
			source: 'plan',
			filter: isKind('line'),
			layout: { 'line-cap': 'round', 'line-join': 'round' },
			paint: {
				'line-color': match('sub', PURPOSE_COLOURS, '#1f5d8c'),
				'line-width': 2
			}
		},
		{
			id: 'line-label',
			type: 'symbol',
			source: 'plan-labels',
			filter: ['any', isKind('line'), isKind('ridge'), isKind('area')],
			layout: {
				...text,
				'symbol-placement': 'line-center',
				'text-field': ['get', 'name'],
				'text-offset': [0, -0.9]
			},
			paint: { 'text-color': '#212429', 'text-halo-color': '#ffffff', 'text-halo-width': 1.5 }
		},
		{
			id: 'station',
			type: 'circle',
			source: 'plan',
			filter: isKind('station'),
			paint: {
				'circle-radius': ['case', ['get', 'selected'], 8, 6],
				'circle-color': match('sub', STATION_COLOURS, '#0b7fb3'),
				'circle-stroke-color': ['case', ['get', 'selected'], '#f59e0b', '#ffffff'],
				'circle-stroke-width': ['case', ['get', 'selected'], 3, 1.5]
			}
		},
		{
			id: 'station-label',
			type: 'symbol',
			source: 'plan-labels',
			filter: isKind('station'),
			layout: {
				...text,
				'text-field': ['get', 'name'],
				// labels move round their station to make room for each other (collision on)
				'text-variable-anchor': ['left', 'right', 'top', 'bottom'],
				'text-radial-offset': 0.9,
				'text-justify': 'auto',
				'symbol-sort-key': ['case', ['get', 'selected'], 0, 1]
			},
			paint: { 'text-color': '#212429', 'text-halo-color': '#ffffff', 'text-halo-width': 1.5 }
		},
		{
			id: 'swath-fill',
			type: 'fill',
			source: 'draft',
			filter: isKind('swath'),
			paint: { 'fill-color': '#0f7c74', 'fill-opacity': 0.18, 'fill-outline-color': '#0f7c74' }
		},
		{
			id: 'draft-fill',
			type: 'fill',
			source: 'draft',
			filter: ['all', ['==', ['geometry-type'], 'Polygon'], ['!', isKind('swath')]],
			paint: { 'fill-color': DRAFT_COLOUR, 'fill-opacity': 0.12 }
		},
		{
			id: 'draft-line',
			type: 'line',
			source: 'draft',
			filter: ['all', ['!=', ['geometry-type'], 'Point'], ['!', isKind('swath')]],
			layout: { 'line-cap': 'round', 'line-join': 'round' },
			paint: {
				'line-color': ['case', isKind('preview'), '#1f5d8c', DRAFT_COLOUR],
				'line-width': ['case', isKind('preview'), 1.5, 3],
				'line-dasharray': [2, 1.5]
			}
		},
		{
			id: 'draft-point',
			type: 'circle',
			source: 'draft',
			filter: ['==', ['geometry-type'], 'Point'],
			paint: {
				'circle-radius': 8,
				'circle-color': '#ffffff',
				'circle-stroke-color': DRAFT_COLOUR,
				'circle-stroke-width': 3
			}
		}
	];
	return {
		version: 8,
		'font-faces': { [FONT]: [{ url: fontUrl }] },
		sources: Object.fromEntries(
			SOURCES.map((id) => [id, { type: 'geojson', data: initial[id] ?? EMPTY }])
		) as StyleSpecification['sources'],
		layers
	};
}

/** Layers the user can click to pick a saved feature. */
export const PICKABLE_LAYERS = ['station', 'line', 'ridge', 'area-fill'];
