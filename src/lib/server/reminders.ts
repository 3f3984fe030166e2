// Reminders of documents and clearances falling due, 14, 7 and 1 days before (UTC days). A
// scheduler in the server process runs `run()` now and then; what it sent is the state, kept in
// the database (each reminder's dedupeKey in the notice table), so a restart never sends one twice
// and a server that was down catches up with the latest stage reached, not with every stage missed.
import { and, eq, inArray, ne } from 'drizzle-orm';
import { utcDay } from '../schedule';
import * as clearances from './clearances';
import { config } from './config';
import { db as appDb } from './db';
import type { Db } from './db/client';
import { berthApplication, cruise, cruiseMember, document } from './db/schema';
import * as deadlines from './deadlines';
import type { DeadlineView } from './deadlines';
import * as templates from './mail/templates';
import * as notices from './notices';
import * as timelines from './timeline';

const DAY_MS = 86_400_000;
/** Days before the due day on which a reminder goes out. */
export const STAGES = [14, 7, 1] as const;

/** The reminder stage reached on `now` for a due day, or null (too early, or already past). */
export function stageFor(dueAt: number, now: number): number | null {
	const daysLeft = Math.round((utcDay(dueAt) - utcDay(now)) / DAY_MS);
	if (daysLeft < 1) return null;
	const reached = STAGES.filter((s) => daysLeft <= s);
	return reached.length ? Math.min(...reached) : null;
}

/**
 * Checklist kinds that are the science party's own documents (personnel and medical forms): each
 * participant who has not uploaded that kind of document is reminded. Every other item (clearances,
 * cargo, reports) is the chief scientist's.
 */
const DOCUMENT_KIND: Partial<Record<DeadlineView['kind'], 'personnel' | 'medical'>> = {
	personnel: 'personnel',
	medical: 'medical'
};

function chiefs(d: Pick<Db, 'select'>, cruiseId: string): string[] {
	return d
		.select({ userId: cruiseMember.userId })
		.from(cruiseMember)
		.where(and(eq(cruiseMember.cruiseId, cruiseId), eq(cruiseMember.role, 'chief_scientist')))
		.all()
		.map((r) => r.userId);
}

/** The science party: confirmed berths, and participants on the cruise. */
function party(d: Pick<Db, 'select'>, cruiseId: string): string[] {
	const confirmed = d
		.select({ userId: berthApplication.userId })
		.from(berthApplication)
		.where(and(eq(berthApplication.cruiseId, cruiseId), eq(berthApplication.status, 'confirmed')))
		.all();
	const participants = d
		.select({ userId: cruiseMember.userId })
		.from(cruiseMember)
		.where(and(eq(cruiseMember.cruiseId, cruiseId), eq(cruiseMember.role, 'participant')))
		.all();
	return [...new Set([...confirmed, ...participants].map((r) => r.userId))];
}

function owing(
	d: Pick<Db, 'select'>,
	cruiseId: string,
	kind: 'personnel' | 'medical',
	people: string[]
): string[] {
	if (!people.length) return [];
	const have = new Set(
		d
			.select({ userId: document.userId })
			.from(document)
			.where(
				and(
					eq(document.cruiseId, cruiseId),
					eq(document.kind, kind),
					inArray(document.userId, people)
				)
			)
			.all()
			.map((r) => r.userId)
	);
	return people.filter((p) => !have.has(p));
}

/** Queues the reminders due at `now`. Returns how many were queued (0 when all were sent). */
export function run(now = Date.now(), d: Db = appDb): number {
	const cruises = d
		.select({ id: cruise.id, code: cruise.code })
		.from(cruise)
		.where(ne(cruise.status, 'completed'))
		.all();
	let queued = 0;
	for (const c of cruises) {
		const built = timelines.build(c.id, d);
		const t = built.timeline;
		const anchors = {
			sailingAt: built.data.input?.departure.at ?? built.data.cruise.departureAt?.getTime() ?? null,
			returnAt: t ? timelines.returnAt(t) : (built.data.cruise.returnAt?.getTime() ?? null)
		};
		const list = deadlines.list(c.id, anchors, clearances.list(c.id, built, now, d), now, d);
		const link = `${config.origin}/cruises/${c.id}/clearances`;
		d.transaction((tx) => {
			for (const item of list) {
				if (item.done || item.dueAt == null) continue;
				const stage = stageFor(item.dueAt, now);
				if (stage == null) continue;
				const docKind = DOCUMENT_KIND[item.kind];
				const who = docKind ? owing(tx, c.id, docKind, party(tx, c.id)) : chiefs(tx, c.id);
				const mail = templates.reminder({
					cruiseCode: c.code,
					title: item.title,
					dueAt: item.dueAt,
					daysBefore: stage,
					what: docKind
						? `Please upload your ${docKind} form in Wakeline before then (documents are never sent by e-mail).`
						: `It is on the cruise checklist (${item.rule}).`,
					link
				});
				const day = new Date(item.dueAt).toISOString().slice(0, 10);
				for (const userId of who)
					if (
						notices.send(tx, {
							kind: 'reminder',
							userId,
							cruiseId: c.id,
							...mail,
							dedupeKey: `reminder:${item.id}:${day}:${stage}:${userId}`
						})
					)
						queued++;
			}
		});
	}
	return queued;
}

let timer: ReturnType<typeof setInterval> | null = null;

/** Runs the reminders at start and then every REMINDER_INTERVAL_MS (default one hour). */
export function startScheduler() {
	if (timer || config.reminderIntervalMs <= 0) return;
	const tick = () => {
		try {
			const n = run();
			if (n) console.log(`[reminders] queued ${n}`);
		} catch (e) {
			console.error('[reminders] run failed', e);
		}
	};
	timer = setInterval(tick, config.reminderIntervalMs);
	timer.unref?.();
	setTimeout(tick, 1000).unref?.();
}
