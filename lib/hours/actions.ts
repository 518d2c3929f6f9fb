"use server";

import { revalidatePath } from "next/cache";
import { actor, ruledAction } from "@/lib/auth/actions";
import { logRunningHours } from "./mutations";
import { vesselOfEngine } from "./queries";
import { logRunningHoursSchema } from "./schemas";

/** The chief engineer keeps the running-hours log (a counter reading per day). */
export const logRunningHoursAction = ruledAction(
  "logRunningHoursAction",
  logRunningHoursSchema,
  async (input, ctx) => {
    const { duplicate } = await logRunningHours(actor(ctx), input, ctx.vesselId!);
    revalidatePath(`/engines/${input.engineId}`);
    return { message: duplicate ? "That reading was already logged." : `Logged ${input.engineHours} h for ${input.loggedOn}.` };
  },
  { vesselOf: (input) => vesselOfEngine(input.engineId) },
);
