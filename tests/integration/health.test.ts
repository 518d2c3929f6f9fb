import { describe, expect, it } from "vitest";
import { GET } from "@/app/api/health/route";

describe("GET /api/health", () => {
  it("reports the real database (migrated) and the object store as reachable", async () => {
    const res = await GET();
    const body = await res.json();
    expect(res.status, JSON.stringify(body)).toBe(200);
    expect(body.ok).toBe(true);
    expect(body.database.ok).toBe(true);
    expect(body.database.migrations).toBeGreaterThanOrEqual(2);
    expect(body.objectStore.ok).toBe(true);
  });
});
