import "server-only";
import { db } from "@/lib/db/knex";
import { alertUnitsInsideHorizon } from "./alert-mutations";
import { alertFromOutlook } from "./outlook-alerts";

/*
 * Some causes come with time alone (a limit date comes inside the horizon as the weeks pass, a
 * planned renewal's day passes, a spare's order-by date comes near, the chance of passing the
 * limit by the next overhaul grows), not with a change anyone makes. The scan looks for them every SCAN_MS in each app instance;
 * the outbox's unique keys make two instances scanning at once queue each alert once.
 */
const SCAN_MS = 60 * 60_000;

/** One pass over every unit; answers how many alerts were queued. */
export async function scanTimedAlerts(now = new Date()): Promise<number> {
  return (await alertUnitsInsideHorizon(db, {}, now)) + (await alertFromOutlook(db, now));
}

const globalForScan = globalThis as unknown as { kaliboreAlertScan?: ReturnType<typeof setInterval> };

/** Starts the periodic scan once per process (it does not keep the process alive), with a first pass now. */
export function startAlertScan(): void {
  if (globalForScan.kaliboreAlertScan) return;
  const run = () => void scanTimedAlerts().catch((err) => console.error("alert scan:", err));
  globalForScan.kaliboreAlertScan = setInterval(run, SCAN_MS);
  globalForScan.kaliboreAlertScan.unref?.();
  run();
}
