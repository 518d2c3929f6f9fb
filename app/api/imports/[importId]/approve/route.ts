import { NextResponse } from "next/server";
import { withRoute } from "@/lib/auth/api";
import { importIdOf, vesselOfImport } from "@/lib/imports/http";
import { approveImport } from "@/lib/imports/mutations";

export const dynamic = "force-dynamic";

// POST /api/imports/:importId/approve – approve an import of past records as a whole (not by its importer)
export const POST = withRoute<{ importId: string }>("POST /api/imports/[importId]/approve", async (_req, { user, params }) => NextResponse.json(await approveImport(user, importIdOf(params))), {
  vesselOf: vesselOfImport,
});
