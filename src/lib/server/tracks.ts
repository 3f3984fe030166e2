// Observed tracks of a cruise (DESIGN.md §4 flow 9): streamed upload and reading, compact storage,
// residual depth against the cruise's own ridge model, and calibration of a ridge segment from a
// track. The residual computation runs in-process today (trackResiduals is pure and takes typed
// arrays, ready to become one named task of the engine worker pool).
import { createHash } from 'node:crypto';
import { and, desc, eq } from 'drizzle-orm';
import {
	TrackFileError,
	TrackReader,
	TRACK_FORMATS,
	type TrackFixes,
	type TrackFormat,
	type TrackReadResult,
	type TrackWarning
} from '$lib/engine/formats/track';
import { EngineInputError } from '$lib/engine/profile';
import {
	calibrateSegment,
	trackResiduals,
	type CalibrationResult,
	type Histogram,
	type ResidualStats
} from '$lib/engine/residual';
import { ApiError } from './api';
import { audit } from './audit';
import { db as appDb } from './db';
import type { CruiseAccess } from './guards';
import type { Db } from './db/client';
import { observedTrack, ridgeSegment, type ObservedTrack, type RidgeSegment } from './db/schema';
import { newId } from './ids';
import * as plan from './plan';
import { ridgeInputs } from './plancompute';

/**
 * Largest upload (bytes). The same as the server's BODY_SIZE_LIMIT (60 MiB): about 750 000 rows
 * of a full 26-column MGD77T file; a million fixes fit as CSV/XYZ or as MGD77T without the
 * magnetics and gravity columns.
 */
export const MAX_TRACK_BYTES = 60 * 1024 * 1024;
/** Points a residuals answer returns at most (statistics always use every fix). */
export const DEFAULT_RESIDUAL_POINTS = 5000;
export const MAX_RESIDUAL_POINTS = 200_000;
export const MAX_TRACK_NAME = 120;

export interface TrackSummary {
	id: string;
	name: string;
	format: TrackFormat;
	points: number;
	warnings: TrackWarning[];
	depthsFlipped: boolean;
	createdAt: string;
}

// ---------------------------------------------------------------- storage

/** Fixes as one buffer of little-endian Float64 columns [lon…, lat…, depth…, time…]. */
export function packFixes(f: TrackFixes): Buffer {
	const n = f.count;
	const all = new Float64Array(4 * n);
	all.set(f.lon.subarray(0, n), 0);
	all.set(f.lat.subarray(0, n), n);
	all.set(f.depthM.subarray(0, n), 2 * n);
	all.set(f.timeS.subarray(0, n), 3 * n);
	return Buffer.from(all.buffer, all.byteOffset, all.byteLength);
}

export function unpackFixes(buf: Uint8Array, n: number): TrackFixes {
	if (buf.byteLength !== 32 * n) throw new Error('stored fixes do not match their count');
	// copy into an aligned buffer (SQLite's may start at any byte)
	const all = new Float64Array(4 * n);
	new Uint8Array(all.buffer).set(buf);
	return {
		count: n,
		lon: all.subarray(0, n),
		lat: all.subarray(n, 2 * n),
		depthM: all.subarray(2 * n, 3 * n),
		timeS: all.subarray(3 * n, 4 * n)
	};
}

function summary(r: Omit<ObservedTrack, 'fixes'>): TrackSummary {
	return {
		id: r.id,
		name: r.name,
		format: r.format,
		points: r.points,
		warnings: (r.warnings ?? []) as TrackWarning[],
		depthsFlipped: r.depthsFlipped,
		createdAt: r.createdAt.toISOString()
	};
}

const SUMMARY_COLUMNS = {
	id: observedTrack.id,
	cruiseId: observedTrack.cruiseId,
	name: observedTrack.name,
	format: observedTrack.format,
	points: observedTrack.points,
	warnings: observedTrack.warnings,
	depthsFlipped: observedTrack.depthsFlipped,
	sha256: observedTrack.sha256,
	createdById: observedTrack.createdById,
	createdAt: observedTrack.createdAt
};

export function list(cruiseId: string, conn: Pick<Db, 'select'> = appDb): TrackSummary[] {
	return conn
		.select(SUMMARY_COLUMNS)
		.from(observedTrack)
		.where(eq(observedTrack.cruiseId, cruiseId))
		.orderBy(desc(observedTrack.createdAt))
		.all()
		.map(summary);
}

/** Ids of the tracks `userId` uploaded to the cruise (they may delete those). */
export function ownedBy(cruiseId: string, userId: string): string[] {
	return appDb
		.select({ id: observedTrack.id })
		.from(observedTrack)
		.where(and(eq(observedTrack.cruiseId, cruiseId), eq(observedTrack.createdById, userId)))
		.all()
		.map((r) => r.id);
}

export function get(cruiseId: string, trackId: string): TrackSummary & { fixes: TrackFixes } {
	const r = appDb
		.select()
		.from(observedTrack)
		.where(and(eq(observedTrack.cruiseId, cruiseId), eq(observedTrack.id, trackId)))
		.get();
	if (!r) throw new ApiError(404, 'No such track on this cruise.');
	return { ...summary(r), fixes: unpackFixes(r.fixes, r.points) };
}

export interface NewTrack {
	name: string;
	read: TrackReadResult;
	sha256: string;
	depthsFlipped?: boolean;
}

/** Stores a track that was read whole; 409 when the same file is already on the cruise. */
export function create(
	actorId: string | null,
	cruiseId: string,
	t: NewTrack,
	conn: Pick<Db, 'select' | 'insert' | 'transaction'> = appDb
): TrackSummary {
	const name = t.name.trim().slice(0, MAX_TRACK_NAME) || 'Track';
	return conn.transaction((tx) => {
		const dup = tx
			.select({ id: observedTrack.id, name: observedTrack.name })
			.from(observedTrack)
			.where(and(eq(observedTrack.cruiseId, cruiseId), eq(observedTrack.sha256, t.sha256)))
			.get();
		if (dup)
			throw new ApiError(
				409,
				`This file is already on the cruise as “${dup.name}”.`,
				'duplicate_track',
				{ trackId: dup.id }
			);
		const id = newId();
		tx.insert(observedTrack)
			.values({
				id,
				cruiseId,
				name,
				format: t.read.format,
				points: t.read.fixes.count,
				fixes: packFixes(t.read.fixes),
				warnings: t.read.warnings,
				depthsFlipped: !!t.depthsFlipped,
				sha256: t.sha256,
				createdById: actorId
			})
			.run();
		audit(tx, {
			userId: actorId,
			cruiseId,
			action: 'track.uploaded',
			detail: { id, name, format: t.read.format, points: t.read.fixes.count }
		});
		const row = tx
			.select(SUMMARY_COLUMNS)
			.from(observedTrack)
			.where(eq(observedTrack.id, id))
			.get()!;
		return summary(row);
	});
}

/** Deletes a track: the chief scientist (or an admin) any, a participant only their own. */
export function removeAs(access: CruiseAccess, trackId: string) {
	const own = access.role === 'chief_scientist' || access.isAdmin;
	remove(access.user.id, access.cruise.id, trackId, own ? undefined : access.user.id);
}

export function remove(actorId: string, cruiseId: string, trackId: string, onlyBy?: string) {
	appDb.transaction((tx) => {
		const r = tx
			.select({
				id: observedTrack.id,
				name: observedTrack.name,
				createdById: observedTrack.createdById
			})
			.from(observedTrack)
			.where(and(eq(observedTrack.cruiseId, cruiseId), eq(observedTrack.id, trackId)))
			.get();
		if (!r) throw new ApiError(404, 'No such track on this cruise.');
		if (onlyBy !== undefined && r.createdById !== onlyBy)
			throw new ApiError(
				403,
				'Only the chief scientist or whoever uploaded it may delete a track.'
			);
		tx.delete(observedTrack).where(eq(observedTrack.id, trackId)).run();
		audit(tx, {
			userId: actorId,
			cruiseId,
			action: 'track.deleted',
			detail: { id: r.id, name: r.name }
		});
	});
}

// ---------------------------------------------------------------- reading an upload

export interface UploadOptions {
	filename?: string;
	format?: TrackFormat;
	flipDepths?: boolean;
	maxBytes?: number;
}

/**
 * Reads a track from a request body as it streams in: bytes → UTF-8 text → the track reader, one
 * chunk at a time, so the file is never held whole. 413 past the byte limit, 415 for binary or
 * non-UTF-8 bytes, 422 for a bad file (naming the row and column).
 */
export async function readUpload(
	request: Request,
	options: UploadOptions = {}
): Promise<{ read: TrackReadResult; sha256: string; bytes: number }> {
	const max = options.maxBytes ?? MAX_TRACK_BYTES;
	const tooBig = () =>
		new ApiError(
			413,
			`The file is larger than ${max / 2 ** 20} MiB. Split the track, or keep only the position, ` +
				'time and depth columns.',
			'payload_too_large',
			{ maxBytes: max }
		);
	const declared = Number(request.headers.get('content-length') ?? 0);
	if (declared > max) throw tooBig();
	if (!request.body) throw new ApiError(400, 'The file is empty.', 'empty_file');
	const reader = new TrackReader({
		filename: options.filename,
		format: options.format,
		flipDepths: options.flipDepths
	});
	const decoder = new TextDecoder('utf-8', { fatal: true });
	const hash = createHash('sha256');
	const stream = request.body.getReader();
	let bytes = 0;
	try {
		for (;;) {
			const { done, value } = await stream.read();
			if (done) break;
			if (bytes === 0 && value.subarray(0, 4096).includes(0))
				throw new ApiError(
					415,
					'This is a binary file; tracks are MGD77T, MGD77, CSV/TSV or XYZ text.',
					'unsupported_media_type'
				);
			bytes += value.byteLength;
			if (bytes > max) throw tooBig();
			hash.update(value);
			let text: string;
			try {
				text = decoder.decode(value, { stream: true });
			} catch {
				throw new ApiError(415, 'The file is not UTF-8 text.', 'unsupported_media_type');
			}
			reader.push(text);
		}
		if (bytes === 0) throw new ApiError(400, 'The file is empty.', 'empty_file');
		return { read: reader.end(), sha256: hash.digest('hex'), bytes };
	} catch (e) {
		await stream.cancel().catch(() => {});
		if (e instanceof TrackFileError) throw fileError(e);
		// the server's own body limit errors the stream with status 413
		if ((e as { status?: number })?.status === 413) throw tooBig();
		throw e;
	}
}

/** A reader refusal as the API's 422 answer (the code says what to do). */
export function fileError(e: TrackFileError): ApiError {
	const code = e.code === 'invalid_row' ? 'invalid_track' : e.code;
	return new ApiError(422, e.message, code, {
		...(e.row !== undefined ? { row: e.row } : {}),
		...(e.column !== undefined ? { column: e.column } : {})
	});
}

export function isTrackFormat(v: string | null): v is TrackFormat {
	return v !== null && (TRACK_FORMATS as readonly string[]).includes(v);
}

// ---------------------------------------------------------------- residuals and calibration

function cruiseRidges(cruiseId: string) {
	const rows = plan.rows(cruiseId);
	if (rows.ridges.length === 0)
		throw new ApiError(
			409,
			'The cruise has no ridge segment yet; draw or import one to compare tracks with the model.',
			'no_ridge'
		);
	return { rows: rows.ridges, inputs: ridgeInputs(rows.ridges), model: rows.cruise.depthModel };
}

const r1 = (v: number) => (Number.isFinite(v) ? Math.round(v * 10) / 10 : null);
const r3 = (v: number) => (Number.isFinite(v) ? Math.round(v * 1000) / 1000 : null);
const r6 = (v: number) => Math.round(v * 1e6) / 1e6;

export interface ResidualPoint {
	distanceKm: number | null;
	lon: number;
	lat: number;
	time: string | null;
	observedM: number | null;
	predictedM: number | null;
	residualM: number | null;
	ageMa: number | null;
	predictedLowM: number | null;
	predictedHighM: number | null;
	segmentId: string;
}

export interface ResidualsAnswer {
	track: TrackSummary;
	points: ResidualPoint[];
	/** Fixes in the track; `points` holds every k-th of them when there are more than asked. */
	totalPoints: number;
	stats: {
		n: number;
		meanM: number | null;
		medianM: number | null;
		rmsM: number | null;
		stdM: number | null;
		minM: number | null;
		maxM: number | null;
	};
	histogram: Histogram;
	implied: {
		crustalThicknessChangeKm: number | null;
		crustKm: number | null;
		potentialTemperatureC: number | null;
		meltModel: string;
		assumptions: string[];
	};
	model: string;
	segments: {
		id: string;
		name: string;
		axialDepthM: number | null;
		fullRateMmYr: number;
		potentialTemperatureC: number | null;
	}[];
	caution: string;
}

export const RESIDUAL_CAUTION =
	'Predicted depths are planning estimates from a plate-cooling model, not soundings; never for ' +
	'wire work or navigation. Sediment, seamounts, faults and scarps make residuals too.';

export const IMPLIED_ASSUMPTIONS = [
	'Airy isostasy with water 1030, crust 2900 and mantle 3300 kg/m³: a residual of +400 m means crust 2.27 km thinner.',
	'The whole mean residual is taken as crustal thickness; sediment, seamounts, faults and dynamic topography are not removed.',
	'Crust is turned into potential temperature by the McKenzie & Bickle (1988) melting model for passive upwelling, from a reference crust of 7 km shifted by each segment’s own setting.'
];

function stat(s: ResidualStats): ResidualsAnswer['stats'] {
	return {
		n: s.n,
		meanM: r1(s.meanM),
		medianM: r1(s.medianM),
		rmsM: r1(s.rmsM),
		stdM: r1(s.stdM),
		minM: r1(s.minM),
		maxM: r1(s.maxM)
	};
}

export function residuals(
	cruiseId: string,
	trackId: string,
	maxPoints = DEFAULT_RESIDUAL_POINTS
): ResidualsAnswer {
	const t = get(cruiseId, trackId);
	const ridges = cruiseRidges(cruiseId);
	let r;
	try {
		r = trackResiduals(t.fixes, ridges.inputs, { model: ridges.model });
	} catch (e) {
		if (e instanceof EngineInputError)
			throw new ApiError(422, e.message, 'invalid', { field: e.field });
		throw e;
	}
	const n = r.count;
	const step = Math.max(1, Math.ceil(n / Math.max(2, maxPoints)));
	const points: ResidualPoint[] = [];
	const push = (i: number) => {
		const time = t.fixes.timeS[i];
		points.push({
			distanceKm: r3(r.distanceKm[i]),
			lon: r6(t.fixes.lon[i]),
			lat: r6(t.fixes.lat[i]),
			time: Number.isFinite(time) ? new Date(time * 1000).toISOString() : null,
			observedM: r1(t.fixes.depthM[i]),
			predictedM: r1(r.predictedM[i]),
			residualM: r1(r.residualM[i]),
			ageMa: r3(r.ageMa[i]),
			predictedLowM: r1(r.lowM[i]),
			predictedHighM: r1(r.highM[i]),
			segmentId: ridges.rows[r.segment[i]].id
		});
	};
	for (let i = 0; i < n; i += step) push(i);
	if ((n - 1) % step !== 0) push(n - 1);
	return {
		track: trackOnly(t),
		points,
		totalPoints: n,
		stats: stat(r.stats),
		histogram: r.histogram,
		implied: {
			crustalThicknessChangeKm: r.implied ? r3(r.implied.crustalThicknessChangeKm) : null,
			crustKm: r.implied ? r3(r.implied.crustKm) : null,
			potentialTemperatureC:
				r.implied?.potentialTemperatureC != null ? r1(r.implied.potentialTemperatureC) : null,
			meltModel: r.implied?.meltModel ?? 'mckenzie-bickle-1988',
			assumptions: IMPLIED_ASSUMPTIONS
		},
		model: r.model,
		segments: ridges.rows.map(segmentInfo),
		caution: RESIDUAL_CAUTION
	};
}

function trackOnly(t: TrackSummary & { fixes: TrackFixes }): TrackSummary {
	const { fixes: _fixes, ...track } = t;
	return track;
}

function segmentInfo(s: RidgeSegment) {
	return {
		id: s.id,
		name: s.name,
		axialDepthM: s.axialDepthM,
		fullRateMmYr: s.fullRateMmYr,
		potentialTemperatureC: s.potentialTemperatureC
	};
}

export interface CalibrationRequest {
	segmentId: string;
	fitRate?: boolean;
	nearAxisKm?: number;
}

export interface CalibrationAnswer extends CalibrationResult {
	segmentId: string;
	segmentName: string;
}

/** What calibrating a segment to this track would give (nothing is changed). */
export function calibration(
	cruiseId: string,
	trackId: string,
	req: CalibrationRequest
): CalibrationAnswer {
	const t = get(cruiseId, trackId);
	const ridges = cruiseRidges(cruiseId);
	const k = ridges.rows.findIndex((s) => s.id === req.segmentId);
	if (k < 0) throw new ApiError(404, 'No such ridge segment on this cruise.');
	try {
		const c = calibrateSegment(t.fixes, ridges.inputs, k, {
			model: ridges.model,
			fitRate: req.fitRate,
			nearAxisKm: req.nearAxisKm
		});
		const round = (x: CalibrationResult['before']) => ({
			axialDepthM: r1(x.axialDepthM)!,
			fullRateMmYr: r3(x.fullRateMmYr)!,
			rmsM: r1(x.rmsM)!,
			rmsNearAxisM: r1(x.rmsNearAxisM)!
		});
		return {
			...c,
			before: round(c.before),
			after: round(c.after),
			segmentId: req.segmentId,
			segmentName: ridges.rows[k].name
		};
	} catch (e) {
		if (e instanceof EngineInputError)
			throw new ApiError(422, e.message, 'cannot_calibrate', { field: e.field });
		throw e;
	}
}

/**
 * Applies the calibration to the ridge segment (its measured axial depth, and its full rate when
 * fitted) through the plan, so every prediction in the plan follows; audit-logged with the RMS
 * before and after.
 */
export async function applyCalibration(
	actorId: string,
	cruiseId: string,
	trackId: string,
	req: CalibrationRequest
): Promise<CalibrationAnswer> {
	const c = calibration(cruiseId, trackId, req);
	await plan.update(actorId, cruiseId, req.segmentId, {
		properties: {
			axialDepthM: c.after.axialDepthM,
			...(req.fitRate ? { fullRateMmYr: c.after.fullRateMmYr } : {})
		}
	});
	audit(appDb, {
		userId: actorId,
		cruiseId,
		action: 'track.calibration.applied',
		detail: {
			trackId,
			segmentId: req.segmentId,
			before: c.before,
			after: c.after,
			fitRate: !!req.fitRate
		}
	});
	return c;
}

/** For pages: the cruise's ridge segments (id and name) to calibrate. */
export function segments(cruiseId: string) {
	return appDb
		.select()
		.from(ridgeSegment)
		.where(eq(ridgeSegment.cruiseId, cruiseId))
		.all()
		.map(segmentInfo);
}
