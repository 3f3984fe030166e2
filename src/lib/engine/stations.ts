/**
 * Station durations from water depth and vessel settings (SCIENCE.md §6). All defaults are
 * planning assumptions [trade] the user can change; results in minutes or hours as named.
 */

export interface CtdOptions {
	/** Winch speed below the slow zone (m/min); CalCOFI procedures use 50–60. */
	wireSpeedMPerMin?: number;
	/** Top of the downcast run slowly (m) and its speed (m/min): 100 m at 30 m/min (CalCOFI). */
	slowZoneM?: number;
	slowSpeedMPerMin?: number;
	/** Bottle stops on the upcast and minutes per stop. */
	bottleStops?: number;
	bottleStopMin?: number;
	/** Deck time: recovery, sampling, redeploy (min). */
	deckMin?: number;
}

export const CTD_DEFAULTS: Required<CtdOptions> = Object.freeze({
	wireSpeedMPerMin: 60,
	slowZoneM: 100,
	slowSpeedMPerMin: 30,
	bottleStops: 0,
	bottleStopMin: 2,
	deckMin: 30
});

export interface CtdDuration {
	downMin: number;
	upMin: number;
	wireMin: number;
	bottleMin: number;
	deckMin: number;
	totalMin: number;
}

/**
 * CTD cast to castDepthM of wire: down (slow zone, then wire speed) + up at wire speed + bottle
 * stops + deck time.
 */
export function ctdDuration(castDepthM: number, options: CtdOptions = {}): CtdDuration {
	const o = { ...CTD_DEFAULTS, ...options };
	const depth = Math.max(0, castDepthM);
	const slow = Math.min(depth, o.slowZoneM);
	const downMin = slow / o.slowSpeedMPerMin + (depth - slow) / o.wireSpeedMPerMin;
	const upMin = depth / o.wireSpeedMPerMin;
	const bottleMin = o.bottleStops * o.bottleStopMin;
	const wireMin = downMin + upMin;
	return {
		downMin,
		upMin,
		wireMin,
		bottleMin,
		deckMin: o.deckMin,
		totalMin: wireMin + bottleMin + o.deckMin
	};
}

export interface DredgeOptions {
	winchSpeedMPerMin?: number;
	/** Wire paid out per metre of depth while dredging (scope). */
	wireScope?: number;
	/** On the bottom, including a drag of about 1 km (h). */
	bottomH?: number;
	deckH?: number;
}

export const DREDGE_DEFAULTS: Required<DredgeOptions> = Object.freeze({
	winchSpeedMPerMin: 60,
	wireScope: 1.5,
	bottomH: 1.5,
	deckH: 1
});

/** Rock dredge (h): wire down + up at winch speed (depth × scope) + bottom time + deck time. */
export function dredgeHours(depthM: number, options: DredgeOptions = {}): number {
	const o = { ...DREDGE_DEFAULTS, ...options };
	const wireH = (2 * Math.max(0, depthM) * o.wireScope) / o.winchSpeedMPerMin / 60;
	return wireH + o.bottomH + o.deckH;
}

export interface CoreOptions {
	winchSpeedMPerMin?: number;
	/** Penetration and pull-out (h). */
	bottomH?: number;
	/** Rigging, recovery and core handling (h). */
	deckH?: number;
}

export const CORE_DEFAULTS: Required<CoreOptions> = Object.freeze({
	winchSpeedMPerMin: 60,
	bottomH: 0.25,
	deckH: 1.5
});

/** Gravity or piston core (h): wire down + up + bottom + deck. */
export function coreHours(depthM: number, options: CoreOptions = {}): number {
	const o = { ...CORE_DEFAULTS, ...options };
	return (2 * Math.max(0, depthM)) / o.winchSpeedMPerMin / 60 + o.bottomH + o.deckH;
}

export type VehicleKind = 'crewed' | 'rov' | 'auv';

/** Fixed dive blocks including launch and recovery (h); a crewed dive takes 6–10 h [trade]. */
export const VEHICLE_BLOCK_HOURS: Readonly<Record<VehicleKind, number>> = Object.freeze({
	crewed: 8,
	rov: 12,
	auv: 16
});

export function vehicleDiveHours(kind: VehicleKind, blockH?: number): number {
	return blockH ?? VEHICLE_BLOCK_HOURS[kind];
}

export type StationKind = 'ctd' | 'dredge' | 'core' | 'dive';

export interface StationSettings {
	/** Vessel winch speed (m/min), used for every wire station. */
	winchSpeedMPerMin?: number;
	ctd?: CtdOptions;
	dredge?: DredgeOptions;
	core?: CoreOptions;
	vehicle?: VehicleKind;
	diveBlockH?: number;
	/** CTD stops this far above the seafloor (m). */
	ctdOffBottomM?: number;
}

/** Duration (h) of a station of `kind` at a predicted depth, using the vessel's winch speed. */
export function stationHours(kind: StationKind, depthM: number, s: StationSettings = {}): number {
	const winch = s.winchSpeedMPerMin;
	switch (kind) {
		case 'ctd': {
			const cast = Math.max(0, depthM - (s.ctdOffBottomM ?? 10));
			const opts = winch ? { wireSpeedMPerMin: winch, ...s.ctd } : s.ctd;
			return ctdDuration(cast, opts).totalMin / 60;
		}
		case 'dredge':
			return dredgeHours(depthM, winch ? { winchSpeedMPerMin: winch, ...s.dredge } : s.dredge);
		case 'core':
			return coreHours(depthM, winch ? { winchSpeedMPerMin: winch, ...s.core } : s.core);
		case 'dive':
			return vehicleDiveHours(s.vehicle ?? 'crewed', s.diveBlockH);
	}
}

const numbers = (params: Readonly<Record<string, number | string | null>>) =>
	Object.fromEntries(
		Object.entries(params).filter((e): e is [string, number] => typeof e[1] === 'number')
	);

/**
 * A station's own parameters (as stored with it: numbers by option name, `vehicle` for dives) on
 * top of the vessel's winch speed, as `stationHours` takes them. Browser and server share this.
 */
export function stationSettings(
	kind: StationKind,
	params: Readonly<Record<string, number | string | null>>,
	winchSpeedMPerMin: number
): StationSettings {
	const own = numbers(params);
	const vehicle = params.vehicle;
	switch (kind) {
		case 'ctd':
			return { winchSpeedMPerMin, ctd: own, ctdOffBottomM: own.offBottomM };
		case 'dredge':
			return { winchSpeedMPerMin, dredge: own };
		case 'core':
			return { winchSpeedMPerMin, core: own };
		case 'dive':
			return {
				winchSpeedMPerMin,
				diveBlockH: own.blockH,
				vehicle:
					vehicle === 'rov' || vehicle === 'auv' || vehicle === 'crewed' ? vehicle : undefined
			};
	}
}
