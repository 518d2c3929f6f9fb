import { NextResponse } from "next/server";
import { notFound, withRoute } from "@/lib/auth/api";
import { importIdOf, vesselOfImport } from "@/lib/imports/http";
import { getImportDto } from "@/lib/imports/queries";

export const dynamic = "force-dynamic";

// GET /api/imports/:importId – one import: its preview with every row error, and the records it made
export const GET = withRoute<{ importId: string }>(
  "GET /api/imports/[importId]",
  async (_req, { params }) => {
    const dto = await getImportDto(importIdOf(params));
    if (!dto) throw notFound("Import not found.");
    return NextResponse.json(dto);
  },
  { vesselOf: vesselOfImport },
);
