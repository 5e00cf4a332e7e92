import type { CheckId } from "./tolerance";
import type { QualityWarning } from "./types";

// Which checks a warning invalidates. A check whose figure a warning makes unreliable is judged
// inconclusive with the warning's sentence as its reason, whatever the number says: a clipped
// waveform's THD is not the machine's THD, whether it reads inside or outside the band.

/** Flat tops change the waveform's shape: every distortion figure of that channel. */
export const CLIPPING_INVALIDATES: CheckId[] = ["thd", "individual-harmonic", "deviation-factor", "thf", "tif"];

/**
 * Below FEW_CYCLES whole cycles, figures drawn from the fundamental and the harmonics (frequency,
 * phasors, spectra, Ke from the fundamental) are not settled. True RMS over whole cycles and the
 * sign of the phase sequence stay sound.
 */
export const FEW_CYCLES_INVALIDATES: CheckId[] = [
  "frequency", "pole-count", "thd", "individual-harmonic", "voltage-unbalance", "phase-displacement", "deviation-factor", "thf", "tif", "back-emf-constant",
];

/** Harmonics above Nyquist are missing (or aliased): every figure summed over the harmonic orders asked. */
export const SAMPLE_RATE_INVALIDATES: CheckId[] = ["thd", "individual-harmonic", "deviation-factor", "thf", "tif"];

/** A magnitude far off the nameplate: the figures that scale with the voltage. */
export const IMPLAUSIBLE_LEVEL_INVALIDATES: CheckId[] = ["voltage", "back-emf-constant"];

/** Roles that do not fit the rating's phases: the phase set, and the voltage basis it decides. */
export const ROLE_MISMATCH_INVALIDATES: CheckId[] = ["voltage", "voltage-unbalance", "phase-displacement", "phase-sequence", "back-emf-constant"];

/** Codes of warnings produced when judging (they depend on the rating): a re-judge replaces them. */
export const JUDGEMENT_WARNING_CODES = ["implausible-voltage", "implausible-ke", "roles-do-not-fit-rating"] as const;

/** Reports made before warnings carried their list (engine < 2.1.0): the same lists by code. */
const BY_CODE: Record<string, CheckId[]> = {
  clipping: CLIPPING_INVALIDATES,
  "few-cycles": FEW_CYCLES_INVALIDATES,
  "sample-rate-low": SAMPLE_RATE_INVALIDATES,
};

export function invalidatedChecks(warning: Pick<QualityWarning, "code" | "invalidates">): readonly string[] {
  return warning.invalidates ?? BY_CODE[warning.code] ?? [];
}

/**
 * The sentences of the warnings that invalidate `check` as computed from `channels` (a warning
 * about one channel touches only the checks that channel feeds). Empty when none does.
 */
export function invalidatingReasons(warnings: readonly QualityWarning[], check: CheckId, channels: readonly string[]): string[] {
  return warnings
    .filter((w) => invalidatedChecks(w).includes(check) && (w.channel === undefined || channels.includes(w.channel)))
    .map((w) => w.message);
}
