import { describe, expect, it } from 'vitest';

// The server modules open the app database on import; keep it in memory for this test.
process.env.DATABASE_PATH = ':memory:';
const calendar = await import('./calendar');
const publications = await import('./publications');
const reminders = await import('./reminders');
const templates = await import('./mail/templates');

type Item = import('./calendar').PublishedItem;
const H = 3_600_000;
const T0 = Date.UTC(2027, 4, 3, 8, 0);

function item(key: string, kind: string, name: string, start: number, hours = 2, seq = 0): Item {
	return {
		key,
		kind,
		name,
		title: `X: ${name}`,
		description: '',
		location: `${key} place`,
		start,
		end: start + hours * H,
		allDay: false,
		offsetMinutes: -600,
		sequence: seq
	};
}

function snap(items: Item[], returnAt = T0 + 100 * H): import('./publications').Snapshot {
	return {
		code: 'X1',
		title: 'Test cruise',
		departure: { port: 'Home', at: T0, offsetMinutes: -600 },
		return: { port: 'Home', at: returnAt },
		legs: [{ seq: 1, from: 'Home', to: 'Home', start: T0, end: returnAt }],
		items
	};
}

describe('SEQUENCE against the published version (RFC 5545 §3.8.7.4)', () => {
	const published = [
		item('a', 'station', 'A', T0, 2, 3),
		item('b', 'station', 'B', T0 + 5 * H, 2, 0)
	];

	it('keeps the number of an item that did not move, even when its wording changed', () => {
		const now = [{ ...published[0], title: 'renamed' }, published[1]];
		const seq = calendar.sequencesAgainst(published, now);
		expect(seq.get('a')).toBe(3);
		expect(seq.get('b')).toBe(0);
	});

	it('raises by one an item whose time or place moved, and starts new items at 0', () => {
		const now = [
			{ ...published[0], start: published[0].start + H },
			{ ...published[1], location: 'elsewhere' },
			item('c', 'line', 'C', T0 + 9 * H)
		];
		const seq = calendar.sequencesAgainst(published, now);
		expect([seq.get('a'), seq.get('b'), seq.get('c')]).toEqual([4, 1, 0]);
	});

	it('does not count a shift below a second, which the calendar cannot show', () => {
		const now = [{ ...published[0], start: published[0].start + 300 }, published[1]];
		expect(calendar.sequencesAgainst(published, now).get('a')).toBe(3);
	});
});

describe('what changed between versions', () => {
	const v1 = snap([
		item('s1', 'station', 'CTD-01', T0),
		item('s2', 'station', 'DIVE-01', T0 + 3 * H),
		item('p', 'port', 'Port call, Far', T0 + 10 * H, 36),
		item('t', 'transit', 'Transit to CTD-01', T0 - H, 1)
	]);

	it('nothing, when nothing moved', () => {
		expect(publications.diff(v1, snap(v1.items))).toEqual({ changed: false, changes: [] });
	});

	it('the first version is a change with no summary', () => {
		expect(publications.diff(null, v1)).toEqual({ changed: true, changes: [] });
	});

	it('names moved, added and removed items and the new return date; transits only as a whole', () => {
		const v2 = snap(
			[
				item('s2', 'station', 'DIVE-01', T0),
				item('p', 'port', 'Port call, Far', T0 + 10 * H, 40),
				item('n', 'line', 'N-1', T0 + 60 * H),
				item('t', 'transit', 'Transit to DIVE-01', T0 - 2 * H, 1)
			],
			T0 + 104 * H
		);
		const { changed, changes } = publications.diff(v1, v2);
		expect(changed).toBe(true);
		expect(changes.map((c) => `${c.type} ${c.name}`)).toEqual([
			'moved DIVE-01',
			'moved Port call, Far',
			'added N-1',
			'removed CTD-01',
			'return Return to Home'
		]);
		const text = templates.changeLines(changes);
		expect(text.portCalls).toEqual([
			'Port call, Far now ends 2027-05-05 10:00 UTC (was 2027-05-05 06:00 UTC)'
		]);
		expect(text.other[0]).toBe('DIVE-01 moved: 2027-05-03 11:00 UTC → 2027-05-03 08:00 UTC');
		expect(text.other).toContain('New return date: 2027-05-07 12:00 UTC → 2027-05-07 16:00 UTC');
	});

	it('a change only in transits or wording still counts, under one line', () => {
		const v2 = snap(v1.items.map((i) => (i.key === 't' ? { ...i, start: i.start - H } : i)));
		expect(publications.diff(v1, v2).changes.map((c) => c.type)).toEqual(['other']);
	});
});

describe('the publication mail', () => {
	const s = snap([
		item('s1', 'station', 'CTD-01', T0 + 2 * H),
		item('p', 'port', 'Port call, Far', T0 + 10 * H, 36)
	]);

	it('has the code in the subject, the work in UTC with ship time beside, and the link', () => {
		const m = templates.schedulePublished({
			snapshot: s,
			version: 1,
			previousVersion: null,
			changes: [],
			link: 'http://x/cruises/1/schedule'
		});
		expect(m.subject).toBe(
			'X1 schedule published (version 1): sails 2027-05-03 08:00 UTC, back 2027-05-07'
		);
		expect(m.text).not.toContain('What changed');
		// 10:00 UTC is 00:00 on a ship keeping UTC−10.
		expect(m.text).toContain('2027-05-03 10:00 UTC · 2027-05-03 00:00 ship (UTC−10) · CTD-01');
		expect(m.text).toContain('- Port call, Far: 2027-05-03 18:00 UTC to 2027-05-05 06:00 UTC');
		expect(m.text).toContain('http://x/cruises/1/schedule');
		expect(m.html).toContain('<a href="http://x/cruises/1/schedule">');
	});

	it('starts with what changed from the second version on, and escapes names in HTML', () => {
		const odd = snap([item('s1', 'station', '<b>CTD</b>', T0 + 2 * H)]);
		const m = templates.schedulePublished({
			snapshot: odd,
			version: 2,
			previousVersion: 1,
			changes: [
				{ type: 'added', kind: 'station', name: '<b>CTD</b>', after: { start: T0, end: T0 } }
			],
			link: 'http://x'
		});
		expect(
			m.text.startsWith('What changed since version 1:\n- Added: <b>CTD</b>, 2027-05-03 08:00 UTC')
		).toBe(true);
		expect(m.html).not.toContain('<b>CTD</b>');
		expect(m.html).toContain('&lt;b&gt;CTD&lt;/b&gt;');
	});
});

describe('reminder stages', () => {
	const due = Date.UTC(2027, 1, 20);
	const day = 86_400_000;
	it('14, 7 and 1 days before, the latest stage reached, nothing on or after the day', () => {
		expect(reminders.stageFor(due, due - 20 * day)).toBeNull();
		expect(reminders.stageFor(due, due - 14 * day)).toBe(14);
		expect(reminders.stageFor(due, due - 9 * day + 5 * 3_600_000)).toBe(14);
		expect(reminders.stageFor(due, due - 7 * day)).toBe(7);
		expect(reminders.stageFor(due, due - 2 * day)).toBe(7);
		expect(reminders.stageFor(due, due - day + 23 * 3_600_000)).toBe(1);
		expect(reminders.stageFor(due, due)).toBeNull();
		expect(reminders.stageFor(due, due + day)).toBeNull();
	});
});
