import { apiError } from '$lib/server/api';
import type { RequestHandler } from './$types';

// Public: unknown API paths answer in the API's JSON error shape instead of an HTML page.
export const fallback: RequestHandler = ({ url, request }) =>
	apiError(404, `No API route ${request.method} ${url.pathname}.`);
