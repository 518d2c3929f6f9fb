import { z } from "zod";

const isoDay = z
  .string({ error: "Enter the date." })
  .regex(/^\d{4}-\d{2}-\d{2}$/, "Enter the date as YYYY-MM-DD.")
  .refine((d) => !Number.isNaN(Date.parse(`${d}T00:00:00Z`)) && new Date(`${d}T00:00:00Z`).toISOString().startsWith(d), "Not a calendar date.")
  .refine((d) => Date.parse(`${d}T00:00:00Z`) <= Date.now() + 36 * 3_600_000, "The date is in the future.");

/** One counter reading of the main engine's running hours (shared by the form and the server). */
export const logRunningHoursSchema = z.object({
  engineId: z.coerce.number({ error: "Unknown engine." }).int().positive("Unknown engine."),
  loggedOn: isoDay,
  engineHours: z.coerce
    .number({ error: "Enter the running hours as a number, e.g. 64210." })
    .finite("Enter the running hours as a number, e.g. 64210.")
    .min(0, "Running hours cannot be negative.")
    .max(2_000_000, "That is more running hours than any engine has."),
});

export type LogRunningHoursInput = z.infer<typeof logRunningHoursSchema>;
