/**
 * The one error type behind every API answer that is not a success: the HTTP status, a
 * sentence for the person, and details for the form (the field at fault, the problems).
 * Free of Next.js imports, so mutations that scripts and tests call directly throw it too;
 * the route wrapper (lib/auth/api.ts) turns it into the JSON answer.
 */
export class HttpError extends Error {
  constructor(
    public status: number,
    message: string,
    public details?: Record<string, unknown>,
  ) {
    super(message);
    this.name = "HttpError";
  }
}
