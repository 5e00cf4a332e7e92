import { spanPairMean, spanWeights } from "./goertzel";
import { angleRad, magnitude, type Complex } from "./phasors";
import type { CycleWindow } from "./cycles";

export interface PowerInput {
  voltageId: string;
  currentId: string;
  voltage: Float64Array;
  current: Float64Array;
  voltageRms: number;
  currentRms: number;
  /** Peak phasors of the fundamentals, same time reference. */
  voltageFundamental: Complex;
  currentFundamental: Complex;
}

export interface PhasePower {
  voltageId: string;
  currentId: string;
  activePowerW: number;
  fundamentalActivePowerW: number;
  fundamentalReactivePowerVar: number;
  apparentPowerVa: number;
  fundamentalApparentPowerVa: number;
  powerFactor: number | null;
  fundamentalPowerFactor: number | null;
}

const ratio = (a: number, b: number): number | null => (b > 0 ? a / b : null);

/** IEEE 1459-2010 single-phase quantities: P = mean(v·i), P1 = V1·I1·cos θ1, Q1 = V1·I1·sin θ1, S = V·I [M]. */
export function computePhasePower(input: PowerInput, window: CycleWindow): PhasePower {
  const activePowerW = spanPairMean(input.voltage, input.current, window.start, window.spanSamples, "product");
  const v1 = magnitude(input.voltageFundamental) / Math.SQRT2;
  const i1 = magnitude(input.currentFundamental) / Math.SQRT2;
  const theta = angleRad(input.voltageFundamental) - angleRad(input.currentFundamental);
  const fundamentalApparentPowerVa = v1 * i1;
  const fundamentalActivePowerW = fundamentalApparentPowerVa * Math.cos(theta);
  const apparentPowerVa = input.voltageRms * input.currentRms;
  return {
    voltageId: input.voltageId,
    currentId: input.currentId,
    activePowerW,
    fundamentalActivePowerW,
    fundamentalReactivePowerVar: fundamentalApparentPowerVa * Math.sin(theta),
    apparentPowerVa,
    fundamentalApparentPowerVa,
    powerFactor: ratio(activePowerW, apparentPowerVa),
    fundamentalPowerFactor: ratio(fundamentalActivePowerW, fundamentalApparentPowerVa),
  };
}

/** RMS of ia + ib + ic (the neutral current of a four-wire system) over the window. */
export function neutralCurrentRms(a: Float64Array, b: Float64Array, c: Float64Array, window: CycleWindow): number {
  const { whole, edges } = spanWeights(a.length, window.start, window.spanSamples);
  const square = (n: number): number => {
    const s = (a[n] as number) + (b[n] as number) + (c[n] as number);
    return s * s;
  };
  const end = window.start + whole;
  let sum = 0;
  for (let n = window.start; n < end; n++) sum += square(n);
  for (const { offset, weight } of edges) sum += weight * square(window.start + offset);
  return Math.sqrt(Math.max(0, sum / window.spanSamples));
}

export interface TotalPower {
  activePowerW: number;
  fundamentalActivePowerW: number;
  fundamentalReactivePowerVar: number;
  /** S_e = 3·V_e·I_e for three phases (IEEE 1459 effective quantities), V·I for one. */
  effectiveApparentPowerVa: number;
  powerFactor: number | null;
  /** P1⁺ = 3·V1⁺·I1⁺·cos θ1⁺, RMS sequence magnitudes; null for one phase. */
  positiveSequenceActivePowerW: number | null;
}

/**
 * Four-wire effective values (IEEE 1459-2010 [M]): V_e = √((3·ΣV_ln² + ΣV_ll²)/18),
 * I_e = √((ΣI² + I_n²)/3).
 */
export function computeTotalPower(
  phases: readonly PhasePower[],
  effective: { lineNeutralRms: number[]; lineLineRms: number[]; currentRms: number[]; neutralRms: number } | null,
  positiveSequence: { voltage: Complex; current: Complex } | null,
): TotalPower {
  const sum = (pick: (phase: PhasePower) => number): number => phases.reduce((total, phase) => total + pick(phase), 0);
  const activePowerW = sum((phase) => phase.activePowerW);
  let apparent = sum((phase) => phase.apparentPowerVa);
  if (effective) {
    const squares = (values: number[]): number => values.reduce((total, value) => total + value * value, 0);
    const ve = Math.sqrt((3 * squares(effective.lineNeutralRms) + squares(effective.lineLineRms)) / 18);
    const ie = Math.sqrt((squares(effective.currentRms) + effective.neutralRms ** 2) / 3);
    apparent = 3 * ve * ie;
  }
  let positiveSequenceActivePowerW: number | null = null;
  if (positiveSequence) {
    const v = magnitude(positiveSequence.voltage) / Math.SQRT2;
    const i = magnitude(positiveSequence.current) / Math.SQRT2;
    positiveSequenceActivePowerW = 3 * v * i * Math.cos(angleRad(positiveSequence.voltage) - angleRad(positiveSequence.current));
  }
  return {
    activePowerW,
    fundamentalActivePowerW: sum((phase) => phase.fundamentalActivePowerW),
    fundamentalReactivePowerVar: sum((phase) => phase.fundamentalReactivePowerVar),
    effectiveApparentPowerVa: apparent,
    powerFactor: ratio(activePowerW, apparent),
    positiveSequenceActivePowerW,
  };
}
