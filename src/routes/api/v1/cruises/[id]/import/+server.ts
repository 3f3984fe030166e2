import { json } from '@sveltejs/kit';
import {
	checkImportSize,
	detectFormat,
	FORMATS,
	importPlan,
	MAX_IMPORT_BYTES,
	type FormatId
} from '$lib/engine/formats';
import { api, ApiError } from '$lib/server/api';
import * as guards from '$lib/server/guards';
import * as plan from '$lib/server/plan';
import type { RequestHandler } from './$types';

/**
 * Imports a plan file (the raw file as the body). Query: `format` (else detected from the bytes and
 * `filename`), `dryRun=1` to only report, `acceptValid=1` to import the valid items despite problems.
 * Without acceptValid, any error imports nothing (422 with the problems, each naming where).
 */
export const POST: RequestHandler = api(async (event) => {
	const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
	const q = event.url.searchParams;
	const declared = Number(event.request.headers.get('content-length') ?? 0);
	const tooBig = checkImportSize(declared);
	if (tooBig) throw new ApiError(413, tooBig.message);
	const bytes = new Uint8Array(await event.request.arrayBuffer());
	const tooBigActual = checkImportSize(bytes.byteLength);
	if (tooBigActual) throw new ApiError(413, tooBigActual.message);
	if (bytes.byteLength === 0) throw new ApiError(400, 'The file is empty.');
	if (bytes.subarray(0, 4096).includes(0))
		throw new ApiError(
			415,
			'This is a binary file; plan imports are GeoJSON, GPX, KML, CSV or RTZ text.'
		);
	let text: string;
	try {
		text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
	} catch {
		throw new ApiError(415, 'The file is not UTF-8 text.');
	}
	const filename = q.get('filename') ?? undefined;
	const format = (q.get('format') || detectFormat(text, filename)) as FormatId | null;
	if (!format || !(FORMATS as readonly string[]).includes(format))
		throw new ApiError(415, `Cannot tell the file's format; name one of ${FORMATS.join(', ')}.`);

	const result = importPlan(text, format, { filename, maxBytes: MAX_IMPORT_BYTES });
	const errors = result.problems.filter((p) => p.severity !== 'warning');
	const counts = {
		ridges: result.plan.ridges.length,
		lines: result.plan.lines.length,
		areas: result.plan.areas.length,
		stations: result.plan.stations.length
	};
	const found = counts.ridges + counts.lines + counts.areas + counts.stations;
	if (q.get('dryRun') === '1')
		return json({ format, valid: counts, problems: result.problems, imported: null });
	if (errors.length > 0 && q.get('acceptValid') !== '1')
		throw new ApiError(
			422,
			`${errors.length} problem${errors.length === 1 ? '' : 's'} in the file; nothing was imported.`,
			'invalid_file',
			{ format, valid: counts, problems: result.problems }
		);
	if (found === 0)
		throw new ApiError(422, 'The file holds nothing to import.', 'empty_file', {
			problems: result.problems
		});
	const imported = plan.importDoc(user.id, cruise.id, result.plan);
	return json({ format, valid: counts, problems: result.problems, imported }, { status: 201 });
});
