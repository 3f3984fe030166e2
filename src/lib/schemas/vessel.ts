import { z } from './messages';
import { bounded } from './limits';

export const vesselSchema = z.object({
	name: z.string().trim().min(2, 'Enter the vessel name.').max(120),
	callSign: z
		.string()
		.trim()
		.toUpperCase()
		.regex(/^[A-Z0-9]{3,9}$/, 'A call sign is 3–9 letters and digits.'),
	scienceBerths: bounded('scienceBerths').int('Berths are whole people.'),
	transitSpeedKn: bounded('transitSpeedKn'),
	surveySpeedKn: bounded('surveySpeedKn'),
	dayRate: bounded('dayRate'),
	currency: z
		.string()
		.trim()
		.toUpperCase()
		.regex(/^[A-Z]{3}$/, 'Use a three-letter currency code, e.g. EUR.'),
	swathAngleDeg: bounded('swathAngleDeg'),
	swathDepthFactor: bounded('swathDepthFactor').default(4),
	winchSpeedMPerMin: bounded('winchSpeedMPerMin'),
	enduranceDays: bounded('enduranceDays').int('Whole days.')
});
export type VesselInput = z.infer<typeof vesselSchema>;
