import { z } from 'zod';

/** Calibrating a ridge segment from an observed track (preview and apply). */
export const calibrationSchema = z.object({
	segmentId: z.string().min(1, 'choose a ridge segment').max(64),
	fitRate: z.boolean().default(false),
	nearAxisKm: z.number().positive().max(200).default(15)
});
export type CalibrationInput = z.infer<typeof calibrationSchema>;
