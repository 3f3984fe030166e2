// Zod numbers bounded by the shared limits (src/lib/engine/limits.ts): the same bounds for the API,
// the forms, bulk edit and (through the engine) file imports. The words come from the plain-message
// error map in ./messages ("Survey speed (kn): at most 20."), named after the field that holds them.
import { z } from './messages';
import { LIMITS, type LimitName } from '$lib/engine/limits';

/** A finite number within LIMITS[name]. */
export function bounded(name: LimitName) {
	const r = LIMITS[name];
	const n = z.number();
	return ('minExclusive' in r && r.minExclusive ? n.gt(r.min) : n.min(r.min)).max(r.max);
}
