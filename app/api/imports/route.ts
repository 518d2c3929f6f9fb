import { NextResponse } from "next/server";
import { withRoute } from "@/lib/auth/api";
import { readBody } from "@/lib/inspections/http";
import { toCsv } from "@/lib/imports/csv-export";
import { vesselInBody, vesselInQuery } from "@/lib/imports/http";
import { previewImport } from "@/lib/imports/mutations";
import { listImports } from "@/lib/imports/queries";
import { createImportSchema, IMPORT_STATUS_LABELS } from "@/lib/imports/schemas";

export const dynamic = "force-dynamic";

// POST /api/imports – check an uploaded file under a mapping and store its preview (nothing is written to the records)
export const POST = withRoute(
  "POST /api/imports",
  async (req, { user }) => NextResponse.json(await previewImport(user, await readBody(req, createImportSchema)), { status: 201 }),
  { vesselOf: vesselInBody },
);

// GET /api/imports?vesselId= – the vessel's import log (?format=csv for a spreadsheet copy)
export const GET = withRoute(
  "GET /api/imports",
  async (req, { user, vesselId }) => {
    const imports = await listImports(user, { vesselId });
    if (new URL(req.url).searchParams.get("format") === "csv") {
      const rows = [
        ["import", "file", "sha256", "destination", "status", "imported by", "imported at", "approved by", "approved at", "rows", "gaugings", "records", "replaces", "replaced by"],
        ...imports.map((i) => [i.id, i.fileName, i.sha256, i.destination, IMPORT_STATUS_LABELS[i.status], i.createdBy.name, i.committedAt ?? i.createdAt, i.approvedBy?.name ?? "", i.approvedAt ?? "", i.rowCount, i.groupCount, i.inspectionIds.join(" "), i.replacesId ?? "", i.supersededById ?? ""]),
      ];
      return new NextResponse(toCsv(rows), {
        headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="kalibore-imports-vessel-${vesselId}.csv"`, "cache-control": "no-store" },
      });
    }
    return NextResponse.json({ imports });
  },
  { vesselOf: vesselInQuery },
);
