// Keyboard shortcuts of the chart, so every tool is reachable without the mouse. Keys act only
// when the focus is not in a text field, and never with Ctrl/Alt/Meta (those belong to the browser),
// except Ctrl+Z / ⌘Z for undo.
import type { Tool } from '$lib/components/map/ChartMap.svelte';

export type ChartAction =
	{ do: 'tool'; tool: Tool } | { do: 'undo' } | { do: 'cancel' } | { do: 'panel' } | { do: 'book' };

export const SHORTCUTS: { keys: string; what: string; editOnly?: boolean }[] = [
	{ keys: 'S', what: 'Select' },
	{ keys: 'R', what: 'Draw a ridge axis', editOnly: true },
	{ keys: 'L', what: 'Draw a survey line', editOnly: true },
	{ keys: 'A', what: 'Draw a survey area', editOnly: true },
	{ keys: 'T', what: 'Place a station', editOnly: true },
	{ keys: 'U or Ctrl+Z', what: 'Undo', editOnly: true },
	{ keys: 'Esc', what: 'Cancel the drawing or the change' },
	{ keys: 'P', what: 'Show or hide the side panel' },
	{ keys: 'B', what: 'Show or hide the line book' }
];

const TOOL_KEYS: Record<string, Tool> = {
	s: 'browse',
	r: 'ridge',
	l: 'line',
	a: 'area',
	t: 'station'
};

export interface KeyLike {
	key: string;
	ctrlKey?: boolean;
	metaKey?: boolean;
	altKey?: boolean;
	/** The element the key was pressed in. */
	target?: { tagName?: string; isContentEditable?: boolean } | null;
}

function typing(target: KeyLike['target']): boolean {
	const tag = target?.tagName?.toUpperCase();
	return tag === 'INPUT' || tag === 'TEXTAREA' || tag === 'SELECT' || !!target?.isContentEditable;
}

export function shortcutFor(e: KeyLike, canEdit: boolean): ChartAction | null {
	if (typing(e.target)) return null;
	const k = e.key.toLowerCase();
	if ((e.ctrlKey || e.metaKey) && !e.altKey && k === 'z') return canEdit ? { do: 'undo' } : null;
	if (e.ctrlKey || e.metaKey || e.altKey) return null;
	if (e.key === 'Escape') return { do: 'cancel' };
	if (k === 'p') return { do: 'panel' };
	if (k === 'b') return { do: 'book' };
	const tool = TOOL_KEYS[k];
	if (tool) return tool === 'browse' || canEdit ? { do: 'tool', tool } : null;
	if (k === 'u' && canEdit) return { do: 'undo' };
	return null;
}
