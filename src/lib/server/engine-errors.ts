// Failures of the engine pool (engine-pool.ts), kept apart so api.ts can map them without loading
// the pool.
export class EngineBudgetError extends Error {
	constructor(readonly budgetMs: number) {
		super(`The computation needs more than ${budgetMs / 1000} s; make the input smaller.`);
		this.name = 'EngineBudgetError';
	}
}

export class EngineBusyError extends Error {
	constructor() {
		super('The server is busy computing for others; try again in a few seconds.');
		this.name = 'EngineBusyError';
	}
}
