import "server-only";
import type { ZodType } from "zod";
import { HttpError, parseId } from "@/lib/auth/api";
import { parseRecordId } from "@/lib/validation/ids";
import { describeIssues } from "@/lib/validation/issues";
import { getInspectionVesselId, getUnitVesselId } from "./queries";

/**
 * Reads a JSON body and parses it with the same schema the form uses. Anything the
 * client let through is refused with 400, a sentence saying why, and the field's path.
 */
export async function readBody<S extends ZodType>(req: Request, schema: S, options: { fieldPrefix?: string } = {}): Promise<S["_output"]> {
  let body: unknown;
  try {
    body = await req.json();
  } catch {
    throw new HttpError(400, "The request body is not valid JSON.", { field: "" });
  }
  const parsed = schema.safeParse(body);
  if (!parsed.success) {
    // Field paths are named as the form names them (a draft save's body wraps the draft).
    const strip = (f: string) => (options.fieldPrefix && f.startsWith(options.fieldPrefix) ? f.slice(options.fieldPrefix.length) : f);
    const { message, field, fields } = describeIssues(parsed.error);
    throw new HttpError(400, message.replace(`(field: ${field})`, `(field: ${strip(field)})`), {
      field: strip(field),
      fields: Object.fromEntries(Object.entries(fields).map(([k, v]) => [strip(k), v])),
    });
  }
  return parsed.data;
}

/** vesselOf for routes under /api/inspections/[inspectionId]. */
export async function vesselOfInspection(_req: Request, params: { inspectionId: string }): Promise<number | null> {
  const id = parseRecordId(params.inspectionId);
  return id === null ? null : getInspectionVesselId(id);
}

/** vesselOf for POST /api/inspections: the unit named in the body. */
export async function vesselOfUnitInBody(req: Request): Promise<number | null> {
  let body: { unitId?: unknown };
  try {
    body = (await req.clone().json()) as { unitId?: unknown };
  } catch {
    throw new HttpError(400, "The request body is not valid JSON.", { field: "" });
  }
  const id = typeof body?.unitId === "number" ? parseRecordId(String(body.unitId)) : null;
  if (id === null) throw new HttpError(400, "Choose the unit to inspect. (field: unitId)", { field: "unitId" });
  return getUnitVesselId(id);
}

export const inspectionIdOf = (params: { inspectionId: string }) => parseId(params.inspectionId, "Inspection");
