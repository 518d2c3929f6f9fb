import fc from "fast-check";
import { fuzzCase, hostileString, type FuzzCase } from "../../support/fuzz";
import type { RoleWorld } from "../../support/role-world";

// The digest job: public in the registry, its credential is the scheduler's bearer token
// (scripts/test.sh sets JOBS_TOKEN). Mostly hostile tokens; now and then the real one, so the
// job runs (a second run in the week sends nothing new).
export const fuzzCases: Record<string, FuzzCase<RoleWorld>> = {
  "POST /api/jobs/digest": fuzzCase({
    as: "admin",
    setup: async (w) => w,
    headers: () =>
      fc
        .oneof(
          { weight: 1, arbitrary: fc.constant(`Bearer ${process.env.JOBS_TOKEN ?? ""}`) },
          { weight: 3, arbitrary: fc.oneof(hostileString().map((t) => `Bearer ${t}`), hostileString(), fc.constant(`bearer ${process.env.JOBS_TOKEN ?? ""}x`)) },
        )
        .map((authorization) => ({ authorization })),
    body: () => fc.record({ week: hostileString() }),
  }),
};
