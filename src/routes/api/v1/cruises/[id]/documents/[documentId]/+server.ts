import { json } from '@sveltejs/kit';
import { api, readJson } from '$lib/server/api';
import * as documents from '$lib/server/documents';
import * as guards from '$lib/server/guards';
import { reviewSchema } from '$lib/schemas/party';
import type { RequestHandler } from './$types';

/** Downloads the file under its original name. Medical: owner, chief scientist, master only. */
export const GET: RequestHandler = api((event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	const { doc, bytes } = documents.open(access, event.params.documentId);
	const ascii = doc.filename.replace(/[^\x20-\x7e]/g, '_');
	return new Response(new Uint8Array(bytes), {
		headers: {
			'content-type': doc.mimeType,
			'content-length': String(bytes.byteLength),
			// RFC 6266: an ASCII fallback and the UTF-8 name.
			'content-disposition': `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(doc.filename)}`,
			'cache-control': 'private, no-store'
		}
	});
});

/** The chief scientist accepts or rejects (with a reason). */
export const PATCH: RequestHandler = api(async (event) => {
	const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
	const body = await readJson(event, reviewSchema, 8 * 1024);
	const doc = documents.review(
		user.id,
		cruise.id,
		event.params.documentId,
		body.status,
		body.reason
	);
	return json({ id: doc.id, status: doc.status, reviewReason: doc.reviewReason });
});

/** The owner takes back their own upload. */
export const DELETE: RequestHandler = api((event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	documents.removeOwn(access, event.params.documentId);
	return new Response(null, { status: 204 });
});
