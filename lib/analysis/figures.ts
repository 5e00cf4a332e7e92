import { largestHarmonic } from "./thd";
import { KE_BASIS_UNITS, type Rating } from "./rating";
import type { AnalysisReport } from "./report-schema";
import type { CheckId, CheckRule, ToleranceProfile } from "./tolerance";
import { keInBasis } from "./ke-basis";

export type Measured = Pick<AnalysisReport, "channels" | "frequencyHz" | "threePhase" | "backEmf" | "warnings"> & { referenceChannel?: string };

export type Band = { lower: number | null; upper: number | null; nominal: number; marginalZonePercent: number };

/** One check's figure: its value, how it was taken, its band, and the channels it was computed from. */
export type Figure = { value: number | string | null; unit: string; basis: string; band?: Band; expected?: string; channels: string[]; nominal?: number };

const maxOf = (values: (number | null)[]): number | null => {
  const present = values.filter((value): value is number => value !== null && Number.isFinite(value));
  return present.length > 0 ? Math.max(...present) : null;
};
const mean = (values: number[]): number | null => (values.length > 0 ? values.reduce((s, v) => s + v, 0) / values.length : null);

/** Each check's figure from the measured report, with its band from the profile and the nameplate. */
export function figures(measured: Measured, rating: Rating, profile: ToleranceProfile): Record<CheckId, Figure> {
  const zone = profile.marginalZonePercent;
  const checks = profile.checks;
  const voltages = measured.channels.filter((c) => c.unit === "V");
  const lineVoltages = voltages.filter((c) => ["vab", "vbc", "vca"].includes(c.role));
  const waveform = lineVoltages.length > 0 ? lineVoltages : voltages;
  const voltageIds = voltages.map((c) => c.id);
  const waveformIds = waveform.map((c) => c.id);
  const referenceIds = measured.referenceChannel !== undefined ? [measured.referenceChannel] : voltageIds;
  const tp = measured.threePhase;
  // Away from rated speed the nameplate values move with the shaft: f = p·n/120 and, at constant
  // excitation, the EMF is proportional to speed (Faraday's law). Within 1 % the nameplate stands.
  const speed = measured.backEmf?.speedRpm ?? null;
  const ratio = speed !== null ? speed / rating.ratedSpeedRpm : 1;
  const offRated = Math.abs(ratio - 1) > 0.01;
  const atSpeed = offRated ? ` (nameplate scaled to the test speed, ${speed} rpm)` : "";
  const relative = (rule: CheckRule, nominal: number): Band | undefined =>
    rule.required && "lowerPercent" in rule ? { lower: nominal * (1 + rule.lowerPercent / 100), upper: nominal * (1 + rule.upperPercent / 100), nominal, marginalZonePercent: zone } : undefined;
  const upTo = (rule: CheckRule): Band | undefined =>
    rule.required && "maxPercent" in rule ? { lower: null, upper: rule.maxPercent, nominal: 0, marginalZonePercent: zone } : undefined;

  const lineLevel = rating.voltageBasis === "line-line-rms";
  const voltage = lineLevel
    ? mean(tp?.lineToLine.map((l) => l.rms) ?? (rating.phases === 1 ? voltages.slice(0, 1).map((c) => c.rms) : []))
    : mean(voltages.filter((c) => ["van", "vbn", "vcn", "v"].includes(c.role)).map((c) => c.rms));
  const vNominal = rating.nominalVoltageV * (offRated ? ratio : 1);
  const fNominal = offRated && speed !== null ? (rating.poles * speed) / 120 : rating.frequencyHz;

  const unbalanceRule = checks["voltage-unbalance"];
  const definition = unbalanceRule.required ? unbalanceRule.definition : "vuf";
  const unbalanceKey = definition === "nema" ? "nemaPercent" : definition === "ieee" ? "ieeePercent" : "vufPercent";
  const unbalanceNames = { nema: "NEMA MG 1 line-voltage unbalance", ieee: "IEEE phase-voltage unbalance", vuf: "VUF = |V2|/|V1|" } as const;

  const nominalDisplacement = rating.phases === 3 ? 120 : rating.phases === 2 ? 90 : 180;
  const displacements = tp ? Object.values(tp.displacementDeg).map((v) => Math.abs(v)) : [];
  const worstDisplacement = displacements.length > 0 ? displacements.reduce((w, v) => (Math.abs(v - nominalDisplacement) > Math.abs(w - nominalDisplacement) ? v : w)) : null;
  const dRule = checks["phase-displacement"];
  const sRule = checks["phase-sequence"];
  const tifRule = checks.tif;

  const ke = rating.ke ? keInBasis(measured.backEmf, rating.ke.basis) : null;
  const keNominal = rating.ke?.value ?? 0;

  return {
    voltage: { value: voltage, unit: "V", basis: (lineLevel ? "mean line-line true RMS" : "mean line-neutral true RMS") + atSpeed, band: relative(checks.voltage, vNominal), channels: voltageIds, nominal: vNominal },
    frequency: { value: measured.frequencyHz, unit: "Hz", basis: "fundamental frequency of the reference channel" + (offRated ? ` against p·n/120 at ${speed} rpm` : ""), band: relative(checks.frequency, fNominal), channels: referenceIds },
    thd: { value: maxOf(waveform.map((c) => c.thdFPercent)), unit: "%", basis: "THD-F, worst voltage channel", band: upTo(checks.thd), channels: waveformIds },
    "individual-harmonic": { value: maxOf(waveform.map((c) => largestHarmonic(c.fundamental.rms, c.harmonics)?.percent ?? null)), unit: "%", basis: "percent of the fundamental, worst voltage channel", band: upTo(checks["individual-harmonic"]), channels: waveformIds },
    "voltage-unbalance": { value: tp ? tp.unbalance[unbalanceKey] : null, unit: "%", basis: unbalanceNames[definition], band: upTo(unbalanceRule), channels: voltageIds },
    "phase-displacement": {
      value: worstDisplacement, unit: "°", basis: "worst of the three fundamental displacements", channels: voltageIds,
      band: dRule.required ? { lower: nominalDisplacement - dRule.toleranceDeg, upper: nominalDisplacement + dRule.toleranceDeg, nominal: nominalDisplacement, marginalZonePercent: zone } : undefined,
    },
    "phase-sequence": { value: tp?.sequence ?? null, unit: "", basis: "from symmetrical components", expected: sRule.required ? sRule.expected : undefined, channels: voltageIds },
    "deviation-factor": { value: maxOf(waveform.map((c) => c.deviationFactorPercent)), unit: "%", basis: "worst voltage channel", band: upTo(checks["deviation-factor"]), channels: waveformIds },
    thf: { value: maxOf(waveform.map((c) => c.thfPercent)), unit: "%", basis: "worst voltage channel, harmonics to 5 kHz", band: upTo(checks.thf), channels: waveformIds },
    tif: { value: maxOf(waveform.map((c) => c.tif)), unit: "", basis: "worst voltage channel", band: tifRule.required ? { lower: null, upper: tifRule.max, nominal: 0, marginalZonePercent: zone } : undefined, channels: waveformIds },
    "back-emf-constant": {
      value: ke, unit: rating.ke ? KE_BASIS_UNITS[rating.ke.basis] : "V/krpm", channels: voltageIds, nominal: keNominal,
      basis: measured.backEmf?.keLineRmsPerKrpmAtReference != null ? `fundamental, at ${measured.backEmf.referenceTemperatureC} °C` : "fundamental",
      band: relative(checks["back-emf-constant"], keNominal),
    },
    "pole-count": { value: measured.backEmf?.polesFromFrequency ?? null, unit: "", basis: "120·f/n against the rating", band: relative(checks["pole-count"], rating.poles), channels: referenceIds },
  };
}
