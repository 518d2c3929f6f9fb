import { auth } from "@/lib/auth/auth";

/** Signs in through better-auth's server API and returns the Cookie header a browser would send. */
export async function signInCookie(email: string, password: string): Promise<string> {
  const res = await auth.api.signInEmail({ body: { email, password }, asResponse: true });
  if (!res.ok) throw new Error(`sign-in failed for ${email}: ${res.status} ${await res.text()}`);
  const setCookie = res.headers.getSetCookie?.() ?? [res.headers.get("set-cookie") ?? ""];
  const pairs = setCookie.map((c) => c.split(";")[0]).filter((kv) => kv && !kv.endsWith("="));
  if (!pairs.length) throw new Error(`no session cookie for ${email}`);
  return pairs.join("; ");
}
