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
/** A page older than this when shown was not just loaded from the server: a kept copy, or one restored from history. */
const STALE_AFTER_MS = 5 * 60_000;

/** "13:20 on 2 Dec (45 min ago)": when the records on screen were taken, in the device's time. */
export function describeCopyTime(at: Date, now: Date): string {
  const clock = at.toLocaleTimeString("en-GB", { hour: "2-digit", minute: "2-digit" });
  const date = at.toLocaleDateString("en-GB", { day: "numeric", month: "short", year: at.getFullYear() === now.getFullYear() ? undefined : "numeric" });
  const mins = Math.max(0, Math.round((now.getTime() - at.getTime()) / 60_000));
  const ago = mins < 1 ? "just now" : mins < 60 ? `${mins} min ago` : mins < 48 * 60 ? `${Math.round(mins / 60)} h ago` : `${Math.round(mins / 1440)} days ago`;
  return `${clock} on ${date} (${ago})`;
}

export function OfflineSupport({ renderedAt }: { renderedAt?: string }) {
  const [online, setOnline] = useState(true);
  // When what is on screen came from the server: the render time for the document first
  // shown (a kept copy carries the time it was kept), then the time of each in-app move,
  // which fetched its page afresh.
  const [shownAt, setShownAt] = useState<Date | null>(renderedAt ? new Date(renderedAt) : null);
  const [now, setNow] = useState<Date | null>(null);
  const firstPath = useRef(true);

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
    if (firstPath.current) {
      firstPath.current = false;
      return;
    }
    if (navigator.onLine) setShownAt(new Date());
  }, [pathname]);

  useEffect(() => {
    const tick = () => setNow(new Date());
    tick();
    const t = window.setInterval(tick, 60_000);
    return () => window.clearInterval(t);
  }, []);

  useEffect(() => {
    if (!registration) return;
    keepThisPage(registration, pathname, loadedByWorker.current);
    loadedByWorker.current = null;
  }, [registration, pathname]);

  const taken = shownAt && now ? describeCopyTime(shownAt, now) : null;
  const stale = !!(shownAt && now && now.getTime() - shownAt.getTime() > STALE_AFTER_MS);
  if (online && !stale) return null;
  if (online) {
    return (
      <div role="status" data-testid="page-time" className="no-print flex flex-wrap items-center justify-center gap-x-3 border-b border-ink-line bg-paper-sunk px-4 py-1 text-center text-sm text-ink">
        <span>
          This page shows the records as they stood at <strong className="num font-semibold">{taken}</strong>.
        </span>
        <button type="button" className="min-h-11 min-w-11 rounded-md px-3 font-medium text-signal underline" onClick={() => location.reload()}>
          Reload
        </button>
      </div>
    );
  }
  return (
    <div role="status" data-testid="page-time" className="no-print border-b border-ink-line bg-paper-sunk px-4 py-2 text-center text-sm text-ink">
      <strong className="font-semibold">No network.</strong>{" "}
      {taken ? (
        <>
          This page is the copy kept on this device at <strong className="num font-semibold">{taken}</strong>; drafts and records may have changed since.{" "}
        </>
      ) : (
        "Pages opened before on this device still open. "
      )}
      What you type on a gauging sheet is kept here and saved when the network is back.
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
