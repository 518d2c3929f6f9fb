"use server";

import { revalidatePath } from "next/cache";
import { actor, ruledAction } from "@/lib/auth/actions";
import { savePreferences } from "./mutations";
import { savePreferencesSchema } from "./schemas";
import { TOPIC_INFO } from "./topics";

/** Each person chooses which e-mails they get; nobody sets another's. */
export const savePreferencesAction = ruledAction("savePreferencesAction", savePreferencesSchema, async ({ topics }, ctx) => {
  const on = await savePreferences(actor(ctx), topics);
  revalidatePath("/notifications/preferences");
  if (!on.length) return { message: "Saved. Kalibore will send you no e-mail about records or units (password resets still come)." };
  return { message: `Saved. You get: ${on.map((t) => TOPIC_INFO[t].label.toLowerCase()).join("; ")}.` };
});
