import { describe, expect, it } from 'vitest';
import {
	crossingLatitude,
	joinPaths,
	joinRings,
	splitPath,
	splitRing,
	unwrap
} from './antimeridian';
import { pathLengthKm } from './testing';
import type { LonLat } from './types';

describe('splitPath', () => {
	it('cuts 179.5°E → 179.5°W into two parts meeting at ±180 [published] RFC 7946 §3.1.9', () => {
		const parts = splitPath([
			[179.5, -20],
			[-179.5, -20]
		]);
		expect(parts).toHaveLength(2);
		expect(parts[0][1][0]).toBe(180);
		expect(parts[1][0][0]).toBe(-180);
		expect(parts[0][1][1]).toBe(parts[1][0][1]);
		// Symmetric geodesic: the crossing lies a hair poleward of −20 (a geodesic bulges poleward).
		expect(parts[0][1][1]).toBeLessThan(-20);
		expect(parts[0][1][1]).toBeGreaterThan(-20.001);
		// Neither part crosses: every longitude step stays below 180°.
		for (const p of parts)
			for (let i = 1; i < p.length; i++) expect(Math.abs(p[i][0] - p[i - 1][0])).toBeLessThan(180);
	});

	it('puts the cut on the geodesic [reference library] GeographicLib', () => {
		const lat = crossingLatitude(170, 40, 200, 50, 180);
		// The cut point's distances from both ends add up to the whole geodesic (it lies on it).
		const whole = pathLengthKm([
			[170, 40],
			[-160, 50]
		]);
		const viaCut = pathLengthKm([
			[170, 40],
			[180, lat],
			[-160, 50]
		]);
		expect(viaCut - whole).toBeLessThan(1e-6); // within 1 mm
	});

	it('leaves a path that does not cross alone and rejoins every cut', () => {
		const path: LonLat[] = [
			[179.8, -21],
			[-179.8, -21.1],
			[179.9, -21.2],
			[-179.9, -21.3]
		];
		const parts = splitPath(path);
		expect(parts).toHaveLength(4);
		expect(joinPaths(parts)).toEqual([path]);
		expect(
			splitPath([
				[10, 0],
				[11, 1]
			])
		).toEqual([
			[
				[10, 0],
				[11, 1]
			]
		]);
	});

	it('unwraps longitudes the short way', () => {
		expect(
			unwrap([
				[179, 0],
				[-179, 0],
				[-178, 0]
			])
		).toEqual([179, 181, 182]);
	});
});

describe('splitRing', () => {
	it('cuts a box across 180 and joins it back exactly', () => {
		const ring: LonLat[] = [
			[179.6, -22],
			[-179.6, -22],
			[-179.6, -21.5],
			[179.6, -21.5]
		];
		const [home, away] = splitRing(ring);
		expect(home.every((p) => p[0] > 0)).toBe(true);
		expect(away.every((p) => p[0] < 0)).toBe(true);
		expect(joinRings(home, away)).toEqual(ring);
	});

	it('handles a ring starting east of the line', () => {
		const ring: LonLat[] = [
			[-179.6, -23],
			[-179.6, -22.5],
			[179.6, -22.5],
			[179.6, -23]
		];
		const parts = splitRing(ring);
		expect(parts).toHaveLength(2);
		expect(joinRings(parts[0], parts[1])).toEqual(ring);
	});

	it('returns rings that do not cross unchanged, and refuses to join unrelated rings', () => {
		const ring: LonLat[] = [
			[0, 0],
			[1, 0],
			[1, 1]
		];
		expect(splitRing(ring)).toEqual([ring]);
		expect(
			joinRings(ring, [
				[5, 5],
				[6, 5],
				[6, 6]
			])
		).toBeNull();
	});
});
