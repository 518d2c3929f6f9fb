import { NextResponse } from "next/server";
import { withRoute } from "@/lib/auth/api";
import { readBody } from "@/lib/inspections/http";
import { vesselInBody } from "@/lib/imports/http";
import { createImportUpload } from "@/lib/imports/mutations";
import { createUploadSchema } from "@/lib/imports/schemas";

export const dynamic = "force-dynamic";

// POST /api/imports/uploads – reserve an upload for one reading file: a presigned PUT URL for the object store
export const POST = withRoute(
  "POST /api/imports/uploads",
  async (req, { user }) => NextResponse.json(await createImportUpload(user, await readBody(req, createUploadSchema)), { status: 201 }),
  { vesselOf: vesselInBody },
);
