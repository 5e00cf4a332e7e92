// One CSV cell per RFC 4180, with spreadsheet formulas defused in text cells (a leading = + - @ tab or
// CR gets a quote mark). Numbers keep 8 significant digits. Shared by every CSV the service writes.
export function csvCell(value: unknown): string {
  if (value === null || value === undefined) return "";
  const text = typeof value === "number" ? String(Number(value.toPrecision(8))) : String(value);
  const safe = /^[=+\-@\t\r]/.test(text) && typeof value !== "number" ? `'${text}` : text;
  return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

export function csvLine(values: readonly unknown[]): string {
  return values.map(csvCell).join(",");
}
