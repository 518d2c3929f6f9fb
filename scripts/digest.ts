/**
 * Runs the weekly digest once and sends what it queued:
 *
 *   npm run digest
 *
 * Safe to repeat: a second run in the same ISO week queues nothing new (each person's digest
 * has its own key in the mail outbox). Reads the same environment as the app (.env, then the
 * environment); run it from cron or a scheduler, or use POST /api/jobs/digest with JOBS_TOKEN.
 */
import nextEnv from "@next/env";

nextEnv.loadEnvConfig(process.cwd());

const { db } = await import("../lib/db/knex");
const { drainOutbox, outboxIdle } = await import("../lib/mail/outbox");
const { runWeeklyDigest } = await import("../lib/notifications/digest-mutations");

try {
  const run = await runWeeklyDigest();
  console.log(
    `weekly digest ${run.week}: ${run.queued} queued for ${run.people} people` +
      (run.alreadyQueued ? `, ${run.alreadyQueued} already queued this week` : "") +
      (run.nothingToSay ? `, ${run.nothingToSay} with nothing to report` : ""),
  );
  const sent = await drainOutbox();
  await outboxIdle();
  console.log(`${sent} e-mails sent now; anything the mail server refused is retried by the app`);
} finally {
  await db.destroy();
  // nodemailer keeps no socket open between messages, but make sure the script ends.
  setImmediate(() => process.exit(process.exitCode ?? 0));
}
