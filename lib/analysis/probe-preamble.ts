import type { AppliedProbeScale } from "./types";

// Probe ratios stated in an instrument's preamble ("Probe attenuation,100X", "Probe,10:1",
// "CH1 Probe ×100"). A channel the caller gave no ratio for takes the preamble's; the report says
// which ratio was applied and from which line. Scopes that already scaled their export state the
// ratio too: the plausibility check against the rating catches a ratio applied twice, and a ratio
// of 1 given for the channel overrides the preamble.

/** Lines about the probe or its attenuation; "probe type" or "probe unit" lines carry no ratio. */
const PROBE_KEY = /\b(probe|atten(?:uation)?)\b/i;
const CHANNEL_IN_KEY = /(?:^|[^a-z0-9])(?:ch(?:annel)?|c)\s*([1-8])(?![0-9])/i;
const LOWEST = 1e-3;
const HIGHEST = 1e6;

/** "100X", "100x", "x100", "×100", "10:1", "100", "1000.0 X" → the ratio; null otherwise. */
export function readProbeRatio(text: string): number | null {
  const t = text.trim().replace(/,(?=\d)/, ".");
  const match = /^(\d+(?:\.\d+)?)\s*[x×]$/i.exec(t) ?? /^[x×]\s*(\d+(?:\.\d+)?)$/i.exec(t) ?? /^(\d+(?:\.\d+)?)\s*:\s*1$/.exec(t) ?? /^(\d+(?:\.\d+)?)$/.exec(t);
  if (!match?.[1]) return null;
  const ratio = Number(match[1]);
  return Number.isFinite(ratio) && ratio >= LOWEST && ratio <= HIGHEST ? ratio : null;
}

/** The ratio at the end of a probe line whose key and value are run together ("CH1 Probe ×100"). */
function trailingRatio(text: string): number | null {
  const match = /([x×]\s*\d+(?:[.,]\d+)?|\d+(?:[.,]\d+)?\s*[x×]|\d+(?:[.,]\d+)?\s*:\s*1)\s*$/i.exec(text);
  return match?.[1] ? readProbeRatio(match[1]) : null;
}

export type PreambleScale = { scale: number; statement: string };

export type PreambleColumn = { header: string; kind: "voltage" | "current" | "time" | "unknown" };

function channelNumberOf(header: string): number | null {
  const match = CHANNEL_IN_KEY.exec(header);
  return match?.[1] ? Number(match[1]) : null;
}

/**
 * Probe ratios the preamble states, keyed by column header. A line naming a channel ("CH2 Probe")
 * applies to the column of that number; a line naming none applies to every voltage column (a
 * current probe states its ratio in V/A, which is not a plain ratio), or position by position when
 * it lists one ratio per channel column. Lines naming a channel win over lines naming none.
 */
export function probeScalesFromPreamble(metadata: Record<string, string>, columns: readonly PreambleColumn[]): Record<string, PreambleScale> {
  const channels = columns.filter((c) => c.kind !== "time");
  const out: Record<string, PreambleScale> = {};
  const global: Record<string, PreambleScale> = {};
  for (const [key, value] of Object.entries(metadata)) {
    const statement = value ? `${key}: ${value}` : key;
    if (!PROBE_KEY.test(key)) continue;
    const number = channelNumberOf(key);
    const tokens = value.split(/\s+/).filter((t) => t !== "");
    if (number !== null) {
      const ratio = tokens.length > 0 ? readProbeRatio(value) ?? trailingRatio(value) : trailingRatio(key);
      const column = channels.find((c) => channelNumberOf(c.header) === number);
      if (ratio !== null && column) out[column.header] = { scale: ratio, statement };
      continue;
    }
    const each = tokens.map(readProbeRatio);
    if (tokens.length > 1 && tokens.length === channels.length && each.every((r) => r !== null)) {
      channels.forEach((c, i) => (global[c.header] = { scale: each[i] as number, statement }));
      continue;
    }
    const ratio = tokens.length > 0 ? readProbeRatio(value) : trailingRatio(key);
    if (ratio === null) continue;
    for (const c of channels) if (c.kind === "voltage" || c.kind === "unknown") global[c.header] = { scale: ratio, statement };
  }
  return { ...global, ...out };
}

/**
 * The probe ratio of every column (undefined where none applies, and for time) and what was
 * applied: the caller's ratio where given, else the preamble's. One rule for both parse paths.
 */
export function columnProbeScales(
  layout: { metadata: Record<string, string>; headers: readonly string[]; units: readonly ({ kind: PreambleColumn["kind"] } | undefined)[]; timeColumn: number | null },
  calibration: Record<string, { scale?: number }> | undefined,
): { scales: (number | undefined)[]; applied: AppliedProbeScale[] } {
  const stated = probeScalesFromPreamble(layout.metadata, layout.headers.map((header, index) => ({ header, kind: index === layout.timeColumn ? "time" : (layout.units[index]?.kind ?? "unknown") })));
  const applied: AppliedProbeScale[] = [];
  const scales = layout.headers.map((header, index) => {
    if (index === layout.timeColumn) return calibration?.[header]?.scale;
    const given = calibration?.[header]?.scale;
    const fromFile = given === undefined ? stated[header] : undefined;
    const scale = given ?? fromFile?.scale;
    if (scale !== undefined) applied.push({ channel: header, scale, from: fromFile ? "preamble" : "caller", statement: fromFile?.statement ?? null });
    return scale;
  });
  return { scales, applied };
}
