import { z } from "zod";

/*
 * Record ids, parsed one way everywhere: a page's [id] segment, an API route's params and
 * an id inside a JSON body. Ids are the database's INT UNSIGNED keys, so anything that is
 * not a whole number from 1 to 4 294 967 295 written in plain digits ("abc", "1e309",
 * "007", "-1", "1.0") names no record. No server imports.
 */

/** Largest id the database can hold (INT UNSIGNED). */
export const MAX_RECORD_ID = 4_294_967_295;

/** An id as it appears in an address: plain digits, no sign, no leading zero, no exponent. */
export const recordIdParamSchema = z
  .string()
  .regex(/^[1-9][0-9]{0,9}$/, "not a record number")
  .transform(Number)
  .refine((n) => n <= MAX_RECORD_ID, "not a record number");

/** The id in an address segment, or null when it cannot name a record (answer 404 then). */
export function parseRecordId(value: unknown): number | null {
  const parsed = recordIdParamSchema.safeParse(value);
  return parsed.success ? parsed.data : null;
}

/** An id inside a JSON body, with a message naming what it should identify. */
export const recordIdField = (what: string) =>
  z
    .number({ error: (i) => (i.input === undefined || i.input === null ? `Choose the ${what}.` : `The ${what} must be given by its record number, not "${String(i.input).slice(0, 20)}".`) })
    // The range first: a number too large to be an integer exactly (1e20) is "too large", not "not whole".
    .min(1, `The ${what} must be given by its record number, from 1 up.`)
    .max(MAX_RECORD_ID, `There is no ${what} with a number that large.`)
    .int(`The ${what} must be given by its record number, a whole number.`);
