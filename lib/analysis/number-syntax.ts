/**
 * The one numeric cell syntax both body parsers accept: optional sign, digits with an optional
 * decimal separator, optional exponent. No hex, no "NaN", no "Infinity", no thousands separators.
 */
const POINT_NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;
const COMMA_NUMBER = /^[+-]?(?:\d+,?\d*|,\d+)(?:[eE][+-]?\d+)?$/;

export function isNumericCell(cell: string, decimal: "." | ","): boolean {
  return (decimal === "." ? POINT_NUMBER : COMMA_NUMBER).test(cell);
}

/** The value of a cell already known to pass `isNumericCell`. */
export function readNumericCell(cell: string, decimal: "." | ","): number {
  return Number(decimal === "," ? cell.replace(",", ".") : cell);
}

/** Shortens a cell for an error message. */
export function quoteCell(cell: string): string {
  const shown = cell.length > 24 ? `${cell.slice(0, 24)}…` : cell;
  return JSON.stringify(shown);
}
