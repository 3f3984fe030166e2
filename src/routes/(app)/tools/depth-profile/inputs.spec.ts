import { describe, expect, it } from 'vitest';
import { checkInputs, placeDetails, type ProfileInputs } from './inputs';

const filled: ProfileInputs = {
	lineText: '30°00.0′S 146°45.0′W\n30°00.0′S 145°15.0′W',
	axisText: '29°30.0′S 146°00.0′W\n30°30.0′S 145°55.0′W',
	fullRate: 38,
	asymmetry: 0.5,
	potentialT: null,
	axialDepth: null,
	spacingKm: 1,
	swathAngle: 130
};

describe('depth-profile inputs', () => {
	it('reads a filled form without errors', () => {
		const r = checkInputs(filled);
		expect(r.errors).toEqual({});
		expect(r.line).toHaveLength(2);
		expect(r.line![0][0]).toBeCloseTo(-146.75, 9);
	});

	it('explains an empty submission at each field that needs a value', () => {
		const r = checkInputs({
			lineText: '  ',
			axisText: '',
			fullRate: null,
			asymmetry: null,
			potentialT: null,
			axialDepth: null,
			spacingKm: null,
			swathAngle: null
		});
		expect(Object.keys(r.errors).sort()).toEqual(
			['asymmetry', 'axis', 'fullRate', 'line', 'spacingKm', 'swathAngle'].sort()
		);
		expect(r.errors.line).toMatch(/^Line positions: empty — enter at least two positions/);
		expect(r.errors.fullRate).toBe(
			'Full spreading rate (mm/yr): empty — enter the full rate across both flanks, e.g. 38.'
		);
		// The optional settings may stay empty.
		expect(r.errors.potentialT).toBeUndefined();
	});

	it('names the row of an unreadable position', () => {
		const r = checkInputs({ ...filled, lineText: '30°00.0′S 146°45.0′W\n95°00.0′S 145°15.0′W' });
		expect(r.errors.line).toMatch(/^Line positions: .*row 2/);
	});

	it('places API details at their fields, led by the page’s label', () => {
		const r = placeDetails([
			{ field: 'ridge.fullRateMmYr', message: 'the full spreading rate must be at most 300 mm/yr' },
			{ field: 'line.coordinates.1.1', message: 'latitude 95 is outside ±90' },
			{ field: 'spacingKm', message: 'Sample spacing (km): above 0.' },
			{ field: '(body)', message: 'Unknown field x.' }
		]);
		expect(r.errors.fullRate).toBe(
			'Full spreading rate (mm/yr): the full spreading rate must be at most 300 mm/yr'
		);
		expect(r.errors.line).toBe('Line positions, row 2: latitude 95 is outside ±90');
		expect(r.errors.spacingKm).toBe('Sample every (km): above 0.');
		expect(r.other).toEqual(['Unknown field x.']);
	});
});
