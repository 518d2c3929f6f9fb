/// <reference lib="webworker" />
import Papa from "papaparse";
import { detectOptions, stripBom, type CsvOptions } from "@/lib/imports/parse";

/*
 * Reads a chosen file in the browser, off the main thread, so a big history file neither
 * freezes the screen nor goes up before it has been looked at: the options detected from its
 * start, its header, the first rows for the mapping, the count of rows, and progress as it
 * goes. The server parses the stored file again with the same code; this is for the screen.
 */

export type WorkerRequest = { file: File; options?: Partial<CsvOptions> };
export type WorkerAnswer =
  | { type: "progress"; fraction: number }
  | { type: "done"; options: CsvOptions; header: string[] | null; sample: string[][]; rows: number; columnCount: number }
  | { type: "error"; message: string };

const post = (m: WorkerAnswer) => (self as unknown as Worker).postMessage(m);

self.onmessage = async (e: MessageEvent<WorkerRequest>) => {
  const { file } = e.data;
  try {
    const head = stripBom(await file.slice(0, 64 * 1024).text());
    const options: CsvOptions = { ...detectOptions(head), ...e.data.options };
    let header: string[] | null = null;
    const sample: string[][] = [];
    let rows = 0;
    let columnCount = 0;
    Papa.parse<string[]>(file, {
      delimiter: options.delimiter,
      chunkSize: 512 * 1024,
      skipEmptyLines: "greedy",
      chunk: (res) => {
        for (const raw of res.data) {
          const cells = raw.map((c, i) => (rows === 0 && i === 0 && !header ? stripBom(c) : c));
          if ((cells[0] ?? "").trimStart().startsWith("#")) continue;
          if (options.hasHeader && header === null) {
            header = cells.map((c) => c.trim());
            columnCount = Math.max(columnCount, cells.length);
            continue;
          }
          rows++;
          columnCount = Math.max(columnCount, cells.length);
          if (sample.length < 8) sample.push(cells.map((c) => c.slice(0, 40)));
        }
        post({ type: "progress", fraction: Math.min(1, res.meta.cursor / Math.max(1, file.size)) });
      },
      complete: () => post({ type: "done", options, header, sample, rows, columnCount }),
      error: (err) => post({ type: "error", message: `The file could not be read: ${err.message}` }),
    });
  } catch (err) {
    post({ type: "error", message: `The file could not be read: ${(err as Error).message}` });
  }
};
