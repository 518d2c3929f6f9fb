/**
 * What an uploaded file really is, from its first bytes rather than its name or the
 * browser's claim: JPEG (FF D8 FF), PNG (the 8-byte signature), WebP (RIFF…WEBP) and
 * HEIC/HEIF (an ISO-BMFF "ftyp" box whose brands name HEIF). Anything else is refused.
 */
export type PhotoType = "image/jpeg" | "image/png" | "image/webp" | "image/heic" | "image/heif";

const HEIC_BRANDS = new Set(["heic", "heix", "hevc", "hevx", "heim", "heis", "hevm", "hevs"]);
const HEIF_BRANDS = new Set(["mif1", "msf1", "mif2"]);

const ascii = (b: Uint8Array, from: number, to: number) => String.fromCharCode(...b.subarray(from, to));

export function sniffImageType(bytes: Uint8Array): PhotoType | null {
  if (bytes.length >= 3 && bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff) return "image/jpeg";
  const png = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];
  if (bytes.length >= 8 && png.every((v, i) => bytes[i] === v)) return "image/png";
  if (bytes.length >= 12 && ascii(bytes, 0, 4) === "RIFF" && ascii(bytes, 8, 12) === "WEBP") return "image/webp";
  if (bytes.length >= 16 && ascii(bytes, 4, 8) === "ftyp") {
    const boxSize = (bytes[0] << 24) | (bytes[1] << 16) | (bytes[2] << 8) | bytes[3];
    const end = Math.min(bytes.length, Math.max(16, boxSize >>> 0));
    const brands = [ascii(bytes, 8, 12)];
    for (let i = 16; i + 4 <= end; i += 4) brands.push(ascii(bytes, i, i + 4));
    if (brands.some((b) => HEIC_BRANDS.has(b))) return "image/heic";
    if (brands.some((b) => HEIF_BRANDS.has(b))) return "image/heif";
  }
  return null;
}
