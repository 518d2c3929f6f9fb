import { clear, createStore, del, entries, set, type UseStore } from "idb-keyval";

/*
 * Photos taken where there is no network, kept on this device (IndexedDB, through
 * idb-keyval) until they can be uploaded. Browser only: every function is a no-op answer
 * where IndexedDB is missing (server rendering, private modes that refuse it). Signing out
 * clears the store, so a shared tablet keeps no one's photos.
 */

export type WaitingPhoto = {
  key: string;
  inspectionId: number;
  name: string;
  type: string;
  size: number;
  blob: Blob;
  caption: string | null;
  stationKey: string | null;
  ringPosition: number | null;
  /** When the photo was taken into the queue (ISO). */
  keptAt: string;
};

let store: UseStore | null = null;
function photos(): UseStore | null {
  if (typeof indexedDB === "undefined") return null;
  store ??= createStore("kalibore-photos", "waiting");
  return store;
}

/** Keeps a photo on this device until it is uploaded. Throws when the device cannot keep it (storage full, no IndexedDB). */
export async function keepWaitingPhoto(photo: WaitingPhoto): Promise<void> {
  const s = photos();
  if (!s) throw new Error("This browser cannot keep photos on the device.");
  await set(photo.key, photo, s);
}

/** The photos waiting on this device, for one inspection or all, oldest first. */
export async function listWaitingPhotos(inspectionId?: number): Promise<WaitingPhoto[]> {
  const s = photos();
  if (!s) return [];
  try {
    const all = (await entries<string, WaitingPhoto>(s)).map(([, v]) => v);
    return all.filter((p) => inspectionId === undefined || p.inspectionId === inspectionId).sort((a, b) => a.keptAt.localeCompare(b.keptAt));
  } catch {
    return [];
  }
}

/** Removes one waiting photo (uploaded, or refused by the server). */
export async function dropWaitingPhoto(key: string): Promise<void> {
  const s = photos();
  if (s) await del(key, s);
}

/** Removes the waiting photos of one inspection (a discarded draft). */
export async function forgetWaitingPhotos(inspectionId: number): Promise<void> {
  try {
    for (const p of await listWaitingPhotos(inspectionId)) await dropWaitingPhoto(p.key);
  } catch {
    /* nothing kept */
  }
}

/** Removes every waiting photo on this device (on sign-out). */
export async function forgetAllWaitingPhotos(): Promise<void> {
  const s = photos();
  try {
    if (s) await clear(s);
  } catch {
    /* nothing kept */
  }
}
