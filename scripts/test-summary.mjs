// Adds up the vitest and Playwright JSON reports into one closing line.
import fs from "node:fs";
import path from "node:path";

const dir = process.argv[2];
let passed = 0, failed = 0, skipped = 0, missing = [];
for (const name of ["unit.json", "integration.json"]) {
  const file = path.join(dir, name);
  if (!fs.existsSync(file)) { missing.push(name); continue; }
  const r = JSON.parse(fs.readFileSync(file, "utf8"));
  passed += r.numPassedTests; failed += r.numFailedTests; skipped += r.numPendingTests + (r.numTodoTests ?? 0);
}
const e2e = path.join(dir, "e2e.json");
if (fs.existsSync(e2e)) {
  const s = JSON.parse(fs.readFileSync(e2e, "utf8")).stats;
  passed += s.expected + s.flaky; failed += s.unexpected; skipped += s.skipped;
} else missing.push("e2e.json");
if (missing.length) { console.log(`missing reports: ${missing.join(", ")}`); failed += missing.length; }
console.log(`${passed} passed, ${failed} failed, ${skipped} skipped`);
process.exit(failed ? 1 : 0);
