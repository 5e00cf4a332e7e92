import { parseArgs } from "node:util";
import { CHANNEL_ROLES, type AnalysisOptions, type ChannelCalibration, type ChannelRole } from "@/lib/analysis";

export class UsageError extends Error {}

export const HELP = `Analyse one capture file with the Emfolio engine and print its figures (or the report as JSON).

Usage: npm run analyse -- <capture.csv> [options]

Options (units in brackets):
  --channel "<header>=<role>"  role of a column, repeatable; roles: ${CHANNEL_ROLES.join(", ")}
                               e.g. --channel "V_AB (V)=vab"
  --speed-rpm <n>              shaft speed [rpm], for Ke and poles          e.g. --speed-rpm 1500
  --poles <n>                  pole count [poles] (else from speed and f)   e.g. --poles 4
  --harmonics <n>              highest harmonic order [order], default 50   e.g. --harmonics 40
  --sample-rate <hz>           sample rate [Hz] for files with no time column or
                               with a sample-index column                   e.g. --sample-rate 20000
  --probe "<header>=<ratio>"   probe ratio [V/V or A/A] applied to a column, repeatable
                                                                            e.g. --probe "CH1 (V)=100"
  --offset "<header>=<value>"  offset [V or A] added after the probe ratio, repeatable
                                                                            e.g. --offset "I_A (A)=-0.02"
  --rating <file.json>         the unit's rating (nominal voltage, frequency, …) e.g. --rating rating.json
  --tolerance <preset|file>    tolerance profile: a preset id or a JSON file e.g. --tolerance iso-8528-5-g2
  --magnet-temp <c>            magnet temperature during a back-EMF test [°C] e.g. --magnet-temp 62
  --reference-temp <c>         temperature Ke is stated at [°C], default 20 e.g. --reference-temp 20
  --magnet <material>          ndfeb, smco or ferrite, default ndfeb        e.g. --magnet smco
  --iec-groups                 harmonic groups per IEC 61000-4-7
  --worst-cycle                deviation factor of the worst cycle, not the average cycle
  --json                       print the versioned report alone, as JSON
  -h, --help                   print this help

Exit status: 0 analysed, 2 input rejected (the message names line and column), 1 internal error.
Example: npm run analyse -- capture.csv --channel "V_AB (V)=vab" --speed-rpm 1500 --poles 4 --json`;

export interface CliArguments {
  help: boolean;
  file: string;
  json: boolean;
  sampleRateHz?: number;
  calibration: Record<string, ChannelCalibration>;
  options: AnalysisOptions;
  ratingPath?: string;
  tolerance?: string;
}

function positiveNumber(flag: string, text: string | undefined): number | undefined {
  if (text === undefined) return undefined;
  const value = Number(text);
  if (!Number.isFinite(value) || value <= 0) throw new UsageError(`--${flag} needs a positive number, got ${text}`);
  return value;
}

function finiteNumber(flag: string, text: string | undefined): number | undefined {
  if (text === undefined) return undefined;
  const value = Number(text);
  if (text.trim() === "" || !Number.isFinite(value)) throw new UsageError(`--${flag} needs a number, got ${text}`);
  return value;
}

function headerValue(flag: string, spec: string): [string, string] {
  const split = spec.lastIndexOf("=");
  if (split <= 0) throw new UsageError(`--${flag} needs "<column header>=<value>", got "${spec}"`);
  return [spec.slice(0, split), spec.slice(split + 1)];
}

const OPTIONS = {
  help: { type: "boolean", short: "h" },
  json: { type: "boolean" },
  channel: { type: "string", multiple: true },
  "speed-rpm": { type: "string" },
  poles: { type: "string" },
  harmonics: { type: "string" },
  "sample-rate": { type: "string" },
  probe: { type: "string", multiple: true },
  offset: { type: "string", multiple: true },
  rating: { type: "string" },
  tolerance: { type: "string" },
  "magnet-temp": { type: "string" },
  "reference-temp": { type: "string" },
  magnet: { type: "string" },
  "iec-groups": { type: "boolean" },
  "worst-cycle": { type: "boolean" },
} as const;

export function parseArguments(argv: string[]): CliArguments {
  let parsed: ReturnType<typeof parseArgs<{ options: typeof OPTIONS; allowPositionals: true; args: string[] }>>;
  try {
    parsed = parseArgs({ args: argv, options: OPTIONS, allowPositionals: true, strict: true });
  } catch (error) {
    throw new UsageError(`${(error as Error).message.split(". To specify")[0]} (see --help)`);
  }
  const { values, positionals } = parsed;
  if (values.help) return { help: true, file: "", json: false, calibration: {}, options: {} };
  if (positionals.length > 1) throw new UsageError(`Only one capture file, got ${positionals.map((p) => `"${p}"`).join(" and ")}`);
  const file = positionals[0];
  if (!file) throw new UsageError("Give a capture file: npm run analyse -- <file.csv> [options] (see --help)");
  const roles: Record<string, ChannelRole> = {};
  for (const spec of values.channel ?? []) {
    const [header, role] = headerValue("channel", spec);
    if (!CHANNEL_ROLES.includes(role as ChannelRole)) throw new UsageError(`--channel needs "<column header>=<role>" with role one of ${CHANNEL_ROLES.join(", ")}; got "${spec}"`);
    roles[header] = role as ChannelRole;
  }
  const calibration: Record<string, ChannelCalibration> = {};
  for (const spec of values.probe ?? []) {
    const [header, ratio] = headerValue("probe", spec);
    calibration[header] = { ...calibration[header], scale: positiveNumber("probe", ratio) as number };
  }
  for (const spec of values.offset ?? []) {
    const [header, offset] = headerValue("offset", spec);
    calibration[header] = { ...calibration[header], offset: finiteNumber("offset", offset) as number };
  }
  const options: AnalysisOptions = {};
  const set = <K extends keyof AnalysisOptions>(key: K, value: AnalysisOptions[K] | undefined) => {
    if (value !== undefined) options[key] = value;
  };
  set("speedRpm", positiveNumber("speed-rpm", values["speed-rpm"]));
  set("poles", positiveNumber("poles", values.poles));
  set("harmonics", positiveNumber("harmonics", values.harmonics));
  if (values["iec-groups"]) options.groupingIec = true;
  if (values["worst-cycle"]) options.deviationBasis = "worst-cycle";
  if (Object.keys(roles).length > 0) options.channelRoles = roles;
  const measuredC = finiteNumber("magnet-temp", values["magnet-temp"]);
  if (measuredC !== undefined) {
    // Checked with the rest of the options by analysisOptionsSchema.
    options.magnetTemperature = {
      measuredC,
      ...(values["reference-temp"] !== undefined ? { referenceC: finiteNumber("reference-temp", values["reference-temp"]) } : {}),
      ...(values.magnet !== undefined ? { material: values.magnet as "ndfeb" } : {}),
    };
  } else if (values["reference-temp"] !== undefined || values.magnet !== undefined) {
    throw new UsageError("--reference-temp and --magnet need --magnet-temp");
  }
  const sampleRateHz = positiveNumber("sample-rate", values["sample-rate"]);
  return {
    help: false, file, json: values.json ?? false, calibration, options,
    ...(sampleRateHz !== undefined ? { sampleRateHz } : {}),
    ...(values.rating !== undefined ? { ratingPath: values.rating } : {}),
    ...(values.tolerance !== undefined ? { tolerance: values.tolerance } : {}),
  };
}
