// Live figures for the chart, all from the shared engine: the feature in hand (a draft or the
// selection) with its line or station feedback, swaths, generated survey lines and the predicted
// isobaths. Isobaths wait until the plan is drawn, so they never hold up the first picture.
import type { LineString, Polygon } from 'geojson';
import {
	depthLayer,
	depthModelOf,
	FALLBACK_VESSEL,
	generateSurvey,
	lineFeedback,
	ridgeInputs,
	stationFeedback,
	swathFootprint,
	workArea
} from '$lib/components/map/feedback';
import { formFromFeature, type SettingsForm } from '$lib/components/map/form';
import type { ViewBounds } from '$lib/components/map/graticule';
import { boundsOf } from '$lib/components/map/shape';
import type { PlanCruise, PlanKind } from '$lib/components/map/types';
import type { DraftGeometry, PlanEditor } from './editor.svelte';

export interface Active {
	key: string;
	kind: PlanKind;
	id: string | null;
	geometry: DraftGeometry;
	form: SettingsForm;
}

export class ChartFigures {
	showDepth = $state(true);
	shade = $state(false);
	globe = $state(false);
	view = $state<ViewBounds | null>(null);
	/** Set once the map has drawn the saved plan. */
	planDrawn = $state(false);

	#editor: PlanEditor;
	#cruise: () => PlanCruise | null = () => null;

	constructor(editor: PlanEditor, cruise: () => PlanCruise | null) {
		this.#editor = editor;
		this.#cruise = cruise;
	}

	model = $derived(depthModelOf(this.#cruise()?.depthModel));
	ship = $derived(this.#cruise()?.vessel ?? FALLBACK_VESSEL);
	ridges = $derived.by(() => {
		const { features, draft, form } = this.#editor;
		return draft?.kind === 'ridge' ? ridgeInputs(features, draft, form) : ridgeInputs(features);
	});
	area = $derived.by(() => {
		const { features, draft } = this.#editor;
		const b = boundsOf([
			...features.map((f) => f.geometry),
			...(draft?.kind === 'ridge' ? [draft.geometry] : [])
		]);
		return b ? workArea(b) : null;
	});
	depth = $derived(
		this.showDepth && this.area && this.planDrawn
			? depthLayer(this.ridges, this.model, this.area, this.view)
			: null
	);

	active = $derived.by((): Active | null => {
		const { draft, selected, form } = this.#editor;
		if (draft)
			return {
				key: `draft-${draft.key}`,
				kind: draft.kind,
				id: draft.featureId,
				geometry: draft.geometry,
				form
			};
		if (selected)
			return {
				key: selected.id,
				kind: selected.properties.kind,
				id: selected.id,
				geometry: selected.geometry,
				form: formFromFeature(selected, this.#cruise()?.vessel ?? null)
			};
		return null;
	});

	lineFb = $derived.by(() => {
		const a = this.active;
		if (a?.kind !== 'line' || a.geometry.type !== 'LineString') return null;
		if (a.geometry.coordinates.length < 2) return null;
		const neighbours = this.#editor.features
			.filter(
				(f) => f.properties.kind === 'line' && f.properties.purpose === 'multibeam' && f.id !== a.id
			)
			.map((f) => ({ name: f.properties.name, coords: (f.geometry as LineString).coordinates }));
		return lineFeedback(
			a.geometry.coordinates,
			this.ridges,
			this.model,
			{
				speedKn: a.form.surveySpeedKn ?? 0,
				overlapPct: a.form.overlapPct ?? 30,
				ihoOrder: a.form.ihoOrder
			},
			this.ship,
			a.form.purpose === 'multibeam' ? neighbours : []
		);
	});

	stationFb = $derived.by(() => {
		const a = this.active;
		if (a?.kind !== 'station' || a.geometry.type !== 'Point') return null;
		return stationFeedback(
			a.geometry.coordinates,
			a.form.stationKind,
			a.form.params,
			this.ridges,
			this.model,
			this.ship
		);
	});

	shownSurvey = $derived.by(() => {
		const g = this.#editor.generated;
		return g && g.for === this.active?.key ? g.value : null;
	});

	swaths = $derived.by((): Polygon[] => {
		if (this.shownSurvey) return this.shownSurvey.coverage.map((f) => f.geometry);
		if (this.lineFb?.ok) {
			const p = swathFootprint(this.lineFb.value.samples);
			return p ? [p] : [];
		}
		return [];
	});

	/** Lines over the area in hand, spaced for its overlap at the predicted depth. */
	generate() {
		const a = this.active;
		if (!a || a.kind !== 'area' || a.geometry.type !== 'Polygon') return;
		this.#editor.showGenerated(
			a.key,
			generateSurvey(
				a.geometry.coordinates[0],
				this.ridges,
				this.model,
				{
					overlapPct: a.form.overlapPct ?? 30,
					speedKn: a.form.surveySpeedKn ?? this.ship.surveySpeedKn,
					headingDeg: this.#editor.headingDeg ?? undefined
				},
				this.ship
			)
		);
	}

	accept() {
		const a = this.active;
		if (!a || !this.shownSurvey) return;
		return this.#editor.acceptGenerated(
			{ key: a.key, id: a.id, form: a.form },
			this.shownSurvey,
			a.form.surveySpeedKn ?? this.ship.surveySpeedKn
		);
	}
}
