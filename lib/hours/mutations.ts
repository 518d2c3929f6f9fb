import "server-only";
import type { Knex } from "knex";
import { recomputeUnits } from "@/lib/analysis/recompute";
import { alertUnitsInsideHorizon } from "@/lib/notifications/alert-mutations";
import { writeAudit } from "@/lib/audit/mutations";
import { ActionError } from "@/lib/auth/action-error";
import { db as defaultDb } from "@/lib/db/knex";
import type { LogRunningHoursInput } from "./schemas";
import { inTransaction } from "@/lib/db/transaction";

const DAY_MS = 86_400_000;

/**
 * Records one counter reading. The counter only goes up, and no faster than the
 * 24 hours a day there are; the same reading sent twice (a double tap) is accepted
 * once. The engine's projections turn liner hours into dates from this log, so its
 * units are recomputed in the same transaction.
 */
export async function logRunningHours(
  actor: { id: string; name: string },
  input: LogRunningHoursInput,
  vesselId: number,
  db: Knex = defaultDb,
): Promise<{ duplicate: boolean }> {
  return inTransaction(db, async (trx) => {
    // Lock the engine row so two entries for one engine are checked one after the other.
    await trx("main_engines").where({ id: input.engineId }).forUpdate().first("id");
    const same = await trx("running_hours_log").where({ engine_id: input.engineId, logged_on: input.loggedOn }).first("engine_hours");
    if (same) {
      if (Number(same.engine_hours) === input.engineHours) return { duplicate: true };
      throw new ActionError(`Running hours for ${input.loggedOn} are already logged (${Number(same.engine_hours)} h).`, {
        loggedOn: ["This day already has a reading; pick another day."],
      });
    }
    const before = await trx("running_hours_log")
      .where({ engine_id: input.engineId })
      .where("logged_on", "<", input.loggedOn)
      .orderBy("logged_on", "desc")
      .first("logged_on", "engine_hours");
    const after = await trx("running_hours_log")
      .where({ engine_id: input.engineId })
      .where("logged_on", ">", input.loggedOn)
      .orderBy("logged_on", "asc")
      .first("logged_on", "engine_hours");
    const at = Date.parse(`${input.loggedOn}T00:00:00Z`);
    if (before) {
      const h = Number(before.engine_hours);
      if (input.engineHours < h) {
        throw new ActionError(`The counter cannot go back: ${before.logged_on} already shows ${h} h.`, {
          engineHours: [`At least ${h} h (the reading of ${before.logged_on}).`],
        });
      }
      const days = (at - Date.parse(`${before.logged_on}T00:00:00Z`)) / DAY_MS;
      if (input.engineHours - h > days * 24 + 0.5) {
        throw new ActionError(`That is more than 24 running hours a day since ${before.logged_on}.`, {
          engineHours: [`At most ${Math.floor(h + days * 24)} h after ${before.logged_on} (${h} h).`],
        });
      }
    }
    if (after && input.engineHours > Number(after.engine_hours)) {
      throw new ActionError(`A later reading (${after.logged_on}) shows fewer hours.`, {
        engineHours: [`At most ${Number(after.engine_hours)} h (the reading of ${after.logged_on}).`],
      });
    }
    await trx("running_hours_log").insert({
      engine_id: input.engineId,
      logged_on: input.loggedOn,
      engine_hours: input.engineHours,
      recorded_by: actor.id,
    });
    await writeAudit(
      { actor, action: "hours.log", entityType: "main_engine", entityId: input.engineId, vesselId, detail: { loggedOn: input.loggedOn, engineHours: input.engineHours } },
      trx,
    );
    await recomputeUnits(trx, { engineIds: [input.engineId] });
    // A new counter reading changes how fast the engine runs, so dates to the limit move.
    await alertUnitsInsideHorizon(trx, { engineIds: [input.engineId] });
    return { duplicate: false };
  }, { idempotent: true }); // the same reading sent again is answered as a duplicate
}
