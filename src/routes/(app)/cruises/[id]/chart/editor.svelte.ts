// The chart's editing state and handlers: which tool is on, what is selected, the draft being drawn
// or typed, the settings form, the undo stack, typed placing with its "did you mean W?" check, and
// lines generated over a survey area. The page only lays these out; the map draws them.
import type { LineString, Point, Polygon } from 'geojson';
import type { Tool } from '$lib/components/map/ChartMap.svelte';
import {
	ApiFailure,
	createRequest,
	describeEdit,
	inverseRequests,
	type ApiRequest,
	type PlanEdit
} from '$lib/components/map/edits';
import {
	defaultForm,
	formFromFeature,
	plainRefusal,
	propertiesFromForm,
	withStationKind,
	type SettingsForm
} from '$lib/components/map/form';
import {
	formatPosition,
	hemisphereDoubt,
	parseTyped,
	withPositions,
	type HemisphereDoubt
} from '$lib/components/map/typed';
import type { Draft, PlanFeature, PlanKind, PlanVessel } from '$lib/components/map/types';
import type { StationKind } from '$lib/engine/formats/types';
import type { GeneratedSurvey } from '$lib/components/map/feedback';

export type DraftGeometry = LineString | Polygon | Point;

export interface EditorDeps {
	cruiseId: () => string;
	features: () => readonly PlanFeature[];
	vessel: () => PlanVessel | null;
	/** Sends one API request (the real `send` in the page; a recorder in the spec). */
	send: <T>(req: ApiRequest) => Promise<T>;
	/** Reloads the page's data after a change was saved. */
	reload: () => Promise<void>;
}

export const TOOLS: { tool: Tool; label: string; key: string; hint: string }[] = [
	{ tool: 'browse', label: 'Select', key: 'S', hint: 'Click a line, station or area to see it.' },
	{
		tool: 'ridge',
		label: 'Ridge axis',
		key: 'R',
		hint: 'Click along the axis; click the last point again (or press Enter) to finish.'
	},
	{
		tool: 'line',
		label: 'Line',
		key: 'L',
		hint: 'Click the line’s waypoints; click the last point again (or press Enter) to finish.'
	},
	{
		tool: 'area',
		label: 'Area',
		key: 'A',
		hint: 'Click the corners; click the first corner to close.'
	},
	{ tool: 'station', label: 'Station', key: 'T', hint: 'Click where the station goes.' }
];

/** Every position of a geometry (an area's ring without its closing repeat). */
export function positionsOf(g: DraftGeometry): number[][] {
	if (g.type === 'Point') return [g.coordinates];
	if (g.type === 'LineString') return g.coordinates;
	return g.coordinates[0].slice(0, -1);
}

export class PlanEditor {
	tool = $state<Tool>('browse');
	selectedId = $state<string | null>(null);
	draft = $state<Draft | null>(null);
	form = $state<SettingsForm>(defaultForm('line', [], null));
	/** The field the last refusal named, and the plain message shown next to it. */
	fieldError = $state<{ field: string; message: string } | null>(null);
	message = $state<{ tone: 'ok' | 'error'; text: string } | null>(null);
	busy = $state(false);
	undoStack = $state<PlanEdit[]>([]);

	typedKind = $state<PlanKind>('station');
	typedText = $state('');
	typedError = $state<string | null>(null);
	/** A typed position far from the rest, waiting for the person to choose. */
	doubt = $state<(HemisphereDoubt & { kind: PlanKind; typed: [number, number][] }) | null>(null);

	generated = $state<{ for: string; value: GeneratedSurvey } | null>(null);
	generateError = $state<string | null>(null);
	headingDeg = $state<number | null>(null);

	/** Called with a geometry to bring into view (the map sets it). */
	fitTo: ((g: DraftGeometry[]) => void) | null = null;
	/** Takes back the last vertex while drawing (the map sets it); false when there is none. */
	undoVertex: (() => boolean) | null = null;

	#deps: EditorDeps;
	#draftKey = 0;

	constructor(deps: EditorDeps) {
		this.#deps = deps;
	}

	get features() {
		return this.#deps.features();
	}
	get selected(): PlanFeature | null {
		return this.features.find((f) => f.id === this.selectedId) ?? null;
	}
	get lastEdit(): PlanEdit | null {
		return this.undoStack.at(-1) ?? null;
	}
	get hint(): string {
		if (this.draft) return 'Drag the orange vertices to adjust, then save or cancel in the panel.';
		return TOOLS.find((t) => t.tool === this.tool)?.hint ?? '';
	}

	chooseTool(t: Tool) {
		this.message = null;
		if (t !== 'browse') {
			this.draft = null;
			this.selectedId = null;
		}
		this.tool = t;
	}

	select(id: string | null) {
		this.selectedId = id;
		this.draft = null;
	}

	#start(
		kind: PlanKind,
		geometry: DraftGeometry,
		origin: Draft['origin'],
		featureId: string | null = null
	) {
		this.draft = { key: ++this.#draftKey, kind, featureId, geometry, origin };
		this.fieldError = null;
		this.message = null;
	}

	onDrawn(kind: PlanKind, geometry: DraftGeometry) {
		this.form = defaultForm(kind, this.features, this.#deps.vessel());
		this.#start(kind, geometry, 'drawn');
		this.tool = 'browse';
	}

	onDraftEdited(geometry: DraftGeometry) {
		if (this.draft) this.draft = { ...this.draft, geometry };
	}

	setStationKind(k: StationKind) {
		this.form = withStationKind(this.form, k, this.features);
	}

	/**
	 * Places the typed positions as a draft. A position more than 1,000 km from everything else on
	 * the cruise is held back with the hemisphere flip that lands near the rest, for the person to
	 * choose; `place(true)`/`place(false)` then take the flip or the positions as typed.
	 */
	place(choice?: boolean) {
		if (choice !== undefined && this.doubt) {
			const d = this.doubt;
			this.doubt = null;
			this.#placeAt(d.kind, choice ? d.positions : d.typed);
			return;
		}
		const r = parseTyped(this.typedText, this.typedKind);
		if (!r.ok) {
			this.typedError = r.message;
			this.doubt = null;
			return;
		}
		this.typedError = null;
		const others = this.features.flatMap((f) => positionsOf(f.geometry));
		const doubt = hemisphereDoubt(r.positions, others);
		if (doubt) {
			this.doubt = { ...doubt, kind: this.typedKind, typed: r.positions };
			return;
		}
		this.#placeAt(this.typedKind, r.positions);
	}

	/** "Did you mean 30°12.500′S 146°24.000′W?" for the held-back positions. */
	get doubtQuestion(): string | null {
		const d = this.doubt;
		if (!d) return null;
		const where = d.positions.map(([lon, lat]) => formatPosition(lon, lat));
		const shown = where.length > 2 ? `${where[0]} … (${where.length} positions)` : where.join(', ');
		return `This is ${Math.round(d.distanceKm).toLocaleString('en')} km from everything else on the cruise. Did you mean ${d.flip}: ${shown}?`;
	}

	#placeAt(kind: PlanKind, positions: [number, number][]) {
		const geometry = withPositions(kind, positions);
		this.form = defaultForm(kind, this.features, this.#deps.vessel());
		this.selectedId = null;
		this.tool = 'browse';
		this.#start(kind, geometry, 'typed');
		this.fitTo?.([geometry]);
	}

	edit() {
		const s = this.selected;
		if (!s) return;
		this.form = formFromFeature(s, this.#deps.vessel());
		this.#start(s.properties.kind, s.geometry, 'saved', s.id);
	}

	cancel() {
		this.draft = null;
		this.fieldError = null;
		this.doubt = null;
	}

	#remember(edit: PlanEdit) {
		this.undoStack = [...this.undoStack.slice(-19), edit];
	}

	/** Shows a refusal in plain words, at its field when it names one. */
	#fail(e: unknown) {
		if (e instanceof ApiFailure) {
			const plain = plainRefusal(e.details?.[0]?.field);
			const text = e.status === 422 || e.status === 400 ? plain.message : e.message;
			this.fieldError = plain.field ? { field: plain.field, message: text } : null;
			this.message = { tone: 'error', text };
		} else this.message = { tone: 'error', text: e instanceof Error ? e.message : String(e) };
	}

	async #run(work: () => Promise<void>) {
		this.busy = true;
		try {
			await work();
		} catch (err) {
			this.#fail(err);
		} finally {
			this.busy = false;
		}
	}

	async save() {
		const draft = this.draft;
		if (!draft) return;
		const r = propertiesFromForm(draft.kind, this.form);
		if (!r.ok) {
			this.fieldError = { field: r.field, message: r.message };
			this.message = { tone: 'error', text: r.message };
			return;
		}
		const cruiseId = this.#deps.cruiseId();
		await this.#run(async () => {
			if (draft.featureId) {
				const before = this.features.find((f) => f.id === draft.featureId)!;
				const after = await this.#deps.send<PlanFeature>({
					method: 'PATCH',
					path: `/api/v1/cruises/${cruiseId}/plan/features/${draft.featureId}`,
					body: { name: r.name, geometry: draft.geometry, properties: r.properties }
				});
				this.#remember({ op: 'update', before, after });
				this.selectedId = after.id;
			} else {
				const created = await this.#deps.send<PlanFeature>(
					createRequest(cruiseId, draft.kind, r.name, draft.geometry, r.properties)
				);
				this.#remember({ op: 'create', features: [created] });
				this.selectedId = created.id;
			}
			this.message = { tone: 'ok', text: `Saved ${r.name}.` };
			this.fieldError = null;
			this.draft = null;
			await this.#deps.reload();
		});
	}

	async remove() {
		const victim = this.selected;
		if (!victim) return;
		await this.#run(async () => {
			await this.#deps.send({
				method: 'DELETE',
				path: `/api/v1/cruises/${this.#deps.cruiseId()}/plan/features/${victim.id}`
			});
			this.#remember({ op: 'delete', feature: victim });
			this.selectedId = null;
			this.message = { tone: 'ok', text: `Deleted ${victim.properties.name}.` };
			await this.#deps.reload();
		});
	}

	async undo() {
		if (this.tool !== 'browse' && this.undoVertex?.()) return;
		const edit = this.lastEdit;
		if (!edit) return;
		await this.#run(async () => {
			for (const req of inverseRequests(this.#deps.cruiseId(), edit)) await this.#deps.send(req);
			this.undoStack = this.undoStack.slice(0, -1);
			this.message = { tone: 'ok', text: `Undone: ${describeEdit(edit)}.` };
			this.draft = null;
			this.selectedId = null;
			await this.#deps.reload();
		});
	}

	async bulkEdit(ids: string[], properties: { surveySpeedKn?: number; overlapPct?: number }) {
		const before = this.features.filter((f) => ids.includes(f.id));
		await this.#run(async () => {
			await this.#deps.send({
				method: 'POST',
				path: `/api/v1/cruises/${this.#deps.cruiseId()}/plan/features/bulk`,
				body: { ids, properties }
			});
			this.#remember({ op: 'bulk', before });
			this.message = { tone: 'ok', text: `Changed ${ids.length} lines.` };
			await this.#deps.reload();
		});
	}

	showGenerated(
		forKey: string,
		r: { ok: true; value: GeneratedSurvey } | { ok: false; message: string }
	) {
		if (r.ok) {
			this.generated = { for: forKey, value: r.value };
			this.generateError = null;
		} else {
			this.generated = null;
			this.generateError = r.message;
		}
	}

	/**
	 * Saves the generated lines — with their area when it is new — in one request, which the server
	 * keeps in one transaction: all of them or none.
	 */
	async acceptGenerated(
		area: { key: string; id: string | null; form: SettingsForm },
		survey: GeneratedSurvey,
		speedKn: number
	) {
		const base = area.form.name.trim() || 'Area';
		const draft = this.draft;
		let newArea: Record<string, unknown> | undefined;
		if (draft && !draft.featureId) {
			const r = propertiesFromForm('area', this.form);
			if (!r.ok) {
				this.fieldError = { field: r.field, message: r.message };
				this.message = { tone: 'error', text: r.message };
				return;
			}
			newArea = { name: r.name, geometry: draft.geometry, properties: r.properties };
		}
		const width = String(survey.lines.length).length < 2 ? 2 : 3;
		const lines = survey.lines.map((geometry, i) => ({
			name: `${base}-${String(i + 1).padStart(width, '0')}`,
			geometry,
			properties: {
				purpose: 'multibeam',
				surveySpeedKn: speedKn,
				overlapPct: area.form.overlapPct ?? 30,
				ihoOrder: '2'
			}
		}));
		await this.#run(async () => {
			const saved = await this.#deps.send<{ area: PlanFeature; lines: PlanFeature[] }>({
				method: 'POST',
				path: `/api/v1/cruises/${this.#deps.cruiseId()}/plan/areas`,
				body: newArea ? { area: newArea, lines } : { areaId: area.id, lines }
			});
			this.#remember({
				op: 'create',
				features: newArea ? [saved.area, ...saved.lines] : saved.lines
			});
			this.message = { tone: 'ok', text: `Added ${lines.length} lines over ${base}.` };
			this.generated = null;
			this.draft = null;
			if (newArea) this.selectedId = saved.area.id;
			await this.#deps.reload();
		});
	}
}
