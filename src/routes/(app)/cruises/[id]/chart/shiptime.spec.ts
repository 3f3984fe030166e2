import { describe, expect, it } from 'vitest';
import { shipTimeNote } from './shiptime';

describe('shipTimeNote', () => {
	it('says when the plan fits its allocation', () => {
		expect(
			shipTimeNote({ operatingDays: 21, allocatedDays: 25, overrunDays: 0, unordered: 0 })
		).toEqual({ tone: 'ok', text: 'Plan: 21 days of 25 days allocated' });
	});

	it('says by how much the plan runs past its allocation, and what waits for the order', () => {
		expect(
			shipTimeNote({ operatingDays: 27, allocatedDays: 25, overrunDays: 2, unordered: 1 })
		).toEqual({
			tone: 'over',
			text: 'Plan: 27 days, 2 days past the 25 days allocated · 1 not yet in the order of work'
		});
	});

	it('has nothing to say without a timeline', () => {
		expect(shipTimeNote(null)).toBeNull();
	});
});
