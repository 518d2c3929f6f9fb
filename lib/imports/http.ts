import "server-only";
import { HttpError, parseId } from "@/lib/auth/api";
import { parseRecordId } from "@/lib/validation/ids";
import { getVesselIdIfExists } from "@/lib/fleet/queries";
import { getImportVesselId } from "./queries";

/** vesselOf for routes under /api/imports/[importId]. */
export async function vesselOfImport(_req: Request, params: { importId: string }): Promise<number | null> {
  const id = parseRecordId(params.importId);
  return id === null ? null : getImportVesselId(id);
}

/** vesselOf for POST /api/imports and /api/imports/uploads: the vessel named in the body (it must exist). */
export async function vesselInBody(req: Request): Promise<number | null> {
  let body: { vesselId?: unknown };
  try {
    body = (await req.clone().json()) as { vesselId?: unknown };
  } catch {
    throw new HttpError(400, "The request body is not valid JSON.", { field: "" });
  }
  const id = typeof body?.vesselId === "number" ? parseRecordId(String(body.vesselId)) : null;
  if (id === null) throw new HttpError(400, "Choose the vessel. (field: vesselId)", { field: "vesselId" });
  return getVesselIdIfExists(id);
}

/** vesselOf for GET /api/imports: `?vesselId=` names the vessel whose log is read. */
export async function vesselInQuery(req: Request): Promise<number | null> {
  const id = parseRecordId(new URL(req.url).searchParams.get("vesselId"));
  if (id === null) throw new HttpError(400, "Say which vessel's imports to list (?vesselId=). (field: vesselId)", { field: "vesselId" });
  return getVesselIdIfExists(id);
}

export const importIdOf = (params: { importId: string }) => parseId(params.importId, "Import");
