/**
 * Command-line analysis for bench PCs and scripts.
 *   npm run analyse -- <file.csv> [--channel "<header>=<role>"]... [--speed-rpm N] [--poles N]
 *     [--rating rating.json] [--tolerance <preset id | profile.json>] [--harmonics N]
 *     [--sample-rate HZ] [--probe "<header>=<ratio>"]... [--offset "<header>=<SI value>"]...
 *     [--magnet-temp C [--reference-temp C] [--magnet ndfeb|smco|ferrite]]
 *     [--iec-groups] [--worst-cycle] [--json]
 * Exit 0 on success, 2 when the input (file or arguments) is rejected, 1 on an internal error.
 * With --json the script writes the report alone; `npm run -s analyse -- …` keeps npm's own banner
 * off stdout too.
 */
import { readFile } from "node:fs/promises";
import {
  CHANNEL_ROLES,
  CaptureRejection,
  analyseCapture,
  analysisOptionsSchema,
  ratingSchema,
  toleranceProfileSchema,
  PRESET_IDS,
  profileFromPreset,
  type PresetId,
  type Rating,
  type AnalysisOptions,
  type AnalysisReport,
  type ChannelCalibration,
  type ChannelRole,
  type ToleranceProfile,
} from "@/lib/analysis";
import { readCaptureFile } from "@/lib/server/capture-reader";
import { formatTable } from "./bench/table";

class UsageError extends Error {}

interface CliArguments {
  file: string;
  json: boolean;
  sampleRateHz?: number;
  calibration: Record<string, ChannelCalibration>;
  magnet: { measuredC?: number; referenceC?: number; material?: string };
  options: AnalysisOptions;
  ratingPath?: string;
  tolerance?: string;
}

function positiveNumber(flag: string, text: string | undefined): number {
  const value = Number(text);
  if (text === undefined || !Number.isFinite(value) || value <= 0) throw new UsageError(`${flag} needs a positive number, got ${text ?? "nothing"}`);
  return value;
}

function parseArguments(argv: string[]): CliArguments {
  const roles: Record<string, ChannelRole> = {};
  const parsed: CliArguments = { file: "", json: false, options: {}, calibration: {}, magnet: {} };
  const headerValue = (flag: string, spec: string | undefined): [string, number] => {
    const split = (spec ?? "").lastIndexOf("=");
    const value = Number((spec ?? "").slice(split + 1));
    if (split <= 0 || !Number.isFinite(value)) throw new UsageError(`${flag} needs "<column header>=<number>", got "${spec ?? ""}"`);
    return [(spec ?? "").slice(0, split), value];
  };
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i] as string;
    const next = (): string | undefined => argv[++i];
    switch (arg) {
      case "--json":
        parsed.json = true;
        break;
      case "--channel": {
        const spec = next() ?? "";
        const split = spec.lastIndexOf("=");
        const role = spec.slice(split + 1) as ChannelRole;
        if (split <= 0 || !CHANNEL_ROLES.includes(role)) {
          throw new UsageError(`--channel needs "<column header>=<role>" with role one of ${CHANNEL_ROLES.join(", ")}; got "${spec}"`);
        }
        roles[spec.slice(0, split)] = role;
        break;
      }
      case "--speed-rpm":
        parsed.options.speedRpm = positiveNumber(arg, next());
        break;
      case "--poles":
        parsed.options.poles = positiveNumber(arg, next());
        break;
      case "--harmonics":
        parsed.options.harmonics = positiveNumber(arg, next());
        break;
      case "--sample-rate":
        parsed.sampleRateHz = positiveNumber(arg, next());
        break;
      case "--probe": {
        const [header, ratio] = headerValue(arg, next());
        parsed.calibration[header] = { ...parsed.calibration[header], scale: ratio };
        break;
      }
      case "--offset": {
        const [header, offset] = headerValue(arg, next());
        parsed.calibration[header] = { ...parsed.calibration[header], offset };
        break;
      }
      case "--rating":
        parsed.ratingPath = next();
        break;
      case "--tolerance":
        parsed.tolerance = next();
        break;
      case "--magnet-temp":
        parsed.magnet.measuredC = Number(next());
        break;
      case "--reference-temp":
        parsed.magnet.referenceC = Number(next());
        break;
      case "--magnet":
        parsed.magnet.material = next();
        break;
      case "--iec-groups":
        parsed.options.groupingIec = true;
        break;
      case "--worst-cycle":
        parsed.options.deviationBasis = "worst-cycle";
        break;
      default:
        if (arg.startsWith("--")) throw new UsageError(`Unknown option ${arg}`);
        if (parsed.file) throw new UsageError(`Only one capture file, got "${parsed.file}" and "${arg}"`);
        parsed.file = arg;
    }
  }
  if (!parsed.file) throw new UsageError("Give a capture file: npm run analyse -- <file.csv> [options]");
  if (Object.keys(roles).length > 0) parsed.options.channelRoles = roles;
  if (parsed.magnet.measuredC !== undefined) {
    // Checked with the rest of the options by analysisOptionsSchema.
    parsed.options.magnetTemperature = parsed.magnet as NonNullable<AnalysisOptions["magnetTemperature"]>;
  }
  return parsed;
}

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
