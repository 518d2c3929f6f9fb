"use client";

import { usePathname } from "next/navigation";
import { useEffect, useRef, useState } from "react";

/**
 * Pages kept on this device whenever they are visited, even by an in-app link (which the worker
 * does not see as a page load): the start page and the gauging sheets, the pages an engineer
 * needs where there is no network. Other pages are kept when loaded in full.
 */
const KEEP_ON_VISIT = [/^\/$/, /^\/inspections\/\d+\/edit$/];

/**
 * Hands the worker this page's assets (they may have loaded before it could see them; it keeps
 * each once) and, for a page needed offline, its address, unless it is `loadedByWorker`: a document
 * that came through the worker, which its fetch handler has kept already.
 */
function keepThisPage(registration: ServiceWorkerRegistration, pathname: string, loadedByWorker: string | null) {
  const assets = performance
    .getEntriesByType("resource")
    .map((e) => e.name)
    .filter((name) => name.startsWith(location.origin));
  const page = pathname !== loadedByWorker && KEEP_ON_VISIT.some((re) => re.test(pathname)) ? pathname : null;
  registration.active?.postMessage({ type: "keep", assets, page });
}

/**
 * Registers the service worker (public/sw.js) that lets pages opened on this device open again
 * without a network, and says so plainly when the network is gone. Production builds only: in
 * development a cached page would hide the code being changed.
 */
export function OfflineSupport() {
  const [online, setOnline] = useState(true);

  useEffect(() => {
    const update = () => setOnline(navigator.onLine);
    update();
    window.addEventListener("online", update);
    window.addEventListener("offline", update);
    return () => {
      window.removeEventListener("online", update);
      window.removeEventListener("offline", update);
    };
  }, []);

  const pathname = usePathname();
  const [registration, setRegistration] = useState<ServiceWorkerRegistration | null>(null);
  // The path of this document when it came through the worker (its fetch handler kept it);
  // used once, for the first visit only.
  const loadedByWorker = useRef<string | null>(null);

  useEffect(() => {
    if (process.env.NODE_ENV !== "production" || !("serviceWorker" in navigator)) return;
    let cancelled = false;
    if (navigator.serviceWorker.controller) loadedByWorker.current = location.pathname;
    (async () => {
      try {
        await navigator.serviceWorker.register("/sw.js", { scope: "/" });
        const ready = await navigator.serviceWorker.ready;
        // Loaded while the worker was still activating: ask it to take this page over too.
        if (!navigator.serviceWorker.controller) ready.active?.postMessage({ type: "claim" });
        if (!cancelled) setRegistration(ready);
      } catch {
        // No service worker (private mode, old browser): the product works online as before.
      }
    })();
    return () => {
      cancelled = true;
    };
  }, []);

  useEffect(() => {
    if (!registration) return;
    keepThisPage(registration, pathname, loadedByWorker.current);
    loadedByWorker.current = null;
  }, [registration, pathname]);

  if (online) return null;
  return (
    <div role="status" className="no-print border-b border-ink-line bg-paper-sunk px-4 py-2 text-center text-sm text-ink">
      <strong className="font-semibold">No network.</strong> Pages opened before on this device still open; what you type on a
      gauging sheet is kept here and saved when the network is back.
    </div>
  );
}

/** Deletes this device's page copies (on sign-out, so a shared tablet keeps no one's records). */
export async function forgetOfflinePages(): Promise<void> {
  try {
    if ("caches" in window) {
      for (const key of await caches.keys()) if (key.startsWith("kalibore-pages-")) await caches.delete(key);
    }
  } catch {
    /* nothing kept */
  }
}
