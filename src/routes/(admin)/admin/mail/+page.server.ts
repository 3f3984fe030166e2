import { desc } from 'drizzle-orm';
import { config } from '$lib/server/config';
import { db } from '$lib/server/db';
import { notice } from '$lib/server/db/schema';
import * as guards from '$lib/server/guards';
import { readCaught } from '$lib/server/mail/catcher';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	guards.requireAdmin(event);
	const outbox = db
		.select({
			id: notice.id,
			kind: notice.kind,
			toAddress: notice.toAddress,
			subject: notice.subject,
			status: notice.status,
			attempts: notice.attempts,
			lastError: notice.lastError,
			createdAt: notice.createdAt,
			sentAt: notice.sentAt,
			nextAttemptAt: notice.nextAttemptAt
		})
		.from(notice)
		.orderBy(desc(notice.createdAt))
		.limit(100)
		.all();
	return {
		outbox,
		catcherInUse: config.catcherInUse,
		caught: config.catcherInUse ? await readCaught(config.mailCatcherDir, 50) : []
	};
};
