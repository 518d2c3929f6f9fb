import { spawn, spawnSync } from "node:child_process";
import fs from "node:fs";
import net from "node:net";
import path from "node:path";

/*
 * Stopping and starting the services scripts/test.sh started, for the fault tests: the
 * test MariaDB (killed with SIGKILL, as a crash or a pulled plug would, and started again on
 * the same data folder, so InnoDB recovers) and the S3 and SMTP fakes (one process). What
 * is started here is written to .test-data/restarted.pids, which scripts/test.sh stops at
 * the end as it stops what it started itself.
 */

const ROOT = path.resolve(import.meta.dirname, "../..");
const DATA = process.env.TEST_DATA_DIR ?? path.join(ROOT, ".test-data");
const PIDS = path.join(DATA, "restarted.pids");
const MARIADB = path.join(DATA, "mariadb");
export const DB_PORT = Number(process.env.DB_PORT ?? 3317);
export const S3_PORT = Number(process.env.S3_FAKE_PORT ?? 4579);
export const SMTP_PORT = Number(process.env.SMTP_FAKE_PORT ?? 2535);

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Whether something accepts connections on a loopback port. */
export function portOpen(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const s = net.connect({ host: "127.0.0.1", port });
    s.once("connect", () => (s.destroy(), resolve(true)));
    s.once("error", () => resolve(false));
  });
}

async function waitPort(port: number, open: boolean, what: string, timeoutMs = 30_000) {
  const until = Date.now() + timeoutMs;
  while ((await portOpen(port)) !== open) {
    if (Date.now() > until) throw new Error(`${what} on port ${port} did not ${open ? "start" : "stop"} within ${timeoutMs / 1000} s`);
    await sleep(100);
  }
}

function remember(pid: number | undefined) {
  if (pid) fs.appendFileSync(PIDS, `${pid}\n`);
}

function alive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

/** Kills the test MariaDB outright (SIGKILL: no clean shutdown, open transactions are cut). */
export async function killMariadb(): Promise<void> {
  const pid = Number(fs.readFileSync(path.join(MARIADB, "run", "mysqld.pid"), "utf8").trim());
  process.kill(pid, "SIGKILL");
  const until = Date.now() + 15_000;
  while (alive(pid) && Date.now() < until) await sleep(50);
  await waitPort(DB_PORT, false, "MariaDB");
}

/** Starts MariaDB again on the same data folder and port, as scripts/lib/common.sh does, and waits until it answers. */
export async function startMariadb(): Promise<void> {
  const sock = path.join(MARIADB, "run", "mysqld.sock");
  const child = spawn(
    "mariadbd",
    [
      "--no-defaults",
      `--user=${process.env.USER ?? "root"}`,
      `--datadir=${path.join(MARIADB, "data")}`,
      "--bind-address=127.0.0.1",
      `--port=${DB_PORT}`,
      `--socket=${sock}`,
      `--pid-file=${path.join(MARIADB, "run", "mysqld.pid")}`,
      `--log-error=${path.join(MARIADB, "error.log")}`,
      "--skip-name-resolve",
      "--innodb-buffer-pool-size=256M",
      "--character-set-server=utf8mb4",
      "--collation-server=utf8mb4_unicode_ci",
      "--max-connections=300",
      "--local-infile=1",
    ],
    { detached: true, stdio: "ignore" },
  );
  child.unref();
  remember(child.pid);
  const until = Date.now() + 60_000;
  while (spawnSync("mariadb-admin", ["--no-defaults", `--socket=${sock}`, "-uroot", "ping"], { stdio: "ignore" }).status !== 0) {
    if (Date.now() > until) throw new Error(`MariaDB did not start again; see ${path.join(MARIADB, "error.log")}`);
    await sleep(200);
  }
}

/** The process listening on a loopback port (ss -ltnp). */
function pidOnPort(port: number): number | null {
  const out = spawnSync("ss", ["-ltnpH", `sport = :${port}`], { encoding: "utf8" }).stdout ?? "";
  const m = out.match(/pid=(\d+)/);
  return m ? Number(m[1]) : null;
}

/** Stops the S3 and SMTP fakes (one process) as a crash would. */
export async function stopFakes(): Promise<void> {
  const pid = pidOnPort(S3_PORT);
  if (!pid) throw new Error(`no S3 fake listening on ${S3_PORT}`);
  process.kill(pid, "SIGKILL");
  await waitPort(S3_PORT, false, "S3 fake");
  await waitPort(SMTP_PORT, false, "SMTP fake");
}

/** Starts the fakes again with the same folders, ports and allowed origins. */
export async function startFakes(): Promise<void> {
  const child = spawn(process.execPath, ["--import", "tsx", "scripts/fakes.ts"], {
    cwd: ROOT,
    detached: true,
    stdio: "ignore",
    env: { ...process.env, S3_FAKE_ALLOWED_ORIGINS: `http://localhost:${process.env.E2E_PORT ?? 3100}` },
  });
  child.unref();
  remember(child.pid);
  await waitPort(S3_PORT, true, "S3 fake");
  await waitPort(SMTP_PORT, true, "SMTP fake");
}
