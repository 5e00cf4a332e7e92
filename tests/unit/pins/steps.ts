import { readFileSync } from "node:fs";
import path from "node:path";

// One representable step either side of a band edge: the neighbouring doubles, so a test at
// `nextUp(edge)` is the smallest value a `>` comparison may treat differently from the edge itself.
const buffer = new DataView(new ArrayBuffer(8));

function step(x: number, direction: 1 | -1): number {
  if (Number.isNaN(x) || !Number.isFinite(x)) return x;
  if (x === 0) return direction * Number.MIN_VALUE;
  buffer.setFloat64(0, x);
  const bits = buffer.getBigUint64(0);
  buffer.setBigUint64(0, (x > 0) === (direction > 0) ? bits + 1n : bits - 1n);
  return buffer.getFloat64(0);
}

/** The next double above x. */
export const nextUp = (x: number): number => step(x, 1);
/** The next double below x. */
export const nextDown = (x: number): number => step(x, -1);

/** |measured − expected| / |expected|. */
export const rel = (measured: number, expected: number): number => Math.abs(measured - expected) / Math.abs(expected);

/** Values computed by scripts/fixtures/make_pin_values.py (numpy/scipy, from the definitions). */
export const PINS = JSON.parse(readFileSync(path.resolve(import.meta.dirname, "../../fixtures/analysis/pins.json"), "utf8")) as Record<string, number>;
