/** Numbers for tables: fixed significant digits, a dash for "not computable" (null). */
export function fmt(value: number | null | undefined, digits = 4): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "—";
  if (value === 0) return "0";
  const magnitude = Math.abs(value);
  if (magnitude >= 1e6 || magnitude < 1e-3) return value.toExponential(digits - 1);
  return value.toPrecision(digits).replace(/\.?0+$/, (m) => (m.includes(".") ? "" : m));
}

export function fmtWithUnit(value: number | string | null | undefined, unit: string, digits = 4): string {
  if (typeof value === "string") return value;
  // Small percentages read as 0.000 %, not 4.019e-4 %: the tables compare them with limits of a few percent.
  const text = unit === "%" && typeof value === "number" && Math.abs(value) < 1 ? fmtFixed(value, 3) : fmt(value, digits);
  return text === "—" || !unit ? text : `${text} ${unit}`;
}

export const fmtDate = (iso: string | null) => (iso ? new Date(iso).toISOString().replace("T", " ").slice(0, 19) + " UTC" : "—");

/** Percentages and angles: fixed decimals read better than significant digits near zero. */
export function fmtFixed(value: number | null | undefined, decimals = 3): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "—";
  const text = value.toFixed(decimals);
  return /^-0\.0*$/.test(text) ? text.slice(1) : text;
}
