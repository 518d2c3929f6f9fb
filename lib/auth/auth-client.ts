"use client";
import { createAuthClient } from "better-auth/react";

/** Browser-side auth calls go to the same origin the page was served from. */
export const authClient = createAuthClient();
