import { describe, expect, it } from 'vitest';
import { axisProblem, inRange, LIMITS, rangeMessage, SIZES } from './limits';

/** A zig-zag axis: n vertices alternating ±amp° of longitude, stepping north by step°. */
function zigzag(n: number, amp: number, step: number): [number, number][] {
	return Array.from({ length: n }, (_, i) => [-30 + (i % 2 ? amp : -amp), i * step]);
}

describe('shared limits', () => {
	it('refuses the tiny and huge speeds that exploded the timeline, at the boundaries exactly', () => {
		expect(inRange(1e-9, LIMITS.surveySpeedKn)).toBe(false);
		expect(inRange(LIMITS.surveySpeedKn.min, LIMITS.surveySpeedKn)).toBe(true);
		expect(inRange(LIMITS.surveySpeedKn.max, LIMITS.surveySpeedKn)).toBe(true);
		expect(inRange(40, LIMITS.surveySpeedKn)).toBe(false);
		expect(inRange(Infinity, LIMITS.transitSpeedKn)).toBe(false);
		expect(inRange(NaN, LIMITS.overlapPct)).toBe(false);
		// a spreading rate must be above zero: the bound itself is refused
		expect(inRange(0, LIMITS.fullRateMmYr)).toBe(false);
		expect(inRange(0.5, LIMITS.fullRateMmYr)).toBe(true);
	});

	it('names the field and the allowed range in its message', () => {
		expect(rangeMessage('surveySpeedKn', LIMITS.surveySpeedKn)).toBe(
			'surveySpeedKn must be within 1–20 kn'
		);
		expect(rangeMessage('fullRateMmYr', LIMITS.fullRateMmYr)).toBe(
			'fullRateMmYr must be above 0 and at most 300 mm/yr'
		);
	});

	it('accepts a realistic axis', () => {
		expect(axisProblem(zigzag(200, 0.02, 0.01))).toBeNull();
	});

	it('refuses axes the nearest-point search cannot bound: too many vertices, too long, repeats', () => {
		expect(axisProblem(zigzag(SIZES.axisVertices + 1, 0.01, 0.001))?.message).toMatch(
			/at most 2000 vertices/
		);
		// 1000 vertices 445 km apart: ≈ 445 000 km of axis
		expect(axisProblem(zigzag(1000, 2, 0.01))?.message).toMatch(/at most 10000 km long/);
		expect(
			axisProblem([
				[0, 0],
				[0, 0],
				[1, 1]
			])
		).toEqual({ vertex: 1, message: 'vertex 1 repeats vertex 0' });
		// back and forth over the same segment: every point is as near to each copy
		expect(
			axisProblem([
				[0, 0],
				[1, 1],
				[0, 0],
				[1, 1]
			])?.vertex
		).toBe(2);
	});
});
