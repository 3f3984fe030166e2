// The plan as the API serves it (GET /api/v1/cruises/{id}/plan): a GeoJSON FeatureCollection whose
// features carry their row id and kind, plus the cruise settings the chart needs.
import type { Feature, FeatureCollection, LineString, Point, Polygon } from 'geojson';
import type { IhoOrder, LinePurpose, StationKind } from '$lib/engine/formats/types';

export type PlanKind = 'ridge' | 'line' | 'area' | 'station';

export interface RidgeProps {
	kind: 'ridge';
	name: string;
	fullRateMmYr: number;
	asymmetry: number;
	potentialTemperatureC: number | null;
	axialDepthM: number | null;
}

export interface LineProps {
	kind: 'line';
	name: string;
	purpose: LinePurpose;
	surveySpeedKn: number;
	overlapPct: number;
	ihoOrder: IhoOrder;
	areaId?: string | null;
	/** Server-computed on save. */
	lengthKm?: number;
	durationH?: number;
	minDepthM?: number;
	maxDepthM?: number;
}

export interface AreaProps {
	kind: 'area';
	name: string;
	overlapPct: number;
	surveySpeedKn: number;
}

export interface StationProps {
	kind: 'station';
	name: string;
	stationKind: StationKind;
	params: Record<string, number | string>;
	depthM?: number;
	durationH?: number;
}

export type RidgeFeature = Feature<LineString, RidgeProps> & { id: string };
export type LineFeature = Feature<LineString, LineProps> & { id: string };
export type AreaFeature = Feature<Polygon, AreaProps> & { id: string };
export type StationFeature = Feature<Point, StationProps> & { id: string };
export type PlanFeature = RidgeFeature | LineFeature | AreaFeature | StationFeature;

export interface PlanVessel {
	swathAngleDeg: number;
	swathDepthFactor: number;
	surveySpeedKn: number;
	transitSpeedKn: number;
	winchSpeedMPerMin: number;
}

export interface PlanCruise {
	id: string;
	code: string;
	depthModel: string;
	canEdit: boolean;
	vessel: PlanVessel | null;
}

export interface PlanCollection extends FeatureCollection {
	features: PlanFeature[];
	cruise: PlanCruise;
}

/** Settings a new feature of each kind starts with (the form fills them in). */
export type PlanProps = RidgeProps | LineProps | AreaProps | StationProps;

/** A geometry the user is drawing, typing or editing, not yet saved. */
export interface Draft {
	/** Changes when a new draft starts (not on vertex edits), so the map reloads its editor. */
	key: number;
	kind: PlanKind;
	/** Row id when the draft edits a saved feature. */
	featureId: string | null;
	geometry: LineString | Polygon | Point;
	/** Where it came from: drawn shapes are already in the editor; typed ones must be loaded. */
	origin: 'drawn' | 'typed' | 'saved' | 'generated';
}
