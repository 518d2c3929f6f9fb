import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";

// IBM Plex is licensed under the SIL Open Font License 1.1, whose condition 2 asks that the
// copyright notice and the licence travel with every copy of the fonts [src] OFL 1.1 text.
const FONTS = path.join(process.cwd(), "public", "fonts");

describe("the shipped fonts carry their licence", () => {
  it("has OFL.txt beside the font files, with the notice of every family shipped", () => {
    const text = readFileSync(path.join(FONTS, "OFL.txt"), "utf8");
    expect(text).toContain("SIL OPEN FONT LICENSE Version 1.1 - 26 February 2007");
    const families = new Set(readdirSync(FONTS).filter((f) => f.endsWith(".woff2")).map((f) => f.split("-latin")[0]));
    expect([...families].sort()).toEqual(["ibm-plex-mono", "ibm-plex-sans"]);
    expect(text).toMatch(/IBMPlexSans.*Copyright 2019 IBM Corp\./);
    expect(text).toMatch(/IBMPlexMono.*Copyright 2017 IBM Corp\./);
  });
});
