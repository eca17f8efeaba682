import fs from 'node:fs';
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import exifr from 'exifr';
import sharp from 'sharp';
import { UPLOAD_LIMITS } from '@shared/rider';
import { AuditEntry, Consultation, Upload, type User } from '@server/models';
import { storedPath } from '@server/services/upload-storage';
import type { SaddlestepApp } from '@server/app';
import { startTestApp, type BrowserLikeAgent } from '../support/app';
import { signedInAs } from '../support/factories';
import { jpegWithLocation, mp4WithLocation, pngBuffer, submitIntake } from '../support/rider-factories';

let saddlestep: SaddlestepApp;
beforeAll(async () => {
  saddlestep = await startTestApp();
});
afterAll(async () => {
  await saddlestep.close();
});

type Client = BrowserLikeAgent & { user: User };

function upload(client: Client, data: Buffer, options: { name?: string; type?: string; view?: string } = {}) {
  const req = client.agent.post('/api/rider/uploads').set('X-CSRF-Token', client.csrfToken);
  if (options.view !== '') req.field('view', options.view ?? 'side-crank-3');
  return req.attach('file', data, { filename: options.name ?? 'photo.jpg', contentType: options.type ?? 'image/jpeg' });
}

async function booked(rider: User, fitter: User) {
  const startsAt = new Date(Date.now() + 86_400_000);
  return Consultation.create({
    riderId: rider.id, fitterId: fitter.id, intakeId: null, status: 'booked', startsAt, endsAt: new Date(startsAt.getTime() + 3_600_000),
    holdExpiresAt: null, feeMinor: 9000, currency: 'GBP', calendarUid: `${randomUUID()}@test`, cancelledById: null, cancelReason: null,
  });
}

describe('POST /api/rider/uploads', () => {
  it('stores a phone photo without its location or camera metadata, orientation applied', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const original = await jpegWithLocation(64, 48);
    const before = await exifr.parse(original, { gps: true, tiff: true });
    expect(before).toMatchObject({ Make: 'InventedPhoneCo', Model: 'Imaginary X1' });
    expect(before.latitude).toBeCloseTo(51.5, 1);

    const res = await upload(rider, original).expect(201);
    expect(res.body.upload).toMatchObject({ kind: 'photo', view: 'side-crank-3', contentType: 'image/jpeg', width: 64, height: 48, metadataStripped: true });
    const row = await Upload.findByPk(res.body.upload.id);
    const stored = fs.readFileSync(storedPath(saddlestep.ctx.config, row!.storageName));
    const after = await exifr.parse(stored, { gps: true, tiff: true, xmp: true, iptc: true, icc: true });
    expect(after?.latitude).toBeUndefined();
    expect(after?.Make).toBeUndefined();
    expect(after?.Model).toBeUndefined();
    expect(stored.includes(Buffer.from('InventedPhoneCo'))).toBe(false);
    expect((await sharp(stored).metadata()).exif).toBeUndefined();
  });

  it('applies EXIF orientation before dropping it', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    // Orientation 6 = "rotate 90° clockwise to display": a 60×20 file shows as 20×60.
    const rotated = await sharp({ create: { width: 60, height: 20, channels: 3, background: '#1f4d45' } }).jpeg().withMetadata({ orientation: 6 }).toBuffer();
    const res = await upload(rider, rotated).expect(201);
    expect(res.body.upload).toMatchObject({ width: 20, height: 60 });
  });

  it('takes PNG photos and MP4 clips, blanking the clip\'s location and camera boxes in place', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    await upload(rider, await pngBuffer(), { name: 'bars.png', type: 'image/png', view: 'front' }).expect(201);
    const clip = mp4WithLocation();
    const res = await upload(rider, clip, { name: 'pedalling.mp4', type: 'video/mp4', view: 'side-crank-6' }).expect(201);
    expect(res.body.upload).toMatchObject({ kind: 'clip', contentType: 'video/mp4', metadataStripped: true, thumbnailUrl: null });
    const stored = fs.readFileSync(storedPath(saddlestep.ctx.config, (await Upload.findByPk(res.body.upload.id))!.storageName));
    expect(stored.length).toBe(clip.length); // same size: sample offsets still point at the same bytes
    expect(stored.includes(Buffer.from('+51.5000'))).toBe(false);
    expect(stored.includes(Buffer.from('Imaginary X1'))).toBe(false);
    expect(stored.subarray(stored.indexOf('mdat') - 4)).toEqual(clip.subarray(clip.indexOf('mdat') - 4));
  });

  it('keeps a WebM clip as sent and says its metadata was not removed', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    // A minimal EBML header with the "webm" DocType, as browsers' recorders write it.
    const webm = Buffer.concat([Buffer.from([0x1a, 0x45, 0xdf, 0xa3, 0x87, 0x42, 0x82, 0x84]), Buffer.from('webm'), Buffer.alloc(200, 1)]);
    const res = await upload(rider, webm, { name: 'clip.webm', type: 'video/webm', view: 'rear' }).expect(201);
    expect(res.body.upload).toMatchObject({ kind: 'clip', contentType: 'video/webm', metadataStripped: false, thumbnailUrl: null });
    const served = await rider.get(`/api/uploads/${res.body.upload.id}/file`).expect(200);
    expect(served.headers['content-type']).toBe('video/webm');
  });

  it('takes an Apple M4V clip as the MP4 it is', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const res = await upload(rider, mp4WithLocation('M4V'), { name: 'clip.m4v', type: 'video/x-m4v' }).expect(201);
    expect(res.body.upload).toMatchObject({ contentType: 'video/mp4', metadataStripped: true });
  });

  it.each([
    ['a text file', Buffer.from('just some words, not a picture at all\n'.repeat(20))],
    ['a PDF', Buffer.from('%PDF-1.4\n1 0 obj\n<< /Type /Catalog >>\nendobj\ntrailer\n<< /Root 1 0 R >>\n%%EOF\n')],
  ])('refuses %s named photo.jpg and sent as image/jpeg, saying what it is', async (label, data) => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const res = await upload(rider, data).expect(415);
    expect(res.body.error.code).toBe('unsupported_file_type');
    expect(res.body.error.message).toMatch(/not a JPEG, PNG or WebP photo or an MP4 or WebM clip, whatever its name or type says/);
    if (label === 'a PDF') expect(res.body.error.message).toMatch(/a PDF document/);
    expect(await Upload.count({ where: { riderId: rider.user.id } })).toBe(0);
  });

  it('refuses a photo over the photo limit with 413 and the limits in the message', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    // A real JPEG header followed by padding: detected as a photo, larger than 15 MB.
    const big = Buffer.concat([await jpegWithLocation(), Buffer.alloc(UPLOAD_LIMITS.photoBytes + 1024)]);
    const res = await upload(rider, big).expect(413);
    expect(res.body.error).toMatchObject({ code: 'file_too_large' });
    expect(res.body.error.message).toMatch(/at most 15 MB/);
  });

  it('refuses a file over the clip limit with 413 from multer, in our error shape', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const res = await upload(rider, Buffer.alloc(UPLOAD_LIMITS.clipBytes + 10), { name: 'long.mp4', type: 'video/mp4' }).expect(413);
    expect(res.body.error.code).toBe('file_too_large');
    expect(res.body.error.message).toMatch(/clips 60 MB/);
  });

  it(`refuses the file after ${UPLOAD_LIMITS.filesPerIntake} with 413, and two files in one request`, async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const png = await pngBuffer(8, 8);
    for (let i = 0; i < UPLOAD_LIMITS.filesPerIntake; i += 1) await upload(rider, png, { name: `p${i}.png`, type: 'image/png', view: 'other' }).expect(201);
    const res = await upload(rider, png, { name: 'one-more.png', type: 'image/png' }).expect(413);
    expect(res.body.error).toMatchObject({ code: 'too_many_files' });
    expect(res.body.error.message).toMatch(/up to 12 photos and clips/);
    const two = await rider.agent.post('/api/rider/uploads').set('X-CSRF-Token', rider.csrfToken).field('view', 'front')
      .attach('file', png, 'a.png').attach('file', png, 'b.png');
    expect(two.status).toBe(413);
    expect(two.body.error.message).toMatch(/one file at a time/);
    expect(await Upload.count({ where: { riderId: rider.user.id } })).toBe(UPLOAD_LIMITS.filesPerIntake);
  });

  it('asks for a file, a known view, and nothing else', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const none = await rider.agent.post('/api/rider/uploads').set('X-CSRF-Token', rider.csrfToken).field('view', 'front');
    expect(none.status).toBe(400);
    expect(none.body.error.message).toMatch(/Choose a photo or clip/);
    const badView = await upload(rider, await pngBuffer(), { view: "front'; DROP TABLE uploads;--" }).expect(400);
    expect(badView.body.error.fields.view).toMatch(/which view/);
    const noView = await upload(rider, await pngBuffer(), { view: '' }).expect(400);
    expect(noView.body.error.fields.view).toBeDefined();
    const extra = await rider.agent.post('/api/rider/uploads').set('X-CSRF-Token', rider.csrfToken).field('view', 'front').field('riderId', '1').attach('file', await pngBuffer(), 'x.png');
    expect(extra.status).toBe(400);
    expect(extra.body.error.message).toMatch(/Unexpected field: riderId/);
    const json = await rider.post('/api/rider/uploads', { view: 'front' });
    expect(json.status).toBe(400);
    const broken = await rider.agent.post('/api/rider/uploads').set('X-CSRF-Token', rider.csrfToken).set('Content-Type', 'multipart/form-data; boundary=xyz').send('--xyz\r\nContent-Disposition: form-data; name="file"; filename="a.jpg"\r\n\r\nabc');
    expect(broken.status).toBe(400);
    expect(broken.body.error.code).toBe('malformed_upload');
    expect(await Upload.count({ where: { riderId: rider.user.id } })).toBe(0);
  });

  it('refuses a damaged photo that only starts like a JPEG', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const jpeg = await jpegWithLocation();
    const res = await upload(rider, jpeg.subarray(0, 40)).expect(400);
    expect(res.body.error.code).toBe('unreadable_file');
  });
});

describe('reading uploads', () => {
  async function riderWithPhoto() {
    const rider = await signedInAs(saddlestep.app, 'rider');
    await submitIntake(rider);
    const res = await upload(rider, await jpegWithLocation()).expect(201);
    return { rider, uploadId: res.body.upload.id as number };
  }

  it('serves the rider their own photo privately, inline, never sniffed, and audits it', async () => {
    const { rider, uploadId } = await riderWithPhoto();
    const res = await rider.get(`/api/uploads/${uploadId}/file`).expect(200);
    expect(res.headers['content-type']).toBe('image/jpeg');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['content-disposition']).toMatch(/^inline; filename="photo-\d+\.jpg"$/);
    expect(res.headers['cache-control']).toMatch(/^private/);
    const thumb = await rider.get(`/api/uploads/${uploadId}/thumbnail`).expect(200);
    expect(thumb.headers['content-type']).toBe('image/webp');
    expect(await AuditEntry.count({ where: { action: 'upload.read', subjectId: String(uploadId) } })).toBe(2);
    expect(await AuditEntry.count({ where: { action: 'upload.create', subjectId: String(uploadId) } })).toBe(1);
  });

  it("answers 404 for another rider's photo and for an unrelated fitter or physio", async () => {
    const { uploadId } = await riderWithPhoto();
    for (const role of ['rider', 'fitter', 'physio'] as const) {
      const other = await signedInAs(saddlestep.app, role);
      const res = await other.get(`/api/uploads/${uploadId}/file`);
      expect(res.status).toBe(404);
      expect(res.body.error.code).toBe('not_found');
    }
  });

  it('serves the fitter with a booked consultation, who also sees the intake with its fit causes', async () => {
    const { rider, uploadId } = await riderWithPhoto();
    const fitter = await signedInAs(saddlestep.app, 'fitter');
    await fitter.get(`/api/uploads/${uploadId}/file`).expect(404);
    await booked(rider.user, fitter.user);
    const res = await fitter.get(`/api/uploads/${uploadId}/file`).expect(200);
    expect(res.headers['content-type']).toBe('image/jpeg');
    const intakeId = (await rider.get('/api/rider/intake')).body.submitted.id;
    const intake = await fitter.get(`/api/intakes/${intakeId}`).expect(200);
    expect(intake.body.intake.triage.causes.length).toBeGreaterThan(0);
    expect(intake.body.uploads.map((u: { id: number }) => u.id)).toContain(uploadId);
  });

  it('lets the rider list and delete uploads, removing the files', async () => {
    const { rider, uploadId } = await riderWithPhoto();
    const list = await rider.get('/api/rider/uploads').expect(200);
    expect(list.body.uploads.map((u: { id: number }) => u.id)).toEqual([uploadId]);
    const row = await Upload.findByPk(uploadId);
    const other = await signedInAs(saddlestep.app, 'rider');
    await other.delete(`/api/rider/uploads/${uploadId}`).expect(404);
    await rider.delete(`/api/rider/uploads/${uploadId}`).expect(204);
    expect(fs.existsSync(storedPath(saddlestep.ctx.config, row!.storageName))).toBe(false);
    await rider.get(`/api/uploads/${uploadId}/file`).expect(404);
  });

  it('answers 404 for malformed ids', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    await rider.get('/api/uploads/abc/file').expect(404);
    await rider.get('/api/uploads/-1/thumbnail').expect(404);
    await rider.get('/api/uploads/99999999999/file').expect(404);
  });
});
