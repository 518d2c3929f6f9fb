import { handleAuthRequest } from "@/lib/auth/auth-route";

// GET/POST /api/auth/* – better-auth, only the endpoints the screens use (sign-in,
// sign-out, session, password reset); everything else answers 404. See lib/auth/auth-route.ts.
export const GET = handleAuthRequest;
export const POST = handleAuthRequest;
