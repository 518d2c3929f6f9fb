import { z } from "zod";
import { MAX_RUNNING_HOURS } from "@/lib/validation/bounds";
import { recordDate } from "@/lib/validation/dates";
import { MAX_RECORD_ID } from "@/lib/validation/ids";

/** One counter reading of the main engine's running hours (shared by the form and the server). */
export const logRunningHoursSchema = z.object({
  engineId: z.coerce.number({ error: "Unknown engine." }).int("Unknown engine.").positive("Unknown engine.").max(MAX_RECORD_ID, "Unknown engine."),
  loggedOn: recordDate("date of the reading"),
  engineHours: z.coerce
    .number({ error: "Enter the running hours as a number, e.g. 64210." })
    .finite("Enter the running hours as a number, e.g. 64210.")
    .min(0, "Running hours cannot be negative.")
    .max(MAX_RUNNING_HOURS, { error: (i) => `${String(i.input)} h is more running hours than any engine has (at most ${MAX_RUNNING_HOURS.toLocaleString("en-GB")} h).` }),
});

export type LogRunningHoursInput = z.infer<typeof logRunningHoursSchema>;
