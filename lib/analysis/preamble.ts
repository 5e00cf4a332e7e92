import { splitLine, withoutTrailingEmpties } from "./dialect";
import { CaptureRejection } from "./rejection";
import { readQuantity } from "./units";

/** Preamble entries by key, with the 1-based file line each came from. */
export interface Metadata {
  values: Record<string, string>;
  lines: Record<string, number>;
}

export function emptyMetadata(): Metadata {
  return { values: {}, lines: {} };
}

export function addMetadata(metadata: Metadata, key: string, value: string, line: number): void {
  if (key === "" || key in metadata.values) return;
  metadata.values[key] = value;
  metadata.lines[key] = line;
}

/** "Key;Value;Unit", "# Key: value", "Key = value" → [key, "value unit"]. */
export function readMetadataLine(line: string, delimiter: string): [string, string] | null {
  const text = line.replace(/^\s*[#%;"']+\s*/, "").trim();
  if (text === "") return null;
  const cells = withoutTrailingEmpties(splitLine(text, delimiter));
  if (cells.length >= 2 && cells[0]) {
    return [cells[0].replace(/[:=]\s*$/, "").trim(), cells.slice(1).filter((c) => c !== "").join(" ")];
  }
  const match = /^([^:=]+)[:=]\s*(.*)$/.exec(text);
  if (match && match[1]) return [match[1].trim(), (match[2] ?? "").trim()];
  return [text, ""];
}

const INTERVAL_KEY = /(sample|sampling)?\s*(interval|period)|x\s*incr|^incr(ement)?$|^time\s*(step|incr(ement)?)$|delta\s*t|^dt$|time\s*(per|\/)\s*(sample|point)|^tinc|abtastintervall|intervalle/i;
const RATE_KEY = /(sample|sampling)\s*(rate|freq)|^fs$|samples?\s*per\s*second|abtastrate|^sample\s*frequency$|fréquence\s*d'échantillonnage/i;
const START_KEY = /^(start|x\s*start|t\s*start|start\s*time|t0|x\s*origin|x\s*zero|time\s*offset|first\s*sample\s*time|startzeit)$/i;

export function isIntervalName(name: string): boolean {
  return INTERVAL_KEY.test(name.trim());
}
export function isStartName(name: string): boolean {
  return START_KEY.test(name.trim());
}

/** The time base a preamble (or header region) states: either may be missing. */
export interface StatedTimeBase {
  intervalS: number | null;
  startS: number | null;
}

function readNumber(value: string, decimal: "." | ","): ReturnType<typeof readQuantity> {
  return readQuantity(value, decimal) ?? readQuantity(value, ".");
}

/**
 * Sample interval (or rate) and start time from the preamble. A stated interval or rate that is
 * zero or negative is refused where it is written, never skipped.
 */
export function timeBaseFromMetadata(metadata: Metadata, decimal: "." | ","): StatedTimeBase {
  let intervalS: number | null = null;
  let startS: number | null = null;
  for (const [key, value] of Object.entries(metadata.values)) {
    const quantity = readNumber(value, decimal);
    if (!quantity) continue;
    const rate = RATE_KEY.test(key) && quantity.unit !== "s";
    const interval = !rate && INTERVAL_KEY.test(key) && quantity.unit !== "Hz";
    if ((rate || interval) && intervalS === null) {
      if (!(quantity.value > 0)) {
        const what = rate ? "sample rate" : "sample interval";
        throw new CaptureRejection(
          rate ? "bad-sample-rate" : "bad-sample-interval",
          `The preamble gives a ${what} of ${value} ("${key}"): a ${what} must be positive`,
          { line: metadata.lines[key] ?? 1 },
        );
      }
      intervalS = rate ? 1 / quantity.value : quantity.value;
    } else if (START_KEY.test(key) && startS === null && quantity.unit !== "Hz") {
      startS = quantity.value;
    }
  }
  return { intervalS, startS };
}
