// Looks keys up in records by own property only: a key such as "constructor", "toString" or
// "__proto__" in a user's file must never reach an inherited Object.prototype member.

/** The record's own value at `key`, or undefined (never an inherited member). */
export function own<T>(record: Readonly<Record<string, T>>, key: string): T | undefined {
  return Object.prototype.hasOwnProperty.call(record, key) ? record[key] : undefined;
}

/** A record without a prototype, safe to fill with keys from a user's file. */
export function emptyRecord<T>(): Record<string, T> {
  return Object.create(null) as Record<string, T>;
}
