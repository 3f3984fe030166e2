import { describe, expect, it } from 'vitest';
import { cruiseSchema } from './cruise';
import { newFeatureSchema } from './plan';
import { deadlineSchema, timingSchema } from './timeline';
import { vesselSchema } from './vessel';
import { fieldOf, labelFor, z } from './messages';

const messages = (r: {
	success: boolean;
	error?: { issues: { path: PropertyKey[]; message: string }[] };
}) => Object.fromEntries((r.error?.issues ?? []).map((i) => [i.path.join('.'), i.message]));

const cruise = {
	code: 'WL-27-01',
	title: 'A cruise',
	allocatedDays: 10,
	weatherMarginPct: 10
};

describe('plain schema messages', () => {
	it('names the field and says what is allowed, from the schema’s own limits', () => {
		const m = messages(
			cruiseSchema.safeParse({ ...cruise, title: 'x'.repeat(300), allocatedDays: 0 })
		);
		expect(m.title).toBe('Title: at most 200 characters.');
		expect(m.allocatedDays).toBe('Allocated days: at least 1.');
	});

	it('never lets zod’s built-in wording through', () => {
		const results = [
			cruiseSchema.safeParse({
				code: 'x',
				title: '',
				status: 'sunk',
				allocatedDays: 'many',
				weatherMarginPct: 101
			}),
			vesselSchema.safeParse({
				name: '',
				scienceBerths: 0.5,
				transitSpeedKn: -1,
				enduranceDays: 1000
			}),
			newFeatureSchema.safeParse({
				kind: 'line',
				name: 'n'.repeat(81),
				geometry: { type: 'LineString', coordinates: [[0, 0]] }
			})
		];
		const all = results.flatMap((r) => r.error?.issues ?? []);
		expect(all.length).toBeGreaterThan(8);
		for (const i of all) {
			expect(i.message).not.toMatch(
				/Too big|Too small|Invalid input|expected string to have|expected number to be/
			);
			expect(i.message.length).toBeGreaterThan(5);
		}
		const m = messages(results[0]);
		expect(m.code).toBe('Cruise code: at least 2 characters.');
		expect(m.status).toMatch(/^Status: choose one of draft, /);
		expect(m.allocatedDays).toBe('Allocated days: enter a number.');
		expect(m.weatherMarginPct).toBe('Weather margin (%): at most 100.');
		expect(messages(results[2]).name).toBe('Name: at most 80 characters.');
	});

	it('a missing value is "required", an exclusive bound is "above"/"below"', () => {
		const s = z.object({ rateMmYr: z.number().gt(0).lt(300), note: z.string().min(1) });
		const m = messages(s.safeParse({ rateMmYr: 0, note: '' }));
		expect(m.rateMmYr).toBe('Rate (mm/yr): above 0.');
		expect(m.note).toBe('Note: required.');
		expect(messages(s.safeParse({ rateMmYr: 300 })).rateMmYr).toBe('Rate (mm/yr): below 300.');
		expect(messages(s.safeParse({ rateMmYr: 1 })).note).toBe('Note: required.');
	});

	it('spells out field keys with their unit, and list positions', () => {
		expect(labelFor('surveySpeedKn')).toBe('Survey speed (kn)');
		expect(labelFor('winchSpeedMPerMin')).toBe('Winch speed (m/min)');
		expect(labelFor('mobilisationH')).toBe('Mobilisation (hours)');
		expect(labelFor('leadMonths')).toBe('Months ahead');
		expect(labelFor('maxDays')).toBe('Max days');
		expect(fieldOf(['items', 2, 'id'])).toBe('Id');
		expect(fieldOf(['line', 'coordinates', 0, 1])).toBe('Positions (#1, #2)');
		expect(fieldOf([])).toBe('');
	});

	it('a bound is said as a bound, not as a type message of the whole schema', () => {
		// zod applies a schema-level message to every issue without its own; the schemas leave type
		// messages to the error map so that "31 hours" is not answered with "Enter hours."
		expect(messages(timingSchema.safeParse({ turnH: 30 })).turnH).toBe(
			'Turn between lines (hours): at most 24.'
		);
		expect(messages(timingSchema.safeParse({ turnH: 'x' })).turnH).toBe(
			'Turn between lines (hours): enter a number.'
		);
		expect(messages(deadlineSchema.safeParse({ title: 'Due', offsetDays: 9999 })).offsetDays).toBe(
			'Days (− before): at most 730.'
		);
		expect(messages(vesselSchema.safeParse({ transitSpeedKn: 0 })).transitSpeedKn).toBe(
			'Transit speed (kn): at least 2.'
		);
	});
});
