/**
 * Seeds the invented demo fleet (fixtures/demo) into a migrated database.
 *
 *   node --conditions=react-server --import tsx scripts/seed.ts [--if-empty] [--scale N] [--seed N] [--database NAME]
 *
 * --if-empty   seed only when `vessels` is empty, else say so and exit 0
 *              (without it, a database that already has vessels is refused with exit 1)
 * --scale N    ships × N (1 → 5 ships; 50 → 250 ships)
 * --seed N     another invented fleet (default 20261201)
 * --today D    the scenario's "today", YYYY-MM-DD (default 2026-12-01)
 * --database   overrides DB_NAME, e.g. a scratch database for experiments
 * --no-recompute  leave unit_analysis empty (the benchmark times the recompute itself)
 */
import knex, { type Knex } from "knex";
import { recomputeAllUnits } from "../lib/analysis/recompute";

const TABLES = [
  "companies",
  "vessels",
  "user",
  "user_vessels",
  "engine_profiles",
  "profile_stations",
  "main_engines",
  "running_hours_log",
  "cylinder_units",
  "liners",
  "inspections",
  "liner_readings",
  "ring_readings",
  "checklist_entries",
  "spares_stock",
  "vessel_schedule",
  "renewal_plans",
  "unit_analysis",
];

interface Args {
  ifEmpty: boolean;
  scale: number;
  seed: number | undefined;
  today: string | undefined;
  database: string | undefined;
  recompute: boolean;
}

function parseArgs(argv: string[]): Args {
  const args: Args = { ifEmpty: false, scale: 1, seed: undefined, today: undefined, database: undefined, recompute: true };
  for (let i = 0; i < argv.length; i++) {
    const flag = argv[i];
    const value = () => {
      const v = argv[++i];
      if (v === undefined) throw new Error(`${flag} needs a value`);
      return v;
    };
    if (flag === "--if-empty") args.ifEmpty = true;
    else if (flag === "--scale") args.scale = Number(value());
    else if (flag === "--seed") args.seed = Number(value());
    else if (flag === "--today") args.today = value();
    else if (flag === "--database") args.database = value();
    else if (flag === "--no-recompute") args.recompute = false;
    else throw new Error(`unknown option ${flag}`);
  }
  if (!(args.scale > 0)) throw new Error("--scale must be a positive number");
  if (args.seed !== undefined && !Number.isInteger(args.seed)) throw new Error("--seed must be an integer");
  if (args.database !== undefined && !/^[A-Za-z0-9_]+$/.test(args.database)) throw new Error("--database: letters, digits and _ only");
  return args;
}

async function counts(db: Knex): Promise<Record<string, number>> {
  const out: Record<string, number> = {};
  for (const t of TABLES) {
    const row = (await db(t).count({ n: "*" }).first()) as { n: number | string };
    out[t] = Number(row.n);
  }
  return out;
}

/** Fills unit_analysis so the fleet screens have their per-unit results from the start. */
async function recompute(db: Knex): Promise<void> {
  const t = performance.now();
  const n = await recomputeAllUnits(db);
  console.log(`analyses of ${n} units recomputed in ${((performance.now() - t) / 1000).toFixed(1)} s`);
}

async function main() {
  const args = parseArgs(process.argv.slice(2));
  // Before the knexfile is loaded: it reads the environment once.
  if (args.database) process.env.DB_NAME = args.database;
  const { default: config } = await import("../knexfile");
  const { buildScenario } = await import("../fixtures/demo/scenario");
  const { insertScenario } = await import("../fixtures/demo/insert");

  const db = knex({ ...config, pool: { min: 0, max: 2 } });
  const database = (config.connection as { database?: string }).database;
  try {
    const row = (await db("vessels").count({ n: "*" }).first()) as { n: number | string };
    if (Number(row.n) > 0) {
      if (args.ifEmpty) {
        console.log(`demo data already present, keeping it (${database}: ${row.n} vessels)`);
        return;
      }
      console.error(`${database} already has ${row.n} vessels; seed a fresh database or use --if-empty`);
      process.exitCode = 1;
      return;
    }

    const t0 = performance.now();
    const scenario = buildScenario({ seed: args.seed, scale: args.scale, today: args.today });
    const total = scenario.vesselPlans.length;
    let lastShown = 0;
    const result = await insertScenario(db, scenario, {
      onProgress: ({ vesselsDone, linerReadings }) => {
        if (total >= 20 && vesselsDone - lastShown >= total / 10) {
          lastShown = vesselsDone;
          console.log(`  ${vesselsDone}/${total} vessels, ${linerReadings} liner readings`);
        }
      },
    });
    const seconds = (performance.now() - t0) / 1000;
    console.log(`seeded ${database} (seed ${scenario.seed}, scale ${scenario.scale}, today ${scenario.today}) in ${seconds.toFixed(1)} s`);
    if (result.reusedUsers.length) console.log(`kept ${result.reusedUsers.length} existing users: ${result.reusedUsers.join(", ")}`);

    try {
      if (args.recompute) await recompute(db);
    } catch (err) {
      console.error("recomputing the analyses failed:", err);
      process.exitCode = 1;
    }

    const c = await counts(db);
    console.log(Object.entries(c).map(([t, n]) => `  ${t.padEnd(18)} ${n}`).join("\n"));
    console.log(`\ndemo sign-ins (password ${scenario.demoPassword}):`);
    for (const u of scenario.users.slice(0, 6)) {
      const where = u.vesselKeys.length > 1 ? "all vessels" : u.vesselKeys.length === 1 ? scenario.vesselPlans.find((p) => p.vessel.key === u.vesselKeys[0])!.vessel.name : "";
      console.log(`  ${u.email.padEnd(28)} ${u.role.padEnd(15)} ${where}`);
    }
    if (scenario.users.length > 6) console.log(`  and ${scenario.users.length - 6} more crew (chiefN@ / engineerN@ for vessel N), same password`);
  } finally {
    await db.destroy();
  }
}

main().catch((err) => {
  console.error(err instanceof Error ? err.message : err);
  process.exitCode = 1;
});
