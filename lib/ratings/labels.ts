import type { ChannelRole, CheckId, CheckRule } from "@/lib/analysis";

// Human labels for what a rating, its profile and its plan hold (browser-safe: no server imports).

export const CHANNEL_ROLE_LABELS: Record<ChannelRole, string> = {
  v: "Single voltage", van: "Phase A–N", vbn: "Phase B–N", vcn: "Phase C–N",
  vab: "Line A–B", vbc: "Line B–C", vca: "Line C–A", ia: "Current A", ib: "Current B", ic: "Current C",
};

export const PLAN_TEST_KIND_LABELS: Record<"no-load" | "load" | "back-emf" | "other", string> = {
  "no-load": "No-load (open circuit)", load: "Load", "back-emf": "Back-EMF (PM, driven)", other: "Other",
};

export const UNBALANCE_DEFINITION_LABELS = {
  nema: "NEMA line-voltage deviation from the mean",
  ieee: "IEEE phase-voltage deviation from the mean",
  vuf: "voltage unbalance factor (negative / positive sequence)",
} as const;

export const SEQUENCE_LABELS = { positive: "positive (A-B-C)", negative: "negative (A-C-B)" } as const;

/** What the relative band of each check is a percentage of. */
const RELATIVE_TO: Partial<Record<CheckId, string>> = {
  voltage: "rated voltage",
  frequency: "rated frequency",
  "back-emf-constant": "nominal Ke",
  "pole-count": "the frequency the rated poles imply at the measured speed",
};

const pct = (n: number) => `${n > 0 ? "+" : n < 0 ? "−" : ""}${Math.abs(n)} %`;

/** A band in words with its unit, e.g. "−5 % to +5 % of rated voltage", "at most 5 %". */
export function describeBand(check: CheckId, rule: CheckRule): string {
  if (!rule.required) return `Not required: ${rule.reason}`;
  if ("lowerPercent" in rule) return `${pct(rule.lowerPercent)} to ${pct(rule.upperPercent)} of ${RELATIVE_TO[check] ?? "nominal"}`;
  if ("definition" in rule) return `at most ${rule.maxPercent} % (${UNBALANCE_DEFINITION_LABELS[rule.definition]})`;
  if ("maxPercent" in rule) return `at most ${rule.maxPercent} %`;
  if ("toleranceDeg" in rule) return `within ± ${rule.toleranceDeg}° of the ideal phase spacing`;
  if ("expected" in rule) return `must be ${SEQUENCE_LABELS[rule.expected]}`;
  if ("max" in rule) return `at most ${rule.max} (TIF, dimensionless)`;
  return "judged";
}
