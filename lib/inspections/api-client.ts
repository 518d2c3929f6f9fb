/*
 * The browser's side of the inspection API: JSON in and out, with the server's
 * message kept so the form can show it in words. No server imports.
 */

export type ApiErrorBody = { error?: string; details?: { field?: string; problems?: { field: string; message: string }[]; server?: unknown; fields?: Record<string, string[]> } };

export class ApiError extends Error {
  constructor(
    public status: number,
    public body: ApiErrorBody,
  ) {
    super(body.error ?? `The server answered ${status}.`);
  }
}

/** The request never reached the server (offline, or the network dropped). */
export class NetworkError extends Error {
  constructor() {
    super("No network: the server could not be reached.");
  }
}

export async function apiJson<T>(url: string, init: { method?: string; body?: unknown; signal?: AbortSignal } = {}): Promise<T> {
  let res: Response;
  try {
    res = await fetch(url, {
      method: init.method ?? "GET",
      headers: init.body === undefined ? undefined : { "content-type": "application/json" },
      body: init.body === undefined ? undefined : JSON.stringify(init.body),
      signal: init.signal,
      credentials: "same-origin",
      cache: "no-store",
    });
  } catch (err) {
    if ((err as Error)?.name === "AbortError") throw err;
    throw new NetworkError();
  }
  const text = await res.text();
  let body: unknown = null;
  try {
    body = text ? JSON.parse(text) : null;
  } catch {
    body = { error: text.slice(0, 200) };
  }
  if (!res.ok) throw new ApiError(res.status, (body ?? {}) as ApiErrorBody);
  return body as T;
}

/** SWR fetcher. */
export const fetchJson = <T,>(url: string) => apiJson<T>(url);
