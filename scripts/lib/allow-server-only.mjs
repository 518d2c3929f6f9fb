/**
 * For scripts that run server code outside Next.js (npm run digest): `server-only` guards a
 * module against being bundled for the browser and throws when imported anywhere else; a
 * script on the server is where such modules belong, so it resolves to an empty module here.
 *
 *   node --import tsx --import ./scripts/lib/allow-server-only.mjs scripts/….ts
 */
import { register } from "node:module";

const hook = `export async function resolve(specifier, context, next) {
  if (specifier === "server-only") return { url: "data:text/javascript,export {};", shortCircuit: true };
  return next(specifier, context);
}`;
register(`data:text/javascript,${encodeURIComponent(hook)}`);
