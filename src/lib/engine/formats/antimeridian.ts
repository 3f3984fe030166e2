/**
 * Cutting paths and rings at the antimeridian, and joining them back.
 *
 * [published] RFC 7946 §3.1.9: a geometry crossing the antimeridian SHOULD be cut in two so that
 * neither part's representation crosses it. The cut point lies where the *geodesic* between the two
 * vertices meets ±180°, found with GeographicLib, so the cut geometry describes the same route.
 *
 * Cut points are written as exactly 180 on the west part and exactly −180 on the east part, with
 * the same latitude; the join recognises them by that and drops them, giving back the original
 * vertices unchanged. Known limit: an original vertex lying exactly on ±180° is taken for a cut
 * point and dropped on joining.
 */
import { Geodesic } from '../geographiclib';
import type { LonLat } from './types';

const MASK = Geodesic.LATITUDE | Geodesic.LONGITUDE | Geodesic.LONG_UNROLL;

/** Longitudes made continuous: each step is the short way round (|Δλ| ≤ 180°). */
export function unwrap(coords: LonLat[]): number[] {
	const out: number[] = [];
	for (let i = 0; i < coords.length; i++) {
		if (i === 0) out.push(coords[0][0]);
		else {
			let d = coords[i][0] - coords[i - 1][0];
			d -= 360 * Math.round(d / 360);
			out.push(out[i - 1] + d);
		}
	}
	return out;
}

/** Which 360°-wide cell an unwrapped longitude falls in; cell 0 is [−180, 180). */
function cell(u: number): number {
	return Math.floor((u + 180) / 360);
}

/** Latitude where the geodesic from (lonA, latA) to (lonB, latB), unwrapped, meets longitude `cut`. */
export function crossingLatitude(
	lonA: number,
	latA: number,
	lonB: number,
	latB: number,
	cut: number
): number {
	const line = Geodesic.WGS84.InverseLine(latA, lonA, latB, lonB, MASK | Geodesic.DISTANCE_IN);
	const target = cut - lonA;
	const along = (s: number) => {
		const p = line.Position(s, MASK);
		return { dLon: (p.lon2 ?? Number.NaN) - p.lon1, lat: p.lat2 ?? Number.NaN };
	};
	let lo = 0;
	let hi = line.s13;
	const rising = along(hi).dLon > 0;
	// Bisection: the longitude along a sub-half-globe geodesic away from the poles is monotonic.
	for (let i = 0; i < 64 && hi - lo > 1e-6; i++) {
		const mid = (lo + hi) / 2;
		const past = rising ? along(mid).dLon >= target : along(mid).dLon <= target;
		if (past) hi = mid;
		else lo = mid;
	}
	return along((lo + hi) / 2).lat;
}

/** The edge value a cut point takes in a part lying in `partCell`. */
function edgeFor(cut: number, partCell: number): number {
	return cut >= 180 + 360 * partCell ? 180 : -180;
}

/** Cut a path at every antimeridian crossing; one part when it does not cross. */
export function splitPath(coords: LonLat[]): LonLat[][] {
	if (coords.length < 2) return [coords.map((c) => [c[0], c[1]] as LonLat)];
	const u = unwrap(coords);
	const parts: LonLat[][] = [[[coords[0][0], coords[0][1]]]];
	for (let i = 1; i < coords.length; i++) {
		const ca = cell(u[i - 1]);
		const cb = cell(u[i]);
		if (ca !== cb) {
			const cut = 180 + 360 * Math.min(ca, cb);
			const lat = crossingLatitude(u[i - 1], coords[i - 1][1], u[i], coords[i][1], cut);
			parts[parts.length - 1].push([edgeFor(cut, ca), lat]);
			parts.push([[edgeFor(cut, cb), lat]]);
		}
		parts[parts.length - 1].push([coords[i][0], coords[i][1]]);
	}
	return parts;
}

function isCut(p: LonLat | undefined): boolean {
	return !!p && Math.abs(p[0]) === 180;
}

/** Join consecutive parts that meet at a cut point (180 / −180, same latitude). */
export function joinPaths(parts: LonLat[][]): LonLat[][] {
	const out: LonLat[][] = [];
	for (const part of parts) {
		const prev = out[out.length - 1];
		const end = prev?.[prev.length - 1];
		const start = part[0];
		if (
			prev &&
			end &&
			start &&
			isCut(end) &&
			isCut(start) &&
			end[0] === -start[0] &&
			end[1] === start[1]
		) {
			out[out.length - 1] = [...prev.slice(0, -1), ...part.slice(1)];
		} else out.push(part.map((c) => [c[0], c[1]] as LonLat));
	}
	return out;
}

/**
 * Cut an open ring into the part holding its first vertex and the part across the antimeridian.
 * Rings spanning more than one cut or enclosing a pole are returned whole.
 */
export function splitRing(ring: LonLat[]): LonLat[][] {
	const n = ring.length;
	if (n < 3) return [ring];
	const u = unwrap(ring);
	let closing = ring[0][0] - ring[n - 1][0];
	closing -= 360 * Math.round(closing / 360);
	// A ring that does not come back to its start longitude goes round a pole.
	if (Math.abs(u[n - 1] + closing - u[0]) > 1e-9) return [ring];
	const cells = u.map(cell);
	const min = Math.min(...cells);
	const max = Math.max(...cells);
	if (min === max || max - min > 1) return [ring];
	const cut = 180 + 360 * min;
	const home = cells[0];
	const parts: Record<'home' | 'away', LonLat[]> = { home: [], away: [] };
	const side = (c: number) => (c === home ? parts.home : parts.away);
	for (let i = 0; i < n; i++) {
		const j = (i + 1) % n;
		side(cells[i]).push([ring[i][0], ring[i][1]]);
		const uj = j === 0 ? u[n - 1] + closing : u[j];
		const cj = cell(uj);
		if (cells[i] !== cj) {
			const lat = crossingLatitude(u[i], ring[i][1], uj, ring[j][1], cut);
			side(cells[i]).push([edgeFor(cut, cells[i]), lat]);
			side(cj).push([edgeFor(cut, cj), lat]);
		}
	}
	return [parts.home, parts.away];
}

/**
 * Join the two rings splitRing made. Walking the first ring, each exit/entry pair of cut points
 * is replaced by the second ring's vertices between the same two cut points. Returns null when
 * the rings do not fit together that way.
 */
export function joinRings(first: LonLat[], second: LonLat[]): LonLat[] | null {
	const out: LonLat[] = [];
	const findCut = (lat: number, lon: number, from: number) => {
		for (let k = 0; k < second.length; k++) {
			const idx = (from + k) % second.length;
			const p = second[idx];
			if (isCut(p) && p[1] === lat && p[0] === -lon) return idx;
		}
		return -1;
	};
	let used = 0;
	for (let i = 0; i < first.length; i++) {
		const p = first[i];
		const q = first[i + 1];
		if (isCut(p) && isCut(q)) {
			const a = findCut(p[1], p[0], 0);
			const b = findCut(q[1], q[0], 0);
			if (a < 0 || b < 0) return null;
			for (let k = (a + 1) % second.length; k !== b; k = (k + 1) % second.length) {
				if (isCut(second[k])) return null;
				out.push([second[k][0], second[k][1]]);
				used++;
			}
			i++;
		} else if (isCut(p)) return null;
		else out.push([p[0], p[1]]);
	}
	const secondVertices = second.filter((p) => !isCut(p)).length;
	return used === secondVertices ? out : null;
}
