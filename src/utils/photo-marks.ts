import type { PhotoMeasurementInput, PixelPoint } from '@shared/fit/photo';

/** The points of shared/fit/photo's `photoPointsSchema`, in the order a fitter usually marks them. */
export const POINT_NAMES = ['hip', 'knee', 'ankle', 'kneeFront', 'spindle', 'shoulder', 'toe', 'bottomBracket'] as const;
export type PointName = (typeof POINT_NAMES)[number];
export type MarkName = PointName | 'scaleFrom' | 'scaleTo';
export type Marks = Partial<Record<MarkName, PixelPoint>>;

export interface MarkInfo {
  label: string;
  /** Where exactly to put it, in the trade's terms. */
  landmark: string;
  /** The `data-test` suffix: handle-<test>, mark-<test>. */
  test: string;
  optional?: boolean;
}

export const MARK_INFO: Record<MarkName, MarkInfo> = {
  hip: { label: 'Hip', landmark: 'greater trochanter', test: 'hip' },
  knee: { label: 'Knee', landmark: 'lateral epicondyle, the knee joint centre', test: 'knee' },
  ankle: { label: 'Ankle', landmark: 'lateral malleolus', test: 'ankle' },
  kneeFront: { label: 'Knee front', landmark: 'front of the knee, or the tibial tuberosity', test: 'knee-front' },
  spindle: { label: 'Pedal spindle', landmark: 'centre of the pedal axle, cranks level', test: 'spindle' },
  shoulder: { label: 'Shoulder', landmark: 'acromion; optional, for the hip angle', test: 'shoulder', optional: true },
  toe: { label: 'Foot', landmark: 'fifth metatarsal head; optional, for the ankle angle', test: 'toe', optional: true },
  bottomBracket: { label: 'Bottom bracket', landmark: 'centre of the crank axle; optional, checks the cranks are level', test: 'bottom-bracket', optional: true },
  scaleFrom: { label: 'Scale start', landmark: 'one end of the known length', test: 'scale-from' },
  scaleTo: { label: 'Scale end', landmark: 'the other end of the known length', test: 'scale-to' },
};

/** What is marked after each click, so five clicks mark the leg without going back to the list. */
export const MARKING_ORDER: readonly MarkName[] = ['hip', 'knee', 'ankle', 'kneeFront', 'spindle', 'scaleFrom', 'scaleTo'];

export interface ScaleSettings {
  kind: 'none' | 'wheel' | 'crank';
  /** ISO 5775 size, e.g. 25-622. */
  tyre: string;
  diameter: 'bead-seat' | 'outside';
  crankLength: number;
}

export interface MeasureSettings {
  marks: Marks;
  scale: ScaleSettings;
  facing: 'left' | 'right';
  clickPrecisionPx: number;
}

/** The click precision the workspace starts with, ± pixels. */
export const DEFAULT_CLICK_PRECISION_PX = 3;

export function defaultSettings(crankLength: number | null): MeasureSettings {
  return {
    marks: {},
    scale: { kind: 'none', tyre: '25-622', diameter: 'bead-seat', crankLength: crankLength ?? 172.5 },
    facing: 'right',
    clickPrecisionPx: DEFAULT_CLICK_PRECISION_PX,
  };
}

/** The shared computation's input from what is on screen. */
export function toMeasurementInput(s: MeasureSettings): PhotoMeasurementInput {
  const points: PhotoMeasurementInput['points'] = {};
  for (const name of POINT_NAMES) {
    const p = s.marks[name];
    if (p) points[name] = p;
  }
  const { scaleFrom: from, scaleTo: to } = s.marks;
  let scale: PhotoMeasurementInput['scale'];
  if (from && to && s.scale.kind === 'wheel') scale = { kind: 'wheel', tyre: s.scale.tyre, diameter: s.scale.diameter, from, to };
  if (from && to && s.scale.kind === 'crank') scale = { kind: 'crank', crankLength: s.scale.crankLength, from, to };
  return { points, ...(scale ? { scale } : {}), facing: s.facing, clickPrecisionPx: s.clickPrecisionPx };
}

/** Back from a saved measurement to the screen, so reopening a photo shows its last marks. */
export function fromMeasurementInput(input: PhotoMeasurementInput, fallback: MeasureSettings): MeasureSettings {
  const marks: Marks = { ...input.points };
  const scale = { ...fallback.scale };
  if (input.scale) {
    marks.scaleFrom = input.scale.from;
    marks.scaleTo = input.scale.to;
    if (input.scale.kind === 'wheel') Object.assign(scale, { kind: 'wheel', tyre: input.scale.tyre, diameter: input.scale.diameter });
    if (input.scale.kind === 'crank') Object.assign(scale, { kind: 'crank', crankLength: input.scale.crankLength });
  }
  return { marks, scale, facing: input.facing, clickPrecisionPx: input.clickPrecisionPx ?? DEFAULT_CLICK_PRECISION_PX };
}
