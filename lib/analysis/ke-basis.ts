import type { KeBasis } from "./rating";
import type { BackEmfReport } from "./report-schema";

/**
 * The measured back-EMF constant in the rating's basis, at the magnet reference temperature when the
 * report carries a corrected value. V_ph = V_LL/√3 for a balanced star-equivalent set; peak = √2·RMS;
 * 1 krpm = 104.72 rad/s (DOMAIN §1).
 */
export function keInBasis(backEmf: BackEmfReport | null, basis: KeBasis): number | null {
  if (!backEmf) return null;
  const corrected = backEmf.keLineRmsPerKrpmAtReference;
  const factor = corrected != null && backEmf.keLineRmsPerKrpm > 0 ? corrected / backEmf.keLineRmsPerKrpm : 1;
  const value: number = (() => {
    switch (basis) {
      case "line-line-rms-per-krpm":
        return backEmf.keLineRmsPerKrpm;
      case "line-line-peak-per-krpm":
        return backEmf.keLinePeakPerKrpm;
      case "phase-rms-per-krpm":
        return backEmf.keLineRmsPerKrpm / Math.sqrt(3);
      case "phase-peak-per-rad-s":
        return backEmf.kePhasePeakPerRadS;
    }
  })();
  return Number.isFinite(value * factor) ? value * factor : null;
}
