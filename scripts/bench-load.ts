/**
 * The load part of npm run bench (scripts/bench.sh starts the production server on the bench
 * fleet first): autocannon on loopback, BENCH_CONNECTIONS (20) connections for BENCH_LOAD_S (15)
 * seconds per route in BENCH_LOAD_ROUNDS (3) interleaved rounds after a short warm-up, each
 * request sent as the next of 20 signed-in users
 * (round robin, each to a unit or engine of their own vessel). /api/health (no session, one
 * database query and one object-store call) is the baseline; the unit analysis must reach
 * ≥ 0.8× its throughput and ≤ 1.5× its p99, with no errors.
 */
import fs from "node:fs";
import autocannon from "autocannon";
import knex from "knex";
import config from "../knexfile";

const base = process.env.BENCH_WEB_URL ?? "http://127.0.0.1:3338";
const origin = new URL(process.env.APP_URL ?? base).origin;
const connections = Number(process.env.BENCH_CONNECTIONS ?? 20);
const duration = Number(process.env.BENCH_LOAD_S ?? 15);
const ROUNDS = Number(process.env.BENCH_LOAD_ROUNDS ?? 3);
const PASSWORD = "Kalibore-demo-1"; // the invented demo accounts' shared password (README)

type Seat = { email: string; cookie: string; unitId: number; engineId: number };

/** 20 crew and superintendent accounts of the bench fleet, each with a unit and engine of a vessel they see. */
async function pickUsers(n: number): Promise<Omit<Seat, "cookie">[]> {
  const db = knex({ ...config, pool: { min: 0, max: 1 } });
  try {
    const crew = await db("user as u")
      .join("user_vessels as uv", "uv.user_id", "u.id")
      .join("main_engines as e", "e.vessel_id", "uv.vessel_id")
      .join("cylinder_units as c", "c.engine_id", "e.id")
      .whereIn("u.role", ["chief_engineer", "engineer"])
      .where((w) => w.whereNull("u.banned").orWhere("u.banned", false))
      .groupBy("u.id", "u.email")
      .orderBy("u.email")
      .limit(n - 1)
      .select("u.email", db.raw("MIN(c.id) as unitId"), db.raw("MIN(e.id) as engineId"));
    // …and the superintendent, who sees the whole fleet: a unit far from the crew's.
    const far = await db("cylinder_units").orderBy("id", "desc").first("id", "engine_id");
    const supt = await db("user").where({ role: "superintendent" }).orderBy("email").first("email");
    return [...crew, { email: supt.email, unitId: far.id, engineId: far.engine_id }].map((r) => ({ email: r.email, unitId: Number(r.unitId), engineId: Number(r.engineId) }));
  } finally {
    await db.destroy();
  }
}

async function signIn(email: string): Promise<string> {
  const res = await fetch(`${base}/api/auth/sign-in/email`, {
    method: "POST",
    headers: { "content-type": "application/json", origin },
    body: JSON.stringify({ email, password: PASSWORD }),
  });
  if (!res.ok) throw new Error(`sign-in of ${email} answered ${res.status}: ${await res.text()}`);
  return res.headers
    .getSetCookie()
    .map((c) => c.split(";")[0])
    .join("; ");
}

type Target = { name: string; path: (s: Seat) => string; signedIn: boolean };
type Row = { name: string; rps: number; p50: number; p99: number; errors: number; total: number };

/** One timed stretch of one route: autocannon with each request sent as the next signed-in user. */
async function stretch(target: Target, seats: Seat[], seconds: number, warm: boolean): Promise<Row> {
  let next = 0;
  const result = await autocannon({
    url: base,
    connections,
    duration: seconds,
    ...(warm ? { warmup: { connections, duration: 2 } } : {}),
    requests: [
      {
        method: "GET",
        setupRequest: (req) => {
          const seat = seats[next++ % seats.length];
          return { ...req, path: target.path(seat), headers: target.signedIn ? { ...req.headers, cookie: seat.cookie } : req.headers };
        },
      },
    ],
  });
  return {
    name: target.name,
    rps: result.requests.average,
    p50: result.latency.p50,
    p99: result.latency.p99,
    errors: result.errors + result.timeouts + result.non2xx,
    total: result.requests.total,
  };
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

/**
 * The routes are timed in ROUNDS interleaved stretches (route 1, 2, 3, then again …), so a burst
 * of other work on a shared machine falls on every route alike; each figure is the median of
 * its rounds, errors the sum.
 */
async function measure(targets: Target[], seats: Seat[]): Promise<Row[]> {
  const per = targets.map(() => [] as Row[]);
  for (let round = 0; round < ROUNDS; round++) {
    for (const [i, t] of targets.entries()) per[i].push(await stretch(t, seats, Math.max(1, Math.round(duration / ROUNDS)), round === 0));
  }
  return per.map((runs) => ({
    name: runs[0].name,
    rps: median(runs.map((r) => r.rps)),
    p50: median(runs.map((r) => r.p50)),
    p99: median(runs.map((r) => r.p99)),
    errors: runs.reduce((s, r) => s + r.errors, 0),
    total: runs.reduce((s, r) => s + r.total, 0),
  }));
}

const picked = await pickUsers(20);
const seats: Seat[] = [];
for (const p of picked) seats.push({ ...p, cookie: await signIn(p.email) });
console.log(`\nload: ${seats.length} signed-in users, ${connections} connections, ${duration} s per route in ${ROUNDS} interleaved rounds (medians), ${base}`);

const targets: Target[] = [
  { name: "/api/health (baseline)", path: () => "/api/health", signedIn: false },
  { name: "unit analysis", path: (s) => `/api/units/${s.unitId}/analysis`, signedIn: true },
  { name: "engine page data", path: (s) => `/api/engines/${s.engineId}/analysis`, signedIn: true },
];
if (fs.existsSync("app/api/outlook/route.ts")) targets.push({ name: "outlook", path: () => "/api/outlook", signedIn: true });
else console.log("outlook: /api/outlook is not in this build yet; not measured");

// Each route answers once before it is timed: a wrong path or a refused session is a clear error here.
for (const t of targets) {
  const res = await fetch(`${base}${t.path(seats[0])}`, { headers: t.signedIn ? { cookie: seats[0].cookie } : {} });
  if (!res.ok) throw new Error(`${t.name} answered ${res.status} before the run: ${(await res.text()).slice(0, 200)}`);
}

const rows = await measure(targets, seats);
const [baseline] = rows;
const ok = (b: boolean) => (b ? "PASS" : "MISS");
console.log("");
console.log(`${"route".padEnd(24)} ${"req/s".padStart(7)} ${"p50 ms".padStart(7)} ${"p99 ms".padStart(7)} ${"errors".padStart(7)}   vs baseline`);
for (const r of rows) {
  const vs = r === baseline ? "" : `${(r.rps / baseline.rps).toFixed(2)}× req/s, ${(r.p99 / baseline.p99).toFixed(2)}× p99`;
  console.log(`${r.name.padEnd(24)} ${r.rps.toFixed(0).padStart(7)} ${r.p50.toFixed(0).padStart(7)} ${r.p99.toFixed(0).padStart(7)} ${String(r.errors).padStart(7)}   ${vs}`);
}
const unit = rows[1];
console.log(
  `(e) unit analysis under load: ${(unit.rps / baseline.rps).toFixed(2)}× baseline throughput (target ≥ 0.80×) ${ok(unit.rps / baseline.rps >= 0.8)}, ` +
    `${(unit.p99 / baseline.p99).toFixed(2)}× its p99 (target ≤ 1.50×) ${ok(unit.p99 / baseline.p99 <= 1.5)}, ${unit.errors} errors (target 0) ${ok(unit.errors === 0)}`,
);
