#!/usr/bin/env node
/*
 * First-load JavaScript of the entry screens, compressed, against the 200 kB target: what a
 * tablet on a ship's weak link must fetch before the gauging sheet answers a tap. Reads the
 * chunk list of each route from the last `next build` (.next/diagnostics/route-bundle-stats.json)
 * and gzips each chunk once (a chunk shared by two routes is counted for each, as a first visit
 * fetches it). Not a test: a size is a target to watch, printed beside its figure.
 *
 *   npx next build && node scripts/bench-bundle.mjs [--all]
 */
import { readFileSync, existsSync } from "node:fs";
import path from "node:path";
import { gzipSync } from "node:zlib";

const ROOT = path.resolve(import.meta.dirname, "..");
const STATS = path.join(ROOT, ".next/diagnostics/route-bundle-stats.json");
const TARGET_KB = 200;
/** The screens an engineer enters readings on, and the start page that leads there. */
const ENTRY_ROUTES = ["/", "/inspections/new", "/inspections/[inspectionId]/edit", "/inspections/[inspectionId]"];

if (!existsSync(STATS)) {
  console.error(`No build statistics at ${path.relative(ROOT, STATS)}: run \`npx next build\` first.`);
  process.exit(2);
}
const routes = JSON.parse(readFileSync(STATS, "utf8"));
const gz = new Map();
const gzipped = (file) => {
  if (!gz.has(file)) gz.set(file, gzipSync(readFileSync(path.join(ROOT, file)), { level: 9 }).length);
  return gz.get(file);
};

const all = process.argv.includes("--all");
const rows = routes
  .filter((r) => all || ENTRY_ROUTES.includes(r.route))
  .map((r) => ({ route: r.route, raw: r.firstLoadUncompressedJsBytes, gzip: r.firstLoadChunkPaths.reduce((n, f) => n + gzipped(f), 0) }))
  .sort((a, b) => b.gzip - a.gzip);

const kb = (b) => (b / 1000).toFixed(1).padStart(6);
console.log(`first-load JavaScript per route (gzip -9), target under ${TARGET_KB} kB for the entry screens`);
let over = 0;
for (const r of rows) {
  const entry = ENTRY_ROUTES.includes(r.route);
  const verdict = entry ? (r.gzip < TARGET_KB * 1000 ? "target met" : "OVER TARGET") : "";
  if (entry && r.gzip >= TARGET_KB * 1000) over++;
  console.log(`  ${r.route.padEnd(34)} ${kb(r.gzip)} kB gzip  (${kb(r.raw)} kB raw)  ${verdict}`);
}
console.log(over ? `${over} entry screen(s) over ${TARGET_KB} kB` : `every entry screen under ${TARGET_KB} kB`);
