import { toNextJsHandler } from "better-auth/next-js";
import { auth } from "@/lib/auth/auth";

// GET/POST /api/auth/* – better-auth (sign-in, sign-out, session, password reset)
export const { GET, POST } = toNextJsHandler(auth);
