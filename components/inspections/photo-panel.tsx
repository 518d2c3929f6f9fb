"use client";

import { useCallback, useEffect, useRef, useState } from "react";
import useSWR from "swr";
import { ApiError, apiJson, fetchJson, NetworkError } from "@/lib/inspections/api-client";
import type { ContextProfile } from "@/lib/inspections/context";
import { PHOTO_MAX_BYTES } from "@/lib/inspections/constants";
import type { InspectionDto, PhotoDto } from "@/lib/inspections/schemas";
import { dropWaitingPhoto, keepWaitingPhoto, listWaitingPhotos, type WaitingPhoto } from "@/lib/photos/offline-queue";
import { localPhotoRefusal, photoRefusalMessage, storeRefusalMessage, stripTechnical } from "@/lib/photos/upload-messages";
import { cn } from "@/lib/utils";

type Upload = {
  key: string;
  name: string;
  progress: number;
  state: "uploading" | "checking" | "done" | "failed" | "waiting";
  message?: string;
};

const mb = (bytes: number) => `${(bytes / (1024 * 1024)).toFixed(1)} MB`;

/** The upload could not reach the store or the server: keep the photo and try again later. */
class Unreachable extends Error {}
/** The server or the store refused the photo: say why in plain words, and do not keep it. */
class Refused extends Error {}

/** PUT straight to the object store with upload progress (fetch cannot report it). */
function putWithProgress(url: string, file: Blob, headers: Record<string, string>, onProgress: (f: number) => void): Promise<void> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open("PUT", url);
    for (const [k, v] of Object.entries(headers)) xhr.setRequestHeader(k, v);
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) onProgress(e.loaded / e.total);
    };
    xhr.onload = () => (xhr.status >= 200 && xhr.status < 300 ? resolve() : reject(xhr.status >= 500 ? new Unreachable() : new Refused()));
    xhr.onerror = () => reject(new Unreachable());
    xhr.send(file);
  });
}

/** One photo through the three steps (slot, PUT to the store, the server's check), with the same checks online or from the queue. */
async function sendPhoto(inspectionId: number, p: Omit<WaitingPhoto, "keptAt">, onProgress: (f: number) => void, onChecking: () => void) {
  try {
    const slot = await apiJson<{ fileId: number; uploadUrl: string; headers: Record<string, string> }>(`/api/inspections/${inspectionId}/photos`, {
      method: "POST",
      body: { fileName: p.name || "photo", contentType: p.type || "application/octet-stream", sizeBytes: p.size },
    });
    try {
      await putWithProgress(slot.uploadUrl, p.blob, slot.headers, onProgress);
    } catch (err) {
      if (err instanceof Refused) throw new Refused(storeRefusalMessage(p.name));
      throw err;
    }
    onChecking();
    return await apiJson<PhotoDto & { note?: string }>(`/api/inspections/${inspectionId}/photos/complete`, {
      method: "POST",
      body: { fileId: slot.fileId, caption: p.caption, stationKey: p.stationKey, ringPosition: p.ringPosition },
    });
  } catch (err) {
    if (err instanceof NetworkError || err instanceof Unreachable) throw new Unreachable();
    if (err instanceof ApiError) {
      if (err.status >= 500) throw new Unreachable();
      throw new Refused(photoRefusalMessage(p.name, { status: err.status, message: err.message, field: err.body.details?.field }));
    }
    throw err;
  }
}

export function photoUrl(inspectionId: number, photoId: number, variant: "thumb" | "full") {
  return `/api/inspections/${inspectionId}/photos/${photoId}?variant=${variant}`;
}

function attachLabel(p: PhotoDto, profile: ContextProfile) {
  if (p.stationKey) return `Station ${p.stationKey} · ${profile.stations.find((s) => s.key === p.stationKey)?.label ?? ""}`;
  if (p.ringPosition) return profile.rings.find((r) => r.position === p.ringPosition)?.label ?? `Ring ${p.ringPosition}`;
  return "Whole inspection";
}

/**
 * Photos of the overhaul: taken with the tablet's camera or chosen from files, uploaded
 * straight to the object store with a progress bar, then checked by the server (type by
 * content, size, checksum, thumbnail). Attached to the inspection, a station or a ring.
 */
export function PhotoPanel({ inspectionId, initial, profile, editable }: { inspectionId: number; initial: PhotoDto[]; profile: ContextProfile; editable: boolean }) {
  const { data, mutate } = useSWR<InspectionDto>(`/api/inspections/${inspectionId}`, fetchJson, {
    revalidateOnFocus: false,
    revalidateOnMount: false,
    fallbackData: { photos: initial } as InspectionDto,
  });
  const photos = data?.photos ?? initial;
  const [uploads, setUploads] = useState<Upload[]>([]);
  const [caption, setCaption] = useState("");
  const [attach, setAttach] = useState("");
  const input = useRef<HTMLInputElement>(null);

  const update = (key: string, patch: Partial<Upload>) => setUploads((u) => u.map((x) => (x.key === key ? { ...x, ...patch } : x)));
  const [waiting, setWaiting] = useState<(WaitingPhoto & { url: string })[]>([]);
  const syncing = useRef(false);

  const refreshWaiting = useCallback(async () => {
    const list = await listWaitingPhotos(inspectionId);
    setWaiting((old) => {
      for (const w of old) if (!list.some((l) => l.key === w.key)) URL.revokeObjectURL(w.url);
      return list.map((l) => old.find((w) => w.key === l.key) ?? { ...l, url: URL.createObjectURL(l.blob) });
    });
    return list;
  }, [inspectionId]);

  /** Keeps a photo on this device; says so, or why it could not. */
  async function keep(photo: WaitingPhoto, uploadKey: string) {
    try {
      await keepWaitingPhoto(photo);
      setUploads((u) => u.filter((x) => x.key !== uploadKey));
      await refreshWaiting();
    } catch {
      update(uploadKey, {
        state: "failed",
        message: `No network, and this device could not keep “${photo.name}” (its storage may be full). Take the photo again when you are back online.`,
      });
    }
  }

  /** Uploads the photos kept on this device, oldest first, once the network is back. */
  const sendWaiting = useCallback(async () => {
    if (syncing.current || !navigator.onLine) return;
    syncing.current = true;
    try {
      for (const w of await listWaitingPhotos(inspectionId)) {
        setUploads((u) => [...u.filter((x) => x.key !== w.key), { key: w.key, name: w.name, progress: 0, state: "uploading" }]);
        try {
          const photo = await sendPhoto(inspectionId, w, (f) => update(w.key, { progress: f }), () => update(w.key, { state: "checking", progress: 1 }));
          await dropWaitingPhoto(w.key);
          update(w.key, { state: "done", message: photo.note ?? `Taken without a network at ${new Date(w.keptAt).toLocaleTimeString([], { hour: "2-digit", minute: "2-digit" })}; now stored.` });
          await mutate();
        } catch (err) {
          if (err instanceof Unreachable) {
            setUploads((u) => u.filter((x) => x.key !== w.key));
            break;
          }
          // Refused by the same checks as any photo: it will never pass, so it is not kept.
          await dropWaitingPhoto(w.key);
          update(w.key, { state: "failed", message: err instanceof Error ? err.message : "The photo was not kept." });
        }
      }
    } finally {
      syncing.current = false;
      await refreshWaiting();
    }
  }, [inspectionId, mutate, refreshWaiting]);

  useEffect(() => {
    void refreshWaiting().then((list) => (list.length ? sendWaiting() : undefined));
    const online = () => void sendWaiting();
    window.addEventListener("online", online);
    const t = window.setInterval(() => void sendWaiting(), 20_000);
    return () => {
      window.removeEventListener("online", online);
      window.clearInterval(t);
    };
  }, [refreshWaiting, sendWaiting]);

  useEffect(() => () => waiting.forEach((w) => URL.revokeObjectURL(w.url)), []); // eslint-disable-line react-hooks/exhaustive-deps

  async function uploadOne(file: File) {
    const key = `${file.name}-${file.size}-${Date.now()}-${Math.random()}`;
    setUploads((u) => [...u, { key, name: file.name, progress: 0, state: "uploading" }]);
    const refusal = localPhotoRefusal(file);
    if (refusal) {
      update(key, { state: "failed", message: refusal });
      return;
    }
    const [kind, value] = attach.split(":");
    const photo: WaitingPhoto = {
      key,
      inspectionId,
      name: file.name || "photo",
      type: file.type,
      size: file.size,
      blob: file,
      caption: caption.trim() || null,
      stationKey: kind === "station" ? value : null,
      ringPosition: kind === "ring" ? Number(value) : null,
      keptAt: new Date().toISOString(),
    };
    setCaption("");
    if (!navigator.onLine) {
      await keep(photo, key);
      return;
    }
    try {
      const done = await sendPhoto(inspectionId, photo, (f) => update(key, { progress: f }), () => update(key, { state: "checking", progress: 1 }));
      update(key, { state: "done", message: done.note });
      await mutate();
    } catch (err) {
      if (err instanceof Unreachable) await keep(photo, key);
      else update(key, { state: "failed", message: err instanceof Error ? err.message : "The photo was not kept." });
    }
  }

  async function remove(p: PhotoDto) {
    if (!window.confirm(`Remove this photo${p.caption ? ` (“${p.caption}”)` : ""}?`)) return;
    try {
      await apiJson(`/api/inspections/${inspectionId}/photos/${p.id}`, { method: "DELETE" });
      await mutate();
    } catch (err) {
      window.alert(
        err instanceof NetworkError ? "No network: the photo can be removed when you are back online." : err instanceof Error ? stripTechnical(err.message) : "Could not remove the photo.",
      );
    }
  }

  return (
    <div className="space-y-4">
      {editable ? (
        <div className="grid gap-3 rounded-lg border border-ink-line bg-paper-raised p-3 sm:grid-cols-[1fr_1fr_auto] sm:items-end">
          <div>
            <label htmlFor="photo-caption" className="block text-sm font-medium text-ink-soft">
              Caption
            </label>
            <input
              id="photo-caption"
              className="mt-1 block min-h-12 w-full rounded-md border border-ink-line bg-paper-raised px-3"
              value={caption}
              placeholder="e.g. scuffing below ring 1 TDC, exhaust side"
              onChange={(e) => setCaption(e.target.value)}
            />
          </div>
          <div>
            <label htmlFor="photo-attach" className="block text-sm font-medium text-ink-soft">
              Shows
            </label>
            <select id="photo-attach" className="mt-1 block min-h-12 w-full rounded-md border border-ink-line bg-paper-raised px-3" value={attach} onChange={(e) => setAttach(e.target.value)}>
              <option value="">The whole inspection</option>
              <optgroup label="Liner station">
                {profile.stations.map((s) => (
                  <option key={s.key} value={`station:${s.key}`}>
                    {s.key} · {s.label}
                  </option>
                ))}
              </optgroup>
              <optgroup label="Ring">
                {profile.rings.map((r) => (
                  <option key={r.position} value={`ring:${r.position}`}>
                    {r.label}
                  </option>
                ))}
              </optgroup>
            </select>
          </div>
          <div>
            <input
              ref={input}
              id="photo-file"
              type="file"
              accept="image/*"
              capture="environment"
              className="sr-only"
              onChange={(e) => {
                const files = [...(e.target.files ?? [])];
                e.target.value = "";
                files.forEach((f) => void uploadOne(f));
              }}
            />
            <label htmlFor="photo-file" className="inline-flex min-h-12 cursor-pointer items-center justify-center rounded-md border border-signal bg-signal px-5 font-medium text-white hover:bg-signal-strong">
              Take or choose a photo
            </label>
          </div>
          <p className="text-xs text-ink-faint sm:col-span-3">JPEG, PNG, WebP or HEIC, up to {mb(PHOTO_MAX_BYTES)}.</p>
        </div>
      ) : null}

      {uploads.length ? (
        <ul className="space-y-2" aria-label="Uploads">
          {uploads.map((u) => (
            <li key={u.key} className="rounded-md border border-ink-line bg-paper-raised p-2 text-sm">
              <div className="flex justify-between gap-2">
                <span className="truncate">{u.name}</span>
                <span className={cn("shrink-0 font-medium", u.state === "failed" ? "text-caution" : u.state === "done" ? "text-steady" : "text-ink-soft")}>
                  {u.state === "uploading" ? `${Math.round(u.progress * 100)} %` : u.state === "checking" ? "checking…" : u.state === "done" ? "✓ stored" : "⚠ not stored"}
                </span>
              </div>
              <progress className="mt-1 h-2 w-full" max={1} value={u.progress} aria-label={`Upload of ${u.name}`} />
              {u.message ? <p className={cn("mt-1", u.state === "failed" ? "font-medium text-caution" : "text-ink-soft")}>{u.message}</p> : null}
            </li>
          ))}
        </ul>
      ) : null}

      {waiting.length ? (
        <section aria-labelledby="photos-waiting" className="rounded-lg border-2 border-dashed border-ink-line p-3" data-testid="photos-waiting">
          <h3 id="photos-waiting" className="font-semibold">
            {waiting.length} photo{waiting.length === 1 ? "" : "s"} waiting for the network
          </h3>
          <p className="text-sm text-ink-soft">Kept on this device and uploaded, with the usual checks, as soon as the network is back. Signing out deletes them from this device.</p>
          <ul className="mt-2 grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-4">
            {waiting.map((w) => (
              <li key={w.key} className="overflow-hidden rounded-lg border border-ink-line bg-paper-raised">
                {/* eslint-disable-next-line @next/next/no-img-element */}
                <img src={w.url} alt={w.caption ?? `Photo waiting to upload: ${w.name}`} className="aspect-[4/3] w-full object-cover" />
                <div className="p-2 text-sm">
                  <p className="font-medium">{w.caption ?? <span className="text-ink-soft">No caption</span>}</p>
                  <p className="text-ink-soft">
                    ⏳ waiting · kept {new Date(w.keptAt).toLocaleTimeString([], { hour: "2-digit", minute: "2-digit" })}
                  </p>
                  <button
                    type="button"
                    className="mt-1 min-h-11 min-w-11 text-sm font-medium text-limit underline"
                    onClick={async () => {
                      if (!window.confirm(`Delete “${w.name}” from this device? It has not been uploaded.`)) return;
                      await dropWaitingPhoto(w.key);
                      await refreshWaiting();
                    }}
                  >
                    Delete
                  </button>
                </div>
              </li>
            ))}
          </ul>
        </section>
      ) : null}

      {photos.length ? (
        <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-4">
          {photos.map((p) => (
            <li key={p.id} className="overflow-hidden rounded-lg border border-ink-line bg-paper-raised">
              <a href={photoUrl(inspectionId, p.id, "full")} target="_blank" rel="noreferrer" className="block aspect-[4/3] bg-paper-sunk">
                {p.hasThumbnail ? (
                  // eslint-disable-next-line @next/next/no-img-element
                  <img src={photoUrl(inspectionId, p.id, "thumb")} alt={p.caption ?? "Inspection photo"} className="h-full w-full object-cover" loading="lazy" />
                ) : (
                  <span className="flex h-full items-center justify-center p-2 text-center text-sm text-ink-soft">No preview for this format — open the original</span>
                )}
              </a>
              <div className="p-2 text-sm">
                <p className="font-medium">{p.caption ?? <span className="text-ink-faint">No caption</span>}</p>
                <p className="text-xs text-ink-faint">{attachLabel(p, profile)}</p>
                {editable ? (
                  <button type="button" className="mt-1 min-h-11 min-w-11 text-sm font-medium text-limit underline" onClick={() => remove(p)}>
                    Remove
                  </button>
                ) : null}
              </div>
            </li>
          ))}
        </ul>
      ) : (
        <p className="text-sm text-ink-faint">No photos yet.</p>
      )}
    </div>
  );
}
