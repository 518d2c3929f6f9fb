import { z } from "zod";

/*
 * Dates a record can carry, bounded by what can be true: nothing Kalibore records happened
 * before 1950 (no main engine in service today was running then — common practice, not a
 * published figure), and nothing has happened later than today. "Today" allows one day
 * ahead, since a ship east of Greenwich is already in tomorrow while the server is not.
 * Each message says what was wrong with what was sent. No server imports.
 */

export const EARLIEST_RECORD_DATE = "1950-01-01";

const DAY_MS = 86_400_000;

/** The latest date a record may carry, as yyyy-mm-dd. */
export const latestRecordDate = (now = Date.now()) => new Date(now + DAY_MS).toISOString().slice(0, 10);

const shown = (v: unknown) => `"${String(v).slice(0, 30)}"`;

/** A calendar day (yyyy-mm-dd) from 1950 to today. */
export const recordDate = (label: string) =>
  z
    .string({ error: (i) => (i.input == null ? `Enter the ${label}.` : `Enter the ${label} as yyyy-mm-dd, not ${shown(i.input)}.`) })
    .regex(/^\d{4}-\d{2}-\d{2}$/, { error: (i) => (i.input === "" ? `Enter the ${label}.` : `Enter the ${label} as yyyy-mm-dd, not ${shown(i.input)}.`) })
    .refine(
      (s) => {
        const ms = Date.parse(`${s}T00:00:00Z`);
        return Number.isFinite(ms) && new Date(ms).toISOString().slice(0, 10) === s;
      },
      { error: (i) => `There is no day ${String(i.input)}: check the day and the month.` },
    )
    .refine((s) => s >= EARLIEST_RECORD_DATE, { error: (i) => `The ${label} ${String(i.input)} is before 1950, older than any engine in service: check the year.` })
    .refine((s) => s <= latestRecordDate(), { error: (i) => `The ${label} ${String(i.input)} is in the future: check the year.` });

/** A moment with its UTC offset (ISO 8601), from 1950 to now. */
export const recordDateTime = (label: string) =>
  z.iso
    .datetime({ offset: true, error: (i) => (i.input == null ? `Enter the ${label}.` : `Enter the ${label} as a date and time, not ${shown(i.input)}.`) })
    .refine((s) => s.slice(0, 10) >= EARLIEST_RECORD_DATE, { error: (i) => `The ${label} ${String(i.input).slice(0, 10)} is before 1950: check the year.` })
    .refine((s) => Date.parse(s) <= Date.now() + DAY_MS, { error: (i) => `The ${label} ${String(i.input).slice(0, 16)} is in the future: check the date.` });
