/*
 * Kalibore's own reading file layout, and the fields any file's columns can be mapped to.
 * One row per reading: a liner diameter (cylinder, date, station or depth, direction,
 * diameter) or a ring's values (cylinder, date, ring, closed gap, groove clearance). Rows of
 * the same cylinder and date form one gauging. Pure: the import screen and the server share it.
 */

export const IMPORT_FIELDS = [
  "cylinder",
  "date",
  "engineHours",
  "linerHours",
  "station",
  "depth",
  "direction",
  "diameter",
  "lengthUnit",
  "linerTempC",
  "gaugeTempC",
  "gaugeSerial",
  "ring",
  "closedGap",
  "grooveClearance",
  "note",
] as const;
export type ImportField = (typeof IMPORT_FIELDS)[number];

/** Column index per field (0-based); a field not in the file is absent. */
export type ColumnMapping = Partial<Record<ImportField, number>>;

export const FIELD_LABELS: Record<ImportField, string> = {
  cylinder: "Cylinder (unit number)",
  date: "Date of the gauging",
  engineHours: "Engine running hours",
  linerHours: "Liner hours",
  station: "Station (key or label)",
  depth: "Depth from the liner top",
  direction: "Direction",
  diameter: "Diameter",
  lengthUnit: "Length unit of the row (mm or in)",
  linerTempC: "Liner temperature (°C)",
  gaugeTempC: "Gauge temperature (°C)",
  gaugeSerial: "Gauge serial number",
  ring: "Ring position (1 = top)",
  closedGap: "Ring closed gap",
  grooveClearance: "Ring groove clearance",
  note: "Note",
};

/** Our layout's column names, in order (the template's header row). */
export const LAYOUT_COLUMNS: { name: string; field: ImportField; what: string }[] = [
  { name: "cylinder", field: "cylinder", what: "Cylinder number on the engine, 1 = the first unit." },
  { name: "date", field: "date", what: "Day of the gauging, yyyy-mm-dd (a time after it, yyyy-mm-ddThh:mm, is allowed and ignored)." },
  { name: "engine_hours", field: "engineHours", what: "Engine running-hours counter at the gauging." },
  { name: "liner_hours", field: "linerHours", what: "Hours on this liner; leave empty to derive them from the liner's fitting." },
  { name: "station", field: "station", what: "Station key or label of the engine profile (T, R1, …). Leave empty when depth is given." },
  { name: "depth_mm", field: "depth", what: "Depth of the reading below the liner top face. Matched to a station within the stated tolerance." },
  { name: "direction", field: "direction", what: "fa (fore–aft) or ath (athwartships), or the profile's own direction names." },
  { name: "diameter_mm", field: "diameter", what: "Inside diameter as read, before temperature correction." },
  { name: "liner_temp_c", field: "linerTempC", what: "Liner temperature at the gauging, °C." },
  { name: "gauge_temp_c", field: "gaugeTempC", what: "Micrometer temperature at the gauging, °C." },
  { name: "gauge_serial", field: "gaugeSerial", what: "Serial number of the gauge used." },
  { name: "ring", field: "ring", what: "Ring position for a ring row, 1 = top ring. Leave empty on a diameter row." },
  { name: "closed_gap_mm", field: "closedGap", what: "Closed gap of that ring, measured in a gauge ring." },
  { name: "groove_clearance_mm", field: "grooveClearance", what: "Axial clearance of that ring in its groove." },
  { name: "note", field: "note", what: "Free text, kept with the gauging (never read as a formula)." },
];

/**
 * Header names recognised when a file is opened, normalised (lower case, letters and digits
 * only). Our own layout's names first; then plain words a spreadsheet kept by hand tends to
 * use. A header ending in "in" or "inch" marks that column in inches.
 */
const ALIASES: Record<ImportField, string[]> = {
  cylinder: ["cylinder", "cyl", "cylno", "cylinderno", "cylindernumber", "unit", "unitno"],
  date: ["date", "day", "gaugedon", "inspectedon", "datetime", "timestamp", "time"],
  engineHours: ["enginehours", "runninghours", "rh", "enginerh", "counter", "totalhours"],
  linerHours: ["linerhours", "linerrh", "hoursonliner"],
  station: ["station", "stationkey", "point", "position", "level"],
  depth: ["depthmm", "depth", "depthin", "depthinch", "distancefromtop", "fromtopmm"],
  direction: ["direction", "dir", "axis", "orientation"],
  diameter: ["diametermm", "diameter", "dia", "diamm", "reading", "readingmm", "diameterin", "diameterinch", "value"],
  lengthUnit: ["unit", "units", "lengthunit", "uom"],
  linerTempC: ["linertempc", "linertemp", "linertemperature", "tliner"],
  gaugeTempC: ["gaugetempc", "gaugetemp", "gaugetemperature", "micrometertemp", "tgauge"],
  gaugeSerial: ["gaugeserial", "gauge", "serial", "instrument", "gaugeno"],
  ring: ["ring", "ringno", "ringposition"],
  closedGap: ["closedgapmm", "closedgap", "gap", "ringgap"],
  grooveClearance: ["grooveclearancemm", "grooveclearance", "groove", "axialclearance"],
  note: ["note", "notes", "remark", "remarks", "comment"],
};

export const normaliseHeader = (s: string) => s.toLowerCase().replace(/[^a-z0-9]/g, "");

/** A mapping guessed from a header row: each field takes the first column whose name it knows. */
export function guessMapping(header: readonly string[]): ColumnMapping {
  const names = header.map(normaliseHeader);
  // "closed_gap_in" is the closed gap (in inches): the unit suffix is read apart (headerUnit).
  const bare = names.map((n) => n.replace(/(mm|inch|inches|in)$/, ""));
  const used = new Set<number>();
  const out: ColumnMapping = {};
  // "unit" names a cylinder more often than a length unit; decide cylinder first.
  for (const field of IMPORT_FIELDS) {
    let i = names.findIndex((n, idx) => !used.has(idx) && ALIASES[field].includes(n));
    if (i < 0) i = bare.findIndex((n, idx) => !used.has(idx) && headerUnit(header[idx]) !== null && ALIASES[field].includes(n));
    if (i >= 0) {
      out[field] = i;
      used.add(i);
    }
  }
  return out;
}

/** The length unit a header names for its column ("diameter_in", "Depth (inch)"), if any. */
export function headerUnit(name: string): "mm" | "in" | null {
  // The unit is read from the words around it: "Diameter (in)", "depth_inch", "gap_mm".
  const words = name.toLowerCase().split(/[^a-z]+/).filter(Boolean);
  const last = words.at(-1);
  if (words.length > 1 && (last === "in" || last === "inch" || last === "inches")) return "in";
  if (words.length > 1 && last === "mm") return "mm";
  return null;
}

/**
 * The shape of a file, for offering a saved mapping again: with a header, its normalised
 * names; without, only the column count. Two files of the same shape map the same way.
 */
export function shapeKey(header: readonly string[] | null, columnCount: number): string {
  return header ? `h:${header.map(normaliseHeader).join("|")}`.slice(0, 64) : `n:${columnCount}`;
}

/** What a mapping must hold for the destination: a gauge file names no cylinder when the unit is chosen. */
export function missingFields(mapping: ColumnMapping, destination: "draft" | "history"): ImportField[] {
  const need: ImportField[] = destination === "history" ? ["cylinder", "date", "engineHours", "direction", "diameter"] : ["direction", "diameter"];
  const out = need.filter((f) => mapping[f] === undefined);
  if (mapping.station === undefined && mapping.depth === undefined) out.push("station");
  return out;
}

/** The downloadable template: our layout's header, comments explaining it, and three example rows. */
export function templateCsv(): string {
  const lines = [
    "# Kalibore reading file. One row per reading; rows of the same cylinder and date form one gauging.",
    "# Lines starting with # are comments. Decimal point, comma between columns, lengths in mm.",
    ...LAYOUT_COLUMNS.map((c) => `# ${c.name}: ${c.what}`),
    LAYOUT_COLUMNS.map((c) => c.name).join(","),
    "1,2024-03-14,61250,21250,T,,fa,640.02,32,24,MG-0417,,,,",
    "1,2024-03-14,61250,21250,,150,ath,640.55,32,24,MG-0417,,,,",
    "1,2024-03-14,61250,21250,,,,,,,,1,3.10,0.52,Top ring free in groove",
  ];
  return `${lines.join("\r\n")}\r\n`;
}

/** Largest file the importer takes, checked in the browser before upload and again on the server. */
export const IMPORT_MAX_BYTES = 20 * 1024 * 1024;

/**
 * How far a depth in a file may be from a station's depth in the profile and still count as
 * that station: 10 mm (common practice: a gauge template hangs from the liner top at fixed
 * depths, so readings land within a few millimetres; our demo profiles' stations are 80 mm
 * or more apart, so no depth is within reach of two).
 */
export const DEPTH_TOLERANCE_MM = 10;
