import { json } from '@sveltejs/kit';
import { api } from '$lib/server/api';
import * as notices from '$lib/server/notices';
import type { RequestHandler } from './$types';

// Public by design: RFC 8058 one-click unsubscribe. Mail clients POST `List-Unsubscribe=One-Click`
// here from their own servers, without a session; the single-use token in the URL is the
// credential. Browsers asking for HTML get the page and its form action instead (same URL).
export const POST: RequestHandler = api(({ params }) => {
	const done = notices.unsubscribe(params.token);
	return json({ unsubscribed: done.kind });
});
