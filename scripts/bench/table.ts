/** Plain-text table for terminals: first row is the header, columns right-aligned except the first. */
export function formatTable(rows: readonly (readonly string[])[]): string {
  const widths: number[] = [];
  for (const row of rows) row.forEach((cell, index) => (widths[index] = Math.max(widths[index] ?? 0, cell.length)));
  const line = (row: readonly string[]): string =>
    row.map((cell, index) => (index === 0 ? cell.padEnd(widths[index] ?? 0) : cell.padStart(widths[index] ?? 0))).join("  ");
  const [header, ...body] = rows;
  if (!header) return "";
  const rule = widths.map((width) => "-".repeat(width)).join("  ");
  return [line(header), rule, ...body.map(line)].join("\n");
}

export function printTable(title: string, rows: readonly (readonly string[])[]): void {
  console.log(`\n${title}\n${formatTable(rows)}`);
}
