import { describe, expect, it } from "vitest";
import { marginOf } from "@/lib/verdicts/margin";

const verdict = (measured: number) => ({ check: "voltage" as const, measured, unit: "V", lower: 380, upper: 420 });

describe("marginOf edges (pins: a figure on a limit is inside it, docs/analysis-report.md)", () => {
  it("marginOf at the lower and upper limits reads inside, at distance 0", () => {
    expect(marginOf(verdict(380))).toMatchObject({ side: "lower", distance: 0, inside: true });
    expect(marginOf(verdict(420))).toMatchObject({ side: "upper", distance: 0, inside: true });
  });

  it("marginOf halfway between the limits keeps the lower one, 20 V above it (tie, by hand)", () => {
    expect(marginOf(verdict(400))).toMatchObject({ side: "lower", distance: 20, inside: true });
  });
});
