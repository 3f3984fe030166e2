import { json } from '@sveltejs/kit';
import { api, ApiError } from '$lib/server/api';
import * as documents from '$lib/server/documents';
import * as guards from '$lib/server/guards';
import * as uploads from '$lib/server/storage/uploads';
import { documentMetaSchema } from '$lib/schemas/party';
import type { RequestHandler } from './$types';

/** The caller's own documents on the cruise and the required ones still missing. */
export const GET: RequestHandler = api((event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	return json(documents.mine(access.user.id, access.cruise.id));
});

/**
 * Uploads one sea-going document: the raw file as the body (`application/octet-stream`), with
 * `?kind=…&filename=…[&expiresOn=YYYY-MM-DD]`. PDF, JPEG or PNG read from the bytes, ≤ 10 MB.
 */
export const POST: RequestHandler = api(async (event) => {
	const access = guards.requireCruiseRole(event, event.params.id, 'participant', 'chief_scientist');
	const q = event.url.searchParams;
	const parsed = documentMetaSchema.safeParse({
		kind: q.get('kind') ?? undefined,
		filename: q.get('filename') ?? undefined,
		expiresOn: q.get('expiresOn') || undefined
	});
	if (!parsed.success) {
		const issues = parsed.error.issues.map((i) => ({
			field: i.path.join('.'),
			message: i.message
		}));
		throw new ApiError(
			422,
			issues.map((i) => `${i.field}: ${i.message}`).join('; '),
			'invalid',
			issues
		);
	}
	uploads.checkDeclaredSize(event.request.headers.get('content-length'));
	const bytes = new Uint8Array(await event.request.arrayBuffer());
	const doc = await documents.upload(access, parsed.data, bytes);
	return json(
		{
			id: doc.id,
			kind: doc.kind,
			filename: doc.filename,
			mimeType: doc.mimeType,
			sizeBytes: doc.sizeBytes,
			sha256: doc.sha256,
			status: doc.status,
			expiresOn: doc.expiresOn
		},
		{ status: 201 }
	);
});
