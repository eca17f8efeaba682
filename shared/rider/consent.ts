/**
 * Consent texts, versioned. The server stores the kind, the version and a SHA-256 of the exact
 * text the rider agreed to, so a later change of wording never rewrites what was agreed.
 * Changing a text means adding a new version here; old versions stay for the record.
 */
export const CONSENT_KINDS = ['store-health-data', 'share-with-physio'] as const;
export type ConsentKind = (typeof CONSENT_KINDS)[number];

export interface ConsentText {
  version: string;
  title: string;
  text: string;
}

export const CONSENT_TEXTS: Record<ConsentKind, readonly ConsentText[]> = {
  'store-health-data': [
    {
      version: '2026-12-01',
      title: 'Storing and sharing your health information',
      text:
        'I agree that Saddlestep stores what I tell it about my pain, injuries and body, and the photos and clips I upload, ' +
        'so that a bike fitter can prepare for and run my consultation. Only I, the fitter I book, and a physiotherapist I am ' +
        'referred to (with my separate agreement) can see it; clinic administrators cannot. Every time someone opens it, that ' +
        'is recorded. I can export or delete my information, and withdraw this agreement, at any time; without it I cannot book.',
    },
  ],
  'share-with-physio': [
    {
      version: '2026-12-02',
      title: 'Sharing your case with a physiotherapist',
      text:
        'I agree that the physiotherapist named on this referral may see what I told Saddlestep about my pain and injuries, ' +
        'my check-ins, my current plan and setup history, and the photos and clips listed on the referral, so that they can ' +
        'advise me and my fitter. They may also join my consultation chat. I can withdraw this agreement at any time; from ' +
        'then on the physiotherapist can no longer open my case, though what they already advised stays on record.',
    },
  ],
};

/** The version a rider must agree to today, or null when the kind has no text yet. */
export function currentConsent(kind: ConsentKind): ConsentText | null {
  const versions = CONSENT_TEXTS[kind];
  return versions[versions.length - 1] ?? null;
}

export function consentTextFor(kind: ConsentKind, version: string): ConsentText | null {
  return CONSENT_TEXTS[kind].find((t) => t.version === version) ?? null;
}
