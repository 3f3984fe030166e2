import { exportPlan, FORMATS, type FormatId } from '$lib/engine/formats';
import { api, ApiError } from '$lib/server/api';
import * as guards from '$lib/server/guards';
import * as plan from '$lib/server/plan';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = api(async (event) => {
	const { cruise } = guards.requireCruiseRole(event, event.params.id);
	const format = event.params.format as FormatId;
	if (!(FORMATS as readonly string[]).includes(format))
		throw new ApiError(404, `Unknown export format "${format}"; use one of ${FORMATS.join(', ')}.`);
	const file = exportPlan(await plan.toPlanDoc(cruise.id), format);
	return new Response(file.body, {
		headers: {
			'content-type': file.mimeType.includes('charset')
				? file.mimeType
				: `${file.mimeType}; charset=utf-8`,
			'content-disposition': `attachment; filename="${file.filename}"`,
			'cache-control': 'no-store'
		}
	});
});
