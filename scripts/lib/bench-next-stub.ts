/*
 * For the benchmark bundle only: the request-bound Next.js helpers that modules on the import
 * path load but the benchmark never calls (it passes its own actor and connection). Outside a
 * Next.js server their real modules cannot even load.
 */
const outside = (name: string) => () => {
  throw new Error(`${name} is not available outside a Next.js request`);
};
export const headers = outside("headers");
export const redirect = outside("redirect");
export const unstable_rethrow = (err: unknown) => void err;
