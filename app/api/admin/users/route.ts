import { NextResponse } from "next/server";
import { withRoute } from "@/lib/auth/api";
import { listUsersForAdmin } from "@/lib/admin/queries";

export const dynamic = "force-dynamic";

// GET /api/admin/users – every user with role, vessels and activation (admins only)
export const GET = withRoute("GET /api/admin/users", async () => NextResponse.json({ users: await listUsersForAdmin() }));
