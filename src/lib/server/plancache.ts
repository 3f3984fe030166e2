// Computed plan values (line lengths, times and depth ranges; station depths and durations) cached
// per plan revision: the key is a hash of everything they depend on (depth model, vessel, ridges,
// line and station geometry and settings), so any edit anywhere starts a new revision and readers
// of an unchanged plan share one computation. Computed in the engine pool, off the event loop.
import { createHash } from 'node:crypto';
import * as enginePool from './engine-pool';
import { planValues, type PlanValues, type PlanValuesInput } from './engine-tasks';

export type { PlanValues };

const MAX_ENTRIES = 256;
const cache = new Map<string, PlanValues | Promise<PlanValues>>();

const byId = <T extends { id: string }>(a: T, b: T) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0);

/**
 * Only what the values depend on crosses to the worker and into the key, in id order so that
 * callers listing the plan in different orders share one revision.
 */
function slim(r: PlanValuesInput): PlanValuesInput {
	return {
		cruise: { depthModel: r.cruise.depthModel },
		vessel: r.vessel,
		ridges: [...r.ridges].sort(byId),
		lines: [...r.lines]
			.sort(byId)
			.map((l) => ({ id: l.id, coords: l.coords, surveySpeedKn: l.surveySpeedKn })),
		stations: [...r.stations].sort(byId).map((s) => ({
			id: s.id,
			kind: s.kind,
			lon: s.lon,
			lat: s.lat,
			params: s.params
		}))
	};
}

export function revisionKey(s: PlanValuesInput): string {
	const v = s.vessel;
	return createHash('sha256')
		.update(
			JSON.stringify([
				s.cruise.depthModel,
				v && [
					v.swathAngleDeg,
					v.swathDepthFactor,
					v.surveySpeedKn,
					v.transitSpeedKn,
					v.winchSpeedMPerMin
				],
				s.ridges.map((x) => [
					x.axis,
					x.fullRateMmYr,
					x.asymmetry,
					x.potentialTemperatureC,
					x.axialDepthM
				]),
				s.lines,
				s.stations
			])
		)
		.digest('base64url');
}

function remember(key: string, v: PlanValues | Promise<PlanValues>) {
	cache.delete(key);
	cache.set(key, v);
	if (cache.size > MAX_ENTRIES) cache.delete(cache.keys().next().value!);
}

/** The plan's computed values, from the cache or the engine pool (within its time budget). */
export async function values(rows: PlanValuesInput): Promise<PlanValues> {
	const s = slim(rows);
	const key = revisionKey(s);
	const hit = cache.get(key);
	if (hit) return hit;
	const pending = enginePool.run('planValues', s);
	remember(key, pending);
	try {
		const v = await pending;
		if (cache.get(key) === pending) remember(key, v);
		return v;
	} catch (e) {
		if (cache.get(key) === pending) cache.delete(key);
		throw e;
	}
}

/**
 * The same on the calling thread, for synchronous callers (the timeline); uses and fills the
 * same cache, so after the plan was read once it costs a hash. Bounded by the shared input limits.
 */
export function valuesSync(rows: PlanValuesInput): PlanValues {
	const s = slim(rows);
	const key = revisionKey(s);
	const hit = cache.get(key);
	if (hit && !(hit instanceof Promise)) return hit;
	const v = planValues(s);
	remember(key, v);
	return v;
}

export function clear(): void {
	cache.clear();
}
