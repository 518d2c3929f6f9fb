import { NextResponse } from "next/server";
import { withRoute } from "@/lib/auth/api";
import { listFleet } from "@/lib/fleet/queries";

export const dynamic = "force-dynamic";

// GET /api/vessels – the vessels the caller is assigned to (all of them for admins), with unit bands
export const GET = withRoute("GET /api/vessels", async (_req, { user }) => NextResponse.json({ vessels: await listFleet(user) }));
