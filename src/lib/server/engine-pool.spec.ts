import { afterAll, describe, expect, it } from 'vitest';
import { EngineInputError } from '$lib/engine/profile';
import * as enginePool from './engine-pool';

afterAll(() => enginePool.close());

describe('engine pool', () => {
	it('runs a named task in a worker and answers the same as the engine in-process', async () => {
		const input = {
			line: {
				coordinates: [
					[-31, 10],
					[-29, 10]
				] as [number, number][]
			},
			ridge: {
				axis: {
					coordinates: [
						[-30, 9],
						[-30, 11]
					] as [number, number][]
				},
				fullRateMmYr: 30
			}
		};
		const r = await enginePool.run('depthProfile', input);
		const { depthProfile } = await import('$lib/engine/profile');
		expect(r).toEqual(depthProfile(input));
	});

	it('passes the engine’s input errors back with their field', async () => {
		const bad = {
			line: { coordinates: [[-31, 10]] as [number, number][] },
			ridge: { axis: { coordinates: [] as [number, number][] }, fullRateMmYr: 30 }
		};
		await expect(enginePool.run('depthProfile', bad)).rejects.toBeInstanceOf(EngineInputError);
	});

	it('stops a task past its budget while the event loop stays free', async () => {
		let ticks = 0;
		const iv = setInterval(() => ticks++, 10);
		const t0 = Date.now();
		await expect(enginePool.run('spin', { ms: 5000 }, { budgetMs: 300 })).rejects.toBeInstanceOf(
			enginePool.EngineBudgetError
		);
		clearInterval(iv);
		expect(Date.now() - t0).toBeLessThan(2000);
		// the main thread kept ticking while the worker spun
		expect(ticks).toBeGreaterThan(10);
		// and the pool still serves after stopping a worker
		expect(await enginePool.run('spin', { ms: 1 })).toBeGreaterThanOrEqual(0);
	});
});
