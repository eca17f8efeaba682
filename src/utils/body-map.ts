import { BODY_REGIONS, REGION_INFO, type BodyRegion } from '@shared/fit/triage';

/**
 * Where each region sits on our body drawings (viewBox 200 × 440). Positions are given for the
 * rider's own side as a distance from the midline; the front view is a mirror (the rider faces
 * us, so their left is on our right), the back view is not.
 */
export type BodyView = 'front' | 'back';

export interface RegionShape {
  region: BodyRegion;
  cx: number;
  cy: number;
  rx: number;
  ry: number;
}

interface Spot {
  dx: number;
  cy: number;
  rx: number;
  ry: number;
}

/** Keyed by region name without its side; `dx` is the distance from the midline. */
const SPOTS: Record<string, { front?: Spot; back?: Spot }> = {
  neck: { back: { dx: 0, cy: 60, rx: 10, ry: 9 } },
  shoulder: { front: { dx: 38, cy: 78, rx: 13, ry: 11 }, back: { dx: 38, cy: 78, rx: 13, ry: 11 } },
  'upper-back': { back: { dx: 0, cy: 108, rx: 26, ry: 22 } },
  'lower-back': { back: { dx: 0, cy: 166, rx: 24, ry: 16 } },
  hand: { front: { dx: 64, cy: 222, rx: 10, ry: 14 } },
  hip: { front: { dx: 24, cy: 192, rx: 12, ry: 11 } },
  'sit-bone': { back: { dx: 14, cy: 206, rx: 13, ry: 12 } },
  perineum: { front: { dx: 0, cy: 214, rx: 9, ry: 8 } },
  'thigh-front': { front: { dx: 19, cy: 250, rx: 13, ry: 26 } },
  'thigh-back': { back: { dx: 19, cy: 252, rx: 13, ry: 26 } },
  'knee-front': { front: { dx: 19, cy: 304, rx: 8, ry: 11 } },
  'knee-inner': { front: { dx: 6, cy: 304, rx: 5, ry: 11 } },
  'knee-outer': { front: { dx: 32, cy: 304, rx: 5, ry: 11 } },
  'knee-back': { back: { dx: 19, cy: 304, rx: 10, ry: 11 } },
  calf: { back: { dx: 19, cy: 348, rx: 10, ry: 22 } },
  achilles: { back: { dx: 19, cy: 394, rx: 5, ry: 11 } },
  foot: { front: { dx: 19, cy: 420, rx: 11, ry: 7 } },
};

function baseName(region: BodyRegion): string {
  return region.replace(/-(left|right)$/, '');
}

function place(view: BodyView, side: 'left' | 'right' | 'centre', dx: number): number {
  if (side === 'centre') return 100;
  // Front: the rider's left is on the viewer's right. Back: the rider's left is on the viewer's left.
  const towardViewerRight = view === 'front' ? side === 'left' : side === 'right';
  return towardViewerRight ? 100 + dx : 100 - dx;
}

/** The clickable shapes of one drawing, in BODY_REGIONS order. */
export function shapesFor(view: BodyView): RegionShape[] {
  return BODY_REGIONS.flatMap((region) => {
    const info = REGION_INFO[region];
    if (info.view !== view && info.view !== 'both') return [];
    const spot = SPOTS[baseName(region)]?.[view];
    if (!spot) return [];
    return [{ region, cx: place(view, info.side, spot.dx), cy: spot.cy, rx: spot.rx, ry: spot.ry }];
  });
}

/** The outline of a person, as simple paths; decoration only (the regions carry the meaning). */
export const BODY_OUTLINE = [
  'M100 8 a22 22 0 1 0 0.1 0 Z', // head
  'M91 50 L109 50 L110 66 L90 66 Z', // neck
  'M62 68 L138 68 L142 120 L134 200 L66 200 L58 120 Z', // torso
  'M62 70 L48 140 L36 212 L46 214 L60 146 L70 100', // arm, viewer's left
  'M138 70 L152 140 L164 212 L154 214 L140 146 L130 100', // arm, viewer's right
  'M66 200 L97 200 L96 316 L90 410 L72 410 L70 316 Z', // leg, viewer's left
  'M103 200 L134 200 L130 316 L128 410 L110 410 L104 316 Z', // leg, viewer's right
];
