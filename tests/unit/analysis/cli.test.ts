import { spawnSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { analysisReportSchema } from "@/lib/analysis";
import { FIXTURE_DIR } from "./fixtures";

const ROOT = path.resolve(import.meta.dirname, "../../..");

function analyse(...args: string[]) {
  return spawnSync(process.execPath, ["--import", "tsx", path.join(ROOT, "scripts/analyse.ts"), ...args], { cwd: ROOT, encoding: "utf8" });
}

describe("scripts/analyse.ts", () => {
  it("analyse --json prints a schema-valid report alone on stdout and exits 0 (contract)", () => {
    const result = analyse(path.join(FIXTURE_DIR, "layouts", "bench-layout.csv"), "--json", "--speed-rpm", "1500", "--harmonics", "30");
    expect(result.status).toBe(0);
    const report = analysisReportSchema.parse(JSON.parse(result.stdout));
    expect(report.backEmf?.poles).toBe(4);
    expect(report.threePhase?.basis).toBe("line-line");
    const probed = analyse(path.join(FIXTURE_DIR, "layouts", "bench-layout.csv"), "--json", "--probe", "V_AB (V)=10");
    expect(probed.status).toBe(0);
    const scaled = analysisReportSchema.parse(JSON.parse(probed.stdout));
    expect(scaled.channels[0]!.rms / report.channels[0]!.rms).toBeCloseTo(10, 9);
  }, 30_000);

  it("analyse prints a summary table and applies --channel roles and a rating (contract)", () => {
    const dir = mkdtempSync(path.join(tmpdir(), "emfolio-cli-"));
    const ratingPath = path.join(dir, "rating.json");
    writeFileSync(ratingPath, JSON.stringify({ machineKind: "wound-field-alternator", nominalVoltageV: 400, voltageBasis: "line-line-rms", frequencyHz: 50, phases: 3, connection: "star", poles: 4, ratedSpeedRpm: 1500 }));
    const result = analyse(path.join(FIXTURE_DIR, "layouts", "tab-units-row.csv"), "--channel", "Channel A=van", "--channel", "Channel C=ia", "--rating", ratingPath, "--tolerance", "iso-8528-5-g2");
    expect(result.status).toBe(0);
    expect(result.stdout).toMatch(/Channel A\s+van/);
    expect(result.stdout).toMatch(/Channel C\s+ia/);
    expect(result.stdout).toContain("Overall:");
  }, 30_000);

  it("analyse exits 2 with the located message on stderr for a rejected file (contract)", () => {
    const result = analyse(path.join(FIXTURE_DIR, "rejects", "non-numeric-cell.csv"));
    expect(result.status).toBe(2);
    expect(result.stdout).toBe("");
    expect(result.stderr).toContain('line 32, column "V_AN (V)"');
  }, 30_000);

  it("analyse exits 2 for a bad argument or a missing file (contract)", () => {
    expect(analyse(path.join(FIXTURE_DIR, "layouts", "comma-point.csv"), "--channel", "V_AN (V)=vx").status).toBe(2);
    const poles = analyse(path.join(FIXTURE_DIR, "layouts", "comma-point.csv"), "--poles", "3.5");
    expect(poles.status).toBe(2);
    expect(poles.stderr).toContain("poles");
    const missing = analyse(path.join(FIXTURE_DIR, "nope.csv"));
    expect(missing.status).toBe(2);
    expect(missing.stderr).toContain("no such file");
  }, 30_000);
});
