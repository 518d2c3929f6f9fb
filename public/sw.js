/*
 * Kalibore's service worker: lets a page that was opened on this device open again with no
 * network (a gauging sheet in the scavenge space, an engine page on a ship's weak link).
 *
 * - Pages: network first; the copy last fetched is kept and used only when the network fails.
 *   A page never opened on this device gets a short offline notice instead.
 * - Built assets (/_next/static, fonts, icons) are content-hashed: cache first.
 * - API calls, uploads and every non-GET request pass straight through: saving is the page's
 *   business (it keeps entries on the device and retries), never answered from a cache.
 * Signing out deletes the page copies, so a shared tablet does not keep one person's records.
 */
const VERSION = "v1";
const PAGES = `kalibore-pages-${VERSION}`;
const ASSETS = `kalibore-assets-${VERSION}`;
/** Most page copies kept; the oldest go first. */
const MAX_PAGES = 60;
/** Most assets kept: a few releases' worth; older releases' files go first. */
const MAX_ASSETS = 400;

self.addEventListener("install", () => {
  self.skipWaiting();
});

self.addEventListener("activate", (event) => {
  event.waitUntil(
    (async () => {
      for (const key of await caches.keys()) {
        if (key.startsWith("kalibore-") && key !== PAGES && key !== ASSETS) await caches.delete(key);
      }
      await self.clients.claim();
    })(),
  );
});

const isAsset = (url) =>
  url.pathname.startsWith("/_next/static/") || url.pathname.startsWith("/fonts/") || url.pathname === "/icon.svg";

/** Sign-in and account pages are never kept: they are useless offline and must stay current. */
const AUTH_PAGES = ["/sign-in", "/forgot-password", "/reset-password", "/invite"];

const isPassThrough = (url, request) =>
  request.method !== "GET" ||
  AUTH_PAGES.some((p) => url.pathname === p || url.pathname.startsWith(`${p}/`)) ||
  url.origin !== self.location.origin ||
  url.pathname.startsWith("/api/") ||
  url.pathname === "/sw.js" ||
  request.headers.get("RSC") === "1" ||
  url.searchParams.has("_rsc");

self.addEventListener("fetch", (event) => {
  const request = event.request;
  const url = new URL(request.url);
  if (isPassThrough(url, request)) return;
  if (isAsset(url)) {
    event.respondWith(cacheFirst(request));
  } else if (request.mode === "navigate") {
    event.respondWith(networkFirstPage(request));
  }
});

async function cacheFirst(request) {
  const cache = await caches.open(ASSETS);
  const hit = await cache.match(request);
  if (hit) return hit;
  const response = await fetch(request);
  if (response.ok && response.type === "basic") {
    await cache.put(request, response.clone());
    void trim(cache, MAX_ASSETS);
  }
  return response;
}

async function networkFirstPage(request) {
  const cache = await caches.open(PAGES);
  try {
    const response = await fetch(request);
    if (response.ok && response.type === "basic" && !response.redirected && isHtml(response)) {
      await cache.put(request.url, response.clone());
      void trim(cache, MAX_PAGES);
    }
    return response;
  } catch {
    const hit = await cache.match(request.url);
    if (hit) return hit;
    return offlineNotice();
  }
}

const isHtml = (response) => (response.headers.get("content-type") || "").includes("text/html");

/** Keeps the newest `max` entries (the Cache API lists them oldest first). */
async function trim(cache, max) {
  const keys = await cache.keys();
  for (let i = 0; i < keys.length - max; i++) await cache.delete(keys[i]);
}

function offlineNotice() {
  const html = `<!doctype html><html lang="en-GB"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>No network · Kalibore</title></head>
<body style="font-family:system-ui,sans-serif;background:#f6f5f1;color:#111720;max-width:32rem;margin:0 auto;padding:3rem 1rem;line-height:1.5">
<h1 style="font-size:1.5rem;margin:0 0 .75rem">No network</h1>
<p>This page has not been opened on this device before, so there is no copy of it here.</p>
<p>Pages you opened earlier on this device still open, and a gauging sheet you opened keeps what you type until the network is back.</p>
<p><a href="/" style="color:#0b5f73">Back to start</a></p>
</body></html>`;
  return new Response(html, { status: 503, headers: { "Content-Type": "text/html; charset=utf-8", "Cache-Control": "no-store" } });
}

// A page registers the worker after it has loaded, so its own assets went past the worker;
// it sends their addresses here to be kept, and, for the pages needed offline, its address,
// since moving there by an in-app link is no page load the worker would see.
self.addEventListener("message", (event) => {
  const data = event.data || {};
  if (data.type === "keep" && Array.isArray(data.assets)) {
    event.waitUntil(
      (async () => {
        const assets = await caches.open(ASSETS);
        for (const href of data.assets) {
          const url = new URL(href, self.location.origin);
          if (url.origin !== self.location.origin || !isAsset(url) || (await assets.match(url.href))) continue;
          try {
            const response = await fetch(url.href);
            if (response.ok) await assets.put(url.href, response);
          } catch {
            /* offline already: nothing to keep */
          }
        }
        // The page itself is fetched afresh, so the copy kept is the one just seen.
        if (typeof data.page === "string") {
          const url = new URL(data.page, self.location.origin);
          if (url.origin === self.location.origin) {
            try {
              const response = await fetch(url.href, { credentials: "same-origin" });
              if (response.ok && !response.redirected && isHtml(response)) {
                const pages = await caches.open(PAGES);
                await pages.put(url.href, response);
              }
            } catch {
              /* offline already: the copy kept before stands */
            }
          }
        }
      })(),
    );
  } else if (data.type === "claim") {
    // A page that started loading while this worker was still activating is not controlled
    // by it; it asks, and is taken over without a reload.
    event.waitUntil(self.clients.claim());
  } else if (data.type === "forget-pages") {
    event.waitUntil(caches.delete(PAGES));
  }
});
