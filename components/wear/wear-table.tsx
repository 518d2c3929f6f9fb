import { CautionMark, OverLimitMark } from "@/components/inspections/marks";
import { fixed } from "@/lib/format";
import type { CellResult, StationOvality } from "@/lib/wear/inspection";
import type { Axis, Station } from "@/lib/wear/types";

export type ReadingNote = { enteredUnit?: "mm" | "in"; warningConfirmed?: string | null };

const key = (stationKey: string, axisKey: string) => `${stationKey}|${axisKey}`;

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
  notes,
}: {
  stations: Station[];
  axes: readonly Axis[];
  cells: Pick<CellResult, "stationKey" | "axisKey" | "rawMm" | "correctedMm" | "wearMm" | "usable">[];
  ovality: Pick<StationOvality, "stationKey" | "ovalityMm">[];
  wearLimitMm: number;
  ovalityLimitMm: number;
  maxWearStationKey?: string | null;
  notes?: Map<string, ReadingNote>;
}) {
  const byCell = new Map(cells.map((c) => [key(c.stationKey, c.axisKey), c]));
  return (
    <div className="relative overflow-x-auto rounded-lg border border-ink-line bg-paper-raised">
      <table className="w-full min-w-[720px] text-sm">
        <thead className="bg-paper-sunk text-left text-xs tracking-wide text-ink-soft uppercase">
          <tr>
            <th className="px-3 py-2" scope="col">Station</th>
            <th className="px-3 py-2 text-right" scope="col">Depth</th>
            {axes.map((a) => (
              <th key={a.key} className="px-3 py-2 text-right" scope="col">
                {a.label}: read / at 20 °C / wear
              </th>
            ))}
            <th className="px-3 py-2 text-right" scope="col">Ovality</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-ink-line/70">
          {stations.map((s) => {
            const ov = ovality.find((o) => o.stationKey === s.key)?.ovalityMm ?? null;
            const ovOver = ov !== null && ov >= ovalityLimitMm;
            return (
              <tr key={s.key}>
                <th scope="row" className="px-3 py-2 text-left font-medium">
                  <span className="font-mono">{s.key}</span> {s.label}
                  {maxWearStationKey === s.key ? <span className="ml-1 text-xs font-semibold">(max wear)</span> : null}
                </th>
                <td className="num px-3 py-2 text-right">{fixed(s.depthMm, 0)} mm</td>
                {axes.map((a) => {
                  const cell = byCell.get(key(s.key, a.key));
                  const note = notes?.get(key(s.key, a.key));
                  const over = cell && cell.usable && cell.wearMm >= wearLimitMm;
                  return (
                    <td key={a.key} className="num px-3 py-2 text-right align-top">
                      {cell ? (
                        <>
                          <span className="text-ink-faint">
                            {fixed(cell.rawMm, 2)} / {fixed(cell.correctedMm, 2)} /{" "}
                          </span>
                          <span className={over ? "font-semibold text-limit" : "font-semibold"}>
                            {over ? <OverLimitMark /> : null}
                            {fixed(cell.wearMm, 2)}
                            {over ? <span className="sr-only"> (at or over the limit)</span> : null}
                          </span>
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
                <td className={`num px-3 py-2 text-right ${ovOver ? "font-semibold text-limit" : ""}`}>
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
