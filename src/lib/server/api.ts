// JSON API plumbing: the error shape of DESIGN.md §6, `{ error: { code, message, details? } }`,
// and request-body reading that turns bad JSON and schema failures into 400/422 answers.
import { isHttpError, json, type RequestEvent, type RequestHandler } from '@sveltejs/kit';
import type { z } from 'zod';
import { EngineInputError } from '$lib/engine/profile';
import { EngineBudgetError, EngineBusyError } from './engine-errors';

const CODES: Record<number, string> = {
	400: 'bad_request',
	401: 'unauthenticated',
	403: 'forbidden',
	404: 'not_found',
	405: 'method_not_allowed',
	409: 'conflict',
	413: 'payload_too_large',
	415: 'unsupported_media_type',
	422: 'unprocessable',
	429: 'too_many_requests',
	500: 'internal',
	503: 'busy'
};

export class ApiError extends Error {
	constructor(
		public status: number,
		message: string,
		public code: string = CODES[status] ?? 'error',
		public details?: unknown
	) {
		super(message);
	}
}

export function apiError(status: number, message: string, code?: string, details?: unknown) {
	return json(
		{ error: { code: code ?? CODES[status] ?? 'error', message, ...(details ? { details } : {}) } },
		{ status }
	);
}

/** Wraps a +server.ts handler so every failure leaves as the documented JSON error shape. */
export function api<E extends RequestEvent>(
	handler: (event: E) => Promise<Response> | Response
): (event: E) => Promise<Response> {
	return async (event) => {
		try {
			return await handler(event);
		} catch (e) {
			if (e instanceof ApiError) return apiError(e.status, e.message, e.code, e.details);
			if (isHttpError(e)) return apiError(e.status, e.body.message);
			if (e instanceof EngineInputError)
				return apiError(422, `${e.field}: ${e.message}`, 'invalid', [
					{ field: e.field, message: e.message }
				]);
			if (e instanceof EngineBudgetError) return apiError(422, e.message, 'too_heavy');
			if (e instanceof EngineBusyError) {
				const r = apiError(503, e.message, 'busy');
				r.headers.set('retry-after', '5');
				return r;
			}
			throw e;
		}
	};
}
export type ApiHandler = RequestHandler;

export const MAX_JSON_BYTES = 5 * 1024 * 1024;

/** Reads and validates a JSON body. 413 when too large, 400 when not JSON, 422 when off-schema. */
export async function readJson<S extends z.ZodType>(
	event: RequestEvent,
	schema: S,
	maxBytes = MAX_JSON_BYTES
): Promise<z.infer<S>> {
	const declared = Number(event.request.headers.get('content-length') ?? 0);
	if (declared > maxBytes) throw new ApiError(413, `The body is larger than ${maxBytes} bytes.`);
	const text = await event.request.text();
	if (text.length > maxBytes) throw new ApiError(413, `The body is larger than ${maxBytes} bytes.`);
	let body: unknown;
	try {
		body = JSON.parse(text);
	} catch (e) {
		throw new ApiError(400, `The body is not valid JSON: ${(e as Error).message}`, 'bad_json');
	}
	const parsed = schema.safeParse(body);
	if (!parsed.success) {
		const issues = parsed.error.issues.map((i) => ({
			field: i.path.join('.') || '(body)',
			message: i.message
		}));
		throw new ApiError(
			422,
			// Plain messages already name their field ("Name: at most 80 characters."); the path
			// follows them in brackets rather than leading twice.
			issues
				.map((i) =>
					/^[A-Z][^:]{0,60}: /.test(i.message)
						? `${i.message} (${i.field})`
						: `${i.field}: ${i.message}`
				)
				.join('; '),
			'invalid',
			issues
		);
	}
	return parsed.data;
}
