// Request body of POST /api/v1/depth-profile (DESIGN.md §6). Positions are GeoJSON [lon, lat] in
// WGS84 degrees; longitudes must lie within ±180 (the engine normalises them to [−180, 180) in its
// answers). The sample-count limit (SIZES.profileSamples) needs the line's geodesic length, so the engine
// checks it and throws EngineInputError { field: 'spacingKm' }.
import { z } from './messages';
import { DEPTH_MODEL_IDS, type DepthModelId } from '$lib/engine/depth';
import { axisProblem, SIZES } from '$lib/engine/limits';
import { MAX_POTENTIAL_TEMPERATURE_C } from '$lib/engine/melt';
import { bounded } from './limits';

const coordinate = z.number({ error: 'must be a finite number' });

/** A [lon, lat] position (an optional third member, e.g. height, is accepted and ignored). */
export const lonLatPosition = z
	.array(coordinate)
	.min(2, 'a position is [longitude, latitude]')
	.max(3, 'a position is [longitude, latitude] or [longitude, latitude, height]')
	.superRefine((p, ctx) => {
		const [lon, lat] = p;
		if (Math.abs(lat) > 90) {
			ctx.addIssue({
				code: 'custom',
				path: [1],
				message:
					Math.abs(lon) <= 90
						? `latitude ${lat} is outside ±90; GeoJSON positions are [longitude, latitude] — this one looks swapped`
						: `latitude ${lat} is outside ±90`
			});
		}
		if (Math.abs(lon) > 180) {
			ctx.addIssue({ code: 'custom', path: [0], message: `longitude ${lon} is outside ±180` });
		}
	})
	.transform((p) => [p[0], p[1]] as [number, number]);

export const lineStringSchema = z.object({
	type: z.literal('LineString', { error: 'must be a GeoJSON LineString' }),
	coordinates: z.array(lonLatPosition).min(2, 'a line needs at least two positions')
});

export const depthProfileRequestSchema = z.object({
	line: lineStringSchema.extend({
		coordinates: lineStringSchema.shape.coordinates.max(
			SIZES.lineVertices,
			`a line may have at most ${SIZES.lineVertices} positions`
		)
	}),
	ridge: z.object({
		axis: lineStringSchema.extend({
			coordinates: lineStringSchema.shape.coordinates.superRefine((coords, ctx) => {
				const p = axisProblem(coords);
				if (p)
					ctx.addIssue({
						code: 'custom',
						message: p.message,
						path: p.vertex === undefined ? [] : [p.vertex]
					});
			})
		}),
		fullRateMmYr: bounded('fullRateMmYr'),
		asymmetry: z
			.number({ error: 'must be a finite number' })
			.min(0, 'asymmetry is the left flank share, 0..1')
			.max(1, 'asymmetry is the left flank share, 0..1')
			.optional(),
		potentialTemperatureC: z
			.number({ error: 'must be a finite number' })
			.min(1000, 'potential temperature must be at least 1000 °C')
			.max(
				MAX_POTENTIAL_TEMPERATURE_C,
				`potential temperature must be at most ${MAX_POTENTIAL_TEMPERATURE_C} °C (melting models' range)`
			)
			.optional(),
		axialDepthM: bounded('axialDepthM').optional()
	}),
	model: z
		.enum(DEPTH_MODEL_IDS as [DepthModelId, ...DepthModelId[]], {
			error: `model must be one of ${DEPTH_MODEL_IDS.join(', ')}`
		})
		.optional(),
	spacingKm: bounded('spacingKm').optional(),
	swathAngleDeg: bounded('swathAngleDeg').optional()
});

export type DepthProfileRequest = z.infer<typeof depthProfileRequestSchema>;
