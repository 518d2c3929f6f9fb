import { describe, expect, it } from "vitest";
import { parseServerEnv } from "@/lib/env";

describe("configuration schema", () => {
  it("has working local defaults for every variable", () => {
    const env = parseServerEnv({});
    expect(env.DB_PORT).toBe(3307);
    expect(env.S3_ENDPOINT).toBe("http://127.0.0.1:4569");
    expect(env.SMTP_PORT).toBe(2525);
  });

  it.each([
    ["DB_PORT", "not-a-port"],
    ["DB_PORT", "70000"],
    ["S3_ENDPOINT", "nowhere"],
    ["BETTER_AUTH_SECRET", "short"],
    ["DB_NAME", "drop table;"],
  ])("names the bad variable %s=%s", (key, value) => {
    expect(() => parseServerEnv({ [key]: value })).toThrow(new RegExp(`${key}:`));
  });

  it("treats empty strings as unset", () => {
    expect(parseServerEnv({ SMTP_USER: "", DB_PORT: "" }).DB_PORT).toBe(3307);
  });
});

describe("the session-signing secret", () => {
  const random = "q7Vt2mZ0xJ4rL9sK1bN8cH3wY6pD5fGe-aTuEiOo";

  it.each([
    ["missing", undefined, /must be set in production/],
    ["short", "0123456789abcdef", /at least 32 characters/],
    ["the published example", "local-demo-secret-change-me-0123456789abcdef", /published example value/],
    ["too regular", "a".repeat(40), /too regular/],
  ])("is refused in production when %s", (_what, secret, message) => {
    expect(() => parseServerEnv({ NODE_ENV: "production", BETTER_AUTH_SECRET: secret })).toThrow(message);
    expect(() => parseServerEnv({ NODE_ENV: "production", BETTER_AUTH_SECRET: secret })).toThrow(/BETTER_AUTH_SECRET:/);
  });

  it("is taken as given in production when it is long and random", () => {
    expect(parseServerEnv({ NODE_ENV: "production", BETTER_AUTH_SECRET: random }).BETTER_AUTH_SECRET).toBe(random);
  });

  it("falls back to a development secret outside production only", () => {
    const dev = parseServerEnv({ NODE_ENV: "development" }).BETTER_AUTH_SECRET;
    expect(dev.length).toBeGreaterThanOrEqual(32);
    expect(() => parseServerEnv({ NODE_ENV: "production", BETTER_AUTH_SECRET: dev })).toThrow(/published example value/);
  });
});

describe("published local credentials", () => {
  const secret = "q7Vt2mZ0xJ4rL9sK1bN8cH3wY6pD5fGe-aTuEiOo";
  const prod = (extra: Record<string, string>) => parseServerEnv({ NODE_ENV: "production", BETTER_AUTH_SECRET: secret, ...extra });

  it("are accepted for the private database and the fake store on loopback (npm start)", () => {
    expect(prod({}).DB_PASSWORD).toBe("kalibore-local");
    expect(prod({ DB_HOST: "localhost", S3_ENDPOINT: "http://127.0.0.1:4569" }).S3_ACCESS_KEY_ID).toBe("S3RVER");
  });

  it("are refused in production for a database or an object store elsewhere", () => {
    expect(() => prod({ DB_HOST: "db.internal.example" })).toThrow(/DB_PASSWORD: is the published local default/);
    expect(() => prod({ S3_ENDPOINT: "https://s3.eu-west-1.amazonaws.com" })).toThrow(/S3_SECRET_ACCESS_KEY: is the local fake's published key/);
    expect(prod({ DB_HOST: "db.internal.example", DB_PASSWORD: "a-real-one" }).DB_HOST).toBe("db.internal.example");
  });
});
