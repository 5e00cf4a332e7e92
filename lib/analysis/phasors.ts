/** Complex numbers as plain pairs; angles in radians unless a name says Deg. */
export interface Complex {
  re: number;
  im: number;
}

export const fromPolar = (magnitude: number, angleRad: number): Complex => ({ re: magnitude * Math.cos(angleRad), im: magnitude * Math.sin(angleRad) });
export const add = (a: Complex, b: Complex): Complex => ({ re: a.re + b.re, im: a.im + b.im });
export const subtract = (a: Complex, b: Complex): Complex => ({ re: a.re - b.re, im: a.im - b.im });
export const multiply = (a: Complex, b: Complex): Complex => ({ re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re });
export const scale = (a: Complex, factor: number): Complex => ({ re: a.re * factor, im: a.im * factor });
export const magnitude = (a: Complex): number => Math.hypot(a.re, a.im);
export const angleRad = (a: Complex): number => Math.atan2(a.im, a.re);

export const toDeg = (rad: number): number => (rad * 180) / Math.PI;

/** Wraps an angle in degrees to (−180°, 180°]. */
export function wrapDeg(angleDeg: number): number {
  let wrapped = angleDeg - 360 * Math.floor(angleDeg / 360);
  if (wrapped > 180) wrapped -= 360;
  return wrapped;
}

/** Angle of a minus angle of b, wrapped to (−180°, 180°]. */
export function displacementDeg(a: Complex, b: Complex): number {
  return wrapDeg(toDeg(angleRad(a) - angleRad(b)));
}
