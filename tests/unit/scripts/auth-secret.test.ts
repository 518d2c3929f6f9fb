import { execFileSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync, statSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";

// npm start stays one command: the secret is generated once into the data folder and reused.
const ROOT = path.resolve(import.meta.dirname, "../../..");
const dir = mkdtempSync(path.join(tmpdir(), "kalibore-secret-"));
const file = path.join(dir, "auth-secret");

function secretFromScript(env: Record<string, string> = {}): string {
  const script = `source scripts/lib/common.sh; ensure_auth_secret "$1" >/dev/null; printf '%s' "$BETTER_AUTH_SECRET"`;
  const clean = { ...process.env, BETTER_AUTH_SECRET: "", ...env };
  return execFileSync("bash", ["-c", script, "bash", file], { cwd: ROOT, env: clean, encoding: "utf8" });
}

afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe("ensure_auth_secret (scripts/lib/common.sh)", () => {
  it("generates a random secret on the first run, readable by the owner only, and reuses it after", () => {
    const first = secretFromScript();
    expect(first).toMatch(/^[A-Za-z0-9_-]{64}$/); // 48 random bytes, base64url
    expect(readFileSync(file, "utf8")).toBe(first);
    expect(statSync(file).mode & 0o077).toBe(0);
    expect(secretFromScript()).toBe(first);
  });

  it("leaves a secret given in the environment alone", () => {
    const given = "given-secret-0123456789-abcdefghijklmnopqrstuvwxyz";
    expect(secretFromScript({ BETTER_AUTH_SECRET: given })).toBe(given);
  });
});
