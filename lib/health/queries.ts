import "server-only";
import { db } from "@/lib/db/knex";
import { checkBucket } from "@/lib/storage/s3";

export type HealthReport = {
  ok: boolean;
  database: { ok: boolean; latencyMs?: number; error?: string; migrations?: number };
  objectStore: { ok: boolean; latencyMs?: number; error?: string };
};

async function timed<T>(fn: () => Promise<T>): Promise<{ ok: true; ms: number; value: T } | { ok: false; error: string }> {
  const t0 = performance.now();
  try {
    const value = await fn();
    return { ok: true, ms: Math.round(performance.now() - t0), value };
  } catch (e) {
    return { ok: false, error: e instanceof Error ? e.message || e.name : String(e) };
  }
}

/** Checks the database (and that it is migrated) and the object store. */
export async function checkHealth(): Promise<HealthReport> {
  const [dbr, s3r] = await Promise.all([
    timed(async () => {
      const [row] = await db("knex_migrations").count<{ n: number }[]>({ n: "*" });
      return Number(row.n);
    }),
    timed(checkBucket),
  ]);
  const database = dbr.ok ? { ok: true, latencyMs: dbr.ms, migrations: dbr.value } : { ok: false, error: dbr.error };
  const objectStore = s3r.ok ? { ok: true, latencyMs: s3r.ms } : { ok: false, error: s3r.error };
  return { ok: database.ok && objectStore.ok, database, objectStore };
}
