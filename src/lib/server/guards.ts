// Authority at every door: every load, action and API handler calls one of these. Pages are sent to
// sign-in; API callers get 401 JSON (see api.ts). A layout load alone is never the gate.
import { error, redirect, type RequestEvent } from '@sveltejs/kit';
import { and, eq, sql } from 'drizzle-orm';
import type { SessionUser } from './auth';
import { db } from './db';
import { prepared } from './db/prepared';
import { cruise, cruiseMember, type Cruise, type CruiseRole } from './db/schema';

type Event = Pick<RequestEvent, 'locals' | 'url'>;

function isApi(event: Event) {
	return event.url.pathname.startsWith('/api/');
}

export function requireUser(event: Event): SessionUser {
	const user = event.locals.user;
	if (user) return user;
	if (isApi(event)) error(401, 'Sign in or send a personal API token (Authorization: Bearer …).');
	const next = event.url.pathname + event.url.search;
	redirect(303, `/signin?next=${encodeURIComponent(next)}`);
}

export function requireAdmin(event: Event): SessionUser {
	const user = requireUser(event);
	if (user.role !== 'admin') error(403, 'Only the marine office (admin) may do this.');
	return user;
}

/** Who may create cruises: admins and members the marine office marked as allowed to lead them. */
export function canCreateCruise(user: Pick<SessionUser, 'role' | 'canLeadCruises'>): boolean {
	return user.role === 'admin' || user.canLeadCruises;
}

export function requireCruiseCreator(event: Event): SessionUser {
	const user = requireUser(event);
	if (!canCreateCruise(user))
		error(403, 'Creating a cruise needs the marine office to allow you to lead cruises.');
	return user;
}

export interface CruiseAccess {
	user: SessionUser;
	cruise: Cruise;
	/** The caller's role on this cruise; null for an admin who holds none. */
	role: CruiseRole | null;
	isAdmin: boolean;
}

export function cruiseRoleOf(userId: string, cruiseId: string): CruiseRole | null {
	const row = prepared(db, 'guards.role', (d) =>
		d
			.select({ role: cruiseMember.role })
			.from(cruiseMember)
			.where(
				and(
					eq(cruiseMember.cruiseId, sql.placeholder('cruiseId')),
					eq(cruiseMember.userId, sql.placeholder('userId'))
				)
			)
			.prepare()
	).get({ cruiseId, userId });
	return row?.role ?? null;
}

/**
 * The caller must hold one of `roles` on the cruise (any role when none are named). Admins pass
 * every check here; medical documents use `canReadMedical` instead, which admins do not pass.
 */
export function requireCruiseRole(
	event: Event,
	cruiseId: string,
	...roles: CruiseRole[]
): CruiseAccess {
	const user = requireUser(event);
	const found = prepared(db, 'guards.cruise', (d) =>
		d
			.select()
			.from(cruise)
			.where(eq(cruise.id, sql.placeholder('id')))
			.prepare()
	).get({ id: cruiseId });
	if (!found) error(404, 'No such cruise.');
	const role = cruiseRoleOf(user.id, cruiseId);
	const isAdmin = user.role === 'admin';
	if (isAdmin) return { user, cruise: found, role, isAdmin };
	if (!role) error(403, 'You have no role on this cruise.');
	if (roles.length > 0 && !roles.includes(role))
		error(403, `This needs the role ${roles.map(roleLabel).join(' or ')} on this cruise.`);
	return { user, cruise: found, role, isAdmin };
}

/**
 * The caller must hold one of `roles` on the cruise themselves; being an admin does not count. For
 * data meant for those roles only (the persons-on-board list for the master and the port agent).
 */
export function requireHeldCruiseRole(
	event: Event,
	cruiseId: string,
	...roles: CruiseRole[]
): CruiseAccess {
	const access = requireCruiseRole(event, cruiseId, ...roles);
	if (!access.role || !roles.includes(access.role))
		error(403, `Only the ${roles.map(roleLabel).join(' and the ')} of this cruise see this.`);
	return access;
}

/** Medical documents: the chief scientist and the master of the cruise, nobody else. */
export function canReadMedical(access: CruiseAccess): boolean {
	return access.role === 'chief_scientist' || access.role === 'master';
}

export function roleLabel(role: CruiseRole): string {
	return {
		chief_scientist: 'chief scientist',
		participant: 'participant',
		port_agent: 'port agent',
		master: 'master'
	}[role];
}
