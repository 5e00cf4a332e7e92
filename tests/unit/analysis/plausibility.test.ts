import { describe, expect, it } from "vitest";
import { analyseCapture, judgeReport, parseCaptureText, type AnalysisReport } from "@/lib/analysis";
import { levelWarning, likelyCause } from "@/lib/analysis/plausibility";
import { readProbeRatio } from "@/lib/analysis/probe-preamble";
import { lineSet, pmProfile, pmRating } from "./judged-report";

const statuses = (report: AnalysisReport) => Object.fromEntries(report.verdicts.map((v) => [v.check, v.status]));
const judge = { rating: pmRating, profile: pmProfile, speedRpm: 1500 };

/** A bench export of the 400 V set as seen through 100:1 probes recorded at 1:1, with a preamble. */
function scopeExport(preamble: string[], headers: string[], scale = 0.01): string {
  const set = lineSet(400);
  const rows = [...preamble, ["Time (s)", ...headers].join(",")];
  for (let i = 0; i < 4001; i++) rows.push([(i / 20000).toPrecision(10), ...set.map((c) => (c.samples[i]! * scale).toPrecision(10))].join(","));
  return rows.join("\r\n") + "\r\n";
}

describe("judgeReport plausibility against the rating", () => {
  it("analyseCapture flags a 400 V set recorded at 1:100 as about ×100 low and leaves voltage and Ke inconclusive, not failed (the ×100 probe case)", () => {
    const report = analyseCapture(parseCaptureText(scopeExport([], ["vab", "vbc", "vca"])), judge);
    const warning = report.warnings.find((w) => w.code === "implausible-voltage")!;
    expect(warning.level).toBe("alert");
    expect(warning.message).toMatch(/reads 4\.00 V against 400 V rated: about ×100 low: a probe ratio not applied\?/);
    expect(report.warnings.find((w) => w.code === "implausible-ke")!.message).toMatch(/Ke reads 2\.67 V\/krpm against 267 V\/krpm/);
    const s = statuses(report);
    expect(s.voltage).toBe("inconclusive");
    expect(s["back-emf-constant"]).toBe("inconclusive");
    expect(report.verdicts.find((v) => v.check === "voltage")!.reason).toContain(warning.message);
    expect(s.thd).toBe("pass");
    expect(report.overall).toBe("inconclusive");
  });

  it("analyseCapture names the channel roles when single voltages arrive on a three-phase rating (role mismatch)", () => {
    const report = analyseCapture(parseCaptureText(scopeExport([], ["CH1", "CH2", "CH3"])), { ...judge, channelRoles: { CH1: "v", CH2: "v", CH3: "v" } });
    const roles = report.warnings.find((w) => w.code === "roles-do-not-fit-rating")!;
    expect(roles.message).toMatch(/three-phase.*"CH1" as v/);
    const s = statuses(report);
    for (const check of ["voltage-unbalance", "phase-displacement", "phase-sequence", "voltage", "back-emf-constant"]) expect(s[check]).toBe("inconclusive");
    expect(report.warnings.find((w) => w.code === "implausible-voltage")!.message).toMatch(/about ×100 low/);
  });

  it("judgeReport replaces the plausibility warnings when re-judged against a profile that tolerates the level (re-judge)", () => {
    const report = analyseCapture(parseCaptureText(scopeExport([], ["vab", "vbc", "vca"])), judge);
    const loose = judgeReport(report, { rating: pmRating, profile: { ...pmProfile, plausibilityFactor: 100 } });
    expect(loose.warnings.map((w) => w.code)).not.toContain("implausible-voltage");
    expect(statuses(loose).voltage).toBe("fail");
    const again = judgeReport(loose, { rating: pmRating, profile: pmProfile });
    expect(again.warnings.filter((w) => w.code === "implausible-voltage")).toHaveLength(1);
  });

  it("analyseCapture passes the same set once the probe ratio is given (100:1 applied at parse)", () => {
    const text = scopeExport([], ["vab", "vbc", "vca"]);
    const report = analyseCapture(parseCaptureText(text, { calibration: { vab: { scale: 100 }, vbc: { scale: 100 }, vca: { scale: 100 } } }), judge);
    expect(report.warnings.filter((w) => w.level === "alert")).toEqual([]);
    expect(report.overall).toBe("pass");
    expect(report.probeScales!.map((p) => p.from)).toEqual(["caller", "caller", "caller"]);
  });

  it("levelWarning flags a level 3× or more off and not one just inside (profile plausibilityFactor 3, default)", () => {
    expect(levelWarning("implausible-voltage", "Voltage", 400 * 2.999, 400, "V", 3)).toBeNull();
    expect(levelWarning("implausible-voltage", "Voltage", 400 / 2.999, 400, "V", 3)).toBeNull();
    expect(levelWarning("implausible-voltage", "Voltage", 400 * 3, 400, "V", 3)).not.toBeNull();
    expect(levelWarning("implausible-voltage", "Voltage", 400 / 3.000001, 400, "V", 3)).not.toBeNull();
  });

  it("likelyCause names the probe ratio near a power of ten and the units near 1000 (common practice)", () => {
    expect(likelyCause(1 / 98)).toMatch(/×100 low: a probe ratio not applied/);
    expect(likelyCause(10.4)).toMatch(/×10 high: a probe ratio applied twice/);
    expect(likelyCause(1 / 1000)).toMatch(/mV read as V/);
    expect(likelyCause(1 / 5)).toMatch(/channel roles, the probe ratio and the units/);
  });
});

describe("parseCaptureText probe ratios from the preamble", () => {
  it("readProbeRatio reads 100X, x100, ×100, 10:1 and a bare number, and refuses other text (instrument conventions)", () => {
    expect(readProbeRatio("100X")).toBe(100);
    expect(readProbeRatio("x100")).toBe(100);
    expect(readProbeRatio("×100")).toBe(100);
    expect(readProbeRatio("10:1")).toBe(10);
    expect(readProbeRatio("1000")).toBe(1000);
    expect(readProbeRatio("Passive")).toBeNull();
    expect(readProbeRatio("20 dB")).toBeNull();
  });

  it("analyseCapture applies 'Probe attenuation,100X' to every voltage channel and says so (the issue's ×100 preamble)", () => {
    const text = scopeExport(["Model,BENCHSCOPE 4C", "Firmware,1.02", "Probe attenuation,100X", "Sample Interval,5e-05"], ["vab", "vbc", "vca"]);
    const parsed = parseCaptureText(text);
    expect(parsed.probeScales).toEqual(["vab", "vbc", "vca"].map((channel) => ({ channel, scale: 100, from: "preamble", statement: "Probe attenuation: 100X" })));
    const report = analyseCapture(parsed, judge);
    expect(report.probeScales).toHaveLength(3);
    expect(report.warnings.filter((w) => w.code === "probe-ratio-from-preamble").map((w) => w.level)).toEqual(["info", "info", "info"]);
    expect(report.threePhase!.lineToLine[0]!.rms).toBeCloseTo(400, 3);
    expect(report.overall).toBe("pass");
  });

  it("parseCaptureText applies per-channel statements ('CH1 Probe ×100', '# CH2 Probe: 10:1') to the matching columns only (instrument conventions)", () => {
    const text = scopeExport(["# CH1 Probe ×100", "# CH2 Probe: 10:1", "# Record length: 4001"], ["CH1 (V)", "CH2 (V)", "CH3 (V)"]);
    const parsed = parseCaptureText(text);
    expect(parsed.probeScales).toEqual([
      { channel: "CH1 (V)", scale: 100, from: "preamble", statement: "CH1 Probe ×100" },
      { channel: "CH2 (V)", scale: 10, from: "preamble", statement: "CH2 Probe: 10:1" },
    ]);
    const raw = parseCaptureText(text, { calibration: { "CH1 (V)": { scale: 1 }, "CH2 (V)": { scale: 1 } } });
    const gain = (i: number) => parsed.channels[i]!.samples[7]! / raw.channels[i]!.samples[7]!;
    expect(gain(0)).toBeCloseTo(100, 9);
    expect(gain(1)).toBeCloseTo(10, 9);
    expect(gain(2)).toBe(1);
  });

  it("parseCaptureText maps a list of ratios one per channel column, and the caller's ratio wins over the preamble (options)", () => {
    const text = scopeExport(["Probe,10:1,100:1,1:1"], ["A", "B", "C"]);
    const parsed = parseCaptureText(text, { calibration: { B: { scale: 50 } } });
    expect(parsed.probeScales).toEqual([
      { channel: "A", scale: 10, from: "preamble", statement: "Probe: 10:1 100:1 1:1" },
      { channel: "B", scale: 50, from: "caller", statement: null },
      { channel: "C", scale: 1, from: "preamble", statement: "Probe: 10:1 100:1 1:1" },
    ]);
  });

  it("parseCaptureText applies nothing without a probe statement (no probeScales field)", () => {
    expect(parseCaptureText(scopeExport(["Probe type,Passive"], ["vab", "vbc", "vca"])).probeScales).toBeUndefined();
  });
});
