// Heavy engine work off the event loop: a small pool of worker threads (piscina) running the named
// tasks of ./engine-tasks.ts, each within a time budget. Past the budget the worker is stopped and
// the caller gets EngineBudgetError (422 "too_heavy"); with the queue full, EngineBusyError (503).
// The worker is one self-contained bundle made by the `engineWorker` Vite plugin (vite.config.ts);
// it is written once to the temp folder under its content hash, so dev, tests and the adapter-node
// build all start the same file wherever the server code itself ends up.
import { createHash } from 'node:crypto';
import { existsSync, renameSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Piscina from 'piscina';
import { EngineInputError } from '$lib/engine/profile';
import { config } from './config';
import { EngineBudgetError, EngineBusyError } from './engine-errors';
import type { EngineTasks, TaskName, TaskOutcome } from './engine-tasks';

export { EngineBudgetError, EngineBusyError };

let pool: Piscina | null = null;
let starting: Promise<Piscina> | null = null;

async function workerFile(): Promise<string> {
	// Loaded when first needed: outside Vite (scripts run by tsx) there is no such module.
	const workerSource = (await import('virtual:engine-worker')).default;
	const hash = createHash('sha256').update(workerSource).digest('hex').slice(0, 16);
	const file = join(tmpdir(), `wakeline-engine-worker-${hash}.mjs`);
	if (!existsSync(file)) {
		const tmp = `${file}.${process.pid}.tmp`;
		writeFileSync(tmp, workerSource);
		renameSync(tmp, file); // atomic: another process may be writing the same file
	}
	return file;
}

function thePool(): Promise<Piscina> {
	starting ??= workerFile().then(
		(filename) =>
			(pool = new Piscina({
				filename,
				minThreads: 1,
				maxThreads: config.engine.threads,
				maxQueue: config.engine.maxQueue,
				idleTimeout: 60_000
			}))
	);
	return starting;
}

export interface RunOptions {
	/** Milliseconds the task may take, queueing excluded; default ENGINE_BUDGET_MS. */
	budgetMs?: number;
}

/**
 * Runs a named engine task in a worker. Throws EngineInputError (bad input, with its field),
 * EngineBudgetError (over the time budget) or EngineBusyError (queue full).
 */
export async function run<K extends TaskName>(
	task: K,
	input: Parameters<EngineTasks[K]>[0],
	options: RunOptions = {}
): Promise<ReturnType<EngineTasks[K]>> {
	const budgetMs = options.budgetMs ?? config.engine.budgetMs;
	const p = await thePool();
	if (p.queueSize >= config.engine.maxQueue) throw new EngineBusyError();
	const abort = new AbortController();
	// The budget counts from when a worker starts the task would be fairer, but piscina does not
	// tell; queue time is short with the queue bounded, so the budget includes it.
	const timer = setTimeout(() => abort.abort(), budgetMs);
	try {
		const out = (await p.run({ task, input }, { signal: abort.signal })) as TaskOutcome<
			ReturnType<EngineTasks[K]>
		>;
		if (!out.ok) throw new EngineInputError(out.field, out.message);
		return out.value;
	} catch (e) {
		if (abort.signal.aborted) throw new EngineBudgetError(budgetMs);
		if (e instanceof Error && /queue is at limit/i.test(e.message)) throw new EngineBusyError();
		throw e;
	} finally {
		clearTimeout(timer);
	}
}

/** Starts the pool ahead of the first heavy request (server start), so no request pays for it. */
export async function warm(): Promise<void> {
	await thePool();
}

/** Threads and queue, for the admin and for tests. */
export function stats() {
	return pool
		? { threads: pool.threads.length, queued: pool.queueSize, completed: pool.completed }
		: { threads: 0, queued: 0, completed: 0 };
}

export async function close(): Promise<void> {
	const p = pool;
	pool = null;
	starting = null;
	await p?.destroy();
}
