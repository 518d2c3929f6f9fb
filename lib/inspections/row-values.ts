/* How database column values become DTO values, shared by the inspection queries. */

/** A nullable numeric column (DECIMAL arrives as a string) as a number or null. */
export const num = (v: unknown) => (v === null || v === undefined ? null : Number(v));

/** A nullable date-time column as an ISO string or null. */
export const iso = (v: unknown) => (v == null ? null : v instanceof Date ? v.toISOString() : new Date(String(v)).toISOString());
