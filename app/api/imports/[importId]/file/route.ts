import { NextResponse } from "next/server";
import { withRoute } from "@/lib/auth/api";
import { importIdOf, vesselOfImport } from "@/lib/imports/http";
import { importFileUrl } from "@/lib/imports/mutations";

export const dynamic = "force-dynamic";

// GET /api/imports/:importId/file – download the imported file again, as it was imported (a short-lived store link)
export const GET = withRoute<{ importId: string }>(
  "GET /api/imports/[importId]/file",
  async (_req, { params }) => NextResponse.redirect(await importFileUrl(importIdOf(params)), { status: 303, headers: { "cache-control": "no-store" } }),
  { vesselOf: vesselOfImport },
);
