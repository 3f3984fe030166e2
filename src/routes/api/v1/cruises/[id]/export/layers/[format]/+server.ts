import { api } from '$lib/server/api';
import * as exportFiles from '$lib/server/exports';
import * as guards from '$lib/server/guards';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = api(async (event) => {
	const { cruise } = guards.requireCruiseRole(event, event.params.id);
	return exportFiles.response(await exportFiles.file(cruise.id, 'layers', event.params.format));
});
