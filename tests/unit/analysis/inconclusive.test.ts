import { describe, expect, it } from "vitest";
import { rejectionOf } from "./rejection-of";
import { analyseCapture, CaptureRejection, judgeReport, parseCaptureText, type AnalysisReport } from "@/lib/analysis";
import { largestSafeMagnitude, MIN_PEAK_TO_PEAK } from "@/lib/analysis/sample-check";
import { CLIPPING_INVALIDATES, FEW_CYCLES_INVALIDATES, SAMPLE_RATE_INVALIDATES } from "@/lib/analysis/invalidation";
import { captureOf, synthesise } from "./signals";
import { lineSet, pmProfile, pmRating } from "./judged-report";

/** CSV text of a time column and the given channels, as a bench export writes it. */
function csv(sampleRateHz: number, channels: { id: string; samples: Float64Array }[], format = (v: number) => v.toPrecision(12)): string {
  const rows = [`Time (s),${channels.map((c) => c.id).join(",")}`];
  const n = channels[0]!.samples.length;
  for (let i = 0; i < n; i++) rows.push([(i / sampleRateHz).toPrecision(12), ...channels.map((c) => format(c.samples[i]!))].join(","));
  return rows.join("\n") + "\n";
}


const statuses = (report: AnalysisReport) => Object.fromEntries(report.verdicts.map((v) => [v.check, v.status]));
const judge = { rating: pmRating, profile: pmProfile, speedRpm: 1500 };

describe("analyseCapture rejections of values", () => {
  const sine = (amplitude: number) => synthesise([{ order: 1, amplitude }], 50, 10000, 2001);

  it("parseCaptureText refuses a file around 1e200 at its first such value, naming line and column (no measurement is that large)", () => {
    const error = rejectionOf(() => parseCaptureText(csv(10000, [{ id: "CH1 (V)", samples: sine(1e200) }])));
    expect(error.message).toMatch(/line \d+/);
    expect(error.message).toMatch(/CH1 \(V\)/);
  });

  it("analyseCapture rejects samples around 1e200 that reach it (its squares overflow), naming the column and row (IEEE 754 double range)", () => {
    const parsed = captureOf([{ id: "CH1 (V)", samples: sine(1e200) }], 10000);
    const error = rejectionOf(() => analyseCapture(parsed, judge));
    expect(error.code).toBe("value-overflow");
    expect(error.column).toBe("CH1 (V)");
    expect(error.message).toMatch(/sample row \d+/);
    expect(error.message).toMatch(/CH1 \(V\)/);
  });

  it("analyseCapture rejects a file around 1e-320 (subnormal: below 1 nV peak to peak), naming the column (IEEE 754 subnormal range)", () => {
    const parsed = parseCaptureText(csv(10000, [{ id: "CH1 (V)", samples: sine(1e-320) }], (v) => v.toExponential(3)));
    expect(parsed.channels[0]!.samples.some((v) => v !== 0 && Math.abs(v) < 2.2250738585072014e-308)).toBe(true);
    const error = rejectionOf(() => analyseCapture(parsed, judge));
    expect(error.code).toBe("value-too-small");
    expect(error.column).toBe("CH1 (V)");
  });

  it("parseCaptureText refuses a cell beyond the double range (1e400) with its line and column (IEEE 754)", () => {
    const text = csv(10000, [{ id: "V1", samples: sine(325) }]).replace(/\n(0\.0100000000000,)[^\n]+/, "\n$11e400");
    const error = rejectionOf(() => parseCaptureText(text));
    expect(error.line).toBe(102);
    expect(error.column).toBe("V1");
  });

  it("analyseCapture rejects samples a probe ratio pushed past the double range, naming the column and row (IEEE 754)", () => {
    // What a 1e10 probe ratio makes of samples around 1e300 (the parser now refuses such values itself).
    const parsed = captureOf([{ id: "V1", samples: sine(1e300).map((v) => v * 1e10) }], 10000);
    const error = rejectionOf(() => analyseCapture(parsed, judge));
    expect(error.code).toBe("value-not-finite");
    expect(error.column).toBe("V1");
    expect(error.message).toMatch(/sample row 1\b/);
  });

  it("analyseCapture's limits sit where the double range puts them: the largest safe sample squared and summed stays finite (IEEE 754)", () => {
    const n = 4001;
    const limit = largestSafeMagnitude(n);
    expect(Number.isFinite(limit * limit * n * 16)).toBe(true);
    expect(limit).toBeLessThan(1e154);
    expect(limit).toBeGreaterThan(1e150);
    expect(MIN_PEAK_TO_PEAK).toBe(1e-9);
  });

  it("analyseCapture accepts a 1 µV signal and an idle (all-zero) current channel (above the 1 nV floor, documented)", () => {
    const report = analyseCapture(captureOf([{ id: "V", samples: sine(1e-6) }, { id: "I", unit: "A", samples: new Float64Array(2001) }], 10000));
    expect(report.channels[0]!.rms).toBeCloseTo(1e-6 / Math.SQRT2, 12);
  });
});

describe("analyseCapture warnings that invalidate checks", () => {
  it("analyseCapture makes exactly the distortion checks of a clipped set inconclusive, with the warning as the reason (DOMAIN §10)", () => {
    const set = lineSet(400).map((c) => ({ ...c, samples: c.samples.map((v) => Math.max(-0.9 * 400 * Math.SQRT2, Math.min(0.9 * 400 * Math.SQRT2, v))) }));
    const report = analyseCapture(captureOf(set, 20000), judge);
    const clipping = report.warnings.find((w) => w.code === "clipping")!;
    expect(clipping.invalidates).toEqual(CLIPPING_INVALIDATES);
    const s = statuses(report);
    for (const check of CLIPPING_INVALIDATES) expect(s[check]).toBe("inconclusive");
    expect(report.verdicts.find((v) => v.check === "thd")!.reason).toContain(clipping.message);
    for (const check of ["voltage", "frequency", "voltage-unbalance", "phase-displacement", "phase-sequence", "back-emf-constant", "pole-count"]) expect(s[check]).not.toBe("inconclusive");
    expect(report.overall).toBe("inconclusive");
    // Re-judged from the stored figures, the same verdicts.
    expect(judgeReport(report, judge).verdicts).toEqual(report.verdicts);
  });

  it("analyseCapture keeps a heavy THD failure inconclusive when the set is clipped (a clipped waveform's THD is not the machine's)", () => {
    const set = lineSet(400, 20000, 4001, 0.1).map((c) => ({ ...c, samples: c.samples.map((v) => Math.max(-500, Math.min(500, v))) }));
    const report = analyseCapture(captureOf(set, 20000), judge);
    expect(report.verdicts.find((v) => v.check === "thd")!.status).toBe("inconclusive");
    expect(report.channels[0]!.thdFPercent!).toBeGreaterThan(5);
  });

  it("analyseCapture leaves voltage distortion judged when only a current channel clips (the warning names its channel)", () => {
    const current = synthesise([{ order: 1, amplitude: 10 }], 50, 20000, 4001).map((v) => Math.max(-8, Math.min(8, v)));
    const report = analyseCapture(captureOf([...lineSet(400), { id: "ia", unit: "A", samples: current }], 20000), judge);
    expect(report.warnings.find((w) => w.code === "clipping")!.channel).toBe("ia");
    expect(statuses(report).thd).toBe("pass");
  });

  it("analyseCapture makes the whole-cycle checks of a 3-cycle capture inconclusive, RMS voltage and sequence judged (few-cycles rule)", () => {
    const report = analyseCapture(captureOf(lineSet(400, 20000, 1300), 20000), judge);
    expect(report.cyclesAnalysed).toBe(3);
    const s = statuses(report);
    for (const check of FEW_CYCLES_INVALIDATES) expect(s[check]).toBe("inconclusive");
    expect(s.voltage).toBe("pass");
    expect(s["phase-sequence"]).toBe("pass");
    expect(report.verdicts.find((v) => v.check === "frequency")!.reason).toMatch(/Only 3 whole cycles/);
  });

  it("analyseCapture makes the harmonic checks inconclusive when fs is too low for order 50 (fs > 2·H·f1 = 5 kS/s, Nyquist)", () => {
    const report = analyseCapture(captureOf(lineSet(400, 2000, 401), 2000), judge);
    const s = statuses(report);
    for (const check of SAMPLE_RATE_INVALIDATES) expect(s[check]).toBe("inconclusive");
    expect(s.voltage).toBe("pass");
    expect(s.frequency).toBe("pass");
    expect(report.verdicts.find((v) => v.check === "thd")!.reason).toMatch(/harmonics stop at order 19/);
  });

  it("judgeReport applies the same rules to a report stored before warnings listed their checks (engine 2.0.0 reports)", () => {
    const clean = analyseCapture(captureOf(lineSet(400), 20000), judge);
    const legacy = { ...clean, warnings: [{ code: "clipping", message: "Channel \"vab\" has 4 flat tops at its extreme value" }] };
    const s = statuses(judgeReport(legacy, judge));
    expect(s.thd).toBe("inconclusive");
    expect(s.voltage).toBe("pass");
  });
});
