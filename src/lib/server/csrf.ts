// Cross-site form submissions are refused, as SvelteKit's own origin check does, with one
// exception: RFC 8058 one-click unsubscribe, where the mail provider POSTs the link from its own
// servers (no Origin of ours). That link carries a single-use token as its only credential and no
// cookie is used, so there is nothing to forge. SvelteKit's check runs before any hook and cannot
// make exceptions, so svelte.config.js turns it off (`trustedOrigins: ['*']`) and this takes over.

const FORM_TYPES = [
	'application/x-www-form-urlencoded',
	'multipart/form-data',
	'text/plain',
	'application/x-sveltekit-formdata'
];
const UNSAFE = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

/** Paths open to cross-site form posts, each with its own credential in the URL. */
const ONE_CLICK = /^\/unsubscribe\/[a-z2-7]{20,40}$/;

/** A refusal message when the request is a cross-site form submission we do not take. */
export function crossSiteRefusal(request: Request, url: URL): string | null {
	if (!UNSAFE.has(request.method)) return null;
	const type = request.headers.get('content-type')?.split(';', 1)[0].trim().toLowerCase() ?? '';
	if (!FORM_TYPES.includes(type)) return null;
	if (request.headers.get('origin') === url.origin) return null;
	if (request.method === 'POST' && ONE_CLICK.test(url.pathname)) return null;
	return `Cross-site ${request.method} form submissions are forbidden`;
}
