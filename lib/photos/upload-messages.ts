import { PHOTO_MAX_BYTES } from "@/lib/inspections/constants";

/*
 * What the engineer reads when a photo is not kept: plain words naming the file and what to
 * do, never the API's field names or content types. Browser-safe (no server imports).
 */

const mb = (bytes: number) => `${(bytes / (1024 * 1024)).toFixed(1)} MB`;

/** Types the server checks by content after upload; a file that says it is something else is refused before. */
const PHOTO_LIKE = /^image\//i;

/** A check made on the device before anything is sent (or kept to send later). Null when the file may go. */
export function localPhotoRefusal(file: { name: string; type: string; size: number }): string | null {
  const name = file.name || "The photo";
  if (file.size === 0) return `${quote(name)} is empty. Take the photo again.`;
  if (file.size > PHOTO_MAX_BYTES) return `${quote(name)} is ${mb(file.size)}; a photo can be up to ${mb(PHOTO_MAX_BYTES)}. Take it again at a lower resolution.`;
  // Some browsers give HEIC photos no type at all; the server judges those by their content.
  if (file.type && !PHOTO_LIKE.test(file.type)) return notAPhoto(name);
  return null;
}

const quote = (name: string) => `“${name}”`;
const notAPhoto = (name: string) => `${quote(name)} is not a photo. Choose a picture taken as JPEG, PNG, WebP or HEIC.`;

/** A server refusal in the shape the API client gives it (status, message, the field it names). */
export type Refusal = { status: number; message: string; field?: string };

/** Turns a server refusal of a photo into a sentence for the engineer. */
export function photoRefusalMessage(fileName: string, r: Refusal): string {
  const name = fileName || "The photo";
  switch (r.field) {
    case "contentType":
      return notAPhoto(name);
    case "sizeBytes":
      return `${quote(name)} is larger than a photo may be (${mb(PHOTO_MAX_BYTES)}). Take it again at a lower resolution.`;
    case "file":
      if (/empty/i.test(r.message)) return `${quote(name)} arrived empty and was not kept. Take the photo again.`;
      if (/limit|MB/i.test(r.message)) return `${quote(name)} is larger than a photo may be (${mb(PHOTO_MAX_BYTES)}) and was not kept. Take it again at a lower resolution.`;
      return `${quote(name)} is not a photo (judged by what is inside the file, not its name) and was not kept. Choose a JPEG, PNG, WebP or HEIC picture.`;
    case "fileId":
      return `${quote(name)} did not arrive completely. Try again.`;
    case "stationKey":
    case "ringPosition":
      return `The station or ring chosen for ${quote(name)} is not on this engine's sheet. Choose again and retake the photo.`;
    default:
      break;
  }
  if (r.status === 403) return `${quote(name)} was not kept: ${stripTechnical(r.message)}`;
  if (r.status === 409) return `${quote(name)} was not kept: ${stripTechnical(r.message)}`;
  if (r.status >= 500) return `${quote(name)} could not be stored just now. Try again in a minute; the readings are not affected.`;
  return `${quote(name)} was not kept: ${stripTechnical(r.message)}`;
}

/** The object store answered the upload itself with an error (an expired or refused address). */
export function storeRefusalMessage(fileName: string): string {
  return `${quote(fileName || "The photo")} could not be stored. Try again; if it happens again, tell whoever looks after Kalibore on board.`;
}

/** Drops "(field: …)" tags and anything that reads like code from a server sentence. */
export function stripTechnical(message: string): string {
  return message
    .replace(/\s*\(field: [^)]*\)/g, "")
    .replace(/\b[a-z]+\/[a-z0-9.+-]+\b/gi, "file")
    .trim();
}
