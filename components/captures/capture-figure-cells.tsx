import { formatFigure } from "@/lib/verdicts/format-figure";

export type CaptureFigures = { frequencyHz: number | null; worstThdPercent: number | null; vufPercent: number | null; keLineRmsPerKrpm: number | null };

/** The headline figures of a capture's current analysis as table cells: f, worst THD, VUF, Ke. */
export function CaptureFigureCells({ row, cellClass }: { row: CaptureFigures; cellClass: string }) {
  return (
    <>
      <td className={`${cellClass} tabular-nums`}>{formatFigure(row.frequencyHz, { quantity: "frequency" })}</td>
      <td className={`${cellClass} tabular-nums`}>{formatFigure(row.worstThdPercent, { quantity: "percent" })}</td>
      <td className={`${cellClass} tabular-nums`}>{formatFigure(row.vufPercent, { quantity: "percent" })}</td>
      <td className={`${cellClass} tabular-nums`}>{formatFigure(row.keLineRmsPerKrpm, { quantity: "ke" })}</td>
    </>
  );
}
