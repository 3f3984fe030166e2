import { describe, expect, it, vi } from 'vitest';

// The hooks open the app database on import; keep it in memory for this test.
process.env.DATABASE_PATH = ':memory:';
const { handleError } = await import('./hooks.server');

type Input = Parameters<typeof handleError>[0];
const event = {
	request: new Request('http://localhost/cruises/x'),
	url: new URL('http://localhost/cruises/x')
};

describe('unexpected errors', () => {
	it('show users an error id and a plain message, and log the detail with the same id', () => {
		const log = vi.spyOn(console, 'error').mockImplementation(() => undefined);
		const out = handleError({
			error: new Error('SQLITE_CORRUPT: secret detail'),
			event,
			status: 500,
			message: 'Internal Error'
		} as unknown as Input) as { message: string; id: string };
		expect(out.message).toBe('Something went wrong on our side.');
		expect(out.message).not.toMatch(/SQLITE|secret/);
		expect(out.id).toMatch(/^[a-z2-7]{16}$/);
		expect(String(log.mock.calls[0][0])).toContain(out.id);
		log.mockRestore();
	});

	it('keep the message of a missing page', () => {
		const out = handleError({
			error: new Error('Not found: /nope'),
			event,
			status: 404,
			message: 'Not Found'
		} as unknown as Input) as { message: string };
		expect(out.message).toBe('Not Found');
	});
});
