import { describe, expect, it } from "vitest";
import { marginOf } from "@/lib/verdicts/margin";

const thd = { check: "thd", unit: "%", lower: null, upper: 5 };

describe("marginOf(verdict)", () => {
  it("measures a figure over its upper limit from that limit (hand calculation)", () => {
    // 5.4 − 5 = 0.4 above; resolution 0.01 % from the table in format-figure.ts.
    expect(marginOf({ ...thd, measured: 5.4 })).toMatchObject({ side: "upper", limit: 5, inside: false, words: "0.40 % above the upper limit 5.00 %" });
    expect(marginOf({ ...thd, measured: 5.4 })!.distance).toBeCloseTo(0.4, 12);
  });

  it("takes the nearer limit of a two-sided band when the figure is inside (hand calculation)", () => {
    const voltage = { check: "voltage", unit: "V", lower: 380, upper: 420 };
    expect(marginOf({ ...voltage, measured: 417.8 })).toMatchObject({ side: "upper", inside: true, words: "2.200 V below the upper limit 420.0 V" });
    expect(marginOf({ ...voltage, measured: 381.25 })).toMatchObject({ side: "lower", inside: true, words: "1.250 V above the lower limit 380.0 V" });
    expect(marginOf({ ...voltage, measured: 371 })).toMatchObject({ side: "lower", inside: false, words: "9.000 V below the lower limit 380.0 V" });
  });

  it("says 'at' a figure exactly on its limit and is null for words, missing figures and checks without limits", () => {
    expect(marginOf({ ...thd, measured: 5 })?.words).toBe("at the upper limit 5.00 %");
    expect(marginOf({ ...thd, measured: "negative" })).toBeNull();
    expect(marginOf({ ...thd, measured: null })).toBeNull();
    expect(marginOf({ ...thd, upper: null, measured: 3 })).toBeNull();
  });
});
