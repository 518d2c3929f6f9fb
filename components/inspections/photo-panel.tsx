"use client";

import { useRef, useState } from "react";
import useSWR from "swr";
import { ApiError, apiJson, fetchJson, NetworkError } from "@/lib/inspections/api-client";
import type { ContextProfile } from "@/lib/inspections/context";
import { PHOTO_MAX_BYTES, type InspectionDto, type PhotoDto } from "@/lib/inspections/schemas";
import { cn } from "@/lib/utils";

type Upload = { key: string; name: string; progress: number; state: "uploading" | "checking" | "done" | "failed"; message?: string };

const mb = (bytes: number) => `${(bytes / (1024 * 1024)).toFixed(1)} MB`;

/** PUT straight to the object store with upload progress (fetch cannot report it). */
function putWithProgress(url: string, file: File, headers: Record<string, string>, onProgress: (f: number) => void): Promise<void> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open("PUT", url);
    for (const [k, v] of Object.entries(headers)) xhr.setRequestHeader(k, v);
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) onProgress(e.loaded / e.total);
    };
    xhr.onload = () => (xhr.status >= 200 && xhr.status < 300 ? resolve() : reject(new Error(`The object store answered ${xhr.status}.`)));
    xhr.onerror = () => reject(new NetworkError());
    xhr.send(file);
  });
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

  async function uploadOne(file: File) {
    const key = `${file.name}-${file.size}-${Date.now()}-${Math.random()}`;
    setUploads((u) => [...u, { key, name: file.name, progress: 0, state: "uploading" }]);
    if (file.size > PHOTO_MAX_BYTES) {
      update(key, { state: "failed", message: `${file.name} is ${mb(file.size)}; the limit is ${mb(PHOTO_MAX_BYTES)}. Take it again at a lower resolution.` });
      return;
    }
    try {
      const slot = await apiJson<{ fileId: number; uploadUrl: string; headers: Record<string, string> }>(`/api/inspections/${inspectionId}/photos`, {
        method: "POST",
        body: { fileName: file.name || "photo", contentType: file.type || "application/octet-stream", sizeBytes: file.size },
      });
      await putWithProgress(slot.uploadUrl, file, slot.headers, (f) => update(key, { progress: f }));
      update(key, { state: "checking", progress: 1 });
      const [kind, value] = attach.split(":");
      const photo = await apiJson<PhotoDto & { note?: string }>(`/api/inspections/${inspectionId}/photos/complete`, {
        method: "POST",
        body: {
          fileId: slot.fileId,
          caption: caption.trim() || null,
          stationKey: kind === "station" ? value : null,
          ringPosition: kind === "ring" ? Number(value) : null,
        },
      });
      update(key, { state: "done", message: photo.note });
      setCaption("");
      await mutate();
    } catch (err) {
      const message =
        err instanceof NetworkError
          ? "No network: photos need a connection to upload. The readings are kept on this device; add the photo when you are back online."
          : err instanceof ApiError || err instanceof Error
            ? err.message
            : "The upload failed.";
      update(key, { state: "failed", message });
    }
  }

  async function remove(p: PhotoDto) {
    if (!window.confirm(`Remove this photo${p.caption ? ` (“${p.caption}”)` : ""}?`)) return;
    try {
      await apiJson(`/api/inspections/${inspectionId}/photos/${p.id}`, { method: "DELETE" });
      await mutate();
    } catch (err) {
      window.alert(err instanceof Error ? err.message : "Could not remove the photo.");
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
                  <button type="button" className="mt-1 min-h-10 text-sm font-medium text-limit underline" onClick={() => remove(p)}>
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
