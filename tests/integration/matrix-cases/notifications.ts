import { TOPICS } from "@/lib/notifications/topics";
import { APP, type ActionCase, type RouteCase } from "../../support/matrix";

// The digest job is public in the registry: its credential is the scheduler's token, not a
// session, so every caller who holds the token runs it (a second run in the week sends nothing).
export const routeCases: Record<string, RouteCase> = {
  "POST /api/jobs/digest": async () => ({
    request: new Request(new URL("/api/jobs/digest", APP), { method: "POST", headers: { authorization: `Bearer ${process.env.JOBS_TOKEN ?? ""}` } }),
  }),
};

// Everything on, so the role world's people keep getting what they got.
export const actionCases: Record<string, ActionCase> = {
  savePreferencesAction: async () => ({ topics: [...TOPICS] }),
};
