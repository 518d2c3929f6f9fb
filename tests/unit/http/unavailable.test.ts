import { describe, expect, it } from "vitest";
import { unavailableService } from "@/lib/http/unavailable";

// The error shapes below are the ones mysql2, Knex and the AWS SDK v3 throw when the other
// end is gone (seen in tests/integration/faults.test.ts against the real services).

const withCode = (code: string, extra: Record<string, unknown> = {}) => Object.assign(new Error(code), { code, ...extra });

describe("unavailableService", () => {
  it("names the database for mysql2's connection errors and Knex's pool timeout", () => {
    expect(unavailableService(withCode("ECONNREFUSED", { errno: -111, address: "127.0.0.1", port: 3306 }))).toBe("database");
    expect(unavailableService(withCode("PROTOCOL_CONNECTION_LOST", { fatal: true }))).toBe("database");
    expect(unavailableService(Object.assign(new Error("ROLLBACK - Can't add new command when connection is in closed state"), { fatal: true }))).toBe("database");
    expect(unavailableService(Object.assign(new Error("Knex: Timeout acquiring a connection."), { name: "KnexTimeoutError" }))).toBe("database");
  });

  it("names the store for the AWS SDK's errors, the socket error inside or a 5xx answer", () => {
    expect(unavailableService(withCode("ECONNREFUSED", { $metadata: { attempts: 3 } }))).toBe("store");
    expect(unavailableService(Object.assign(new Error("fetch failed"), { $metadata: {}, cause: withCode("ECONNRESET") }))).toBe("store");
    expect(unavailableService(Object.assign(new Error("InternalError"), { $fault: "server", $metadata: { httpStatusCode: 503 } }))).toBe("store");
  });

  it("leaves everything else alone: a bug stays a 500, a refusal stays a refusal", () => {
    expect(unavailableService(new TypeError("Cannot read properties of undefined"))).toBeNull();
    expect(unavailableService(withCode("ER_DUP_ENTRY"))).toBeNull();
    expect(unavailableService(Object.assign(new Error("NoSuchKey"), { $metadata: { httpStatusCode: 404 } }))).toBeNull();
    expect(unavailableService("ECONNREFUSED")).toBeNull();
    expect(unavailableService(null)).toBeNull();
  });
});
