// The order of work as the timeline page edits it: moves, flips, the shortest-transit suggestion
// (shown with transit hours before and after, applied only when confirmed) and undo. The timeline is
// rebuilt with the engine from the server's input, so the page shows what the server will compute.
import { buildTimeline, shortestTransitOrder, type TimelineInput } from '$lib/engine/timeline';
import { arrange } from '$lib/schedule';

export interface Entry {
	id: string;
	kind: 'line' | 'station' | 'port_call';
	name: string;
	reversed: boolean;
	ends: [number, number][];
}

export interface Note {
	type: 'ok' | 'error';
	text: string;
}

/** Sends the whole order; answers null when saved or the reason it was not. */
export type SaveOrder = (items: { id: string; reversed: boolean }[]) => Promise<string | null>;

export interface Suggestion<E extends Entry = Entry> {
	order: E[];
	beforeH: number;
	afterH: number;
}

const UNDO_DEPTH = 20;

export class OrderEditor<E extends Entry = Entry> {
	/** The order as last arranged here, until the server has it. */
	pending = $state<E[] | null>(null);
	saving = $state(false);
	note = $state<Note | undefined>();
	/** A shortest-transit proposal waiting for the chief scientist's yes or no. */
	suggestion = $state<Suggestion<E> | null>(null);
	/** Orders before each saved change, newest last. */
	history = $state<E[][]>([]);

	constructor(
		private readonly current: () => E[],
		private readonly input: () => TimelineInput | null,
		private readonly send: SaveOrder,
		private readonly reload: () => Promise<void> = async () => {}
	) {}

	get order(): E[] {
		return this.pending ?? this.current();
	}

	get canUndo(): boolean {
		return this.history.length > 0 && !this.saving;
	}

	/** Transit hours of an order, from the same engine the server uses. */
	transitH(order: readonly E[]): number {
		const input = this.input();
		if (!input) return 0;
		return buildTimeline({ ...input, items: arrange(input.items, order) }).totals.transitH;
	}

	private async save(next: E[], done: string, remember = true): Promise<boolean> {
		const before = this.order;
		this.pending = next;
		this.saving = true;
		this.note = undefined;
		try {
			const problem = await this.send(next.map((o) => ({ id: o.id, reversed: o.reversed })));
			if (problem) this.note = { type: 'error', text: problem };
			else {
				this.note = { type: 'ok', text: done };
				if (remember) this.history = [...this.history, before].slice(-UNDO_DEPTH);
			}
			await this.reload();
			return !problem;
		} finally {
			this.pending = null;
			this.saving = false;
		}
	}

	move(from: number, to: number): Promise<boolean> | undefined {
		const order = this.order;
		if (from === to || to < 0 || to >= order.length || from < 0 || from >= order.length) return;
		const next = [...order];
		const [it] = next.splice(from, 1);
		next.splice(to, 0, it);
		return this.save(next, `Moved ${it.name}. Order saved.`);
	}

	flip(i: number): Promise<boolean> | undefined {
		const order = this.order;
		if (!order[i] || order[i].kind !== 'line') return;
		const next = order.map((o, k) => (k === i ? { ...o, reversed: !o.reversed } : o));
		return this.save(next, `${order[i].name} now runs the other way. Order saved.`);
	}

	/** Works out the shortest-transit order and holds it for confirmation; saves nothing. */
	suggest(): Suggestion<E> | null {
		const input = this.input();
		const order = this.order;
		if (!input || order.length < 2) return null;
		const proposal = shortestTransitOrder(
			input.departure.position,
			input.arrival.position,
			order.map((o) => ({
				id: o.id,
				ends: o.ends.length === 2 ? [o.ends[0], o.ends[1]] : [o.ends[0]],
				fixed: o.kind === 'port_call'
			}))
		);
		// A lookup for this call only, not reactive state.
		// eslint-disable-next-line svelte/prefer-svelte-reactivity
		const byId = new Map(order.map((o) => [o.id, o]));
		const next = proposal.map((p) => ({ ...byId.get(p.id)!, reversed: p.reversed }));
		this.suggestion = { order: next, beforeH: this.transitH(order), afterH: this.transitH(next) };
		return this.suggestion;
	}

	dismiss() {
		this.suggestion = null;
	}

	applySuggestion(): Promise<boolean> | undefined {
		const s = this.suggestion;
		if (!s) return;
		this.suggestion = null;
		return this.save(
			s.order,
			`Shortest-transit order applied: transit ${s.beforeH.toFixed(1)} h → ${s.afterH.toFixed(1)} h. Port calls kept their place. Undo brings your order back.`
		);
	}

	async undo(): Promise<boolean> {
		const previous = this.history.at(-1);
		if (!previous || this.saving) return false;
		this.history = this.history.slice(0, -1);
		// The same items must still be there; the server refuses a stale order with a reason.
		const ok = await this.save(previous, 'The previous order is back.', false);
		if (!ok) this.history = [...this.history, previous];
		return ok;
	}
}
