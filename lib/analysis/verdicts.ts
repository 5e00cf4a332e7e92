import { largestHarmonic } from "./thd";
import type { Rating } from "./rating";
import type { AnalysisReport, Verdict, VerdictStatus } from "./report-schema";
import type { ToleranceProfile } from "./tolerance";

type Measured = Pick<AnalysisReport, "channels" | "frequencyHz" | "threePhase" | "backEmf">;

/**
 * Pass, fail, or marginal: inside the band but within `guardPercent` of the distance from the
 * nominal value to the edge it is near. Not applicable without a measurement or without limits.
 */
export function judge(measured: number | null, lower: number | null, upper: number | null, nominal: number, guardPercent: number): VerdictStatus {
  if (measured === null || (lower === null && upper === null)) return "not-applicable";
  if ((lower !== null && measured < lower) || (upper !== null && measured > upper)) return "fail";
  const guard = guardPercent / 100;
  if (upper !== null && measured > upper - guard * Math.abs(upper - nominal)) return "marginal";
  if (lower !== null && measured < lower + guard * Math.abs(nominal - lower)) return "marginal";
  return "pass";
}

export function overallStatus(verdicts: readonly Verdict[]): VerdictStatus {
  const statuses = new Set(verdicts.map((verdict) => verdict.status));
  for (const status of ["fail", "marginal", "pass"] as const) if (statuses.has(status)) return status;
  return "not-applicable";
}

const maxOf = (values: (number | null)[]): number | null => {
  const present = values.filter((value): value is number => value !== null);
  return present.length > 0 ? Math.max(...present) : null;
};

/** Every check, in a fixed order, so reports of one rating line up. */
export function computeVerdicts(measured: Measured, rating: Rating, profile: ToleranceProfile | undefined, guardPercent: number): Verdict[] {
  const source = profile?.source ?? "no tolerance profile given";
  const voltages = measured.channels.filter((channel) => channel.role.startsWith("v"));
  const lineVoltages = voltages.filter((channel) => ["vab", "vbc", "vca"].includes(channel.role));
  const waveformChannels = lineVoltages.length > 0 ? lineVoltages : voltages;
  const threePhase = measured.threePhase;
  const verdicts: Verdict[] = [];
  const add = (
    check: string,
    label: string,
    value: number | null,
    unit: string,
    lower: number | null,
    upper: number | null,
    nominal: number,
    basis: string,
  ): void => {
    verdicts.push({ check, label, measured: value, unit, lower, upper, status: judge(value, lower, upper, nominal, guardPercent), basis, source });
  };

  let voltage: number | null = null;
  let voltageBasis = "";
  if (rating.voltageBasis === "line-line-rms") {
    const lines = threePhase?.lineToLine.map((line) => line.rms) ?? (rating.phases === 1 ? voltages.slice(0, 1).map((c) => c.rms) : []);
    voltage = lines.length > 0 ? lines.reduce((sum, value) => sum + value, 0) / lines.length : null;
    voltageBasis = "mean line-line true RMS";
  } else {
    const phases = voltages.filter((channel) => ["van", "vbn", "vcn", "v"].includes(channel.role)).map((c) => c.rms);
    voltage = phases.length > 0 ? phases.reduce((sum, value) => sum + value, 0) / phases.length : null;
    voltageBasis = "mean line-neutral true RMS";
  }
  // Away from rated speed the nameplate values move with the shaft: f = p·n/120 and, at constant
  // excitation, the EMF is proportional to speed (Faraday's law). Within 1 % the nameplate stands.
  const speed = measured.backEmf?.speedRpm ?? null;
  const speedRatio = speed !== null && rating.ratedSpeedRpm > 0 ? speed / rating.ratedSpeedRpm : 1;
  const offRated = Math.abs(speedRatio - 1) > 0.01;
  const atSpeed = offRated ? ` (nameplate scaled to the test speed, ${speed} rpm)` : "";

  const vTol = profile?.voltageTolerancePercent;
  const vNominal = rating.nominalVoltageV * (offRated ? speedRatio : 1);
  add("voltage", "Voltage", voltage, "V", vTol !== undefined ? vNominal * (1 - vTol / 100) : null, vTol !== undefined ? vNominal * (1 + vTol / 100) : null, vNominal, voltageBasis + atSpeed);

  const fTol = profile?.frequencyTolerancePercent;
  const fNominal = offRated && speed !== null ? (rating.poles * speed) / 120 : rating.frequencyHz;
  add("frequency", "Frequency", measured.frequencyHz, "Hz", fTol !== undefined ? fNominal * (1 - fTol / 100) : null, fTol !== undefined ? fNominal * (1 + fTol / 100) : null, fNominal, "fundamental frequency of the reference channel" + (offRated ? ` against p·n/120 at ${speed} rpm` : ""));

  add("thd", "Total harmonic distortion", maxOf(waveformChannels.map((c) => c.thdFPercent)), "%", null, profile?.thdMaxPercent ?? null, 0, "THD-F, worst voltage channel");

  const individual = maxOf(waveformChannels.map((c) => largestHarmonic(c.fundamental.rms, c.harmonics)?.percent ?? null));
  add("individual-harmonic", "Largest single harmonic", individual, "%", null, profile?.individualHarmonicMaxPercent ?? null, 0, "percent of the fundamental, worst voltage channel");

  const definition = profile?.unbalanceDefinition ?? "vuf";
  const unbalance = threePhase ? threePhase.unbalance[definition === "nema" ? "nemaPercent" : definition === "ieee" ? "ieeePercent" : "vufPercent"] : null;
  const unbalanceNames = { nema: "NEMA MG 1 line-voltage unbalance", ieee: "IEEE phase-voltage unbalance", vuf: "VUF = |V2|/|V1|" } as const;
  add("voltage-unbalance", "Voltage unbalance", unbalance, "%", null, profile?.unbalanceMaxPercent ?? null, 0, unbalanceNames[definition]);

  const nominalDisplacement = rating.phases === 3 ? 120 : rating.phases === 2 ? 90 : 180;
  const displacements = threePhase ? Object.values(threePhase.displacementDeg).map((value) => Math.abs(value)) : [];
  const worstDisplacement = displacements.length > 0 ? displacements.reduce((worst, value) => (Math.abs(value - nominalDisplacement) > Math.abs(worst - nominalDisplacement) ? value : worst)) : null;
  const dTol = profile?.phaseDisplacementToleranceDeg;
  add("phase-displacement", "Phase displacement", worstDisplacement, "°", dTol !== undefined ? nominalDisplacement - dTol : null, dTol !== undefined ? nominalDisplacement + dTol : null, nominalDisplacement, "worst of the three fundamental displacements");

  const expected = profile?.expectedSequence;
  verdicts.push({
    check: "phase-sequence",
    label: "Phase sequence",
    measured: threePhase?.sequence ?? null,
    unit: "",
    lower: null,
    upper: null,
    status: !threePhase || !expected ? "not-applicable" : threePhase.sequence === expected ? "pass" : "fail",
    basis: expected ? `expected ${expected} (A-B-C) from symmetrical components` : "no expected sequence in the profile",
    source,
  });

  add("deviation-factor", "Waveform deviation factor", maxOf(waveformChannels.map((c) => c.deviationFactorPercent)), "%", null, profile?.deviationFactorMaxPercent ?? null, 0, "worst voltage channel");

  const thfBand = rating.ratedKva !== undefined ? profile?.thfLimits?.find((band) => rating.ratedKva! >= band.minKva && (band.maxKva === null || rating.ratedKva! < band.maxKva)) : undefined;
  add("thf", "Telephone harmonic factor", maxOf(waveformChannels.map((c) => c.thfPercent)), "%", null, thfBand?.maxPercent ?? null, 0, thfBand ? `limit for ${rating.ratedKva} kVA` : "no THF band for this rating");

  add("tif", "Telephone influence factor", maxOf(waveformChannels.map((c) => c.tif)), "", null, profile?.tifMax ?? null, 0, "60 Hz machines only");

  const atReference = measured.backEmf?.keLineRmsPerKrpmAtReference ?? null;
  const ke = atReference ?? measured.backEmf?.keLineRmsPerKrpm ?? null;
  const keRated = rating.keLineRmsPerKrpm;
  const keTol = profile?.keTolerancePercent;
  const keLimits = keRated !== undefined && keTol !== undefined;
  add("back-emf-constant", "Back-EMF constant", ke, "V/krpm", keLimits ? keRated * (1 - keTol / 100) : null, keLimits ? keRated * (1 + keTol / 100) : null, keRated ?? 0, atReference !== null ? `V_LL,rms (fundamental) per 1000 rpm at ${measured.backEmf?.referenceTemperatureC} °C` : "V_LL,rms (fundamental) per 1000 rpm");

  const poles = measured.backEmf?.polesFromFrequency ?? null;
  add("pole-count", "Pole count from speed and frequency", poles, "", rating.poles * 0.98, rating.poles * 1.02, rating.poles, "120·f/n against the rating (±2 % for slip and speed reading)");
  return verdicts;
}
