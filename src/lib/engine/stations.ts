/**
 * Station durations from water depth and vessel settings (SCIENCE.md §6). Times in hours, depths in
 * metres, wire speeds in metres per minute.
 */

export type StationKind = 'ctd' | 'dredge' | 'core' | 'dive';

export interface WinchSettings {
	/** Wire speed of the vessel's winch, m/min. */
	winchSpeedMPerMin?: number;
}

export interface CtdParams extends WinchSettings {
	/** Slow wire speed near the surface, m/min (CalCOFI procedures: 30 m/min for the first 100 m). */
	slowSpeedMPerMin?: number;
	slowFirstM?: number;
	/** The rosette stops this far above the seafloor (m). */
	altitudeM?: number;
	bottleStops?: number;
	bottleStopMin?: number;
	deckMin?: number;
}

const num = (v: unknown, fallback: number) =>
	typeof v === 'number' && Number.isFinite(v) ? v : fallback;

/** Minutes on the wire for a cast to `castM`: slow through the first metres, then at speed; both ways. */
export function wireMinutes(
	castM: number,
	speedMPerMin: number,
	slowFirstM = 0,
	slowSpeedMPerMin = speedMPerMin
): number {
	if (!(speedMPerMin > 0) || !(slowSpeedMPerMin > 0))
		throw new RangeError('wire speed must be above 0');
	const slow = Math.min(castM, slowFirstM);
	const oneWay = slow / slowSpeedMPerMin + (castM - slow) / speedMPerMin;
	return 2 * oneWay;
}

/**
 * CTD cast: wire down and up (slow through the first 100 m, CalCOFI), bottle stops on the way up,
 * deck time. Defaults 60 m/min and 30 min on deck [trade].
 */
export function ctdDurationH(depthM: number, p: CtdParams = {}): number {
	const speed = num(p.winchSpeedMPerMin, 60);
	const cast = Math.max(0, depthM - num(p.altitudeM, 10));
	const wire = wireMinutes(cast, speed, num(p.slowFirstM, 100), num(p.slowSpeedMPerMin, 30));
	const stops = num(p.bottleStops, 12) * num(p.bottleStopMin, 2);
	return (wire + stops + num(p.deckMin, 30)) / 60;
}

export interface DredgeParams extends WinchSettings {
	/** Wire paid out per metre of depth, for the drag (trade: about 1.5). */
	scope?: number;
	/** Time dragging on the bottom, h (SCIENCE.md §6 default 1.5 h for about 1 km). */
	bottomH?: number;
	deckH?: number;
}

/** Rock dredge: wire out to depth × scope and back at winch speed, time on the bottom, deck time. */
export function dredgeDurationH(depthM: number, p: DredgeParams = {}): number {
	const wire = wireMinutes(depthM * num(p.scope, 1.5), num(p.winchSpeedMPerMin, 60));
	return wire / 60 + num(p.bottomH, 1.5) + num(p.deckH, 1);
}

export interface CoreParams extends WinchSettings {
	/** Time to settle, penetrate and pull out, h. */
	bottomH?: number;
	deckH?: number;
}

/** Gravity or piston core: down and up at winch speed, a short time at the bottom, deck time. */
export function coreDurationH(depthM: number, p: CoreParams = {}): number {
	const wire = wireMinutes(depthM, num(p.winchSpeedMPerMin, 60));
	return wire / 60 + num(p.bottomH, 0.5) + num(p.deckH, 1);
}

export interface DiveParams {
	/** The whole dive block including launch and recovery, h (crewed dives 6–10 h [trade]). */
	blockH?: number;
}

/** Vehicle dive: a fixed block; weather-limited, so plan it where the margin can absorb a loss. */
export function diveDurationH(p: DiveParams = {}): number {
	return num(p.blockH, 8);
}

/** Duration of a station of any kind at this depth; `params` are the station's own settings. */
export function stationDurationH(
	kind: StationKind,
	depthM: number,
	params: Record<string, number | string> = {},
	vessel: WinchSettings = {}
): number {
	const p = { winchSpeedMPerMin: vessel.winchSpeedMPerMin, ...params } as Record<string, unknown>;
	switch (kind) {
		case 'ctd':
			return ctdDurationH(depthM, p as CtdParams);
		case 'dredge':
			return dredgeDurationH(depthM, p as DredgeParams);
		case 'core':
			return coreDurationH(depthM, p as CoreParams);
		case 'dive':
			return diveDurationH(p as DiveParams);
	}
}
