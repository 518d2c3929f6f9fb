import { describe, expect, it } from "vitest";
import { localPhotoRefusal, photoRefusalMessage, stripTechnical } from "@/lib/photos/upload-messages";

// What an engineer reads when a photo is refused: the file's name and what to do, never the
// API's field names, content types or status codes.
const technical = /field:|contentType|sizeBytes|text\/plain|application\/|\b4\d\d\b|\b5\d\d\b/;

describe("photo refusals in plain words", () => {
  it("names the file and the fix for each refusal the server gives", () => {
    const cases = [
      { status: 400, field: "contentType", message: "A text/plain is not a photo: use JPEG, PNG, WebP or HEIC. (field: contentType)" },
      { status: 400, field: "sizeBytes", message: "The photo is 16.0 MB; the limit is 15.0 MB. (field: sizeBytes)" },
      { status: 400, field: "file", message: "This file is not a JPEG, PNG, WebP or HEIC image (judged by its content, not its name). It was not kept. (field: file)" },
      { status: 400, field: "file", message: "The uploaded file is empty. It was not kept. (field: file)" },
      { status: 409, message: "This inspection is submitted; photos can be added or removed only while it is a draft (amend it to change an approved record)." },
      { status: 500, message: "Internal error" },
    ];
    for (const c of cases) {
      const text = photoRefusalMessage("notes.txt", c);
      expect(text, c.message).toContain("“notes.txt”");
      expect(text, c.message).not.toMatch(technical);
    }
    expect(photoRefusalMessage("notes.txt", cases[0])).toMatch(/is not a photo/);
  });

  it("refuses on the device what can never pass, before anything is sent or kept", () => {
    expect(localPhotoRefusal({ name: "notes.txt", type: "text/plain", size: 120 })).toMatch(/“notes.txt” is not a photo/);
    expect(localPhotoRefusal({ name: "big.jpg", type: "image/jpeg", size: 16 * 1024 * 1024 })).toMatch(/16.0 MB/);
    expect(localPhotoRefusal({ name: "empty.jpg", type: "image/jpeg", size: 0 })).toMatch(/empty/);
    // A HEIC photo often comes with no type at all: the server judges it by its content.
    expect(localPhotoRefusal({ name: "IMG_0001.HEIC", type: "", size: 2_000_000 })).toBeNull();
    expect(localPhotoRefusal({ name: "liner.jpg", type: "image/jpeg", size: 2_000_000 })).toBeNull();
  });

  it("drops field tags and content types from a server sentence", () => {
    expect(stripTechnical("A text/plain is not a photo. (field: contentType)")).toBe("A file is not a photo.");
  });
});
