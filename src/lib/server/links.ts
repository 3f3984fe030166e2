// Where a link may send someone after signing in: a path on this site, never elsewhere.

/**
 * `next` resolved against the origin; only a same-origin path (with its query and fragment) is
 * kept. `/\evil.example`, `//evil.example`, `https://evil.example`, `javascript:` all fall back.
 */
export function safeNext(next: string | null, origin: string, fallback: string): string {
	if (!next || !next.startsWith('/')) return fallback;
	let url: URL;
	try {
		url = new URL(next, origin);
	} catch {
		return fallback;
	}
	if (url.origin !== new URL(origin).origin) return fallback;
	return url.pathname + url.search + url.hash;
}
