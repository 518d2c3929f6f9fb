import type { Knex } from "knex";

/*
 * Vessel scope, the second half of every access decision (the first is the permission
 * table): which vessels a person's records may come from. Decided here and nowhere else.
 * No Next.js imports, so queries that scripts and tests load can use it too.
 */

/** What scope needs to know about a person: "all" for roles that see the whole fleet. */
export type VesselScope = { vessels: "all" | number[] };

/** Whether a record on `vesselId` is inside the person's scope. */
export function canSeeVessel(user: VesselScope, vesselId: number): boolean {
  return user.vessels === "all" || user.vessels.includes(vesselId);
}

/**
 * Limits a query to the person's vessels through `column` (a vessel id column of the
 * query, e.g. "v.id" or "e.vessel_id"). Nobody with no vessels sees anything.
 */
export function whereVesselInScope<Q extends Knex.QueryBuilder>(q: Q, user: VesselScope, column: string): Q {
  if (user.vessels !== "all") q.whereIn(column, user.vessels.length ? user.vessels : [-1]);
  return q;
}
