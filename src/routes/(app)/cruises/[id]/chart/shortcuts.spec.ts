import { describe, expect, it } from 'vitest';
import { shortcutFor } from './shortcuts';

describe('shortcutFor', () => {
	it('picks the drawing tools by letter for an editor', () => {
		expect(shortcutFor({ key: 'l' }, true)).toEqual({ do: 'tool', tool: 'line' });
		expect(shortcutFor({ key: 'A' }, true)).toEqual({ do: 'tool', tool: 'area' });
		expect(shortcutFor({ key: 't' }, true)).toEqual({ do: 'tool', tool: 'station' });
		expect(shortcutFor({ key: 'u' }, true)).toEqual({ do: 'undo' });
		expect(shortcutFor({ key: 'z', ctrlKey: true }, true)).toEqual({ do: 'undo' });
	});

	it('gives a reader only the keys that do not edit', () => {
		expect(shortcutFor({ key: 'l' }, false)).toBeNull();
		expect(shortcutFor({ key: 'u' }, false)).toBeNull();
		expect(shortcutFor({ key: 's' }, false)).toEqual({ do: 'tool', tool: 'browse' });
		expect(shortcutFor({ key: 'b' }, false)).toEqual({ do: 'book' });
	});

	it('leaves keys typed into a field, and the browser’s own combinations, alone', () => {
		expect(shortcutFor({ key: 'l', target: { tagName: 'INPUT' } }, true)).toBeNull();
		expect(shortcutFor({ key: 'p', target: { tagName: 'textarea' } }, true)).toBeNull();
		expect(shortcutFor({ key: 'l', ctrlKey: true }, true)).toBeNull();
		expect(shortcutFor({ key: 'Escape' }, true)).toEqual({ do: 'cancel' });
	});
});
