import { fmt, fmtFixed } from "./format";

export type CaptureFigures = { frequencyHz: number | null; worstThdPercent: number | null; vufPercent: number | null; keLineRmsPerKrpm: number | null };

/** The headline figures of a capture's current analysis as table cells: f, worst THD, VUF, Ke. */
export function CaptureFigureCells({ row, cellClass }: { row: CaptureFigures; cellClass: string }) {
  return (
    <>
      <td className={`${cellClass} tabular-nums`}>{fmt(row.frequencyHz, 6)}</td>
      <td className={`${cellClass} tabular-nums`}>{fmtFixed(row.worstThdPercent, 2)}</td>
      <td className={`${cellClass} tabular-nums`}>{fmtFixed(row.vufPercent, 3)}</td>
      <td className={`${cellClass} tabular-nums`}>{fmt(row.keLineRmsPerKrpm)}</td>
    </>
  );
}
