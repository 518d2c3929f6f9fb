import type { Role } from "@/lib/auth/roles";

/*
 * What Kalibore tells people by e-mail, in one list: each topic a person can switch on or
 * off on the preferences page, who it concerns, and the key that makes each alert go once per
 * cause. Pure, so the preferences form and the tests read the same list.
 */

export const TOPICS = [
  "inspection_submitted",
  "inspection_returned",
  "unit_over_limit",
  "unit_horizon",
  "unit_probability",
  "plan_missed",
  "spare_order_by",
  "weekly_digest",
] as const;
export type Topic = (typeof TOPICS)[number];

export type TopicInfo = { label: string; hint: string; roles: readonly Role[] };

export const TOPIC_INFO: Record<Topic, TopicInfo> = {
  inspection_submitted: {
    label: "A record waits for my approval",
    hint: "An inspection on one of your vessels was submitted and you may approve it.",
    roles: ["chief_engineer", "superintendent"],
  },
  inspection_returned: {
    label: "A record I entered was returned",
    hint: "The approver sent your inspection back with a comment.",
    roles: ["engineer", "chief_engineer"],
  },
  unit_over_limit: {
    label: "A record is approved over its limit",
    hint: "An approved inspection has wear, ovality or a ring at or over its limit.",
    roles: ["chief_engineer", "superintendent"],
  },
  unit_horizon: {
    label: "A limit date comes inside the alert horizon",
    hint: "The early end of a unit's projected limit date comes within the company's alert horizon.",
    roles: ["chief_engineer", "superintendent"],
  },
  unit_probability: {
    label: "A unit is likely to pass its limit before the next overhaul",
    hint: "The chance of passing the limit by the next overhaul passes the company's threshold.",
    roles: ["chief_engineer", "superintendent"],
  },
  plan_missed: {
    label: "A renewal opportunity passed without the renewal",
    hint: "A planned liner or ring renewal's port call or docking ended and the renewal is not recorded.",
    roles: ["superintendent"],
  },
  spare_order_by: {
    label: "A spare must be ordered within two weeks",
    hint: "A spare's order-by date, from its lead time and the planned renewal, is less than two weeks away.",
    roles: ["superintendent"],
  },
  weekly_digest: {
    label: "Weekly digest",
    hint: "Once a week: records waiting, units that moved band, upcoming renewals and spares short.",
    roles: ["engineer", "chief_engineer", "superintendent"],
  },
};

export function isTopic(value: unknown): value is Topic {
  return typeof value === "string" && (TOPICS as readonly string[]).includes(value);
}

/** The topics that can concern a role (the preferences page offers only these). */
export function topicsFor(role: Role): Topic[] {
  return TOPICS.filter((t) => TOPIC_INFO[t].roles.includes(role));
}

/**
 * The ISO 8601 week of a day (weeks start on Monday; week 1 holds the year's first Thursday),
 * as "2026-W49". The digest's once-a-week key.
 */
export function isoWeek(d: Date): string {
  const t = new Date(Date.UTC(d.getUTCFullYear(), d.getUTCMonth(), d.getUTCDate()));
  const weekday = t.getUTCDay() || 7;
  t.setUTCDate(t.getUTCDate() + 4 - weekday); // the Thursday of this week decides the year
  const yearStart = Date.UTC(t.getUTCFullYear(), 0, 1);
  const week = Math.ceil(((t.getTime() - yearStart) / 86_400_000 + 1) / 7);
  return `${t.getUTCFullYear()}-W${String(week).padStart(2, "0")}`;
}

/**
 * The dedupe key of one alert to one person: the cause (topic and what it is about) and the
 * recipient. The outbox keeps it unique, so a cause seen twice (a repeated request, two app
 * instances scanning at once) queues one mail per person.
 */
export function alertKey(topic: Topic, subject: string, userId: string): string {
  return `${topic}:${subject}:${userId}`;
}
