/**
 * Where to send someone after signing in. `next` comes from the address bar, so it is
 * resolved with the URL parser against the app's own origin, exactly as the browser will
 * resolve it: tabs and newlines are dropped and `\` counts as `/`, which is how
 * `/\evil.example` or `/%09/evil.example` turned into `//evil.example`. Only a path on the
 * same origin is accepted, returned in its parsed form; anything else goes home.
 */
export function safeNextPath(next: unknown, origin: string): string {
  if (typeof next !== "string" || !next.startsWith("/")) return "/";
  let base: URL;
  let url: URL;
  try {
    base = new URL(origin);
    url = new URL(next, base);
  } catch {
    return "/";
  }
  if (url.origin !== base.origin || url.username || url.password) return "/";
  const path = url.pathname + url.search + url.hash;
  // "/.//evil" parses to the path "//evil", which a browser reads as another host.
  if (!path.startsWith("/") || path.startsWith("//") || path.startsWith("/\\")) return "/";
  return path;
}
