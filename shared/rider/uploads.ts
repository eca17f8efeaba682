/** Photos and clips for the intake: views, limits and the accepted types (checked by content). */
import { z } from 'zod';
import { strictShape } from './text';

/**
 * The shots a fitter can use, each tagged on upload. Side-on views are filmed on a trainer with
 * the camera level with the bottom bracket, so knee angle and knee-over-pedal-spindle can be marked.
 */
export const UPLOAD_VIEWS = ['side-crank-3', 'side-crank-6', 'front', 'rear', 'other'] as const;
export type UploadView = (typeof UPLOAD_VIEWS)[number];
export const UPLOAD_VIEW_INFO: Record<UploadView, { label: string; guide: string }> = {
  'side-crank-3': {
    label: 'Side-on, crank at 3 o\'clock',
    guide: 'Bike on a trainer, camera at hip height about 3 m away, square to the bike. Stop with the near crank pointing forward, level.',
  },
  'side-crank-6': {
    label: 'Side-on, crank at the bottom',
    guide: 'Same place as the 3 o\'clock shot. Stop with the near crank pointing straight down, in line with the seat tube.',
  },
  front: { label: 'From the front', guide: 'Camera at knee height straight in front of the bike, about 2 m away, while you pedal.' },
  rear: { label: 'From behind', guide: 'Camera at saddle height straight behind the bike, about 2 m away, while you pedal.' },
  other: { label: 'Something else', guide: 'Anything else your fitter should see: cleats, saddle, a sore spot on the bike.' },
};

export const PHOTO_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const;
export const CLIP_TYPES = ['video/mp4', 'video/webm'] as const;
export type UploadContentType = (typeof PHOTO_TYPES)[number] | (typeof CLIP_TYPES)[number];
export const UPLOAD_KINDS = ['photo', 'clip'] as const;

const MB = 1024 * 1024;
/**
 * Our limits: a phone photo is 2–8 MB, so 15 MB leaves room; 60 MB holds about 30 s of 1080p,
 * enough for a few pedal strokes. Twelve files cover every view twice with room for extras.
 */
export const UPLOAD_LIMITS = { photoBytes: 15 * MB, clipBytes: 60 * MB, filesPerIntake: 12 } as const;

/** The form fields sent with each file (multipart). */
export const uploadFieldsSchema = strictShape({
  view: z.enum(UPLOAD_VIEWS, { error: 'Say which view this is, e.g. side-on with the crank at 3 o\'clock.' }),
});

export const uploadViewSchema = z.object({
  id: z.number(),
  intakeId: z.number(),
  view: z.enum(UPLOAD_VIEWS),
  kind: z.enum(UPLOAD_KINDS),
  contentType: z.string(),
  byteSize: z.number(),
  width: z.number().nullable(),
  height: z.number().nullable(),
  /** False when we could not remove the file's metadata (WebM clips; see the upload guide). */
  metadataStripped: z.boolean(),
  createdAt: z.string(),
  url: z.string(),
  thumbnailUrl: z.string().nullable(),
});
export type UploadViewModel = z.infer<typeof uploadViewSchema>;
