import { z } from './messages';

export const vesselSchema = z.object({
	name: z.string().trim().min(2, 'Enter the vessel name.').max(120),
	callSign: z
		.string()
		.trim()
		.toUpperCase()
		.regex(/^[A-Z0-9]{3,9}$/, 'A call sign is 3–9 letters and digits.'),
	scienceBerths: z.number().int('Berths are whole people.').min(1, 'At least one berth.').max(200),
	transitSpeedKn: z.number().positive().max(25, 'Above 25 kn is not a research vessel.'),
	surveySpeedKn: z.number().positive().max(20),
	dayRate: z.number().min(0),
	currency: z
		.string()
		.trim()
		.toUpperCase()
		.regex(/^[A-Z]{3}$/, 'Use a three-letter currency code, e.g. EUR.'),
	swathAngleDeg: z.number().min(60, 'Swath angle is 60–160°.').max(160, 'Swath angle is 60–160°.'),
	swathDepthFactor: z.number().min(1).max(10).default(4),
	winchSpeedMPerMin: z.number().positive().max(150),
	enduranceDays: z.number().int().min(1).max(365)
});
export type VesselInput = z.infer<typeof vesselSchema>;
