// Adds up the vitest and Playwright JSON reports into one closing line.
import fs from "node:fs";
import path from "node:path";

const dir = process.argv[2];
// `--only "unit integration"`: a partial run during development expects only those reports.
const onlyAt = process.argv.indexOf("--only");
const only = onlyAt > 0 ? process.argv[onlyAt + 1].split(/\s+/) : ["unit", "integration", "e2e"];
let passed = 0, failed = 0, skipped = 0, missing = [];
for (const name of ["unit.json", "integration.json"].filter((n) => only.includes(n.replace(".json", "")))) {
  const file = path.join(dir, name);
  if (!fs.existsSync(file)) { missing.push(name); continue; }
  const r = JSON.parse(fs.readFileSync(file, "utf8"));
  passed += r.numPassedTests; failed += r.numFailedTests; skipped += r.numPendingTests + (r.numTodoTests ?? 0);
}
const e2e = path.join(dir, "e2e.json");
if (fs.existsSync(e2e)) {
  const s = JSON.parse(fs.readFileSync(e2e, "utf8")).stats;
  passed += s.expected + s.flaky; failed += s.unexpected; skipped += s.skipped;
} else if (only.includes("e2e")) missing.push("e2e.json");
if (missing.length) { console.log(`missing reports: ${missing.join(", ")}`); failed += missing.length; }
console.log(`${passed} passed, ${failed} failed, ${skipped} skipped`);
process.exit(failed ? 1 : 0);
