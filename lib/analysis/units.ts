import type { SiUnit } from "./types";

/** SI prefixes that bench instruments write in headers and preambles. */
const PREFIX_FACTORS: Record<string, number> = {
  "": 1,
  n: 1e-9,
  u: 1e-6,
  "µ": 1e-6,
  "μ": 1e-6,
  m: 1e-3,
  k: 1e3,
  K: 1e3,
  M: 1e6,
};

export interface HeaderUnit {
  /** Header with the unit decoration removed, e.g. "V_AN" from "V_AN (V)". */
  name: string;
  kind: "voltage" | "current" | "time" | "unknown";
  /** Multiply a raw value by this to get V, A or s. */
  factor: number;
  /** The unit text as written, or null when the header carries none. */
  written: string | null;
}

interface UnitMeaning {
  kind: HeaderUnit["kind"];
  factor: number;
}

/** Reads "V", "mV", "kA", "ms", "µs" (also "uV", "Volts", "sec"). Null when not a unit. */
export function readUnitToken(token: string): UnitMeaning | null {
  const text = token.trim();
  const longForms: Record<string, UnitMeaning> = {
    volt: { kind: "voltage", factor: 1 },
    volts: { kind: "voltage", factor: 1 },
    amp: { kind: "current", factor: 1 },
    amps: { kind: "current", factor: 1 },
    ampere: { kind: "current", factor: 1 },
    amperes: { kind: "current", factor: 1 },
    sec: { kind: "time", factor: 1 },
    secs: { kind: "time", factor: 1 },
    second: { kind: "time", factor: 1 },
    seconds: { kind: "time", factor: 1 },
    sekunde: { kind: "time", factor: 1 },
    sekunden: { kind: "time", factor: 1 },
    seconde: { kind: "time", factor: 1 },
    secondes: { kind: "time", factor: 1 },
    segundo: { kind: "time", factor: 1 },
    segundos: { kind: "time", factor: 1 },
    msec: { kind: "time", factor: 1e-3 },
    usec: { kind: "time", factor: 1e-6 },
    "µsec": { kind: "time", factor: 1e-6 },
    nsec: { kind: "time", factor: 1e-9 },
  };
  const long = longForms[text.toLowerCase()];
  if (long) return long;
  const match = /^([nuµμmkKM]?)(V|A|s)$/.exec(text);
  if (!match) return null;
  const prefix = PREFIX_FACTORS[match[1] ?? ""];
  if (prefix === undefined) return null;
  const base = match[2];
  const kind = base === "V" ? "voltage" : base === "A" ? "current" : "time";
  return { kind, factor: prefix };
}

const DECORATIONS = [/^(.*?)\s*\(([^()]*)\)\s*$/, /^(.*?)\s*\[([^[\]]*)\]\s*$/, /^(.*?)\s*\/\s*([^/\s]+)\s*$/];
/** "Time_ms", "t-us", "Zeit s": a time name joined to its unit (only time: "V_A" is a phase, not volts·amps). */
const JOINED_TIME_UNIT = /^(.*?)[\s_-]+([^\s_-]+)$/;
/** Unit-only headers taken as such: time units and prefixed V/A. A bare "V" or "A" may be a phase name. */
const UNIT_ONLY = /^(?:[nuµμmkKM]?s|[nuµμmkKM](?:V|A)|sec|secs|seconds?|msec|usec|µsec|nsec)$/;

/** Splits "CH2 [mV]", "V_AN (V)", "I_A/A", "Time_ms", "(ms)" into a name and a unit. */
export function readHeaderUnit(header: string): HeaderUnit {
  const trimmed = header.trim();
  for (const pattern of DECORATIONS) {
    const match = pattern.exec(trimmed);
    if (!match) continue;
    const unit = readUnitToken(match[2] ?? "");
    if (unit) return { name: (match[1] ?? "").trim() || trimmed, kind: unit.kind, factor: unit.factor, written: (match[2] ?? "").trim() };
  }
  const joined = JOINED_TIME_UNIT.exec(trimmed);
  if (joined && isTimeName(joined[1] ?? "")) {
    const unit = readUnitToken(joined[2] ?? "");
    if (unit?.kind === "time") return { name: (joined[1] ?? "").trim(), kind: "time", factor: unit.factor, written: (joined[2] ?? "").trim() };
  }
  if (UNIT_ONLY.test(trimmed)) {
    const unit = readUnitToken(trimmed);
    if (unit) return { name: trimmed, kind: unit.kind, factor: unit.factor, written: trimmed };
  }
  return { name: trimmed, kind: "unknown", factor: 1, written: null };
}

/** True when a whole header-like row cell is only a unit, e.g. "(ms)" or "V" in a units row. */
export function isBareUnitCell(cell: string): boolean {
  const text = cell.trim().replace(/^[([]\s*/, "").replace(/\s*[)\]]$/, "");
  return text.length > 0 && (readUnitToken(text) !== null || isIndexName(text));
}

/**
 * Time column names, lower-cased with spaces, underscores, hyphens and dots removed: English,
 * German, French, Spanish, Italian/Portuguese, Dutch, Polish, Scandinavian, Finnish, Czech,
 * Hungarian, Turkish, Russian, Chinese, Japanese, Korean (common practice of DAQ exports).
 */
const TIME_NAMES = new Set([
  "time", "t", "x", "sec", "second", "seconds", "timestamp", "reltime", "relativetime", "elapsedtime", "timeelapsed",
  "zeit", "relzeit", "zeitstempel", "temps", "tempsrelatif", "tiempo", "tempo", "tijd", "czas", "tid", "aika", "čas", "cas",
  "idő", "ido", "zaman", "время", "时间", "時間", "시간",
]);

function isTimeName(name: string): boolean {
  return TIME_NAMES.has(name.toLowerCase().replace(/[\s_.\-]+/g, ""));
}

export function looksLikeTimeHeader(unit: HeaderUnit): boolean {
  return unit.kind === "time" || isTimeName(unit.name);
}

/** Names of a column that counts samples rather than holding time (or a units-row cell saying so). */
const INDEX_NAMES = new Set(["index", "idx", "sample", "samples", "sampleno", "samplenumber", "sampleindex", "point", "points", "pointno", "pt", "no", "nr", "n", "#", "sequence", "seq", "punkt", "nummer", "numéro", "índice", "indice"]);

export function isIndexName(name: string): boolean {
  return INDEX_NAMES.has(name.toLowerCase().replace(/[\s_.\-()[\]]+/g, ""));
}

/** The SI unit a channel carries: from its header, else guessed from its name. */
export function siUnitFor(unit: HeaderUnit): SiUnit {
  if (unit.kind === "current") return "A";
  if (unit.kind === "voltage") return "V";
  return /^(i|curr|current)/i.test(unit.name.replace(/[\s_-]+/g, "")) ? "A" : "V";
}

/** "20 kHz", "50kS/s", "1e-5 s", "10 us" → a number in Hz or s. Null when not understood. */
export function readQuantity(text: string, decimal: "." | ","): { value: number; unit: "Hz" | "s" | null } | null {
  const normal = decimal === "," ? text.trim().replace(",", ".") : text.trim();
  const match = /^([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*([a-zA-Zµμ/]*)$/.exec(normal);
  if (!match) return null;
  const value = Number(match[1]);
  if (!Number.isFinite(value)) return null;
  const unitText = match[2] ?? "";
  if (unitText === "") return { value, unit: null };
  const rate = /^([kKM]?)(Hz|S\/s|Sa\/s|sps|SPS)$/.exec(unitText);
  if (rate) {
    const factor = PREFIX_FACTORS[rate[1] ?? ""] ?? 1;
    return { value: value * factor, unit: "Hz" };
  }
  const time = readUnitToken(unitText);
  if (time && time.kind === "time") return { value: value * time.factor, unit: "s" };
  return null;
}
