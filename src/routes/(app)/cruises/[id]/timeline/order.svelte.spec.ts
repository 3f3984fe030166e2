import { describe, expect, it } from 'vitest';
import type { TimelineInput } from '$lib/engine/timeline';
import { OrderEditor, type Entry } from './order.svelte';

// Three points on the equator at 1°, 2° and 3° E, sailing from and back to 0°: the shortest
// transit visits them in that order (2 × 3° of equator) [derived].
const pt = (id: string, lon: number): Entry => ({
	id,
	kind: 'station',
	name: id,
	reversed: false,
	ends: [[lon, 0]]
});
const input: TimelineInput = {
	departure: { name: 'A', position: [0, 0], at: Date.UTC(2027, 0, 1) },
	arrival: { name: 'A', position: [0, 0] },
	transitSpeedKn: 10,
	items: [1, 2, 3].map((lon) => ({
		kind: 'station' as const,
		id: `s${lon}`,
		name: `s${lon}`,
		position: [lon, 0] as [number, number],
		durationH: 1
	}))
};

function editor(start: Entry[], refuse = false) {
	let server = start;
	const sent: { id: string; reversed: boolean }[][] = [];
	const ed = new OrderEditor(
		() => server,
		() => input,
		async (items) => {
			sent.push(items);
			if (refuse) return 'The order changed meanwhile.';
			const byId = new Map(server.map((o) => [o.id, o]));
			server = items.map((i) => ({ ...byId.get(i.id)!, reversed: i.reversed }));
			return null;
		}
	);
	return { ed, sent, server: () => server };
}

describe('OrderEditor', () => {
	it('moves an item and saves the whole order', async () => {
		const { ed, sent } = editor([pt('s1', 1), pt('s2', 2), pt('s3', 3)]);
		await ed.move(2, 0);
		expect(sent[0].map((x) => x.id)).toEqual(['s3', 's1', 's2']);
		expect(ed.note?.type).toBe('ok');
		expect(ed.canUndo).toBe(true);
	});

	it('suggests without saving, shows hours before and after, and applies only when confirmed', async () => {
		const { ed, sent, server } = editor([pt('s3', 3), pt('s1', 1), pt('s2', 2)]);
		const s = ed.suggest()!;
		expect(sent).toHaveLength(0);
		expect(s.order.map((o) => o.id)).toEqual(['s1', 's2', 's3']);
		// [derived] 3° + 2° + 1° + 2° = 8° of equator before, 6° after; 1° ≈ 60.1 nm.
		expect(s.beforeH).toBeGreaterThan(s.afterH);
		expect(s.beforeH / s.afterH).toBeCloseTo(8 / 6, 3);
		ed.dismiss();
		expect(sent).toHaveLength(0);
		ed.suggest();
		await ed.applySuggestion();
		expect(server().map((o) => o.id)).toEqual(['s1', 's2', 's3']);
		expect(ed.note?.text).toMatch(/transit .* h → .* h/);
		// Undo brings the hand-made order back.
		await ed.undo();
		expect(server().map((o) => o.id)).toEqual(['s3', 's1', 's2']);
		expect(ed.canUndo).toBe(false);
	});

	it('says why when the server refuses, and keeps the undo step', async () => {
		const { ed } = editor([pt('s1', 1), pt('s2', 2)], true);
		await ed.move(0, 1);
		expect(ed.note).toEqual({ type: 'error', text: 'The order changed meanwhile.' });
		expect(ed.canUndo).toBe(false);
	});
});
