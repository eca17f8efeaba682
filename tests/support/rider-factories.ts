import sharp from 'sharp';
import { RED_FLAG_QUESTIONS } from '@shared/fit/triage';
import { currentConsent, questionsToAsk, type IntakeSubmitInput } from '@shared/rider';
import type { Setup } from '@shared/fit/setup';
import type { BrowserLikeAgent } from './app';

/** An invented, plausible road setup in millimetres and degrees. */
export function roadSetup(overrides: Partial<Setup> = {}): Setup {
  return {
    saddleHeight: 742, saddleSetback: 68, saddleTilt: -1, reach: 548, drop: 72, stemLength: 100,
    spacerStack: 20, crankLength: 172.5, stack: 21, cleatForeAft: 0, cleatRotation: 2, ...overrides,
  };
}

export const today = () => new Date().toISOString().slice(0, 10);

export function bikeBody(overrides: Record<string, unknown> = {}) {
  return { name: 'Grey test road bike', kind: 'road', baseline: { unit: 'mm', setup: roadSetup(), takenOn: today(), cleatNotes: 'Cleats centred' }, ...overrides };
}

/** Every question that the intake asks answered "no". */
export function allNo(symptoms: readonly object[] = []): Record<string, boolean> {
  return Object.fromEntries(questionsToAsk({}, symptoms as { afterCrash?: boolean }[]).map((id) => [id, false]));
}

export const kneeSymptom = (overrides: Record<string, unknown> = {}) => ({
  region: 'knee-front-left', pain: 4, kind: 'ache', timing: ['during-ride', 'after-ride'], durationDays: 21, ...overrides,
});

export function submitBody(overrides: Partial<Record<keyof IntakeSubmitInput, unknown>> = {}) {
  const symptoms: { afterCrash?: boolean }[] = (overrides.symptoms as { afterCrash?: boolean }[] | undefined) ?? ([kneeSymptom()] as { afterCrash?: boolean }[]);
  return {
    symptoms,
    redFlagAnswers: allNo(symptoms),
    goals: ['ride-without-pain'],
    goalNotes: 'Ride a 100 km sportive in spring',
    consent: { kind: 'store-health-data', version: currentConsent('store-health-data')!.version, agreed: true },
    ...overrides,
  };
}

/** An urgent answer on its own (cauda equina sign, NICE NG59). */
export const URGENT_FLAG = RED_FLAG_QUESTIONS.find((q) => q.level === 'urgent')!.id;

export async function submitIntake(client: BrowserLikeAgent, overrides: Parameters<typeof submitBody>[0] = {}) {
  const res = await client.post('/api/rider/intake/submit', submitBody(overrides));
  if (res.status !== 201) throw new Error(`intake submit failed: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body as { intake: { id: number; triage: { level: string } }; readiness: { ready: boolean } };
}

/** A small JPEG carrying GPS and camera make/model in its EXIF, like a phone photo. */
export async function jpegWithLocation(width = 64, height = 48): Promise<Buffer> {
  return sharp({ create: { width, height, channels: 3, background: { r: 120, g: 160, b: 140 } } })
    .jpeg()
    .withExif({
      IFD0: { Make: 'InventedPhoneCo', Model: 'Imaginary X1', Software: 'TestCam 1.0' },
      IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '51/1 30/1 0/1', GPSLongitudeRef: 'W', GPSLongitude: '0/1 7/1 0/1' },
    })
    .toBuffer();
}

export function pngBuffer(width = 40, height = 30): Promise<Buffer> {
  return sharp({ create: { width, height, channels: 4, background: { r: 200, g: 100, b: 59, alpha: 1 } } }).png().toBuffer();
}

/** A minimal MP4: ftyp, moov with mvhd and a udta carrying a location and a camera model, mdat. */
export function mp4WithLocation(brand = 'isom'): Buffer {
  const box = (type: string, ...payload: Buffer[]) => {
    const body = Buffer.concat(payload);
    const head = Buffer.alloc(8);
    head.writeUInt32BE(8 + body.length, 0);
    head.write(type, 4, 'latin1');
    return Buffer.concat([head, body]);
  };
  const ftyp = box('ftyp', Buffer.from(brand.padEnd(4, ' '), 'latin1'), Buffer.from([0, 0, 2, 0]), Buffer.from('isomiso2avc1mp41', 'latin1'));
  const mvhd = box('mvhd', Buffer.alloc(100));
  const xyz = box('\u00a9xyz', Buffer.from([0, 17, 0x15, 0xc7]), Buffer.from('+51.5000-000.1167/', 'latin1'));
  const mod = box('\u00a9mod', Buffer.from([0, 12, 0, 0]), Buffer.from('Imaginary X1', 'latin1'));
  const moov = box('moov', mvhd, box('udta', xyz, mod));
  const mdat = box('mdat', Buffer.alloc(256, 7));
  return Buffer.concat([ftyp, moov, mdat]);
}
