/**
 * Command-line analysis for bench PCs and scripts.
 *   npm run analyse -- <file.csv> [options]     (npm run analyse -- --help lists them, with units)
 * Exit 0 on success, 2 when the input (file or arguments) is rejected, 1 on an internal error.
 * With --json the script writes the report alone; `npm run -s analyse -- …` keeps npm's own banner
 * off stdout too.
 */
import { readFile } from "node:fs/promises";
import {
  CaptureRejection,
  analyseCapture,
  analysisOptionsSchema,
  ratingSchema,
  toleranceProfileSchema,
  PRESET_IDS,
  profileFromPreset,
  type PresetId,
  type Rating,
  type AnalysisReport,
  type ToleranceProfile,
} from "@/lib/analysis";
import { readCaptureFile } from "@/lib/server/capture-reader";
import { HELP, parseArguments, UsageError } from "./analyse-args";
import { formatTable } from "./bench/table";

async function readJson(path: string, what: string): Promise<unknown> {
  try {
    return JSON.parse(await readFile(path, "utf8"));
  } catch (error) {
    throw new UsageError(`Cannot read the ${what} ${path}: ${(error as Error).message}`);
  }
}

async function loadTolerance(spec: string, rating: Rating | undefined): Promise<ToleranceProfile> {
  if ((PRESET_IDS as readonly string[]).includes(spec)) {
    if (!rating) throw new UsageError("--tolerance with a preset needs --rating: the bands depend on the nameplate");
    return profileFromPreset(spec as PresetId, rating);
  }
  if (!spec.endsWith(".json")) throw new UsageError(`--tolerance: no preset "${spec}"; presets are ${PRESET_IDS.join(", ")}`);
  const result = toleranceProfileSchema.safeParse(await readJson(spec, "tolerance profile"));
  if (!result.success) throw new UsageError(`Tolerance profile ${spec} is not valid: ${result.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("; ")}`);
  return result.data;
}

const fmt = (value: number | null | undefined, digits = 4): string => (value === null || value === undefined ? "—" : Number(value.toPrecision(digits)).toString());

function printSummary(file: string, report: AnalysisReport): void {
  const out: string[] = [];
  out.push(`${file}: ${report.sampleCount} samples at ${fmt(report.sampleRateHz, 6)} S/s (${fmt(report.durationS)} s)`);
  out.push(`Frequency ${fmt(report.frequencyHz, 8)} Hz over ${report.cyclesAnalysed} whole cycles (zero crossings: ${fmt(report.frequencyZeroCrossingHz, 8)} Hz), reference "${report.referenceChannel}"`);
  out.push("");
  out.push(
    formatTable([
      ["channel", "role", "RMS", "DC", "peak", "crest", "fund. RMS", "phase °", "THD-F %", "THD-R %", "THF %", "TIF", "dev. %"],
      ...report.channels.map((c) => [
        c.id, c.role, `${fmt(c.rms, 6)} ${c.unit}`, fmt(c.dc, 3), fmt(c.peak, 5), fmt(c.crestFactor), fmt(c.fundamental.rms, 6), fmt(c.fundamental.phaseDeg, 5),
        fmt(c.thdFPercent), fmt(c.thdRPercent), fmt(c.thfPercent, 3), fmt(c.tif, 3), fmt(c.deviationFactorPercent, 3),
      ]),
    ]),
  );
  const tp = report.threePhase;
  if (tp) {
    out.push("");
    out.push(`Three-phase (${tp.basis}): sequence ${tp.sequence}; displacement ab ${fmt(tp.displacementDeg.ab, 6)}°, bc ${fmt(tp.displacementDeg.bc, 6)}°, ca ${fmt(tp.displacementDeg.ca, 6)}°`);
    out.push(`  V1 ${fmt(tp.sequenceComponents.positive, 6)}  V2 ${fmt(tp.sequenceComponents.negative, 4)}  V0 ${fmt(tp.sequenceComponents.zero, 4)}  unbalance NEMA ${fmt(tp.unbalance.nemaPercent, 3)} %  IEEE ${fmt(tp.unbalance.ieeePercent, 3)} %  VUF ${fmt(tp.unbalance.vufPercent, 3)} %`);
    out.push(`  line-line: ${tp.lineToLine.map((line) => `${line.id} ${fmt(line.rms, 6)} V (${line.source})`).join(", ")}`);
  }
  const be = report.backEmf;
  if (be) {
    out.push("");
    out.push(`Back-EMF at ${be.speedRpm} rpm, ${be.poles} poles (expected ${fmt(be.expectedFrequencyHz, 6)} Hz; 120·f/n = ${fmt(be.polesFromFrequency, 5)}):`);
    out.push(`  Ke ${fmt(be.keLineRmsPerKrpm, 6)} V_LL,rms/krpm, ${fmt(be.keLinePeakPerKrpm, 6)} V_LL,pk/krpm, ${fmt(be.kePhasePeakPerRadS, 6)} V_ph,pk·s/rad; Kt ≈ ${fmt(be.ktNmPerArms, 5)} N·m/A_rms`);
    if (be.keLineRmsPerKrpmAtReference != null) out.push(`  Ke at ${be.referenceTemperatureC} °C: ${fmt(be.keLineRmsPerKrpmAtReference, 6)} V_LL,rms/krpm`);
  }
  if (report.power) {
    out.push("");
    out.push(
      formatTable([
        ["power", "P W", "P1 W", "Q1 var", "S VA", "PF", "PF1"],
        ...report.power.phases.map((p) => [`${p.voltageId} × ${p.currentId}`, fmt(p.activePowerW, 6), fmt(p.fundamentalActivePowerW, 6), fmt(p.fundamentalReactivePowerVar, 6), fmt(p.apparentPowerVa, 6), fmt(p.powerFactor), fmt(p.fundamentalPowerFactor)]),
        ["total", fmt(report.power.total.activePowerW, 6), fmt(report.power.total.fundamentalActivePowerW, 6), fmt(report.power.total.fundamentalReactivePowerVar, 6), fmt(report.power.total.effectiveApparentPowerVa, 6), fmt(report.power.total.powerFactor), ""],
      ]),
    );
  }
  if (report.verdicts.length > 0) {
    out.push("");
    out.push(
      formatTable([
        ["check", "measured", "lower", "upper", "status"],
        ...report.verdicts.map((v) => [v.label, typeof v.measured === "number" ? `${fmt(v.measured, 5)} ${v.unit}` : (v.measured ?? "—"), fmt(v.lower, 5), fmt(v.upper, 5), v.status]),
      ]),
    );
    out.push(`Overall: ${report.overall} (advisory; release of a unit is a person's decision)`);
  }
  if (report.warnings.length > 0) {
    out.push("");
    out.push("Warnings:");
    for (const warning of report.warnings) out.push(`  [${warning.code}] ${warning.message}`);
  }
  console.log(out.join("\n"));
}

async function main(): Promise<number> {
  try {
    const args = parseArguments(process.argv.slice(2));
    if (args.help) {
      process.stdout.write(`${HELP}\n`);
      return 0;
    }
    if (args.ratingPath) {
      const rating = ratingSchema.safeParse(await readJson(args.ratingPath, "rating"));
      if (!rating.success) throw new UsageError(`Rating ${args.ratingPath} is not valid: ${rating.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("; ")}`);
      args.options.rating = rating.data;
    }
    if (args.tolerance) args.options.profile = await loadTolerance(args.tolerance, args.options.rating);
    const checked = analysisOptionsSchema.safeParse(args.options);
    if (!checked.success) throw new UsageError(`Invalid options: ${checked.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("; ")}`);
    const capture = await readCaptureFile(args.file, { calibration: args.calibration, ...(args.sampleRateHz ? { sampleRateHz: args.sampleRateHz } : {}) });
    const report = analyseCapture(capture, args.options);
    if (args.json) process.stdout.write(`${JSON.stringify(report)}\n`);
    else printSummary(args.file, report);
    return 0;
  } catch (error) {
    if (error instanceof CaptureRejection || error instanceof UsageError) {
      process.stderr.write(`Rejected: ${error.message}\n`);
      return 2;
    }
    if (error instanceof Error && "code" in error && (error as NodeJS.ErrnoException).code === "ENOENT") {
      process.stderr.write(`Rejected: no such file: ${(error as NodeJS.ErrnoException).path}\n`);
      return 2;
    }
    process.stderr.write(`Internal error: ${error instanceof Error ? error.message : String(error)}\n`);
    return 1;
  }
}

process.exitCode = await main();
