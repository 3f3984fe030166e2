// Named heavy engine computations the worker pool runs (src/lib/server/engine-pool.ts). Each task
// is a pure function of structured-cloneable input; add a task here and it can be run with
// `enginePool.run('name', input)`. Imports stay within the engine (no DB, env or Svelte).
import { depthGrid, depthProfile, type BBox, type DepthProfileInput } from '$lib/engine/profile';
import type { DepthModelId } from '$lib/engine/depth';
import type { RidgeInput } from '$lib/engine/profile';
import {
	computeLine,
	computeStation,
	planSettings,
	type LineValues,
	type StationValues
} from './plancompute';
import type { Cruise, RidgeSegment, Station, SurveyLine, Vessel } from './db/schema';

/** What the plan's derived values depend on: everything else in the plan is not read. */
export interface PlanValuesInput {
	cruise: Pick<Cruise, 'depthModel'>;
	vessel: Vessel | null;
	ridges: RidgeSegment[];
	lines: Pick<SurveyLine, 'id' | 'coords' | 'surveySpeedKn'>[];
	stations: Pick<Station, 'id' | 'kind' | 'lon' | 'lat' | 'params'>[];
}

export interface PlanValues {
	lines: Record<string, LineValues>;
	stations: Record<string, StationValues>;
}

export function planValues(input: PlanValuesInput): PlanValues {
	const s = planSettings(input);
	const out: PlanValues = { lines: {}, stations: {} };
	for (const l of input.lines) out.lines[l.id] = computeLine(l, s);
	for (const st of input.stations) out.stations[st.id] = computeStation(st, s);
	return out;
}

export const tasks = {
	depthProfile: (input: DepthProfileInput) => depthProfile(input),
	planValues,
	depthGrid: (input: {
		bbox: BBox;
		nx: number;
		ny: number;
		ridges: RidgeInput[];
		model?: DepthModelId;
	}) => depthGrid(input.bbox, input.nx, input.ny, input.ridges, { model: input.model }),
	/** Busy-waits `ms` (tests of the time budget and of the event loop staying free). */
	spin: (input: { ms: number }) => {
		const end = Date.now() + Math.min(input.ms, 60_000);
		let n = 0;
		while (Date.now() < end) n++;
		return n;
	}
};

export type EngineTasks = typeof tasks;
export type TaskName = keyof EngineTasks;

/** What crosses back from a worker: a value, or an input error the route turns into a 422. */
export type TaskOutcome<T> = { ok: true; value: T } | { ok: false; field: string; message: string };
