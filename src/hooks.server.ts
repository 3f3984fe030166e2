import { json, text, type Handle, type HandleServerError, type ServerInit } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import {
	SESSION_COOKIE,
	deleteSessionCookie,
	setSessionCookie,
	validateApiToken,
	validateSessionToken
} from '$lib/server/auth';
import { apiError } from '$lib/server/api';
import { crossSiteRefusal } from '$lib/server/csrf';
import { db } from '$lib/server/db';
import * as enginePool from '$lib/server/engine-pool';
import { newId } from '$lib/server/ids';
import * as documents from '$lib/server/documents';
import * as outbox from '$lib/server/mail/outbox';
import * as reminders from '$lib/server/reminders';

export const init: ServerInit = () => {
	outbox.startWorker();
	void enginePool.warm().catch((e) => console.error('engine pool did not start', e));
	reminders.startScheduler();
	documents.startRetention();
};

const handleSession: Handle = async ({ event, resolve }) => {
	event.locals.user = null;
	event.locals.session = null;
	const secure = event.url.protocol === 'https:';

	const authz = event.request.headers.get('authorization');
	if (authz?.startsWith('Bearer ')) {
		const found = validateApiToken(db, authz.slice(7).trim());
		if (found) {
			event.locals.user = found.user;
			event.locals.session = found.session;
		}
		return resolve(event);
	}

	const token = event.cookies.get(SESSION_COOKIE);
	if (token) {
		const found = validateSessionToken(db, token);
		if (found) {
			setSessionCookie(event.cookies, token, found.session.expiresAt, secure);
			event.locals.user = found.user;
			event.locals.session = found.session;
		} else {
			deleteSessionCookie(event.cookies, secure);
		}
	}
	return resolve(event);
};

const securityHeaders: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	response.headers.set('X-Content-Type-Options', 'nosniff');
	response.headers.set('Referrer-Policy', 'same-origin');
	if (!response.headers.has('X-Frame-Options')) response.headers.set('X-Frame-Options', 'DENY');
	return response;
};

/**
 * Cross-site form posts refused, as SvelteKit's own check does (svelte.config.js hands it to us, see
 * csrf.ts for the one exception); on API paths in the JSON error shape.
 */
const csrf: Handle = async ({ event, resolve }) => {
	const refusal = crossSiteRefusal(event.request, event.url);
	if (!refusal) return resolve(event);
	if (event.url.pathname.startsWith('/api/')) return apiError(403, refusal, 'cross_site');
	return event.request.headers.get('accept') === 'application/json'
		? json({ message: refusal }, { status: 403 })
		: text(refusal, { status: 403 });
};

export const handle = sequence(csrf, handleSession, securityHeaders);

export const handleError: HandleServerError = ({ error, event, status, message }) => {
	const id = newId();
	if (status !== 404)
		console.error(`[error ${id}] ${event.request.method} ${event.url.pathname}`, error);
	return { message: status === 404 ? message : 'Something went wrong on our side.', id };
};
