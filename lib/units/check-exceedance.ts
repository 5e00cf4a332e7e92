// How far a judged figure lies beyond its band, for the review queue. Pure.

export type JudgedCheck = {
  check: string; label: string; measured: number | string | null; unit: string;
  lower: number | null; upper: number | null; status: string; reason?: string | null;
};

export type CheckFinding = {
  check: string; label: string; status: "fail" | "inconclusive"; measured: string; limit: string; unit: string;
  /** Beyond the nearer violated edge, in the figure's unit and as a percentage of that edge; null when not numeric. */
  exceedance: { amount: number; percentOfLimit: number | null; side: "above" | "below" } | null;
  reason: string | null;
};

const fmt = (value: number, unit: string) => `${Number(value.toPrecision(4))}${unit ? ` ${unit}` : ""}`;

export function describeLimit(c: Pick<JudgedCheck, "lower" | "upper" | "unit">): string {
  if (c.lower !== null && c.upper !== null) return `${fmt(c.lower, "")} to ${fmt(c.upper, c.unit)}`;
  if (c.upper !== null) return `at most ${fmt(c.upper, c.unit)}`;
  if (c.lower !== null) return `at least ${fmt(c.lower, c.unit)}`;
  return "no numeric limit";
}

/** measured − upper above the band, lower − measured below it; percent of |edge| (null when the edge is 0). */
export function exceedanceOf(c: Pick<JudgedCheck, "measured" | "lower" | "upper">): CheckFinding["exceedance"] {
  if (typeof c.measured !== "number" || !Number.isFinite(c.measured)) return null;
  const pct = (amount: number, edge: number) => (edge === 0 ? null : (100 * amount) / Math.abs(edge));
  if (c.upper !== null && c.measured > c.upper) {
    const amount = c.measured - c.upper;
    return { amount, percentOfLimit: pct(amount, c.upper), side: "above" };
  }
  if (c.lower !== null && c.measured < c.lower) {
    const amount = c.lower - c.measured;
    return { amount, percentOfLimit: pct(amount, c.lower), side: "below" };
  }
  return null;
}

/** The failing and inconclusive checks of one result, worded for a queue row. */
export function findingsOf(checks: readonly JudgedCheck[]): CheckFinding[] {
  return checks.flatMap((c) => {
    if (c.status !== "fail" && c.status !== "inconclusive") return [];
    const measured = c.measured === null ? "not measured" : typeof c.measured === "number" ? fmt(c.measured, c.unit) : c.measured;
    return [{ check: c.check, label: c.label, status: c.status, measured, limit: describeLimit(c), unit: c.unit, exceedance: c.status === "fail" ? exceedanceOf(c) : null, reason: c.reason ?? null }];
  });
}

export function describeExceedance(e: NonNullable<CheckFinding["exceedance"]>, unit: string): string {
  const pct = e.percentOfLimit === null ? "" : ` (${Number(e.percentOfLimit.toPrecision(3))} % of the limit)`;
  return `${fmt(e.amount, unit)} ${e.side} the limit${pct}`;
}
