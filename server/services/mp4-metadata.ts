/**
 * Removes the metadata that phones write into MP4 clips (location `©xyz`, camera make and model,
 * Apple's `com.apple.quicktime.location.ISO6709` keys, XMP) without re-encoding, which we cannot
 * do here (no ffmpeg). The `udta` and `meta` boxes under `moov` and each `trak`, and a top-level
 * XMP `uuid` box, are turned into `free` boxes of the same size with their bytes zeroed. Sizes
 * and positions stay the same, so the sample offsets in `stco`/`co64` still point at the right
 * bytes and the clip plays exactly as before (players skip `free` boxes, ISO/IEC 14496-12 §8.1.2).
 * Not touched: `mvhd`/`tkhd` creation times, and anything inside the encoded video itself.
 */

/** XMP packets in ISO media live in a `uuid` box with this id (XMP Specification Part 3, §1.1.4). */
const XMP_UUID = 'be7acfcb97a942e89c71999491e3afac';
const STRIP_UNDER = new Set(['moov', 'trak']);
const STRIP = new Set(['udta', 'meta']);
/** moov → trak is as deep as the boxes we strip go; the limit also bounds work on hostile input. */
const MAX_DEPTH = 3;

export class Mp4StructureError extends Error {}

function neutralise(buf: Buffer, start: number, headerSize: number, size: number): void {
  buf.write('free', start + 4, 'latin1');
  buf.fill(0, start + headerSize, start + size);
}

function walk(buf: Buffer, start: number, end: number, parent: string | null, depth: number, found: string[]): void {
  let pos = start;
  while (pos + 8 <= end) {
    let size = buf.readUInt32BE(pos);
    const type = buf.toString('latin1', pos + 4, pos + 8);
    let header = 8;
    if (size === 1) {
      if (pos + 16 > end) throw new Mp4StructureError('truncated box header');
      const large = buf.readBigUInt64BE(pos + 8);
      if (large > BigInt(end - pos)) throw new Mp4StructureError('box larger than its container');
      size = Number(large);
      header = 16;
    } else if (size === 0) {
      size = end - pos; // "extends to the end of the file" (only valid for the last box)
    }
    if (size < header || pos + size > end) throw new Mp4StructureError('box size out of range');
    const path = parent ? `${parent}/${type}` : type;
    if (parent !== null && STRIP_UNDER.has(parent.split('/').pop()!) && STRIP.has(type)) {
      neutralise(buf, pos, header, size);
      found.push(path);
    } else if (parent === null && type === 'uuid' && size >= header + 16 && buf.toString('hex', pos + header, pos + header + 16) === XMP_UUID) {
      neutralise(buf, pos, header, size);
      found.push('uuid(xmp)');
    } else if (STRIP_UNDER.has(type) && depth < MAX_DEPTH) {
      walk(buf, pos + header, pos + size, path, depth + 1, found);
    }
    pos += size;
  }
}


/**
 * Neutralises the metadata boxes in place and returns their paths (e.g. `moov/udta`).
 * Throws Mp4StructureError when the box structure does not add up, so a malformed file is
 * refused rather than stored half-cleaned.
 */
export function stripMp4Metadata(buf: Buffer): string[] {
  const found: string[] = [];
  walk(buf, 0, buf.length, null, 0, found);
  return found;
}
