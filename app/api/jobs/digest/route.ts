import { NextResponse } from "next/server";
import { serverEnv } from "@/lib/env";
import { runWeeklyDigest } from "@/lib/notifications/digest-mutations";
import { jobTokenMatches } from "@/lib/notifications/job-token";

export const dynamic = "force-dynamic";

// POST /api/jobs/digest – runs the weekly digest once (for a scheduler; JOBS_TOKEN is the credential)
// Not wrapped in withRoute: a scheduler has no session and no browser Origin. The token is
// checked before anything else; a second run in the same ISO week queues nothing new.
export async function POST(req: Request) {
  if (!jobTokenMatches(req.headers.get("authorization"), serverEnv.JOBS_TOKEN)) {
    return NextResponse.json({ error: "A valid job token is needed (Authorization: Bearer …)." }, { status: 401, headers: { "www-authenticate": "Bearer" } });
  }
  try {
    const run = await runWeeklyDigest();
    return NextResponse.json(run, { headers: { "cache-control": "no-store" } });
  } catch (err) {
    console.error("weekly digest:", err);
    return NextResponse.json({ error: "The digest did not run to the end; run it again (nothing is sent twice)." }, { status: 500 });
  }
}
