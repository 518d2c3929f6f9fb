import { z } from "zod";
import { MAX_RECORD_ID } from "@/lib/validation/ids";

/*
 * What the renewal-planning screens and API accept. Plans and schedule entries are about the
 * future, so their days are bounded by what can be meant (from a year back to 15 years ahead)
 * rather than by "not after today". Each message names what was wrong in plain words; the
 * route answer adds the field (lib/validation/issues.ts). No server imports.
 */

const DAY_MS = 86_400_000;
export const MAX_HORIZON_MONTHS = 120;
export const MAX_LEAD_TIME_DAYS = 730;
export const MAX_COST = 10_000_000;
export const MAX_STOCK = 999;

const shown = (v: unknown) => `"${String(v).slice(0, 30)}"`;
const isoDay = (offsetDays: number) => new Date(Date.now() + offsetDays * DAY_MS).toISOString().slice(0, 10);

/** A calendar day from a year ago to 15 years ahead: a plan or a ship's call can be no further. */
export const planningDate = (label: string) =>
  z
    .string({ error: (i) => (i.input == null ? `Enter the ${label}.` : `Enter the ${label} as yyyy-mm-dd, not ${shown(i.input)}.`) })
    .regex(/^\d{4}-\d{2}-\d{2}$/, { error: (i) => (i.input === "" ? `Enter the ${label}.` : `Enter the ${label} as yyyy-mm-dd, not ${shown(i.input)}.`) })
    .refine((s) => {
      const ms = Date.parse(`${s}T00:00:00Z`);
      return Number.isFinite(ms) && new Date(ms).toISOString().slice(0, 10) === s;
    }, { error: (i) => `There is no day ${String(i.input)}: check the day and the month.` })
    .refine((s) => s >= isoDay(-366), { error: (i) => `The ${label} ${String(i.input)} is more than a year ago: check the year.` })
    .refine((s) => s <= isoDay(15 * 366), { error: (i) => `The ${label} ${String(i.input)} is more than 15 years ahead: check the year.` });

const recordId = (what: string) => z.coerce.number({ error: `Unknown ${what}.` }).int(`Unknown ${what}.`).positive(`Unknown ${what}.`).max(MAX_RECORD_ID, `Unknown ${what}.`);
const text = (label: string, max: number) =>
  z
    .string()
    .trim()
    .max(max, `The ${label} is longer than ${max} characters.`)
    .transform((s) => (s === "" ? null : s));

/** The outlook's horizon in whole months, 1 to 120. */
export const horizonSchema = z.coerce
  .number({ error: "Enter the horizon as a whole number of months, e.g. 12." })
  .int("Enter the horizon as a whole number of months, e.g. 12.")
  .min(1, "The horizon is at least 1 month.")
  .max(MAX_HORIZON_MONTHS, `The horizon is at most ${MAX_HORIZON_MONTHS} months (10 years).`);

export const partSchema = z.enum(["liner", "ring_set"], { error: "Choose the part: liner or ring set." });

export const scheduleEntrySchema = z
  .object({
    kind: z.enum(["port_stay", "docking"], { error: "Choose port stay or docking." }),
    place: z.string({ error: "Enter the port or yard." }).trim().min(1, "Enter the port or yard.").max(120, "The port or yard is longer than 120 characters."),
    startsOn: planningDate("first day"),
    endsOn: planningDate("last day"),
    note: text("note", 500).optional().default(""),
  })
  .refine((v) => v.endsOn >= v.startsOn, { path: ["endsOn"], error: "The last day is before the first day." });

export const scheduleUpdateSchema = z.intersection(scheduleEntrySchema, z.object({ revision: z.coerce.number().int().positive() }));

export const PLAN_STATES = ["pencilled", "confirmed", "closed", "dropped"] as const;

export const planCreateSchema = z.object({
  part: partSchema,
  plannedOn: planningDate("day of the renewal"),
  /** A port stay or docking of the unit's ship; none for an overhaul at sea or a day of one's own. */
  scheduleId: recordId("port stay or docking").nullable().optional().default(null),
  opportunity: text("opportunity", 120).optional().default(""),
  spareId: recordId("spare").nullable().optional().default(null),
  note: text("note", 500).optional().default(""),
});

/** A change of state (pencilled → confirmed, or dropped) or of day/opportunity/spare, at the revision the person saw. */
export const planUpdateSchema = z.object({
  revision: z.coerce.number({ error: "The plan's revision is missing; reload the page." }).int().positive(),
  state: z.enum(["pencilled", "confirmed", "dropped"], { error: "A plan is pencilled in, confirmed or dropped here; it is closed by the inspection that records the renewal." }).optional(),
  plannedOn: planningDate("day of the renewal").optional(),
  scheduleId: recordId("port stay or docking").nullable().optional(),
  opportunity: text("opportunity", 120).optional(),
  spareId: recordId("spare").nullable().optional(),
  note: text("note", 500).optional(),
});

const count = (label: string) =>
  z.coerce
    .number({ error: `Enter the ${label} as a whole number.` })
    .int(`Enter the ${label} as a whole number.`)
    .min(0, `The ${label} cannot be negative.`)
    .max(MAX_STOCK, `The ${label} is more than ${MAX_STOCK}: check the figure.`);

const money = (label: string) =>
  z.union([
    z.literal("").transform(() => null),
    z.null(),
    z.coerce
      .number({ error: `Enter the ${label} as a number, e.g. 41500.` })
      .finite(`Enter the ${label} as a number, e.g. 41500.`)
      .min(0, `The ${label} cannot be negative.`)
      .max(MAX_COST, `The ${label} is more than ${MAX_COST.toLocaleString("en-GB")}: check the figure.`)
      .refine((v) => Math.abs(Math.round(v * 100) - v * 100) < 1e-6, `The ${label} has more than two decimals.`),
  ]);

export const spareSchema = z
  .object({
    profileId: recordId("engine profile"),
    part: partSchema,
    /** Null: the company store. */
    vesselId: recordId("vessel").nullable(),
    onHand: count("number on hand"),
    onOrder: count("number on order").optional().default(0),
    onOrderDue: z.union([z.literal("").transform(() => null), z.null(), planningDate("day the order is due")]).optional().default(null),
    leadTimeDays: z.coerce
      .number({ error: "Enter the lead time as a whole number of days." })
      .int("Enter the lead time as a whole number of days.")
      .min(1, "The lead time is at least 1 day.")
      .max(MAX_LEAD_TIME_DAYS, `The lead time is at most ${MAX_LEAD_TIME_DAYS} days (two years).`),
    unitCost: money("unit cost").optional().default(null),
    jobCost: money("cost of the renewal job").optional().default(null),
  })
  .refine((v) => v.onOrder === 0 || v.onOrderDue !== null, { path: ["onOrderDue"], error: "Enter the day the order is due." });

export const spareUpdateSchema = z.intersection(spareSchema, z.object({ revision: z.coerce.number().int().positive() }));

export type ScheduleEntryInput = z.infer<typeof scheduleEntrySchema>;
export type PlanCreateInput = z.infer<typeof planCreateSchema>;
export type PlanUpdateInput = z.infer<typeof planUpdateSchema>;
export type SpareInput = z.infer<typeof spareSchema>;
