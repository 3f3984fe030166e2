import { describe, expect, it } from 'vitest';
import { TrackUpload, type Transport } from './trackupload.svelte';

const file = (text: string, name = 'line.xyz') => new File([text], name);

describe('track upload state', () => {
	it('reports progress, then the track the server read', async () => {
		const seen: number[] = [];
		const ref: { up?: TrackUpload } = {};
		const transport: Transport = async (url, f, onProgress) => {
			expect(url).toBe('/api/v1/cruises/c1/tracks?filename=line.xyz');
			onProgress(5, 10);
			seen.push(ref.up!.progress);
			onProgress(10, 10);
			seen.push(ref.up!.progress);
			expect(ref.up!.phase).toBe('reading');
			return { status: 201, body: { track: { id: 't', name: 'line', format: 'xyz', points: 2 } } };
		};
		const up = new TrackUpload('c1', transport);
		ref.up = up;
		up.choose(file('1 2 3\n1 2 4\n'));
		const track = await up.send();
		expect(seen).toEqual([0.5, 1]);
		expect(track?.id).toBe('t');
		expect(up.phase).toBe('done');
		expect(up.message).toMatch(/Read 2 fixes/);
	});

	it('offers to flip negative depths, and sends flipDepths=1 when asked', async () => {
		const urls: string[] = [];
		const transport: Transport = async (url) => {
			urls.push(url);
			return url.includes('flipDepths=1')
				? { status: 201, body: { track: { id: 't', name: 'x', format: 'xyz', points: 1 } } }
				: { status: 422, body: { error: { code: 'negative_depths', message: 'negative' } } };
		};
		const up = new TrackUpload('c1', transport);
		up.choose(file('1 2 -3\n'));
		await up.send();
		expect(up.askFlip).toBe(true);
		expect(up.message).toBe('negative');
		await up.send(true);
		expect(up.askFlip).toBe(false);
		expect(urls[1]).toMatch(/flipDepths=1/);
	});

	it('shows the row the server names and never sends an empty file', async () => {
		let calls = 0;
		const transport: Transport = async () => {
			calls++;
			return {
				status: 422,
				body: { error: { code: 'invalid_track', message: 'Row 4, column LAT' } }
			};
		};
		const up = new TrackUpload('c1', transport);
		up.choose(file(''));
		expect(up.phase).toBe('error');
		await up.send();
		expect(calls).toBe(0);
		up.choose(file('x'));
		await up.send();
		expect(up.message).toBe('Row 4, column LAT');
		expect(up.askFlip).toBe(false);
	});
});
