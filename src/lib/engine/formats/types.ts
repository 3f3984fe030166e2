/**
 * The interchange plan document: what every format reads and writes. Positions are [lon, lat]
 * in WGS84 decimal degrees (GeoJSON order), longitudes in [−180, 180).
 */

export type LonLat = [number, number];

export const LINE_PURPOSES = ['multibeam', 'magnetics', 'gravity', 'seismic'] as const;
export const IHO_ORDERS = ['exclusive', 'special', '1a', '1b', '2'] as const;
export const STATION_KINDS = ['ctd', 'dredge', 'core', 'dive'] as const;
export const ITEM_KINDS = ['ridge', 'line', 'area', 'station'] as const;

export type LinePurpose = (typeof LINE_PURPOSES)[number];
export type IhoOrder = (typeof IHO_ORDERS)[number];
export type StationKind = (typeof STATION_KINDS)[number];
export type ItemKind = (typeof ITEM_KINDS)[number];

export interface PlanRidge {
	id?: string;
	name: string;
	axis: LonLat[];
	fullRateMmYr: number;
	/** Share of the full rate on the left flank walking along the axis, 0..1. */
	asymmetry?: number;
	potentialTemperatureC?: number | null;
	axialDepthM?: number | null;
}

export interface LineComputed {
	lengthKm: number;
	durationH: number;
	minDepthM: number;
	maxDepthM: number;
}

export interface PlanLine {
	id?: string;
	name: string;
	coords: LonLat[];
	purpose: LinePurpose;
	surveySpeedKn: number;
	overlapPct: number;
	ihoOrder: IhoOrder;
	computed?: LineComputed;
	/** Predicted depth (m) at each vertex, where a ridge makes it known. */
	vertexDepthsM?: (number | null)[];
	/** UTC, ISO 8601. */
	plannedStart?: string;
	plannedEnd?: string;
}

export interface PlanArea {
	id?: string;
	name: string;
	/** Open ring: the first vertex is not repeated at the end (writers close it, readers open it). */
	ring: LonLat[];
	overlapPct: number;
	surveySpeedKn: number;
}

export interface StationComputed {
	depthM: number;
	durationH: number;
}

export interface PlanStation {
	id?: string;
	name: string;
	kind: StationKind;
	position: LonLat;
	params: Record<string, number | string>;
	computed?: StationComputed;
	plannedStart?: string;
	plannedEnd?: string;
}

export interface PlanDoc {
	/** Route/cruise name; the RTZ route name and every export's file name come from it. */
	name: string;
	ridges: PlanRidge[];
	/** Lines and stations are each in plan order; see `order` for how they interleave. */
	lines: PlanLine[];
	areas: PlanArea[];
	stations: PlanStation[];
	/**
	 * Optional cruise order of lines and stations, e.g. [{kind:'line',index:0},{kind:'station',
	 * index:0}]. Without it the route runs all lines, then all stations.
	 */
	order?: PlanOrderEntry[];
	/** Who and what the plan is for; written where a format has room (GeoJSON foreign members). */
	meta?: PlanMeta;
}

export interface PlanMeta {
	cruise: { code: string; title: string };
	vessel: { name: string; callSign: string | null } | null;
	depthModel: string;
	/** Planned sailing and return (with the weather margin), UTC ISO 8601. */
	departureAt?: string;
	backInPortAt?: string;
}

export interface PlanOrderEntry {
	kind: 'line' | 'station';
	/** Index into `lines` or `stations`. */
	index: number;
	/** A line run from its last vertex to its first. */
	reversed?: boolean;
}

export interface ImportProblem {
	/** Where in the file, e.g. "line 12", "feature 3", "rtept 4". */
	where: string;
	field?: string;
	message: string;
	/** 'error': the part was left out; 'warning': it was read, with a default or a repair. */
	severity?: 'error' | 'warning';
}

export interface ImportResult {
	/** Only the valid parts. */
	plan: PlanDoc;
	problems: ImportProblem[];
}

export const FORMATS = ['geojson', 'gpx', 'kml', 'csv', 'rtz'] as const;
export type FormatId = (typeof FORMATS)[number];

export interface ExportedFile {
	filename: string;
	mimeType: string;
	body: string;
}
