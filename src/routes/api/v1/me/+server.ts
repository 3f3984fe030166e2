import { json } from '@sveltejs/kit';
import { api } from '$lib/server/api';
import * as cruises from '$lib/server/cruises';
import * as guards from '$lib/server/guards';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = api((event) => {
	const user = guards.requireUser(event);
	const roles = cruises
		.listFor(user)
		.filter((c) => c.role)
		.map((c) => ({ cruiseId: c.id, code: c.code, role: c.role }));
	return json({ id: user.id, email: user.email, name: user.name, role: user.role, cruises: roles });
});
