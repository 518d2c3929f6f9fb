/**
 * A refusal from the inspection and photo mutations, with the HTTP status it maps to.
 * Kept free of Next.js imports so scripts and tests can run the mutations directly;
 * the route handlers turn it into a JSON answer (lib/inspections/http.ts).
 */
export class RecordError extends Error {
  constructor(
    public status: 400 | 403 | 404 | 409,
    message: string,
    public details?: Record<string, unknown>,
  ) {
    super(message);
    this.name = "RecordError";
  }
}
