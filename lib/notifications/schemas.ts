import { z } from "zod";
import { TOPICS } from "./topics";

/** The preferences form: the topics left on (a topic not sent is off). */
export const savePreferencesSchema = z.object({
  topics: z
    .union([z.enum(TOPICS, { error: "That is not a kind of e-mail Kalibore sends." }), z.array(z.enum(TOPICS, { error: "That is not a kind of e-mail Kalibore sends." }))])
    .optional()
    .transform((v) => (v === undefined ? [] : Array.isArray(v) ? v : [v])),
});
export type SavePreferencesInput = z.input<typeof savePreferencesSchema>;

/** The notifications list's filter, from the page's query string. */
export const NOTIFICATION_STATES = ["queued", "sent", "failed"] as const;
export type NotificationState = (typeof NOTIFICATION_STATES)[number];
export const notificationFilterSchema = z.object({
  state: z.enum(NOTIFICATION_STATES).optional().catch(undefined),
});
