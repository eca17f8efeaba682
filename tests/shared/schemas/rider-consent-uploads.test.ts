import { describe, expect, it } from 'vitest';
import {
  CLIP_TYPES, CONSENT_KINDS, CONSENT_TEXTS, consentTextFor, currentConsent, PHOTO_TYPES, UPLOAD_LIMITS, UPLOAD_VIEW_INFO, UPLOAD_VIEWS,
  uploadFieldsSchema, uploadViewSchema,
} from '@shared/rider';
import { problems } from './problems';

describe('currentConsent', () => {
  it('gives the newest version of the health-data consent', () => {
    const current = currentConsent('store-health-data');
    expect(current).toMatchObject({ version: '2026-12-01', title: 'Storing and sharing your health information' });
    expect(current?.text).toMatch(/clinic administrators cannot/);
  });

  it('gives the newest version of the physio-sharing consent', () => {
    expect(currentConsent('share-with-physio')).toMatchObject({ version: '2026-12-02', title: 'Sharing your case with a physiotherapist' });
  });

  it('is always the last version listed, for every kind', () => {
    for (const kind of CONSENT_KINDS) expect(currentConsent(kind)).toBe(CONSENT_TEXTS[kind].at(-1));
  });
});

describe('consentTextFor', () => {
  it('finds the exact text a rider agreed to by kind and version', () => {
    expect(consentTextFor('store-health-data', '2026-12-01')).toBe(currentConsent('store-health-data'));
    expect(consentTextFor('share-with-physio', '2026-12-02')?.text).toMatch(/^I agree that the physiotherapist/);
  });

  it('gives null for a version that does not exist', () => {
    expect(consentTextFor('store-health-data', '1999-01-01')).toBeNull();
  });

  it('does not mix up kinds: a version belongs to its own kind only', () => {
    expect(consentTextFor('share-with-physio', '2026-12-01')).toBeNull();
  });
});

describe('consent texts', () => {
  it('have unique, date-like versions within each kind', () => {
    for (const kind of CONSENT_KINDS) {
      const versions = CONSENT_TEXTS[kind].map((t) => t.version);
      expect(new Set(versions).size).toBe(versions.length);
      for (const v of versions) expect(v).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    }
  });
});

describe('uploadFieldsSchema', () => {
  it.each([...UPLOAD_VIEWS])('accepts the %s view', (view) => {
    expect(uploadFieldsSchema.parse({ view })).toEqual({ view });
  });

  it('asks which view an unknown or missing view is', () => {
    const message = "Say which view this is, e.g. side-on with the crank at 3 o'clock.";
    expect(problems(uploadFieldsSchema, { view: 'top' })).toEqual({ view: message });
    expect(problems(uploadFieldsSchema, {})).toEqual({ view: message });
  });

  it('refuses extra form fields, such as a client-chosen content type', () => {
    expect(problems(uploadFieldsSchema, { view: 'front', contentType: 'image/svg+xml' })).toEqual({ '': 'Unexpected field: contentType.' });
  });
});

describe('upload views and limits', () => {
  it('guide the rider through every view', () => {
    expect(Object.keys(UPLOAD_VIEW_INFO)).toEqual([...UPLOAD_VIEWS]);
    for (const view of UPLOAD_VIEWS) expect(UPLOAD_VIEW_INFO[view].guide.length).toBeGreaterThan(20);
  });

  it('accept phone photos and short clips only', () => {
    expect(PHOTO_TYPES).not.toContain('image/svg+xml');
    expect(CLIP_TYPES).toEqual(['video/mp4', 'video/webm']);
    expect(UPLOAD_LIMITS.photoBytes).toBe(15 * 1024 * 1024);
    expect(UPLOAD_LIMITS.clipBytes).toBe(60 * 1024 * 1024);
  });

  it('describe a stored upload as the API returns it', () => {
    const view = {
      id: 1, intakeId: 2, view: 'side-crank-3', kind: 'photo', contentType: 'image/jpeg', byteSize: 2_000_000, width: 4000, height: 3000,
      metadataStripped: true, createdAt: '2026-03-01T00:00:00Z', url: '/api/uploads/1', thumbnailUrl: null,
    };
    expect(uploadViewSchema.parse(view)).toEqual(view);
    expect(uploadViewSchema.safeParse({ ...view, kind: 'audio' }).success).toBe(false);
  });
});
