// Saving plan edits through the API, and undoing the last one. Each saved edit is remembered with
// what it replaced, so its inverse can be sent back (a re-created feature gets a new id).
import type { Geometry } from 'geojson';
import type { PlanFeature, PlanKind } from './types';

export interface ApiRequest {
	method: 'POST' | 'PATCH' | 'DELETE';
	path: string;
	body?: unknown;
}

export type PlanEdit =
	| { op: 'create'; features: PlanFeature[] }
	| { op: 'update'; before: PlanFeature; after: PlanFeature }
	| { op: 'delete'; feature: PlanFeature }
	| { op: 'bulk'; before: PlanFeature[] };

const KIND_WORDS: Record<PlanKind, string> = {
	ridge: 'ridge segment',
	line: 'line',
	area: 'survey area',
	station: 'station'
};

const featuresPath = (cruiseId: string) => `/api/v1/cruises/${cruiseId}/plan/features`;

/** The settings of a feature as the API takes them (server-computed values left out). */
export function settingsOf(f: PlanFeature): Record<string, unknown> {
	const p = f.properties;
	switch (p.kind) {
		case 'ridge':
			return {
				fullRateMmYr: p.fullRateMmYr,
				asymmetry: p.asymmetry,
				potentialTemperatureC: p.potentialTemperatureC,
				axialDepthM: p.axialDepthM
			};
		case 'line':
			return {
				purpose: p.purpose,
				surveySpeedKn: p.surveySpeedKn,
				overlapPct: p.overlapPct,
				ihoOrder: p.ihoOrder
			};
		case 'area':
			return { overlapPct: p.overlapPct, surveySpeedKn: p.surveySpeedKn };
		case 'station':
			return { stationKind: p.stationKind, params: p.params };
	}
}

export function createRequest(
	cruiseId: string,
	kind: PlanKind,
	name: string,
	geometry: Geometry,
	properties: Record<string, unknown>
): ApiRequest {
	return {
		method: 'POST',
		path: featuresPath(cruiseId),
		body: { kind, name, geometry, properties }
	};
}

/** Requests that take the plan back to before `edit`. */
export function inverseRequests(cruiseId: string, edit: PlanEdit): ApiRequest[] {
	switch (edit.op) {
		case 'create':
			return edit.features.map((f) => ({
				method: 'DELETE',
				path: `${featuresPath(cruiseId)}/${encodeURIComponent(f.id)}`
			}));
		case 'update':
			return [
				{
					method: 'PATCH',
					path: `${featuresPath(cruiseId)}/${encodeURIComponent(edit.before.id)}`,
					body: {
						name: edit.before.properties.name,
						geometry: edit.before.geometry,
						properties: settingsOf(edit.before)
					}
				}
			];
		case 'delete':
			return [
				createRequest(
					cruiseId,
					edit.feature.properties.kind,
					edit.feature.properties.name,
					edit.feature.geometry,
					settingsOf(edit.feature)
				)
			];
		case 'bulk':
			return edit.before.map((f) => ({
				method: 'PATCH',
				path: `${featuresPath(cruiseId)}/${encodeURIComponent(f.id)}`,
				body: { properties: settingsOf(f) }
			}));
	}
}

/** "add line N-X6", "move station CTD-01", "bulk edit of 3 lines". */
export function describeEdit(edit: PlanEdit): string {
	switch (edit.op) {
		case 'create': {
			if (edit.features.length === 1) {
				const [f] = edit.features;
				return `add ${KIND_WORDS[f.properties.kind]} ${f.properties.name}`;
			}
			const lines = edit.features.filter((f) => f.properties.kind === 'line').length;
			const parts = edit.features
				.filter((f) => f.properties.kind !== 'line')
				.map((f) => `${KIND_WORDS[f.properties.kind]} ${f.properties.name}`);
			if (lines) parts.push(`${lines} line${lines === 1 ? '' : 's'}`);
			return `add ${parts.join(' and ')}`;
		}
		case 'update':
			return `change ${KIND_WORDS[edit.after.properties.kind]} ${edit.after.properties.name}`;
		case 'delete':
			return `delete ${KIND_WORDS[edit.feature.properties.kind]} ${edit.feature.properties.name}`;
		case 'bulk':
			return `bulk edit of ${edit.before.length} line${edit.before.length === 1 ? '' : 's'}`;
	}
}

export class ApiFailure extends Error {
	constructor(
		readonly status: number,
		message: string,
		readonly details?: { field?: string; message: string }[]
	) {
		super(message);
	}
}

/** Sends one request; the JSON answer, or an ApiFailure with the API's own message. */
export async function send<T = unknown>(
	req: ApiRequest,
	fetcher: typeof fetch = fetch
): Promise<T> {
	const res = await fetcher(req.path, {
		method: req.method,
		headers: req.body === undefined ? undefined : { 'content-type': 'application/json' },
		body: req.body === undefined ? undefined : JSON.stringify(req.body)
	});
	if (res.status === 204) return undefined as T;
	const data = (await res.json().catch(() => null)) as {
		error?: { message?: string; details?: { field?: string; message: string }[] };
	} | null;
	if (!res.ok) {
		throw new ApiFailure(
			res.status,
			data?.error?.message ?? `The server answered ${res.status}.`,
			data?.error?.details
		);
	}
	return data as T;
}
