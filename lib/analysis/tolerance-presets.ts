import { isPermanentMagnet, type Rating } from "./rating";
import type { CheckRules, LimitSource, ToleranceProfile } from "./tolerance";

// Starting points for a rating's tolerance profile. A preset is a named source for some checks on
// top of the lab's own common-practice limits for the rest; the bands that depend on the nameplate
// (THF by kVA class, distortion by voltage class, what a single-phase or wound-field machine lacks)
// are derived here. Every number is a starting point a lab manager edits; docs/sources.md explains
// the source labels. Sources not checked against their document say so.

export const PRESET_IDS = ["lab-own", "iec-60034-1", "nema-mg-1", "iso-8528-5-g1", "iso-8528-5-g2", "iso-8528-5-g3", "ieee-519-2014", "genset-acceptance"] as const;
export type PresetId = (typeof PRESET_IDS)[number];

export const PRESETS: Record<PresetId, { label: string; summary: string }> = {
  "lab-own": { label: "Lab's own limits", summary: "Common-practice limits for every check, to be set by the lab" },
  "iec-60034-1": { label: "IEC 60034-1 (rotating electrical machines)", summary: "Voltage ±5 % and frequency ±2 % (zone A), THF by rated kVA" },
  "nema-mg-1": { label: "NEMA MG 1 (synchronous generators)", summary: "Deviation factor ≤ 10 %, line-voltage unbalance ≤ 1 %" },
  "iso-8528-5-g1": { label: "ISO 8528-5 generating set, class G1", summary: "Voltage ±5 %, frequency ±2.5 %, unbalance 1 %" },
  "iso-8528-5-g2": { label: "ISO 8528-5 generating set, class G2", summary: "Voltage ±2.5 %, frequency ±1.5 %, unbalance 1 %" },
  "iso-8528-5-g3": { label: "ISO 8528-5 generating set, class G3", summary: "Voltage ±1 %, frequency ±0.5 %, unbalance 1 %" },
  "ieee-519-2014": { label: "IEEE 519-2014 distortion limits (borrowed system limits)", summary: "THD and single-harmonic limits by the rated voltage's class" },
  "genset-acceptance": { label: "Generator set acceptance (US facilities guide)", summary: "THD ≤ 5 %, any single harmonic ≤ 3 %" },
};

const LAB: LimitSource = { document: "Lab's own limit (common practice)", clause: "", verified: false };
const IEC_ZONE: LimitSource = { document: "IEC 60034-1", clause: "zone A of voltage and frequency variation", verified: false };
const IEC_THF: LimitSource = { document: "IEC 60034-1", clause: "telephone harmonic factor limits by rated output", verified: false };
const NEMA_DF: LimitSource = { document: "NEMA MG 1", clause: "waveform deviation factor of synchronous generators", verified: false };
const NEMA_UNBALANCE: LimitSource = { document: "NEMA MG 1", clause: "voltage unbalance (line voltages)", verified: false };
const ISO: LimitSource = { document: "ISO 8528-5", clause: "performance classes, steady-state limits", verified: false };
const IEEE_519: LimitSource = { document: "IEEE Std 519-2014", clause: "Table 1, voltage distortion limits", verified: true };
const UFGS: LimitSource = { document: "US Unified Facilities Guide Specifications, engine generator sets", clause: "harmonic distortion at rated load", verified: true };

const sym = (percent: number, source: LimitSource) => ({ required: true as const, source, lowerPercent: -percent, upperPercent: percent });
const max = (maxPercent: number, source: LimitSource) => ({ required: true as const, source, maxPercent });
const notRequired = (reason: string) => ({ required: false as const, reason });

/** IEC 60034-1 THF limits by rated output [M ⚠ DOMAIN §4]: none below 300 kVA. */
export function thfLimitForKva(kva: number | undefined): number | null {
  if (kva === undefined || kva < 300) return null;
  if (kva < 1000) return 5;
  if (kva < 5000) return 1.5;
  return 1;
}

/** IEEE 519-2014 Table 1 [S]: THD and individual limits by bus voltage, kV. */
export function ieee519Limits(voltageV: number): { thd: number; individual: number } {
  if (voltageV <= 1000) return { thd: 8, individual: 5 };
  if (voltageV <= 69_000) return { thd: 5, individual: 3 };
  if (voltageV <= 161_000) return { thd: 2.5, individual: 1.5 };
  return { thd: 1.5, individual: 1 };
}

function labOwn(rating: Rating): CheckRules {
  const thf = thfLimitForKva(rating.ratedKva);
  return {
    voltage: sym(5, LAB),
    frequency: sym(1, LAB),
    thd: max(5, LAB),
    "individual-harmonic": max(3, LAB),
    "voltage-unbalance": { required: true, source: LAB, maxPercent: 1, definition: "vuf" },
    "phase-displacement": { required: true, source: LAB, toleranceDeg: 2 },
    "phase-sequence": { required: true, source: LAB, expected: "positive" },
    "deviation-factor": max(10, NEMA_DF),
    thf: thf === null ? notRequired(`IEC 60034-1 sets THF limits from 300 kVA; this rating is ${rating.ratedKva === undefined ? "not rated in kVA" : `${rating.ratedKva} kVA`}`) : max(thf, IEC_THF),
    tif: { required: true, source: LAB, max: 50 },
    "back-emf-constant": sym(5, LAB),
    "pole-count": sym(2, { ...LAB, clause: "slip and speed-reading allowance" }),
  };
}

function applyPreset(id: PresetId, rating: Rating, rules: CheckRules): CheckRules {
  switch (id) {
    case "lab-own":
      return rules;
    case "iec-60034-1":
      return { ...rules, voltage: sym(5, IEC_ZONE), frequency: sym(2, IEC_ZONE) };
    case "nema-mg-1":
      return { ...rules, "deviation-factor": max(10, NEMA_DF), "voltage-unbalance": { required: true, source: NEMA_UNBALANCE, maxPercent: 1, definition: "nema" } };
    case "iso-8528-5-g1":
    case "iso-8528-5-g2":
    case "iso-8528-5-g3": {
      const [v, f] = id.endsWith("g1") ? [5, 2.5] : id.endsWith("g2") ? [2.5, 1.5] : [1, 0.5];
      return { ...rules, voltage: sym(v, ISO), frequency: sym(f, ISO), "voltage-unbalance": { required: true, source: ISO, maxPercent: 1, definition: "vuf" } };
    }
    case "ieee-519-2014": {
      const limits = ieee519Limits(rating.nominalVoltageV);
      return { ...rules, thd: max(limits.thd, IEEE_519), "individual-harmonic": max(limits.individual, IEEE_519) };
    }
    case "genset-acceptance":
      return { ...rules, thd: max(5, UFGS), "individual-harmonic": max(3, UFGS) };
  }
}

/** What the nameplate rules out, whatever the preset says. */
function applyNameplate(rating: Rating, rules: CheckRules): CheckRules {
  const out = { ...rules };
  if (rating.phases === 1) {
    const why = "single-phase machine: there is no phase set to compare";
    out["voltage-unbalance"] = notRequired(why);
    out["phase-displacement"] = notRequired(why);
    out["phase-sequence"] = notRequired(why);
  } else if (rating.phases === 2) {
    out["voltage-unbalance"] = notRequired("two-phase machine: the unbalance definitions are for three-phase sets");
    out["phase-sequence"] = notRequired("two-phase machine: sequence by symmetrical components needs three phases");
  }
  if (!isPermanentMagnet(rating)) out["back-emf-constant"] = notRequired("wound-field machine: no permanent-magnet back-EMF constant on the nameplate");
  if (Math.abs(rating.frequencyHz - 60) > 0.5) out.tif = notRequired(`TIF is defined for 60 Hz machines; this rating is ${rating.frequencyHz} Hz`);
  return out;
}

/** A complete profile for a rating from a preset: every check judged or marked not required. */
export function profileFromPreset(id: PresetId, rating: Rating): ToleranceProfile {
  return {
    label: PRESETS[id].label,
    presetId: id,
    marginalZonePercent: 10,
    harmonicOrder: 50,
    plausibilityFactor: 3,
    decisionRule: "simple",
    checks: applyNameplate(rating, applyPreset(id, rating, labOwn(rating))),
  };
}
