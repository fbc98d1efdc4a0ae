/**
 * Objects indexed by names from the user's files (qubit ids): an id such as `__proto__`,
 * `constructor` or `toString` must never reach Object.prototype. Such objects are made without a
 * prototype (`idRecord`), and reads check own properties only (`hasOwn`, `ownValue`).
 * JSON.stringify writes a prototype-free object like any other.
 */

/** An empty object without a prototype, for values keyed by user-given names. */
export function idRecord<T>(): Record<string, T> {
  return Object.create(null) as Record<string, T>;
}

/** True when `key` is an own property of `obj` (never an inherited one). */
export function hasOwn(obj: object, key: string): boolean {
  return Object.prototype.hasOwnProperty.call(obj, key);
}

/** The own property `key` of `obj`, or undefined (an inherited member is never returned). */
export function ownValue<T>(obj: Record<string, T>, key: string): T | undefined {
  return hasOwn(obj, key) ? obj[key] : undefined;
}
