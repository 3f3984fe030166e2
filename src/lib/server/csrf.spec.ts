import { describe, expect, it } from 'vitest';
import { crossSiteRefusal } from './csrf';

const url = new URL('https://wakeline.example/cruises/x/timeline?/timing');
const post = (path: string, headers: Record<string, string>, method = 'POST') =>
	new Request(new URL(path, url), { method, headers, body: 'a=1' });

describe('cross-site form submissions', () => {
	it('are refused without our origin, whatever the form type', () => {
		for (const type of [
			'application/x-www-form-urlencoded',
			'multipart/form-data; boundary=x',
			'text/plain;charset=utf-8'
		]) {
			const r = post('/signin', { 'content-type': type, origin: 'https://evil.example' });
			expect(crossSiteRefusal(r, new URL(r.url)), type).toMatch(/forbidden/);
			const none = post('/signin', { 'content-type': type });
			expect(crossSiteRefusal(none, new URL(none.url)), type).toMatch(/forbidden/);
		}
	});

	it('pass from our own origin, and JSON is left to the API (no cookie-less forms there)', () => {
		const own = post('/signin', {
			'content-type': 'application/x-www-form-urlencoded',
			origin: url.origin
		});
		expect(crossSiteRefusal(own, new URL(own.url))).toBeNull();
		const j = post('/api/v1/x', { 'content-type': 'application/json' });
		expect(crossSiteRefusal(j, new URL(j.url))).toBeNull();
	});

	it('pass for an RFC 8058 one-click unsubscribe POST, and only there', () => {
		const token = 'abcdefghijklmnopqrstuvwxyz234567';
		const ok = post(`/unsubscribe/${token}`, {
			'content-type': 'application/x-www-form-urlencoded'
		});
		expect(crossSiteRefusal(ok, new URL(ok.url))).toBeNull();
		for (const path of [`/unsubscribe/${token}/x`, '/unsubscribe/', '/signin']) {
			const r = post(path, { 'content-type': 'application/x-www-form-urlencoded' });
			expect(crossSiteRefusal(r, new URL(r.url)), path).toMatch(/forbidden/);
		}
		const del = post(`/unsubscribe/${token}`, { 'content-type': 'text/plain' }, 'DELETE');
		expect(crossSiteRefusal(del, new URL(del.url))).toMatch(/forbidden/);
	});
});
