// The persons-on-board list (immigration and port formalities): confirmed people per leg with the
// travel details they keep on their own profile. Read only by the master and the port agent of the
// cruise (and each person reads their own details); never by other participants or admins.
import { and, asc, eq, inArray } from 'drizzle-orm';
import { quote } from '$lib/engine/formats/csv';
import { ROLE_ON_BOARD_LABELS } from '$lib/party';
import type { TravelProfileInput } from '$lib/schemas/party';
import { audit } from './audit';
import { db as appDb } from './db';
import type { Db } from './db/client';
import { berthApplication, leg, port, travelProfile, user } from './db/schema';

type Reader = Pick<Db, 'select'>;

export function profile(userId: string, db: Reader = appDb) {
	return db.select().from(travelProfile).where(eq(travelProfile.userId, userId)).get() ?? null;
}

export function saveProfile(userId: string, input: TravelProfileInput, db: Db = appDb) {
	db.transaction((tx) => {
		tx.insert(travelProfile)
			.values({ userId, ...input, updatedAt: new Date() })
			.onConflictDoUpdate({
				target: travelProfile.userId,
				set: { ...input, updatedAt: new Date() }
			})
			.run();
		audit(tx, { userId, action: 'travel_profile.saved' });
	});
}

export interface PobPerson {
	name: string;
	fullName: string | null;
	nationality: string | null;
	dateOfBirth: string | null;
	passportNumber: string | null;
	passportExpiry: string | null;
	roleOnBoard: string;
	joiningPort: string;
	leavingPort: string;
}

export interface PobLeg {
	id: string;
	name: string;
	people: PobPerson[];
}

/** Confirmed people per leg, by name, with their travel details (null where not yet entered). */
export function list(cruiseId: string, db: Reader = appDb): PobLeg[] {
	const legs = db.select().from(leg).where(eq(leg.cruiseId, cruiseId)).orderBy(asc(leg.seq)).all();
	const portIds = legs.flatMap((l) => [l.fromPortId, l.toPortId]).filter((x): x is string => !!x);
	const ports = new Map(
		(portIds.length ? db.select().from(port).where(inArray(port.id, portIds)).all() : []).map(
			(p) => [p.id, p.name]
		)
	);
	return legs.map((l) => ({
		id: l.id,
		name: l.name,
		people: db
			.select({
				name: user.name,
				roleOnBoard: berthApplication.roleOnBoard,
				fullName: travelProfile.fullName,
				nationality: travelProfile.nationality,
				dateOfBirth: travelProfile.dateOfBirth,
				passportNumber: travelProfile.passportNumber,
				passportExpiry: travelProfile.passportExpiry
			})
			.from(berthApplication)
			.innerJoin(user, eq(berthApplication.userId, user.id))
			.leftJoin(travelProfile, eq(travelProfile.userId, user.id))
			.where(and(eq(berthApplication.legId, l.id), eq(berthApplication.status, 'confirmed')))
			.orderBy(asc(user.name))
			.all()
			.map((p) => ({
				...p,
				roleOnBoard: p.roleOnBoard ? ROLE_ON_BOARD_LABELS[p.roleOnBoard] : '',
				joiningPort: (l.fromPortId && ports.get(l.fromPortId)) || '',
				leavingPort: (l.toPortId && ports.get(l.toPortId)) || ''
			}))
	}));
}

export const CSV_HEADER = [
	'leg',
	'full_name',
	'nationality',
	'date_of_birth',
	'passport_number',
	'passport_expiry',
	'role_on_board',
	'joining_port',
	'leaving_port'
];

/** RFC 4180: the header row first, CRLF line ends, fields quoted when they hold , " or line breaks. */
export function csv(legs: PobLeg[]): string {
	const rows = [CSV_HEADER];
	for (const l of legs)
		for (const p of l.people)
			rows.push([
				l.name,
				p.fullName ?? p.name,
				p.nationality ?? '',
				p.dateOfBirth ?? '',
				p.passportNumber ?? '',
				p.passportExpiry ?? '',
				p.roleOnBoard,
				p.joiningPort,
				p.leavingPort
			]);
	return rows.map((r) => r.map(quote).join(',')).join('\r\n') + '\r\n';
}
