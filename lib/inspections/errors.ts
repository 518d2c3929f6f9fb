import { HttpError } from "@/lib/http/errors";

/**
 * A refusal from the inspection and photo mutations: the API's one error type under the
 * name those mutations use, so the route wrapper answers it directly.
 */
export const RecordError = HttpError;
export type RecordError = HttpError;
