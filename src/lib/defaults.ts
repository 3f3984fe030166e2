/** Vessel settings used when a cruise has no vessel yet [trade]; shared by browser and server. */
export const DEFAULT_VESSEL = {
	swathAngleDeg: 130,
	swathDepthFactor: 4,
	surveySpeedKn: 8,
	transitSpeedKn: 10,
	winchSpeedMPerMin: 60
} as const;
