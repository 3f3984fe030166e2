// Shaping observed-track answers for the browser: upload limits and refusal messages, the colour
// domain of residuals, longitudes unwrapped across the antimeridian for plotting, the histogram as
// bars. Pure, so the pages stay layout.

/** The server's upload limit (bytes); see MAX_TRACK_BYTES in $lib/server/tracks. */
export const TRACK_UPLOAD_LIMIT = 60 * 1024 * 1024;

export const TRACK_ACCEPT = '.m77t,.mgd77,.a77,.m77,.csv,.tsv,.txt,.xyz,.dat';

export function fileSizeText(bytes: number): string {
	if (bytes < 1024) return `${bytes} B`;
	if (bytes < 1024 ** 2) return `${(bytes / 1024).toFixed(1)} KiB`;
	return `${(bytes / 1024 ** 2).toFixed(1)} MiB`;
}

/** A reason to refuse the file before sending it, or null. */
export function checkTrackFile(file: { name: string; size: number }): string | null {
	if (file.size === 0) return `${file.name} is empty.`;
	if (file.size > TRACK_UPLOAD_LIMIT)
		return (
			`${file.name} is ${fileSizeText(file.size)}; tracks may be up to ` +
			`${fileSizeText(TRACK_UPLOAD_LIMIT)}. Split it, or keep only the position, time and depth columns.`
		);
	return null;
}

export interface ApiErrorBody {
	error?: { code?: string; message?: string; details?: { row?: number; column?: string } };
}

/** What to tell the user about a refused upload (and whether to offer flipping the depths). */
export function refusal(
	status: number,
	body: ApiErrorBody | null
): { text: string; askFlip: boolean } {
	const e = body?.error;
	if (e?.code === 'negative_depths')
		return { text: e.message ?? 'Depths are negative.', askFlip: true };
	if (e?.message) return { text: e.message, askFlip: false };
	if (status === 413)
		return { text: `The file is larger than ${fileSizeText(TRACK_UPLOAD_LIMIT)}.`, askFlip: false };
	return { text: `The upload failed (HTTP ${status}).`, askFlip: false };
}

/** A symmetric colour domain for residuals: ±the 95th percentile of |r|, rounded up to 50 m. */
export function residualDomain(residuals: readonly (number | null)[]): [number, number] {
	const a = residuals.filter((r): r is number => r !== null && Number.isFinite(r)).map(Math.abs);
	if (a.length === 0) return [-100, 100];
	a.sort((x, y) => x - y);
	const p95 = a[Math.min(a.length - 1, Math.floor(0.95 * a.length))];
	const m = Math.max(50, Math.ceil(p95 / 50) * 50);
	return [-m, m];
}

/** Longitudes made continuous along a track (a step across ±180° keeps going past it). */
export function unwrapLon(lons: readonly number[]): number[] {
	const out: number[] = [];
	let shift = 0;
	for (let i = 0; i < lons.length; i++) {
		if (i > 0) {
			const d = lons[i] + shift - out[i - 1];
			if (d > 180) shift -= 360;
			else if (d < -180) shift += 360;
		}
		out.push(lons[i] + shift);
	}
	return out;
}

export interface Bar {
	fromM: number;
	toM: number;
	count: number;
}

export function histogramBars(h: { startM: number; binWidthM: number; counts: number[] }): Bar[] {
	return h.counts.map((count, i) => ({
		fromM: h.startM + i * h.binWidthM,
		toM: h.startM + (i + 1) * h.binWidthM,
		count
	}));
}

/** Metres with a sign, as residuals read: "+180 m", "−42 m". */
export function signedM(v: number | null | undefined, digits = 0): string {
	if (v === null || v === undefined || !Number.isFinite(v)) return '—';
	const s = Math.abs(v).toFixed(digits);
	return `${v > 0 ? '+' : v < 0 ? '−' : ''}${s} m`;
}

/** A plotting domain around values, at least `minSpan` wide (a track along a parallel has none). */
export function paddedDomain(values: readonly number[], minSpan = 0.1): [number, number] {
	let lo = Infinity;
	let hi = -Infinity;
	for (const v of values) {
		if (v < lo) lo = v;
		if (v > hi) hi = v;
	}
	if (!Number.isFinite(lo)) return [0, 1];
	const span = Math.max(hi - lo, minSpan);
	const mid = 0.5 * (lo + hi);
	return [mid - 0.55 * span, mid + 0.55 * span];
}
