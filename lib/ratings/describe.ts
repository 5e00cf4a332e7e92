import {
  CONNECTION_LABELS, KE_BASIS_LABELS, KE_BASIS_UNITS, MACHINE_KIND_LABELS, MAGNET_MATERIAL_LABELS, VOLTAGE_BASIS_LABELS, type Rating,
} from "@/lib/analysis";

export type NameplateRow = { label: string; value: string };

const num = (n: number) => (Number.isInteger(n) ? n.toLocaleString("en-GB").replace(/,/g, " ") : String(n));

/**
 * A nameplate as labelled rows with units, for pages, CSV and PDF alike (browser-safe). Rows for
 * figures the rating does not state are left out.
 */
export function describeNameplate(nameplate: Rating): NameplateRow[] {
  const rows: NameplateRow[] = [
    { label: "Machine kind", value: MACHINE_KIND_LABELS[nameplate.machineKind] },
    { label: "Phases", value: String(nameplate.phases) },
    { label: "Connection", value: CONNECTION_LABELS[nameplate.connection] },
    { label: "Poles", value: String(nameplate.poles) },
    { label: "Rated speed", value: `${num(nameplate.ratedSpeedRpm)} rpm` },
    { label: "Rated voltage", value: `${num(nameplate.nominalVoltageV)} V, ${VOLTAGE_BASIS_LABELS[nameplate.voltageBasis]}` },
    { label: "Rated frequency", value: `${num(nameplate.frequencyHz)} Hz` },
  ];
  if (nameplate.ratedKva !== undefined) rows.push({ label: "Rated apparent power", value: `${num(nameplate.ratedKva)} kVA` });
  if (nameplate.ratedKw !== undefined) rows.push({ label: "Rated power", value: `${num(nameplate.ratedKw)} kW` });
  if (nameplate.ke) rows.push({ label: "Nominal Ke", value: `${num(nameplate.ke.value)} ${KE_BASIS_UNITS[nameplate.ke.basis]}, ${KE_BASIS_LABELS[nameplate.ke.basis]}` });
  if (nameplate.magnetMaterial) rows.push({ label: "Magnet material", value: MAGNET_MATERIAL_LABELS[nameplate.magnetMaterial] });
  if (nameplate.magnetReferenceC !== undefined) rows.push({ label: "Ke reference temperature", value: `${num(nameplate.magnetReferenceC)} °C` });
  return rows;
}
