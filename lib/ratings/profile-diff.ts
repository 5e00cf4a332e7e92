import { CHECK_IDS, CHECK_LABELS, describeSource, type ToleranceProfile } from "@/lib/analysis";
import { describeBand } from "./labels";

const sourceOf = (rule: ToleranceProfile["checks"][keyof ToleranceProfile["checks"]]) => (rule.required ? describeSource(rule.source) : "");

/** What changed from one profile version to the next, one sentence per change. */
export function diffProfiles(before: ToleranceProfile, after: ToleranceProfile): string[] {
  const out: string[] = [];
  const setting = (label: string, a: number, b: number, unit: string) => {
    if (a !== b) out.push(`${label}: ${a}${unit} → ${b}${unit}`);
  };
  setting("Marginal zone", before.marginalZonePercent, after.marginalZonePercent, " %");
  setting("Highest harmonic order", before.harmonicOrder, after.harmonicOrder, "");
  setting("Plausibility factor", before.plausibilityFactor, after.plausibilityFactor, "×");
  const rule = (r: string | undefined) => (r === "guarded" ? "guarded acceptance (w = U)" : "simple acceptance");
  if (rule(before.decisionRule) !== rule(after.decisionRule)) out.push(`Decision rule: ${rule(before.decisionRule)} → ${rule(after.decisionRule)}`);
  for (const id of CHECK_IDS) {
    const a = before.checks[id];
    const b = after.checks[id];
    const bandA = describeBand(id, a);
    const bandB = describeBand(id, b);
    if (bandA !== bandB) out.push(`${CHECK_LABELS[id]}: ${bandA} → ${bandB}`);
    else if (sourceOf(a) !== sourceOf(b)) out.push(`${CHECK_LABELS[id]}: source ${sourceOf(a)} → ${sourceOf(b)}`);
  }
  return out;
}
