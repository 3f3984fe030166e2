// Zod numbers bounded by the shared limits (src/lib/engine/limits.ts): the same bounds and words
// for the API, the forms, bulk edit and (through the engine) file imports.
import { z } from 'zod';
import { LIMITS, rangeMessage, type LimitName } from '$lib/engine/limits';

/** A finite number within LIMITS[name]; `label` names the field in the message. */
export function bounded(name: LimitName, label: string = name) {
	const r = LIMITS[name];
	const msg = rangeMessage(label, r);
	const n = z.number({ error: `${label} must be a number` });
	return ('minExclusive' in r && r.minExclusive ? n.gt(r.min, msg) : n.min(r.min, msg)).max(
		r.max,
		msg
	);
}
