// Worker entry of the engine pool: piscina calls the default export with { task, input }. Bundled
// into one self-contained file by the `engineWorker` Vite plugin (vite.config.ts).
import { EngineInputError } from '$lib/engine/profile';
import { tasks, type TaskName, type TaskOutcome } from './engine-tasks';

export default function run({
	task,
	input
}: {
	task: TaskName;
	input: unknown;
}): TaskOutcome<unknown> {
	const f = tasks[task] as ((input: unknown) => unknown) | undefined;
	if (!f) throw new Error(`unknown engine task "${task}"`);
	try {
		return { ok: true, value: f(input) };
	} catch (e) {
		if (e instanceof EngineInputError) return { ok: false, field: e.field, message: e.message };
		throw e;
	}
}
