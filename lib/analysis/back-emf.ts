/** rad/s per krpm: 1000·2π/60 = 104.72. */
export const RAD_PER_S_PER_KRPM = (1000 * 2 * Math.PI) / 60;

export interface BackEmfResult {
  speedRpm: number;
  poles: number;
  expectedFrequencyHz: number;
  keLineRmsPerKrpm: number;
  keLinePeakPerKrpm: number;
  kePhasePeakPerRadS: number;
  /** Ke_LL,rms in V·s/rad (per mechanical rad/s). */
  keLineRmsVsPerRad: number;
  /** Phase RMS per krpm: V_LL/√3 of a star-equivalent set, or the winding of a single-phase machine. */
  kePhaseRmsPerKrpm: number;
  /** Kt = √3·Ke_LL,rms[V·s/rad], sinusoidal machine, current in phase with EMF [D]. */
  ktNmPerArms: number;
}

/** Pole count implied by f = p·n/120; an even integer for a healthy capture and rating. */
export function polesFromSpeed(frequencyHz: number, speedRpm: number): number {
  return (120 * frequencyHz) / speedRpm;
}

/**
 * Back-EMF constants of a machine driven at `speedRpm` with open terminals, from the
 * fundamental line-line RMS voltage. Phase values assume a star-equivalent (V_ph = V_LL/√3).
 */
export function computeBackEmf(lineRmsVolts: number, speedRpm: number, poles: number): BackEmfResult {
  const krpm = speedRpm / 1000;
  const radPerS = krpm * RAD_PER_S_PER_KRPM;
  const keLineRmsPerKrpm = lineRmsVolts / krpm;
  const keLineRmsVsPerRad = lineRmsVolts / radPerS;
  return {
    speedRpm,
    poles,
    expectedFrequencyHz: (poles * speedRpm) / 120,
    keLineRmsPerKrpm,
    keLinePeakPerKrpm: Math.SQRT2 * keLineRmsPerKrpm,
    kePhasePeakPerRadS: (Math.SQRT2 * lineRmsVolts) / Math.sqrt(3) / radPerS,
    keLineRmsVsPerRad,
    kePhaseRmsPerKrpm: keLineRmsPerKrpm / Math.sqrt(3),
    ktNmPerArms: Math.sqrt(3) * keLineRmsVsPerRad,
  };
}

/**
 * Back-EMF constants of a single-phase machine from its one winding's fundamental RMS voltage: the
 * phase values are the winding's (no √3), and the terminal ("line") values are the same winding.
 * Kt = E_rms/ω per A_rms for one winding, current in phase with the EMF [D].
 */
export function computeSinglePhaseBackEmf(windingRmsVolts: number, speedRpm: number, poles: number): BackEmfResult {
  const krpm = speedRpm / 1000;
  const radPerS = krpm * RAD_PER_S_PER_KRPM;
  const perKrpm = windingRmsVolts / krpm;
  const vsPerRad = windingRmsVolts / radPerS;
  return {
    speedRpm,
    poles,
    expectedFrequencyHz: (poles * speedRpm) / 120,
    keLineRmsPerKrpm: perKrpm,
    keLinePeakPerKrpm: Math.SQRT2 * perKrpm,
    kePhasePeakPerRadS: Math.SQRT2 * vsPerRad,
    keLineRmsVsPerRad: vsPerRad,
    kePhaseRmsPerKrpm: perKrpm,
    ktNmPerArms: vsPerRad,
  };
}

/** Reversible temperature coefficients of remanence, percent per kelvin [M: DOMAIN §1, from memory]. */
export const MAGNET_COEFFICIENTS_PERCENT_PER_K = { ndfeb: -0.11, smco: -0.035, ferrite: -0.2 } as const;

export type MagnetMaterial = keyof typeof MAGNET_COEFFICIENTS_PERCENT_PER_K;

/** Ke(T_ref) = Ke(T)/(1 + α·(T − T_ref)), α in 1/K: back-EMF measured warm, stated at the reference. */
export function keAtReferenceTemperature(ke: number, measuredC: number, referenceC: number, coefficientPercentPerK: number): number {
  return ke / (1 + (coefficientPercentPerK / 100) * (measuredC - referenceC));
}
