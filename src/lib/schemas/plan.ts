// Plan features as the API takes them: GeoJSON geometry (WGS84, [lon, lat]) plus settings per kind.
// Coordinates are checked here so that a bad position is refused with its place named.
import { z } from './messages';
import { MAX_POTENTIAL_TEMPERATURE_C } from '$lib/engine/melt';
import { axisProblem, SIZES } from '$lib/engine/limits';
import { lonLatPosition } from './depthProfile';
import { bounded } from './limits';

// One definition of a valid [lon, lat] position, shared with the depth-profile API.
const position = lonLatPosition;

export const lineString = z.object({
	type: z.literal('LineString'),
	coordinates: z
		.array(position)
		.min(2, 'a line needs at least two positions')
		.max(SIZES.lineVertices, `a line may have at most ${SIZES.lineVertices} positions`)
});

/** A ridge axis: bounded so the nearest-point search always answers fast (see axisProblem). */
export const axisLineString = z.object({
	type: z.literal('LineString'),
	coordinates: z
		.array(position)
		.min(2, 'an axis needs at least two positions')
		.superRefine((coords, ctx) => {
			const p = axisProblem(coords);
			if (p)
				ctx.addIssue({
					code: 'custom',
					message: p.message,
					path: p.vertex === undefined ? [] : [p.vertex]
				});
		})
});

export const polygon = z.object({
	type: z.literal('Polygon'),
	coordinates: z
		.array(
			z
				.array(position)
				.min(4, 'a ring needs at least four positions (closed)')
				.max(SIZES.ringVertices, `a ring may have at most ${SIZES.ringVertices} positions`)
		)
		.min(1, 'a polygon needs a ring')
});

export const point = z.object({ type: z.literal('Point'), coordinates: position });

export const ridgeProps = z.object({
	fullRateMmYr: bounded('fullRateMmYr'),
	asymmetry: z.number().min(0).max(1).default(0.5),
	potentialTemperatureC: z
		.number()
		.min(1000)
		.max(MAX_POTENTIAL_TEMPERATURE_C)
		.nullable()
		.default(null),
	axialDepthM: bounded('axialDepthM').nullable().default(null)
});

export const lineProps = z.object({
	purpose: z.enum(['multibeam', 'magnetics', 'gravity', 'seismic']).default('multibeam'),
	surveySpeedKn: bounded('surveySpeedKn').default(8),
	overlapPct: bounded('overlapPct').default(30),
	ihoOrder: z.enum(['exclusive', 'special', '1a', '1b', '2']).default('2'),
	/** The survey area a generated line covers, if any. */
	areaId: z.string().min(1).nullable().default(null)
});

export const areaProps = z.object({
	overlapPct: bounded('overlapPct').default(30),
	surveySpeedKn: bounded('surveySpeedKn').default(8)
});

export const stationProps = z.object({
	stationKind: z.enum(['ctd', 'dredge', 'core', 'dive']),
	params: z
		.record(z.string().max(40), z.union([bounded('stationParam'), z.string().max(80)]))
		.refine(
			(p) => Object.keys(p).length <= SIZES.stationParams,
			`at most ${SIZES.stationParams} settings`
		)
		.default({})
});

const name = z.string().trim().min(1, 'give it a name').max(80);

export const newFeatureSchema = z.discriminatedUnion('kind', [
	z.object({ kind: z.literal('ridge'), name, geometry: axisLineString, properties: ridgeProps }),
	z.object({
		kind: z.literal('line'),
		name,
		geometry: lineString,
		properties: lineProps.default(lineProps.parse({}))
	}),
	z.object({
		kind: z.literal('area'),
		name,
		geometry: polygon,
		properties: areaProps.default(areaProps.parse({}))
	}),
	z.object({ kind: z.literal('station'), name, geometry: point, properties: stationProps })
]);
export type NewFeature = z.infer<typeof newFeatureSchema>;

export const featurePatchSchema = z.object({
	name: name.optional(),
	geometry: z.union([lineString, polygon, point]).optional(),
	properties: z.record(z.string(), z.unknown()).optional()
});
export type FeaturePatch = z.infer<typeof featurePatchSchema>;

export const bulkEditSchema = z.object({
	ids: z
		.array(z.string())
		.min(1, 'choose at least one line')
		.max(SIZES.planItems, `at most ${SIZES.planItems} lines at once`),
	properties: z
		.object({
			surveySpeedKn: bounded('surveySpeedKn').optional(),
			overlapPct: bounded('overlapPct').optional()
		})
		.refine((p) => p.surveySpeedKn !== undefined || p.overlapPct !== undefined, 'nothing to change')
});

/** Most lines one request may save over an area (a 100 km box at 2 km spacing needs about 50). */
export const MAX_AREA_LINES = 500;

/**
 * A survey area with the lines generated over it, saved in one request: a new area (`area`) or one
 * already on the cruise (`areaId`), and its lines (their `areaId` is set by the server).
 */
export const areaWithLinesSchema = z
	.object({
		area: z
			.object({ name, geometry: polygon, properties: areaProps.default(areaProps.parse({})) })
			.optional(),
		areaId: z.string().min(1).max(64).optional(),
		lines: z
			.array(
				z.object({
					name,
					geometry: lineString,
					properties: lineProps
						.omit({ areaId: true })
						.default(lineProps.omit({ areaId: true }).parse({}))
				})
			)
			.min(1, 'at least one line is needed')
			.max(MAX_AREA_LINES, `at most ${MAX_AREA_LINES} lines can be saved at once`)
	})
	.refine((v) => Boolean(v.area) !== Boolean(v.areaId), {
		message: 'give either a new area or the id of one on this cruise, not both',
		path: ['area']
	});
export type AreaWithLines = z.infer<typeof areaWithLinesSchema>;
