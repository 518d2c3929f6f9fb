import { NextResponse } from "next/server";
import { checkHealth } from "@/lib/health/queries";

export const dynamic = "force-dynamic";

// GET /api/health – database and object store reachability (public: no data in it)
export async function GET() {
  const report = await checkHealth();
  return NextResponse.json(report, { status: report.ok ? 200 : 503, headers: { "cache-control": "no-store" } });
}
