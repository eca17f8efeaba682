import sharp from 'sharp';
import { fileTypeFromBuffer } from 'file-type';
import { CLIP_TYPES, PHOTO_TYPES, UPLOAD_LIMITS, type UploadContentType } from '@shared/rider';
import { AppError } from '../errors';
import { Mp4StructureError, stripMp4Metadata } from './mp4-metadata';

export interface Detected {
  kind: 'photo' | 'clip';
  contentType: UploadContentType;
  ext: 'jpg' | 'png' | 'webp' | 'mp4' | 'webm';
}

const EXT: Record<UploadContentType, Detected['ext']> = {
  'image/jpeg': 'jpg', 'image/png': 'png', 'image/webp': 'webp', 'video/mp4': 'mp4', 'video/webm': 'webm',
};
const ACCEPTED = 'a JPEG, PNG or WebP photo or an MP4 or WebM clip';
/** Friendly names for content we recognise but do not take, so the message says what the file really is. */
const KNOWN: Record<string, string> = {
  'application/pdf': 'a PDF document',
  'image/heic': 'an iPhone HEIC photo (set the camera to "Most Compatible", or share it as JPEG)',
  'image/heif': 'a HEIF photo (share it as JPEG instead)',
  'video/quicktime': 'a QuickTime MOV clip (share or export it as MP4)',
  'image/gif': 'a GIF animation',
  'application/zip': 'a zip archive',
};
const MB = 1024 * 1024;
/** M4V is Apple's label for an MP4 file (the same ISO base media format): stored and served as MP4. */
const ALIASES: Record<string, string> = { 'video/x-m4v': 'video/mp4' };

/**
 * What the file really is, from its first bytes (file-type), never from its name or declared
 * type. Anything else is refused with a message naming what it looks like.
 */
export async function detectUpload(data: Buffer): Promise<Detected> {
  const found = await fileTypeFromBuffer(data);
  const mime = found ? (ALIASES[found.mime] ?? found.mime) : undefined;
  if (mime && ([...PHOTO_TYPES, ...CLIP_TYPES] as string[]).includes(mime)) {
    const contentType = mime as UploadContentType;
    return { kind: mime.startsWith('image/') ? 'photo' : 'clip', contentType, ext: EXT[contentType] };
  }
  const what = mime ? (KNOWN[mime] ?? `a ${found!.ext.toUpperCase()} file`) : 'not something we recognise';
  throw new AppError(415, 'unsupported_file_type', `This file's content is ${what}, not ${ACCEPTED}, whatever its name or type says. Please choose a photo or clip from your camera.`);
}

export function assertSize(kind: Detected['kind'], bytes: number): void {
  const max = kind === 'photo' ? UPLOAD_LIMITS.photoBytes : UPLOAD_LIMITS.clipBytes;
  if (bytes > max) {
    throw new AppError(413, 'file_too_large', `A ${kind} can be at most ${max / MB} MB; this one is ${(bytes / MB).toFixed(1)} MB.`);
  }
}

export interface ProcessedPhoto {
  data: Buffer;
  thumbnail: Buffer;
  width: number;
  height: number;
}

/** Refuse decompression bombs: 80 megapixels is well above any phone camera. */
const MAX_PIXELS = 80_000_000;

/**
 * Re-encode the photo in its own format with the EXIF orientation applied (`rotate()`), and no
 * metadata: sharp writes none unless asked (`keepMetadata`/`withMetadata`), so EXIF (GPS, camera
 * make and model, dates), XMP, IPTC, ICC and PNG text chunks are all dropped. Plus a small WebP
 * thumbnail for lists.
 */
export async function processPhoto(input: Buffer, detected: Detected): Promise<ProcessedPhoto> {
  try {
    const base = sharp(input, { failOn: 'error', limitInputPixels: MAX_PIXELS }).rotate();
    const encoded = detected.ext === 'jpg' ? base.jpeg({ quality: 88 }) : detected.ext === 'png' ? base.png() : base.webp({ quality: 88 });
    const { data, info } = await encoded.toBuffer({ resolveWithObject: true });
    const thumbnail = await sharp(data).resize({ width: 480, height: 480, fit: 'inside', withoutEnlargement: true }).webp({ quality: 72 }).toBuffer();
    return { data, thumbnail, width: info.width, height: info.height };
  } catch {
    throw new AppError(400, 'unreadable_file', 'We could not read this photo; it may be damaged. Please try another file.');
  }
}

/**
 * Clips are stored as sent, except that MP4 metadata boxes are blanked (see mp4-metadata.ts).
 * WebM is not rewritten: browsers and screen recorders that make WebM do not write a location,
 * and without ffmpeg we cannot re-mux it safely. `stripped` says which case applied.
 */
export function processClip(input: Buffer, detected: Detected): { data: Buffer; stripped: boolean } {
  if (detected.contentType !== 'video/mp4') return { data: input, stripped: false };
  try {
    stripMp4Metadata(input);
    return { data: input, stripped: true };
  } catch (error) {
    if (error instanceof Mp4StructureError) throw new AppError(400, 'unreadable_file', 'We could not read this clip; it may be damaged or cut short. Please try another file.');
    throw error;
  }
}
