"use client";

import { useRouter } from "next/navigation";
import { useEffect, useMemo, useRef, useState } from "react";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Hint, Input, Label, Select } from "@/components/ui/field";
import { ApiError, apiJson } from "@/lib/inspections/api-client";
import { DEPTH_TOLERANCE_MM, FIELD_LABELS, guessMapping, IMPORT_FIELDS, IMPORT_MAX_BYTES, LAYOUT_COLUMNS, missingFields, shapeKey, templateCsv, type ColumnMapping, type ImportField } from "@/lib/imports/layout";
import { DELIMITER_NAMES, type CsvOptions } from "@/lib/imports/parse";
import type { WorkerAnswer, WorkerRequest } from "./parse-worker";

export type WizardTargets = {
  id: number;
  name: string;
  engines: { id: number; serial: string; boreMm: number; profileName: string; units: { id: number; cylinderNo: number; drafts: { id: number; inspectedOn: string; engineHours: number }[] }[] }[];
}[];

type Saved = Record<number, Record<string, { mapping: ColumnMapping; options: CsvOptions }>>;

export type WizardStart = {
  destination?: "draft" | "history";
  vesselId?: number;
  engineId?: number;
  unitId?: number;
  inspectionId?: number;
  /** Mapping an uploaded file again (from its preview): the file is already in the store. */
  again?: { fileId: number; fileName: string; mapping: ColumnMapping; options: CsvOptions; header: string[] | null; sample: string[][]; columnCount: number; excludedLines: number[]; replacesImportId: number | null; newDraft: { inspectedOn: string; engineHours: number } | null };
};

type Parsed = { options: CsvOptions; header: string[] | null; sample: string[][]; rows: number | null; columnCount: number };

const mb = (n: number) => `${(n / (1024 * 1024)).toFixed(1)} MB`;
const layoutOrder = (): ColumnMapping => Object.fromEntries(LAYOUT_COLUMNS.map((c, i) => [c.field, i]));

/** Reads a file in a worker (progress as it goes); falls back to the page's own thread if workers are unavailable. */
function readInWorker(file: File, options: Partial<CsvOptions> | undefined, onProgress: (f: number) => void): Promise<Parsed> {
  return new Promise((resolve, reject) => {
    let worker: Worker;
    try {
      worker = new Worker(new URL("./parse-worker.ts", import.meta.url), { type: "module" });
    } catch {
      reject(new Error("This browser cannot read the file in the background."));
      return;
    }
    worker.onmessage = (e: MessageEvent<WorkerAnswer>) => {
      const m = e.data;
      if (m.type === "progress") onProgress(m.fraction);
      else {
        worker.terminate();
        if (m.type === "done") resolve({ options: m.options, header: m.header, sample: m.sample, rows: m.rows, columnCount: m.columnCount });
        else reject(new Error(m.message));
      }
    };
    worker.onerror = () => {
      worker.terminate();
      reject(new Error("The file could not be read."));
    };
    worker.postMessage({ file, options } satisfies WorkerRequest);
  });
}

/** PUTs the file to the store's presigned URL, reporting progress. */
function putFile(url: string, headers: Record<string, string>, file: File, onProgress: (f: number) => void): Promise<void> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open("PUT", url);
    for (const [k, v] of Object.entries(headers)) xhr.setRequestHeader(k, v);
    xhr.upload.onprogress = (e) => e.lengthComputable && onProgress(e.loaded / e.total);
    xhr.onload = () => (xhr.status < 300 ? resolve() : reject(new Error(`The store refused the file (${xhr.status}). Try again.`)));
    xhr.onerror = () => reject(new Error("No network: the file could not be sent. Nothing was imported; try again when the network is back."));
    xhr.send(file);
  });
}

function Progress({ label, fraction }: { label: string; fraction: number }) {
  const pct = Math.round(fraction * 100);
  return (
    <div className="mt-3" role="progressbar" aria-label={label} aria-valuemin={0} aria-valuemax={100} aria-valuenow={pct}>
      <div className="flex justify-between text-sm text-ink-soft">
        <span>{label}</span>
        <span className="num">{pct} %</span>
      </div>
      <div className="mt-1 h-3 overflow-hidden rounded-full bg-ink-line">
        <div className="h-full bg-signal transition-[width]" style={{ width: `${pct}%` }} />
      </div>
    </div>
  );
}

export function ImportWizard({ targets, saved, start }: { targets: WizardTargets; saved: Saved; start: WizardStart }) {
  const router = useRouter();
  const again = start.again ?? null;
  const [destination, setDestination] = useState<"draft" | "history">(start.destination ?? "draft");
  const [vesselId, setVesselId] = useState<number | null>(start.vesselId ?? targets[0]?.id ?? null);
  const vessel = targets.find((v) => v.id === vesselId) ?? null;
  const [engineId, setEngineId] = useState<number | null>(start.engineId ?? vessel?.engines[0]?.id ?? null);
  const engine = vessel?.engines.find((e) => e.id === engineId) ?? vessel?.engines[0] ?? null;
  const [unitId, setUnitId] = useState<number | null>(start.unitId ?? null);
  const unit = engine?.units.find((u) => u.id === unitId) ?? null;
  const [draftChoice, setDraftChoice] = useState<string>(start.inspectionId ? String(start.inspectionId) : "new");
  const [newDate, setNewDate] = useState(again?.newDraft?.inspectedOn ?? new Date().toISOString().slice(0, 10));
  const [newHours, setNewHours] = useState(again?.newDraft ? String(again.newDraft.engineHours) : "");
  const [file, setFile] = useState<File | null>(null);
  const [parsed, setParsed] = useState<Parsed | null>(again ? { options: again.options, header: again.header, sample: again.sample, rows: null, columnCount: again.columnCount } : null);
  const [options, setOptions] = useState<CsvOptions | null>(again?.options ?? null);
  const [mapping, setMapping] = useState<ColumnMapping>(again?.mapping ?? {});
  const [readProgress, setReadProgress] = useState<number | null>(null);
  const [sendProgress, setSendProgress] = useState<number | null>(null);
  const [message, setMessage] = useState<string | null>(null);
  const [savedNote, setSavedNote] = useState<string | null>(null);
  const [duplicateOf, setDuplicateOf] = useState<number | null>(null);
  const [busy, setBusy] = useState(false);
  const fileId = useRef<number | null>(again?.fileId ?? null);

  useEffect(() => {
    if (unit && !unit.drafts.some((d) => String(d.id) === draftChoice)) setDraftChoice(unit.drafts[0] ? String(unit.drafts[0].id) : "new");
  }, [unit, draftChoice]);

  const columns = parsed ? Array.from({ length: parsed.columnCount }, (_, i) => `${parsed.header?.[i] || `Column ${i + 1}`}${parsed.sample[0]?.[i] ? ` (e.g. ${parsed.sample[0][i]})` : ""}`) : [];
  const missing = useMemo(() => missingFields(mapping, destination), [mapping, destination]);
  const template = useMemo(() => `data:text/csv;charset=utf-8,${encodeURIComponent(templateCsv())}`, []);

  async function read(f: File, override?: Partial<CsvOptions>) {
    setMessage(null);
    setReadProgress(0);
    try {
      const p = await readInWorker(f, override, setReadProgress);
      setParsed(p);
      setOptions(p.options);
      const shape = shapeKey(p.header, p.columnCount);
      const keep = vesselId ? saved[vesselId]?.[shape] : undefined;
      if (keep && !override) {
        setMapping(keep.mapping);
        setOptions({ ...p.options, decimalMark: keep.options.decimalMark, lengthUnit: keep.options.lengthUnit });
        setSavedNote("This vessel's files of this shape were mapped before: that mapping is applied. Check it below.");
      } else if (!override || override.hasHeader !== undefined) {
        setMapping(p.header ? guessMapping(p.header) : p.columnCount >= LAYOUT_COLUMNS.length ? layoutOrder() : {});
        setSavedNote(null);
      }
    } catch (err) {
      setMessage((err as Error).message);
      setParsed(null);
    } finally {
      setReadProgress(null);
    }
  }

  function choose(f: File | null) {
    setDuplicateOf(null);
    fileId.current = null;
    setParsed(null);
    setFile(null);
    if (!f) return;
    if (f.size > IMPORT_MAX_BYTES) {
      setMessage(`${f.name} is ${mb(f.size)}; the importer takes files up to ${mb(IMPORT_MAX_BYTES)}. Split it (by year or by unit) and import the parts. Nothing was sent.`);
      return;
    }
    if (f.size === 0) {
      setMessage(`${f.name} is empty. Choose the file with the readings.`);
      return;
    }
    setFile(f);
    void read(f);
  }

  function changeOption<K extends keyof CsvOptions>(key: K, value: CsvOptions[K]) {
    const next = { ...options!, [key]: value };
    setOptions(next);
    if ((key === "delimiter" || key === "hasHeader") && file) void read(file, next);
  }

  async function submit(replaces: number | null = again?.replacesImportId ?? null) {
    if (!vesselId || !options) return;
    setMessage(null);
    setBusy(true);
    try {
      if (!fileId.current) {
        if (!file) throw new Error("Choose the file first.");
        const slot = await apiJson<{ fileId: number; uploadUrl: string; headers: Record<string, string> }>("/api/imports/uploads", { method: "POST", body: { vesselId, fileName: file.name, sizeBytes: file.size } });
        setSendProgress(0);
        await putFile(slot.uploadUrl, slot.headers, file, setSendProgress);
        fileId.current = slot.fileId;
      }
      const body = {
        fileId: fileId.current,
        vesselId,
        destination,
        engineId: destination === "history" ? engine?.id : null,
        unitId: destination === "draft" ? unit?.id : null,
        inspectionId: destination === "draft" && draftChoice !== "new" ? Number(draftChoice) : null,
        newDraft: destination === "draft" && draftChoice === "new" ? { inspectedOn: newDate, engineHours: Number(newHours.replace(",", ".")) } : null,
        mapping,
        options,
        excludedLines: again?.excludedLines ?? [],
        replacesImportId: replaces,
        saveMapping: true,
      };
      const dto = await apiJson<{ id: number }>("/api/imports", { method: "POST", body });
      router.push(`/imports/${dto.id}`);
    } catch (err) {
      if (err instanceof ApiError && err.status === 409 && typeof (err.body.details as { duplicateOf?: number } | undefined)?.duplicateOf === "number") {
        setDuplicateOf((err.body.details as { duplicateOf: number }).duplicateOf);
      }
      setMessage((err as Error).message);
      setBusy(false);
    } finally {
      setSendProgress(null);
    }
  }

  const ready = !!options && !missing.length && (destination === "history" ? !!engine : !!unit && (draftChoice !== "new" || (newDate && newHours.trim() !== "")));

  return (
    <div className="space-y-6">
      <Card className="p-4 sm:p-5">
        <h2 className="text-lg font-semibold">1. Where the readings go</h2>
        <fieldset className="mt-3 grid gap-2 sm:grid-cols-2">
          <legend className="sr-only">Destination</legend>
          {([
            ["draft", "A gauge file into a draft", "The readings of one overhaul fill a new or open draft of one unit; you check the sheet and submit it as usual."],
            ["history", "Past records into the history", "Years of gaugings of many units of one engine; each becomes a record, and they count once a chief engineer or the superintendent approves the import."],
          ] as const).map(([value, title, what]) => (
            <label key={value} className={`flex min-h-11 cursor-pointer gap-3 rounded-md border p-3 ${destination === value ? "border-signal bg-signal-tint" : "border-ink-line"}`}>
              <input type="radio" name="destination" value={value} checked={destination === value} onChange={() => setDestination(value)} className="mt-1 size-5 shrink-0" />
              <span>
                <span className="block font-medium">{title}</span>
                <span className="block text-sm text-ink-soft">{what}</span>
              </span>
            </label>
          ))}
        </fieldset>
        <div className="mt-4 grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
          <div>
            <Label htmlFor="imp-vessel">Vessel</Label>
            <Select id="imp-vessel" value={vesselId ?? ""} onChange={(e) => { setVesselId(Number(e.target.value)); setEngineId(null); setUnitId(null); }} disabled={!!again}>
              {targets.map((v) => <option key={v.id} value={v.id}>{v.name}</option>)}
            </Select>
          </div>
          <div>
            <Label htmlFor="imp-engine">Main engine</Label>
            <Select id="imp-engine" value={engine?.id ?? ""} onChange={(e) => { setEngineId(Number(e.target.value)); setUnitId(null); }} disabled={!!again}>
              {(vessel?.engines ?? []).map((e) => <option key={e.id} value={e.id}>{e.serial} · {e.profileName}</option>)}
            </Select>
          </div>
          {destination === "draft" ? (
            <>
              <div>
                <Label htmlFor="imp-unit">Unit</Label>
                <Select id="imp-unit" value={unit?.id ?? ""} onChange={(e) => setUnitId(e.target.value ? Number(e.target.value) : null)}>
                  <option value="">Choose the cylinder…</option>
                  {(engine?.units ?? []).map((u) => <option key={u.id} value={u.id}>Cylinder {u.cylinderNo}</option>)}
                </Select>
              </div>
              <div>
                <Label htmlFor="imp-draft">Draft</Label>
                <Select id="imp-draft" value={draftChoice} onChange={(e) => setDraftChoice(e.target.value)} disabled={!unit}>
                  {(unit?.drafts ?? []).map((d) => <option key={d.id} value={d.id}>Open draft of {d.inspectedOn}</option>)}
                  <option value="new">A new draft</option>
                </Select>
              </div>
              {unit && draftChoice === "new" ? (
                <>
                  <div>
                    <Label htmlFor="imp-date">Date of the gauging</Label>
                    <Input id="imp-date" type="date" value={newDate} onChange={(e) => setNewDate(e.target.value)} />
                  </div>
                  <div>
                    <Label htmlFor="imp-hours">Engine running hours</Label>
                    <Input id="imp-hours" inputMode="decimal" value={newHours} onChange={(e) => setNewHours(e.target.value)} />
                  </div>
                </>
              ) : null}
            </>
          ) : null}
        </div>
      </Card>

      <Card className="p-4 sm:p-5">
        <h2 className="text-lg font-semibold">2. The file</h2>
        <p className="mt-1 text-sm text-ink-soft">
          A CSV file (comma, semicolon or tab between columns) of up to {mb(IMPORT_MAX_BYTES)}. Kalibore&apos;s own layout needs no mapping:{" "}
          <a href={template} download="kalibore-reading-template.csv" className="inline-flex min-h-11 items-center font-medium text-signal underline">download the template</a>.
          A depth from the liner top counts as a station when it is within {DEPTH_TOLERANCE_MM} mm of the profile&apos;s depth.
        </p>
        {again ? (
          <p className="mt-3 text-sm">File: <span className="font-medium">{again.fileName}</span> (already uploaded; map it again below).</p>
        ) : (
          <div className="mt-3">
            <Label htmlFor="imp-file">Reading file</Label>
            <input id="imp-file" type="file" accept=".csv,.tsv,.txt,text/csv,text/plain" onChange={(e) => choose(e.target.files?.[0] ?? null)} className="mt-1 block min-h-11 w-full text-base file:mr-3 file:min-h-11 file:rounded-md file:border file:border-ink-line file:bg-paper-raised file:px-4" />
          </div>
        )}
        {readProgress !== null ? <Progress label="Reading the file" fraction={readProgress} /> : null}
        {parsed && options ? (
          <>
            <p className="mt-3 text-sm" role="status">
              {parsed.rows !== null ? <><span className="num">{parsed.rows.toLocaleString("en-GB")}</span> rows, </> : null}
              <span className="num">{parsed.columnCount}</span> columns; {DELIMITER_NAMES[options.delimiter]} between columns, decimal {options.decimalMark === "." ? "point" : "comma"}, lengths in {options.lengthUnit}, {options.hasHeader ? "a header row" : "no header row"} (detected; change below if wrong).
            </p>
            <div className="mt-3 grid grid-cols-2 gap-4 lg:grid-cols-4">
              <div>
                <Label htmlFor="imp-delim">Between columns</Label>
                <Select id="imp-delim" value={options.delimiter} onChange={(e) => changeOption("delimiter", e.target.value as CsvOptions["delimiter"])} disabled={!file}>
                  <option value=",">Comma</option>
                  <option value=";">Semicolon</option>
                  <option value={"\t"}>Tab</option>
                </Select>
              </div>
              <div>
                <Label htmlFor="imp-dec">Decimal mark</Label>
                <Select id="imp-dec" value={options.decimalMark} onChange={(e) => changeOption("decimalMark", e.target.value as CsvOptions["decimalMark"])}>
                  <option value=".">Point (640.52)</option>
                  <option value=",">Comma (640,52)</option>
                </Select>
              </div>
              <div>
                <Label htmlFor="imp-unitlen">Lengths in</Label>
                <Select id="imp-unitlen" value={options.lengthUnit} onChange={(e) => changeOption("lengthUnit", e.target.value as CsvOptions["lengthUnit"])}>
                  <option value="mm">Millimetres</option>
                  <option value="in">Inches</option>
                </Select>
              </div>
              <div>
                <Label htmlFor="imp-header">First row</Label>
                <Select id="imp-header" value={options.hasHeader ? "yes" : "no"} onChange={(e) => changeOption("hasHeader", e.target.value === "yes")} disabled={!file}>
                  <option value="yes">Column names</option>
                  <option value="no">Readings</option>
                </Select>
              </div>
            </div>
          </>
        ) : null}
      </Card>

      {parsed && options ? (
        <Card className="p-4 sm:p-5">
          <h2 className="text-lg font-semibold">3. Which column holds what</h2>
          {savedNote ? <p className="mt-2 rounded-md bg-signal-tint p-3 text-sm" role="status">{savedNote}</p> : null}
          <div className="mt-3 grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
            {IMPORT_FIELDS.map((f: ImportField) => {
              const needed = missing.includes(f);
              return (
                <div key={f}>
                  <Label htmlFor={`map-${f}`}>
                    {FIELD_LABELS[f]}
                    {needed ? <span className="text-limit"> (needed)</span> : null}
                  </Label>
                  <Select
                    id={`map-${f}`}
                    aria-invalid={needed || undefined}
                    value={mapping[f] ?? ""}
                    onChange={(e) => setMapping((m) => {
                      const next = { ...m };
                      if (e.target.value === "") delete next[f];
                      else next[f] = Number(e.target.value);
                      return next;
                    })}
                  >
                    <option value="">— not in the file —</option>
                    {columns.map((c, i) => <option key={i} value={i}>{c}</option>)}
                  </Select>
                </div>
              );
            })}
          </div>
          {missing.includes("station") ? <Hint>Map either the station or the depth from the liner top.</Hint> : null}
          <h3 className="mt-5 font-semibold">The first rows</h3>
          <div className="mt-2 max-w-full overflow-x-auto rounded-md border border-ink-line">
            <table className="min-w-full text-sm">
              <thead className="bg-paper">
                <tr>{columns.map((_, i) => <th key={i} className="whitespace-nowrap px-2 py-1 text-left font-medium">{parsed.header?.[i] || `Column ${i + 1}`}</th>)}</tr>
              </thead>
              <tbody>
                {parsed.sample.slice(0, 5).map((r, k) => (
                  <tr key={k} className="border-t border-ink-line">{columns.map((_, i) => <td key={i} className="num whitespace-nowrap px-2 py-1">{r[i] ?? ""}</td>)}</tr>
                ))}
              </tbody>
            </table>
          </div>
        </Card>
      ) : null}

      {message ? (
        <div role="alert" className="rounded-md border-2 border-limit bg-limit-tint p-3">
          <p>{message}</p>
          {duplicateOf ? (
            <Button type="button" variant="secondary" className="mt-2" onClick={() => void submit(duplicateOf)} disabled={busy}>
              Import it as a replacement of import {duplicateOf}
            </Button>
          ) : null}
        </div>
      ) : null}
      {sendProgress !== null ? <Progress label="Sending the file" fraction={sendProgress} /> : null}
      <div className="flex flex-wrap gap-3">
        <Button type="button" size="lg" onClick={() => void submit()} disabled={!ready || busy}>
          {busy ? "Checking…" : "Check the file"}
        </Button>
        {!ready && parsed ? <p className="self-center text-sm text-ink-soft">{missing.length ? `Map ${missing.map((f) => FIELD_LABELS[f].toLowerCase()).join(", ")} first.` : "Choose where the readings go first."}</p> : null}
      </div>
      <p className="text-sm text-ink-soft">Nothing is written to the records until you have seen the check and chosen to import.</p>
    </div>
  );
}
