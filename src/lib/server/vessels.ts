import { asc, eq, ne, and } from 'drizzle-orm';
import type { VesselInput } from '$lib/schemas/vessel';
import { audit } from './audit';
import { db } from './db';
import { port, vessel } from './db/schema';
import { newId } from './ids';
import { DomainError } from './users';

export function list() {
	return db.select().from(vessel).orderBy(asc(vessel.name)).all();
}

export function get(id: string) {
	return db.select().from(vessel).where(eq(vessel.id, id)).get();
}

function values(input: VesselInput) {
	const { dayRate, ...rest } = input;
	return { ...rest, dayRateMinor: Math.round(dayRate * 100) };
}

function assertCallSignFree(callSign: string, exceptId?: string) {
	const clash = db
		.select({ id: vessel.id })
		.from(vessel)
		.where(
			exceptId
				? and(eq(vessel.callSign, callSign), ne(vessel.id, exceptId))
				: eq(vessel.callSign, callSign)
		)
		.get();
	if (clash)
		throw new DomainError(`Another vessel already has call sign ${callSign}.`, 'callSign', 409);
}

export function create(actorId: string, input: VesselInput) {
	assertCallSignFree(input.callSign);
	const id = newId();
	db.insert(vessel)
		.values({ id, ...values(input) })
		.run();
	audit(db, { userId: actorId, action: 'vessel.created', detail: { id, name: input.name } });
	return id;
}

export function update(actorId: string, id: string, input: VesselInput) {
	assertCallSignFree(input.callSign, id);
	db.update(vessel).set(values(input)).where(eq(vessel.id, id)).run();
	audit(db, { userId: actorId, action: 'vessel.updated', detail: { id } });
}

export function ports() {
	return db.select().from(port).orderBy(asc(port.name)).all();
}
