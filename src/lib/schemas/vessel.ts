import { z } from 'zod';
import { bounded } from './limits';

export const vesselSchema = z.object({
	name: z.string().trim().min(2, 'Enter the vessel name.').max(120),
	callSign: z
		.string()
		.trim()
		.toUpperCase()
		.regex(/^[A-Z0-9]{3,9}$/, 'A call sign is 3–9 letters and digits.'),
	scienceBerths: bounded('scienceBerths', 'Science berths').int('Berths are whole people.'),
	transitSpeedKn: bounded('transitSpeedKn', 'The transit speed'),
	surveySpeedKn: bounded('surveySpeedKn', 'The survey speed'),
	dayRate: bounded('dayRate', 'The day rate'),
	currency: z
		.string()
		.trim()
		.toUpperCase()
		.regex(/^[A-Z]{3}$/, 'Use a three-letter currency code, e.g. EUR.'),
	swathAngleDeg: bounded('swathAngleDeg', 'The swath angle'),
	swathDepthFactor: bounded('swathDepthFactor', 'The swath depth factor').default(4),
	winchSpeedMPerMin: bounded('winchSpeedMPerMin', 'The winch speed'),
	enduranceDays: bounded('enduranceDays', 'Endurance').int('Whole days.')
});
export type VesselInput = z.infer<typeof vesselSchema>;
