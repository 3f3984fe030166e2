import type { Db } from './db/client';
import { auditLog } from './db/schema';

export function audit(
	tx: Pick<Db, 'insert'>,
	entry: { userId?: string | null; cruiseId?: string | null; action: string; detail?: unknown }
) {
	tx.insert(auditLog)
		.values({
			userId: entry.userId ?? null,
			cruiseId: entry.cruiseId ?? null,
			action: entry.action,
			detail: entry.detail ?? null
		})
		.run();
}
