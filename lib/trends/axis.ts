// Axis scales for trend charts that do not turn noise into a landscape: the tolerance band (or a
// minimum span around the data) sets the scale, and tick labels carry enough decimals to differ.

/** Without a band, the axis spans at least this share of the data's magnitude (0.5 %), common practice. */
export const MIN_RELATIVE_SPAN = 0.005;

export function axisRange(values: readonly number[], band: { lower: number | null; upper: number | null } | null, extra: readonly (number | null)[] = []): { min: number; max: number } {
  const shown = [...values, ...extra.filter((v): v is number => v !== null && Number.isFinite(v))];
  if (band && band.upper !== null) shown.push(band.upper);
  if (band && band.lower !== null) shown.push(band.lower);
  // A one-sided upper band (THD, unbalance) reads from zero: the figure's own origin.
  if (band && band.lower === null && band.upper !== null) shown.push(0);
  if (shown.length === 0) return { min: 0, max: 1 };
  let min = Math.min(...shown);
  let max = Math.max(...shown);
  const magnitude = Math.max(Math.abs(min), Math.abs(max));
  const floor = magnitude > 0 ? magnitude * MIN_RELATIVE_SPAN : 1;
  if (max - min < floor) {
    const mid = (max + min) / 2;
    min = mid - floor / 2;
    max = mid + floor / 2;
  }
  const pad = (max - min) * 0.05;
  return { min: min === 0 ? 0 : min - pad, max: max + pad };
}

/** Decimals that make ticks `step` apart read differently ("49.9, 50.0", never "50, 50"). */
export function tickDecimals(step: number): number {
  if (!(step > 0) || !Number.isFinite(step)) return 0;
  const d = Math.ceil(-Math.log10(step) - 1e-9);
  // A step like 0.25 needs one more place than its order of magnitude.
  const scaled = step * 10 ** Math.max(0, d);
  return Math.max(0, d) + (Math.abs(scaled - Math.round(scaled)) > 1e-9 ? 1 : 0);
}

export function formatTick(value: number, step: number): string {
  return value.toFixed(Math.min(12, tickDecimals(step)));
}
