import { describe, expect, it } from 'vitest';
import { usedShare, viewApplications, type ApplicationView } from './party';

const row = (p: Partial<ApplicationView> & { id: string; name: string }): ApplicationView => ({
	legId: 'l1',
	status: 'applied',
	roleOnBoard: 'scientist',
	institution: null,
	waitlistPosition: null,
	createdAt: '2027-01-01T00:00:00Z',
	...p
});

const rows = [
	row({ id: 'a', name: 'Zora', createdAt: '2027-01-03T00:00:00Z', institution: 'Deep Lab' }),
	row({ id: 'b', name: 'Anil', status: 'waitlisted', waitlistPosition: 2, legId: 'l2' }),
	row({ id: 'c', name: 'Mia', status: 'waitlisted', waitlistPosition: 1, roleOnBoard: 'student' }),
	row({ id: 'd', name: 'Bo', status: 'confirmed', createdAt: '2026-12-01T00:00:00Z' })
];
const q = { legId: '', status: '', text: '', sort: 'applied' as const };

describe('viewApplications', () => {
	it('sorts by time of application, name, status or waitlist place', () => {
		expect(viewApplications(rows, q).map((r) => r.id)).toEqual(['d', 'b', 'c', 'a']);
		expect(viewApplications(rows, { ...q, sort: 'name' }).map((r) => r.name)).toEqual([
			'Anil',
			'Bo',
			'Mia',
			'Zora'
		]);
		expect(viewApplications(rows, { ...q, sort: 'waitlist' }).map((r) => r.id)).toEqual([
			'c',
			'b',
			'd',
			'a'
		]);
		expect(viewApplications(rows, { ...q, sort: 'status' }).map((r) => r.id)).toEqual([
			'a',
			'b',
			'c',
			'd'
		]);
	});
	it('filters by leg, status and words in name, institution or role', () => {
		expect(viewApplications(rows, { ...q, legId: 'l2' }).map((r) => r.id)).toEqual(['b']);
		expect(viewApplications(rows, { ...q, status: 'waitlisted' }).map((r) => r.id)).toEqual([
			'b',
			'c'
		]);
		expect(viewApplications(rows, { ...q, text: 'deep' }).map((r) => r.id)).toEqual(['a']);
		expect(viewApplications(rows, { ...q, text: 'STUDENT mia' }).map((r) => r.id)).toEqual(['c']);
	});
});

describe('usedShare', () => {
	it('is confirmed over berths, full when a leg has no berths', () => {
		expect(usedShare(22, 24)).toBeCloseTo(0.9167, 4);
		expect(usedShare(0, 0)).toBe(1);
		expect(usedShare(30, 24)).toBe(1);
	});
});
