import type { ActionCase, RouteCase } from "../../support/matrix";

// The running-hours log. Each allowed call adds a reading one day later and 20 h higher,
// dated long before any other reading so the counter rule never trips on the world's data.
let day = 0;

export const routeCases: Record<string, RouteCase> = {};

export const actionCases: Record<string, ActionCase> = {
  logRunningHoursAction: async (w) => {
    day += 1;
    const loggedOn = new Date(Date.UTC(2001, 0, 1) + day * 86_400_000).toISOString().slice(0, 10);
    return { engineId: w.engine1, loggedOn, engineHours: day * 20 };
  },
};
