import { spawn } from "node:child_process";
import { createHash } from "node:crypto";
import { createReadStream } from "node:fs";
import fs from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import type { ServerEnv } from "../../lib/env";

/** What a backup archive holds besides its files; `SHA256SUMS` beside it lists the same checksums for `sha256sum -c`. */
export type BackupManifest = {
  format: "kalibore-backup/1";
  createdAt: string;
  database: { name: string; file: string; bytes: number; sha256: string; server: string };
  bucket: string;
  objects: { key: string; file: string; bytes: number; sha256: string; contentType: string | null }[];
};

/** SHA-256 of a file, read as a stream (a dump may be larger than memory). */
export async function sha256File(file: string): Promise<string> {
  const hash = createHash("sha256");
  for await (const chunk of createReadStream(file)) hash.update(chunk as Buffer);
  return hash.digest("hex");
}

/** The schema owner's credentials (migration user), as the dump and the restore must see every table. */
export function ownerCredentials(env: ServerEnv): { user: string; password: string } {
  return env.DB_MIGRATION_USER
    ? { user: env.DB_MIGRATION_USER, password: env.DB_MIGRATION_PASSWORD ?? "" }
    : { user: env.DB_USER, password: env.DB_PASSWORD };
}

/**
 * Writes a client option file (mode 600) for the mariadb tools, so the password never appears
 * in a process listing; returns its path and a function that removes it.
 */
export async function clientOptionFile(env: ServerEnv): Promise<{ file: string; remove: () => Promise<void> }> {
  const dir = await fs.mkdtemp(path.join(os.tmpdir(), "kalibore-db-"));
  const file = path.join(dir, "client.cnf");
  const { user, password } = ownerCredentials(env);
  const quote = (v: string) => `"${v.replace(/\\/g, "\\\\").replace(/"/g, '\\"')}"`;
  await fs.writeFile(file, `[client]\nhost=${env.DB_HOST}\nport=${env.DB_PORT}\nuser=${quote(user)}\npassword=${quote(password)}\n`, { mode: 0o600 });
  return { file, remove: () => fs.rm(dir, { recursive: true, force: true }) };
}

/** Runs a program, its stdin/stdout optionally from/to files; rejects with its stderr on failure. */
export function run(cmd: string, args: string[], io: { stdinFile?: string; stdoutFile?: string } = {}): Promise<string> {
  return new Promise((resolve, reject) => {
    void (async () => {
      const stdin = io.stdinFile ? await fs.open(io.stdinFile, "r") : null;
      const stdout = io.stdoutFile ? await fs.open(io.stdoutFile, "w") : null;
      const child = spawn(cmd, args, { stdio: [stdin ? stdin.fd : "ignore", stdout ? stdout.fd : "pipe", "pipe"] });
      let out = "";
      let err = "";
      child.stdout?.on("data", (d: Buffer) => (out += d.toString()));
      child.stderr!.on("data", (d: Buffer) => (err += d.toString()));
      child.on("error", reject);
      child.on("close", async (code) => {
        await stdin?.close();
        await stdout?.close();
        if (code === 0) resolve(out);
        else reject(new Error(`${cmd} exited with ${code}: ${err.trim().slice(0, 2000)}`));
      });
    })().catch(reject);
  });
}

/** The checksum list in the format of coreutils' sha256sum, for checking an archive by hand. */
export function sha256sums(entries: { file: string; sha256: string }[]): string {
  return entries.map((e) => `${e.sha256}  ${e.file}\n`).join("");
}
