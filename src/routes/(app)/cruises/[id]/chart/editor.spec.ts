import { describe, expect, it } from 'vitest';
import type { ApiRequest } from '$lib/components/map/edits';
import { ApiFailure } from '$lib/components/map/edits';
import type { PlanFeature } from '$lib/components/map/types';
import { PlanEditor } from './editor.svelte';

const ctd: PlanFeature = {
	type: 'Feature',
	id: 's1',
	properties: { kind: 'station', name: 'CTD-01', stationKind: 'ctd', params: {} },
	geometry: { type: 'Point', coordinates: [-146.2, -30.1] }
};

/** An editor over a one-station plan whose requests are recorded and answered by `answer`. */
function setup(
	answer: (req: ApiRequest) => unknown = (req) => ({ id: 'new', ...(req.body as object) })
) {
	const sent: ApiRequest[] = [];
	let reloads = 0;
	const features: PlanFeature[] = [ctd];
	const editor = new PlanEditor({
		cruiseId: () => 'c1',
		features: () => features,
		vessel: () => null,
		send: async <T>(req: ApiRequest) => {
			sent.push(req);
			const a = answer(req);
			if (a instanceof Error) throw a;
			return a as T;
		},
		reload: async () => {
			reloads++;
		}
	});
	return { editor, sent, reloads: () => reloads };
}

describe('PlanEditor', () => {
	it('select and choose a tool: a drawing tool drops the selection', () => {
		const { editor } = setup();
		editor.select('s1');
		expect(editor.selected?.properties.name).toBe('CTD-01');
		editor.chooseTool('line');
		expect(editor.selectedId).toBeNull();
		expect(editor.tool).toBe('line');
	});

	it('places typed positions near the cruise at once', () => {
		const { editor } = setup();
		editor.typedKind = 'station';
		editor.typedText = '30 12.500 S 146 24.000 W';
		editor.place();
		expect(editor.doubt).toBeNull();
		expect(editor.draft?.geometry).toEqual({
			type: 'Point',
			coordinates: [-146.4, -30.208333333333332]
		});
		expect(editor.form.name).toBe('CTD-02');
	});

	it('asks "did you mean W?" for a far position and places the flip when chosen', () => {
		const { editor } = setup();
		editor.typedKind = 'station';
		editor.typedText = '30 12.500 S 146 24.000 E';
		editor.place();
		expect(editor.draft).toBeNull();
		expect(editor.doubt?.flip).toBe('W');
		expect(editor.doubtQuestion).toMatch(
			/km from everything else on the cruise\. Did you mean W: 30°12\.500′S 146°24\.000′W\?/
		);
		editor.place(true);
		expect(editor.doubt).toBeNull();
		expect(editor.draft?.geometry.coordinates).toEqual([-146.4, -30.208333333333332]);
	});

	it('places the far position as typed when the person says so', () => {
		const { editor } = setup();
		editor.typedText = '30 12.500 S 146 24.000 E';
		editor.place();
		editor.place(false);
		expect(editor.draft?.geometry.coordinates).toEqual([146.4, -30.208333333333332]);
	});

	it('refuses an out-of-limit setting at its field without sending anything', async () => {
		const { editor, sent } = setup();
		editor.onDrawn('line', {
			type: 'LineString',
			coordinates: [
				[-146, -30],
				[-145, -30]
			]
		});
		editor.form.surveySpeedKn = 40;
		await editor.save();
		expect(sent).toHaveLength(0);
		expect(editor.fieldError).toEqual({
			field: 'surveySpeedKn',
			message: 'Survey speed must be above 0 and at most 20 kn.'
		});
	});

	it('shows an API refusal in plain words at its field, not the schema text', async () => {
		const { editor } = setup(
			() =>
				new ApiFailure(422, 'name: Too big: expected string to have <=80 characters', [
					{ field: 'name', message: 'Too big: expected string to have <=80 characters' }
				])
		);
		editor.onDrawn('station', { type: 'Point', coordinates: [-146, -30] });
		await editor.save();
		expect(editor.fieldError).toEqual({
			field: 'name',
			message: 'Name must be 1 to 80 characters long.'
		});
		expect(editor.message?.text).not.toMatch(/Too big|expected/);
	});

	it('saves a draft, remembers it, and undo sends the inverse', async () => {
		const { editor, sent, reloads } = setup((req) =>
			req.method === 'POST'
				? { ...ctd, id: 's2', properties: { ...ctd.properties, name: 'CTD-02' } }
				: undefined
		);
		editor.onDrawn('station', { type: 'Point', coordinates: [-146, -30] });
		await editor.save();
		expect(sent[0]).toMatchObject({ method: 'POST', path: '/api/v1/cruises/c1/plan/features' });
		expect(editor.message).toEqual({ tone: 'ok', text: 'Saved CTD-02.' });
		await editor.undo();
		expect(sent[1]).toEqual({ method: 'DELETE', path: '/api/v1/cruises/c1/plan/features/s2' });
		expect(editor.message?.text).toBe('Undone: add station CTD-02.');
		expect(reloads()).toBe(2);
	});

	it('accepts generated lines with their new area in ONE request', async () => {
		const area = {
			...ctd,
			id: 'a1',
			properties: { kind: 'area', name: 'Box', overlapPct: 30, surveySpeedKn: 8 }
		};
		const { editor, sent } = setup(() => ({ area, lines: [{ id: 'l1' }, { id: 'l2' }] }));
		const ring = [
			[-146, -30],
			[-145, -30],
			[-145, -29],
			[-146, -30]
		];
		editor.onDrawn('area', { type: 'Polygon', coordinates: [ring] });
		editor.form.name = 'Box';
		const lines = [
			{
				type: 'LineString' as const,
				coordinates: [
					[-146, -29.9],
					[-145, -29.9]
				]
			},
			{
				type: 'LineString' as const,
				coordinates: [
					[-146, -29.8],
					[-145, -29.8]
				]
			}
		];
		await editor.acceptGenerated(
			{ key: 'draft-1', id: null, form: editor.form },
			{ plan: {} as never, lines, coverage: [] },
			8
		);
		expect(sent).toHaveLength(1);
		expect(sent[0].path).toBe('/api/v1/cruises/c1/plan/areas');
		const body = sent[0].body as { area: { name: string }; lines: { name: string }[] };
		expect(body.area.name).toBe('Box');
		expect(body.lines.map((l) => l.name)).toEqual(['Box-01', 'Box-02']);
		expect(editor.message?.text).toBe('Added 2 lines over Box.');
		expect(editor.selectedId).toBe('a1');
	});
});
