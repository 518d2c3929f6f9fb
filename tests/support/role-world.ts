import { randomUUID, createHash } from "node:crypto";
import { hashPassword } from "better-auth/crypto";
import type { Knex } from "knex";
import type { Role } from "@/lib/auth/roles";

/**
 * A small world for the authorization tests and for checking screens by hand: one company,
 * two vessels with an engine each, and one user per role (crew on vessel 1 and vessel 2).
 * Addresses are under roles.test so they never collide with the demo data.
 */
export const WORLD_PASSWORD = "Roles-test-password-1";

export type WorldUser = { id: string; email: string; name: string; role: Role; vesselIds: number[] };

export type RoleWorld = {
  companyId: number;
  vessel1: number;
  vessel2: number;
  profileId: number;
  engine1: number;
  engine2: number;
  users: Record<"admin" | "supt" | "chief" | "engineer" | "chief2" | "engineer2", WorldUser>;
};

async function addUser(db: Knex, hash: string, o: Omit<WorldUser, "id">): Promise<WorldUser> {
  const existing = await db("user").where({ email: o.email }).first("id");
  const id = existing?.id ?? randomUUID();
  if (!existing) {
    const now = new Date();
    await db("user").insert({ id, name: o.name, email: o.email, emailVerified: true, role: o.role, banned: false, createdAt: now, updatedAt: now });
    await db("account").insert({ id: randomUUID(), accountId: id, providerId: "credential", userId: id, password: hash, createdAt: now, updatedAt: now });
  } else {
    await db("user").where({ id }).update({ role: o.role, banned: false });
  }
  await db("user_vessels").where({ user_id: id }).delete();
  if (o.vesselIds.length) await db("user_vessels").insert(o.vesselIds.map((v) => ({ user_id: id, vessel_id: v })));
  return { id, ...o };
}

async function upsert(db: Knex, table: string, where: Record<string, unknown>, row: Record<string, unknown>): Promise<number> {
  const found = await db(table).where(where).first("id");
  if (found) return found.id;
  const [id] = await db(table).insert({ ...where, ...row });
  return id;
}

/**
 * An invented IMO number of its own for each world tag, so two test files never share a vessel
 * (and its units, outbox or plans). The seventh digit is the IMO check digit: the first six
 * weighted 7, 6, 5, 4, 3, 2, summed, modulo 10 (IMO Resolution A.1117(30)).
 */
function worldImo(seed: string): string {
  const n = 100000 + (Number.parseInt(createHash("sha256").update(seed).digest("hex").slice(0, 8), 16) % 900000);
  const d = String(n).split("").map(Number);
  const check = d.reduce((sum, digit, i) => sum + digit * (7 - i), 0) % 10;
  return `${n}${check}`;
}

export async function buildRoleWorld(db: Knex, tag = "roles"): Promise<RoleWorld> {
  const hash = await hashPassword(WORLD_PASSWORD);
  const companyId = await upsert(db, "companies", { name: `Harbour Test Shipping (${tag})` }, {});
  // Invented IMO numbers (they pass the check digit); each world has vessels of its own.
  const imo = ({ roles: ["3104522", "4052635"], appr: ["5104320", "5208762"], notify: ["3141594", "2718285"] } as Record<string, string[]>)[tag] ?? [
    worldImo(`${tag}:1`),
    worldImo(`${tag}:2`),
  ];
  const vessel1 = await upsert(db, "vessels", { imo_number: imo[0] }, { name: "Test Petrel", company_id: companyId, vessel_type: "Bulk carrier" });
  const vessel2 = await upsert(db, "vessels", { imo_number: imo[1] }, { name: "Test Fulmar", company_id: companyId, vessel_type: "Tanker" });
  const profileId = await upsert(db, "engine_profiles", { name: `Test 600 bore (${tag})` }, {
    designation: "T-600 long stroke",
    bore_mm: 600,
    stroke_mm: 2330, // invented: not a catalogued bore and stroke pair
    liner_wear_limit_mm: 3.6,
    ovality_limit_mm: 1.2,
    ring_count: 4,
  });
  if (!(await db("profile_stations").where({ profile_id: profileId }).first("id"))) {
    await db("profile_stations").insert([
      { profile_id: profileId, position: 1, station_key: "s1", label: "Top", depth_mm: 40, role: "unworn_top" },
      { profile_id: profileId, position: 2, station_key: "s2", label: "Ring 1 TDC", depth_mm: 120, role: "ring_tdc" },
      { profile_id: profileId, position: 3, station_key: "s3", label: "Middle", depth_mm: 600, role: "intermediate" },
    ]);
    await db("profile_rings").insert(
      [1, 2, 3, 4].map((p) => ({
        profile_id: profileId,
        position: p,
        label: `Ring ${p}`,
        gap_new_min_mm: 3.2,
        gap_new_max_mm: 3.8,
        gap_limit_mm: 6.5,
        groove_new_min_mm: 0.4,
        groove_new_max_mm: 0.5,
        groove_limit_mm: 0.9,
      })),
    );
  }
  const engine1 = await upsert(db, "main_engines", { serial: `T-${tag}-1` }, { vessel_id: vessel1, profile_id: profileId, cylinder_count: 6 });
  const engine2 = await upsert(db, "main_engines", { serial: `T-${tag}-2` }, { vessel_id: vessel2, profile_id: profileId, cylinder_count: 6 });
  for (const engine of [engine1, engine2]) {
    if (!(await db("cylinder_units").where({ engine_id: engine }).first("id"))) {
      await db("cylinder_units").insert([1, 2, 3, 4, 5, 6].map((n) => ({ engine_id: engine, cylinder_no: n })));
    }
  }
  const d = `${tag}.test`;
  const users = {
    admin: await addUser(db, hash, { email: `admin@${d}`, name: "Ada Admin", role: "admin", vesselIds: [] }),
    supt: await addUser(db, hash, { email: `supt@${d}`, name: "Sam Superintendent", role: "superintendent", vesselIds: [vessel1, vessel2] }),
    chief: await addUser(db, hash, { email: `chief@${d}`, name: "Chris Chief", role: "chief_engineer", vesselIds: [vessel1] }),
    engineer: await addUser(db, hash, { email: `engineer@${d}`, name: "Eli Engineer", role: "engineer", vesselIds: [vessel1] }),
    chief2: await addUser(db, hash, { email: `chief2@${d}`, name: "Casey Chief", role: "chief_engineer", vesselIds: [vessel2] }),
    engineer2: await addUser(db, hash, { email: `engineer2@${d}`, name: "Erin Engineer", role: "engineer", vesselIds: [vessel2] }),
  };
  return { companyId, vessel1, vessel2, profileId, engine1, engine2, users };
}
