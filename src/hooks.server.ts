import type { Handle, HandleServerError, ServerInit } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import {
	SESSION_COOKIE,
	deleteSessionCookie,
	setSessionCookie,
	validateApiToken,
	validateSessionToken
} from '$lib/server/auth';
import { db } from '$lib/server/db';
import { newId } from '$lib/server/ids';
import * as documents from '$lib/server/documents';
import * as outbox from '$lib/server/mail/outbox';

export const init: ServerInit = () => {
	outbox.startWorker();
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

export const handle = sequence(handleSession, securityHeaders);

export const handleError: HandleServerError = ({ error, event, status, message }) => {
	const id = newId();
	if (status !== 404)
		console.error(`[error ${id}] ${event.request.method} ${event.url.pathname}`, error);
	return { message: status === 404 ? message : 'Something went wrong on our side.', id };
};
