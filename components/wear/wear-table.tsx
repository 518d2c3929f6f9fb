import { CautionMark, OverLimitMark } from "@/components/inspections/marks";
import { fixed } from "@/lib/format";
import type { CellResult, StationOvality } from "@/lib/wear/inspection";
import type { Axis, Station } from "@/lib/wear/types";

export type ReadingNote = { enteredUnit?: "mm" | "in"; warningConfirmed?: string | null };

const key = (stationKey: string, axisKey: string) => `${stationKey}|${axisKey}`;

/** The change in wear at a cell since the previous gauging, signed, e.g. "+0.08 since". */
function SinceChange({ wearMm, before }: { wearMm: number; before: number | undefined }) {
  if (before === undefined) return null;
  const change = wearMm - before;
  const size = fixed(Math.abs(change), 2);
  // A change that rounds to nothing carries no sign: "−0.00" would read as a fall.
  const sign = size === "0.00" ? "" : change > 0 ? "+" : "−";
  return (
    <span className="block text-xs text-ink-soft">
      {sign}
      {size} since
    </span>
  );
}

/**
 * One gauging as the record shows it: per station and direction the reading as read,
 * referred to 20 °C, and the wear; ovality per station. A value at or over its limit is
 * marked by shape and weight as well as colour.
 */
export function WearTable({
  stations,
  axes,
  cells,
  ovality,
  wearLimitMm,
  ovalityLimitMm,
  maxWearStationKey,
  previousWear,
  notes,
}: {
  stations: Station[];
  axes: readonly Axis[];
  cells: Pick<CellResult, "stationKey" | "axisKey" | "rawMm" | "correctedMm" | "wearMm" | "usable">[];
  ovality: Pick<StationOvality, "stationKey" | "ovalityMm">[];
  wearLimitMm: number;
  ovalityLimitMm: number;
  maxWearStationKey?: string | null;
  /** Wear at each cell at the previous gauging of the same liner, to show the change since. */
  previousWear?: Map<string, number>;
  notes?: Map<string, ReadingNote>;
}) {
  const byCell = new Map(cells.map((c) => [key(c.stationKey, c.axisKey), c]));
  return (
    <div className="relative overflow-x-auto rounded-lg border border-ink-line bg-paper-raised">
      {/* Below tablet width each cell stacks the wear over its readings, so a phone shows the
          wear of both directions without scrolling sideways. */}
      <table className="w-full text-sm md:min-w-[720px]">
        <thead className="bg-paper-sunk text-left text-xs tracking-wide text-ink-soft uppercase">
          <tr>
            <th className="px-2 py-2 sm:px-3" scope="col">Station</th>
            <th className="hidden px-2 py-2 sm:px-3 text-right sm:table-cell" scope="col">Depth</th>
            {axes.map((a) => (
              <th key={a.key} className="px-2 py-2 sm:px-3 text-right" scope="col">
                <span className="hidden md:inline">{a.label}: read / at 20 °C / wear</span>
                <span className="md:hidden">
                  {a.label} wear
                  <span className="block font-normal tracking-normal normal-case">read, then at 20 °C</span>
                </span>
              </th>
            ))}
            <th className="px-2 py-2 sm:px-3 text-right" scope="col">Ovality</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-ink-line/70">
          {stations.map((s) => {
            const ov = ovality.find((o) => o.stationKey === s.key)?.ovalityMm ?? null;
            const ovOver = ov !== null && ov >= ovalityLimitMm;
            return (
              <tr key={s.key}>
                <th scope="row" className="px-2 py-2 sm:px-3 text-left font-medium">
                  <span className="font-mono">{s.key}</span> {s.label}
                  {maxWearStationKey === s.key ? <span className="ml-1 text-xs font-semibold">(max wear)</span> : null}
                  <span className="num block text-xs font-normal text-ink-soft sm:hidden">{fixed(s.depthMm, 0)} mm deep</span>
                </th>
                <td className="num hidden px-2 py-2 sm:px-3 text-right sm:table-cell">{fixed(s.depthMm, 0)} mm</td>
                {axes.map((a) => {
                  const cell = byCell.get(key(s.key, a.key));
                  const note = notes?.get(key(s.key, a.key));
                  const over = cell && cell.usable && cell.wearMm >= wearLimitMm;
                  return (
                    <td key={a.key} className="num px-2 py-2 sm:px-3 text-right align-top">
                      {cell ? (
                        <>
                          <span className="hidden text-ink-faint md:inline">
                            {fixed(cell.rawMm, 2)} / {fixed(cell.correctedMm, 2)} /{" "}
                          </span>
                          <span className={over ? "font-semibold text-limit" : "font-semibold"}>
                            {over ? <OverLimitMark /> : null}
                            {fixed(cell.wearMm, 2)}
                            {over ? <span className="sr-only"> (at or over the limit)</span> : null}
                          </span>
                          {cell.usable ? <SinceChange wearMm={cell.wearMm} before={previousWear?.get(key(s.key, a.key))} /> : null}
                          <span className="block text-xs text-ink-faint md:hidden">{fixed(cell.rawMm, 2)}</span>
                          <span className="block text-xs text-ink-faint md:hidden">{fixed(cell.correctedMm, 2)}</span>
                          {note?.enteredUnit === "in" ? <span className="block text-xs text-ink-faint">entered in inches</span> : null}
                          {!cell.usable ? <span className="block text-xs text-caution">implausible, not counted</span> : null}
                          {note?.warningConfirmed ? (
                            <span className="block max-w-xs text-xs whitespace-normal text-ink-soft">
                              <CautionMark />
                              confirmed as read: {note.warningConfirmed}
                            </span>
                          ) : null}
                        </>
                      ) : (
                        <span className="text-ink-faint">not read</span>
                      )}
                    </td>
                  );
                })}
                <td className={`num px-2 py-2 sm:px-3 text-right ${ovOver ? "font-semibold text-limit" : ""}`}>
                  {ov === null ? (
                    "–"
                  ) : (
                    <>
                      {ovOver ? <OverLimitMark /> : null}
                      {fixed(ov)}
                    </>
                  )}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}

export { key as wearCellKey };
