/** Plane geometry on marked pixel points, with first-order sensitivities for uncertainty. */
import { ensureFinite, FitInputError, requireFinite } from '../errors';
import type { PixelPoint } from './schemas';

/** Points closer than this (pixels) are treated as the same click. */
export const MIN_POINT_SEPARATION_PX = 1;

/** Throws FitInputError unless both coordinates of the point are finite numbers. */
function requirePoint(name: string, p: PixelPoint): void {
  requireFinite(`points.${name}.x`, p.x);
  requireFinite(`points.${name}.y`, p.y);
}

/** Distance between two points, pixels. Throws FitInputError for a NaN or infinite coordinate. */
export function distance(a: PixelPoint, b: PixelPoint, names: [string, string] = ['first', 'second']): number {
  requirePoint(names[0], a);
  requirePoint(names[1], b);
  return ensureFinite('distance', Math.hypot(b.x - a.x, b.y - a.y));
}

export function requireApart(names: [string, string], a: PixelPoint, b: PixelPoint): number {
  const d = distance(a, b, names);
  if (d < MIN_POINT_SEPARATION_PX) {
    throw new FitInputError(`points.${names[1]}`, `The ${names[0]} and ${names[1]} points coincide; mark them apart.`);
  }
  return d;
}

export interface AngleWithSensitivity {
  /** Included angle at the vertex, degrees, 0–180. */
  degrees: number;
  /**
   * Worst-case change in degrees per pixel of movement of each point, first order: the sum of
   * the gradient magnitudes at the three points. Multiply by the click precision.
   */
  degreesPerPixel: number;
}

/**
 * The included angle a–vertex–c in degrees (0–180), computed with atan2 of the cross and dot
 * products so it stays accurate near 0° and 180°. Throws FitInputError when points coincide.
 */
export function includedAngle(
  a: PixelPoint,
  vertex: PixelPoint,
  c: PixelPoint,
  names: [string, string, string] = ['first', 'vertex', 'third'],
): AngleWithSensitivity {
  requireApart([names[1], names[0]], vertex, a);
  requireApart([names[1], names[2]], vertex, c);
  const ax = a.x - vertex.x;
  const ay = a.y - vertex.y;
  const cx = c.x - vertex.x;
  const cy = c.y - vertex.y;
  const cross = ax * cy - ay * cx;
  const dot = ax * cx + ay * cy;
  const degrees = (Math.atan2(Math.abs(cross), dot) * 180) / Math.PI;
  // θ = arg(c) − arg(a); ∂arg(v)/∂v = (−v_y, v_x)/|v|². The vertex gradient is minus their sum.
  const a2 = ax * ax + ay * ay;
  const c2 = cx * cx + cy * cy;
  const gA = { x: ay / a2, y: -ax / a2 };
  const gC = { x: -cy / c2, y: cx / c2 };
  const gB = { x: -(gA.x + gC.x), y: -(gA.y + gC.y) };
  const perPixelRad = Math.hypot(gA.x, gA.y) + Math.hypot(gC.x, gC.y) + Math.hypot(gB.x, gB.y);
  return { degrees: ensureFinite('angle', degrees), degreesPerPixel: ensureFinite('angleUncertainty', (perPixelRad * 180) / Math.PI) };
}


