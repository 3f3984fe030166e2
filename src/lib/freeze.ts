/**
 * Freezes a value and everything reachable from it (plain objects and arrays; Dates and class
 * instances are frozen too, which stops property writes though not a Date's own setters). For
 * values shared between readers, such as cached computations.
 */
export function deepFreeze<T>(value: T): T {
	if (value === null || typeof value !== 'object' || Object.isFrozen(value)) return value;
	// Typed arrays with elements cannot be frozen; they are left as they are.
	if (ArrayBuffer.isView(value)) return value;
	Object.freeze(value);
	for (const v of Object.values(value as object)) deepFreeze(v);
	return value;
}
