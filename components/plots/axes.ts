import { roundToDecimals } from "@/lib/verdicts/format-figure";

// Axis names and tick labels for the uPlot charts: a quantity and its unit on every axis, and
// ticks printed to the decimals their spacing needs, never "-0" (uPlot's splits can land on
// −1e−17 for zero). Pure, so it is unit-tested apart from the canvas.

const QUANTITY_NAMES: Record<string, string> = { V: "Voltage", A: "Current", s: "Time", Hz: "Frequency", "%": "Amplitude" };

/** "Voltage (V)", "Current (A)", "Time (s)"; a unit without a known quantity is named by itself. */
export function axisLabel(unit: string, quantity?: string): string {
  return `${quantity ?? QUANTITY_NAMES[unit] ?? "Value"} (${unit})`;
}

/** Decimal places that print a tick spacing exactly (0.25 → 2, 5 → 0, 0.001 → 3), at most 12. */
export function stepDecimals(step: number): number {
  const size = Math.abs(step);
  if (!(size > 0) || !Number.isFinite(size)) return 0;
  for (let decimals = 0; decimals <= 12; decimals += 1) {
    const scaled = size * 10 ** decimals;
    if (Math.abs(scaled - Math.round(scaled)) < 1e-6 * Math.max(1, scaled)) return decimals;
  }
  return 12;
}

/** Tick labels for evenly spaced splits, all with the decimals of their spacing. */
export function tickLabels(splits: readonly number[]): string[] {
  const step = splits.length > 1 ? (splits[1] as number) - (splits[0] as number) : 0;
  const decimals = stepDecimals(step);
  return splits.map((value) => (Number.isFinite(value) ? roundToDecimals(value, decimals) : ""));
}

/** Channel units present in a waveform, voltage first: each gets its own y scale and axis. */
export function unitsInOrder(units: readonly string[]): ("V" | "A")[] {
  const present = new Set(units);
  return (["V", "A"] as const).filter((unit) => present.has(unit));
}
