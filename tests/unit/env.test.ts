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
