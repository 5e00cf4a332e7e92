// Figures as a person reads them: no more digits than the measurement supports, never "-0".
// Pure and browser-safe, shared by pages, CSV, PDF and API labels.
//
// With an expanded uncertainty U (coverage factor k = 2), U is rounded to two significant digits
// and the value to the same decimal place (GUM, JCGM 100:2008, 7.2.6). Without one, each quantity
// has a fixed resolution:
//
// | quantity    | unit      | resolution                                    | why                                   |
// |-------------|-----------|-----------------------------------------------|---------------------------------------|
// | voltage     | V         | 4 significant digits, finest 0.001 V          | bench meters read 4 digits            |
// | current     | A         | 4 significant digits, finest 0.001 A          | as voltage                            |
// | frequency   | Hz        | 0.001 Hz                                      | the engine's frequency is a few mHz   |
// | percent     | %         | 0.01 %                                        | limits are a few percent              |
// | angle       | °         | 0.1°                                          | displacement limits are whole degrees |
// | ke          | V/krpm …  | 4 significant digits, finest 0.0001           | nominal Ke is given to 3–4 digits     |
// | tif         | (index)   | 1                                             | TIF limits are whole numbers          |
// | poles       | (count)   | 0.01                                          | 120·f/n near an even integer          |
// | ratio       | (ratio)   | 0.001                                         | crest factor, power factor            |
// | speed       | rpm       | 1 rpm                                         | tachometers read whole rpm            |
// | power       | W, var, VA| 4 significant digits, finest 0.001            | as voltage                            |
//
// The resolutions are common practice, chosen for these pages; a figure's uncertainty overrides them.

export type Quantity = "voltage" | "current" | "frequency" | "percent" | "angle" | "ke" | "tif" | "poles" | "ratio" | "speed" | "power";

type Resolution = { step: number } | { significant: number; finest: number };

export const RESOLUTIONS: Readonly<Record<Quantity, Resolution>> = {
  voltage: { significant: 4, finest: 0.001 },
  current: { significant: 4, finest: 0.001 },
  frequency: { step: 0.001 },
  percent: { step: 0.01 },
  angle: { step: 0.1 },
  ke: { significant: 4, finest: 0.0001 },
  tif: { step: 1 },
  poles: { step: 0.01 },
  ratio: { step: 0.001 },
  speed: { step: 1 },
  power: { significant: 4, finest: 0.001 },
};

const BY_UNIT: Record<string, Quantity> = { V: "voltage", A: "current", Hz: "frequency", "%": "percent", "°": "angle", rpm: "speed", W: "power", var: "power", VA: "power" };
const BY_CHECK: Record<string, Quantity> = { tif: "tif", "pole-count": "poles", "back-emf-constant": "ke" };

/** The quantity behind a verdict's figure, from its check id and unit ("ratio" when neither says). */
export function quantityFor(unit: string, check?: string): Quantity {
  return (check ? BY_CHECK[check] : undefined) ?? BY_UNIT[unit] ?? (unit.startsWith("V") ? "ke" : "ratio");
}

/** Decimal places of a step that is a power of ten (0.001 → 3, 1 → 0, 10 → −1). */
const decimalsOf = (step: number) => -Math.round(Math.log10(step));

/** x·10^k computed on the decimal digits (1.005 stays 1.005, not 1.00499…), for any finite x. */
function shiftDecimal(x: number, k: number): number {
  const [mantissa, exponent] = x.toExponential().split("e") as [string, string];
  return Number(`${mantissa}e${Number(exponent) + k}`);
}

/** Rounds half away from zero at `decimals` places (negative: tens, hundreds) and prints without "-0". */
export function roundToDecimals(value: number, decimals: number): string {
  const rounded = Math.round(shiftDecimal(Math.abs(value), decimals));
  if (rounded === 0) return decimals > 0 ? (0).toFixed(decimals) : "0";
  const sign = value < 0 ? "-" : "";
  return sign + shiftDecimal(rounded, -decimals).toFixed(Math.max(decimals, 0));
}

/** Decimal places that keep two significant digits of U, after rounding U itself (0.0996 → 0.10, 2 places). */
export function uncertaintyDecimals(uncertainty: number): number {
  const exponent = Math.floor(Math.log10(uncertainty));
  let decimals = 1 - exponent;
  const rounded = Number(roundToDecimals(uncertainty, decimals));
  if (rounded >= 10 ** (exponent + 1)) decimals -= 1;
  return decimals;
}

function resolutionDecimals(value: number, resolution: Resolution): number {
  if ("step" in resolution) return decimalsOf(resolution.step);
  const finest = decimalsOf(resolution.finest);
  if (value === 0) return finest;
  let decimals = resolution.significant - 1 - Math.floor(Math.log10(Math.abs(value)));
  // 9999.7 at 4 digits rounds up to 10000: one digit fewer after the point.
  if (Math.abs(Number(roundToDecimals(value, decimals))) >= 10 ** (resolution.significant - decimals)) decimals -= 1;
  return Math.min(Math.max(decimals, 0), finest);
}

export type FigureOptions = { quantity: Quantity; uncertainty?: number | null };

export type FormattedFigure = { value: string; uncertainty: string | null; decimals: number };

/**
 * One figure rounded as its uncertainty allows, or to its quantity's resolution; null for a figure
 * that could not be computed (pages print a dash). A non-positive or non-finite U is ignored.
 */
export function formatFigureParts(value: number | null | undefined, options: FigureOptions): FormattedFigure | null {
  if (value === null || value === undefined || !Number.isFinite(value)) return null;
  const u = options.uncertainty;
  if (u !== null && u !== undefined && Number.isFinite(u) && u > 0) {
    const decimals = uncertaintyDecimals(u);
    return { value: roundToDecimals(value, decimals), uncertainty: roundToDecimals(u, decimals), decimals };
  }
  const decimals = resolutionDecimals(value, RESOLUTIONS[options.quantity]);
  return { value: roundToDecimals(value, decimals), uncertainty: null, decimals };
}

/** "49.300", or "—" when the figure is missing. */
export function formatFigure(value: number | null | undefined, options: FigureOptions): string {
  return formatFigureParts(value, options)?.value ?? "—";
}

/** "49.300 ± 0.010 Hz", "400.1 V", "12" (no unit), or "—". */
export function formatFigureWithUnit(value: number | null | undefined, unit: string, options: FigureOptions): string {
  const parts = formatFigureParts(value, options);
  if (!parts) return "—";
  const spaced = unit === "" ? "" : unit === "°" ? "°" : ` ${unit}`;
  return parts.uncertainty === null ? `${parts.value}${spaced}` : `${parts.value} ± ${parts.uncertainty}${spaced}`;
}
