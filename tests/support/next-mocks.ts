import { vi } from "vitest";

/**
 * Stand-ins for next/headers during integration tests: the "browser" is whichever
 * cookie the test sets with `asCaller`. Everything else (better-auth, the session
 * lookup, the database) is real.
 */
export const jar = { cookie: "" };

export function asCaller(cookie: string | null) {
  jar.cookie = cookie ?? "";
}

export function mockedHeaders() {
  return new Headers({
    ...(jar.cookie ? { cookie: jar.cookie } : {}),
    origin: process.env.APP_URL ?? "http://localhost:3000",
    "user-agent": "vitest",
  });
}

export function mockedCookies() {
  const parsed = new Map(
    jar.cookie
      .split(/;\s*/)
      .filter(Boolean)
      .map((kv) => {
        const i = kv.indexOf("=");
        return [kv.slice(0, i), kv.slice(i + 1)] as const;
      }),
  );
  return {
    get: (name: string) => (parsed.has(name) ? { name, value: parsed.get(name)! } : undefined),
    getAll: () => [...parsed].map(([name, value]) => ({ name, value })),
    has: (name: string) => parsed.has(name),
    set: vi.fn(),
    delete: vi.fn(),
  };
}
