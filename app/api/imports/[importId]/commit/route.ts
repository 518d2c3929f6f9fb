import { NextResponse } from "next/server";
import { withRoute } from "@/lib/auth/api";
import { readBody } from "@/lib/inspections/http";
import { importIdOf, vesselOfImport } from "@/lib/imports/http";
import { commitImport } from "@/lib/imports/mutations";
import { commitImportSchema } from "@/lib/imports/schemas";

export const dynamic = "force-dynamic";

// POST /api/imports/:importId/commit – write a previewed import, all or nothing
export const POST = withRoute<{ importId: string }>(
  "POST /api/imports/[importId]/commit",
  async (req, { user, params }) => NextResponse.json(await commitImport(user, importIdOf(params), await readBody(req, commitImportSchema))),
  { vesselOf: vesselOfImport },
);
