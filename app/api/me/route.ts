import { NextResponse } from "next/server";
import { withRoute } from "@/lib/auth/api";
import { permissionsOf } from "@/lib/auth/permissions";

export const dynamic = "force-dynamic";

// GET /api/me – the caller's name, role, vessel scope and permissions (for clients hiding controls)
export const GET = withRoute("GET /api/me", async (_req, { user }) =>
  NextResponse.json({ id: user.id, name: user.name, email: user.email, role: user.role, vessels: user.vessels, permissions: permissionsOf(user.role) }),
);
