import { describe, expect, it } from 'vitest';
import { isIanaTimeZone, needsApproval, registerSchema, signInSchema, accountDecisionSchema } from '@shared/auth';
import { canTransition, CONSULTATION_STATES, STATE_LABELS, TRANSITIONS } from '@shared/consultation';

const valid = { email: 'Rider@Example.com', password: 'long-enough-pw', displayName: ' Ada ', role: 'rider', timeZone: 'Europe/Oslo' };

describe('registerSchema', () => {
  it('normalises e-mail and trims the name', () => {
    const parsed = registerSchema.parse(valid);
    expect(parsed.email).toBe('rider@example.com');
    expect(parsed.displayName).toBe('Ada');
  });

  it.each([
    [{ email: 'not-an-email' }, 'Enter a valid e-mail address, like name@example.com.'],
    [{ password: 'short' }, 'Use at least 10 characters for your password.'],
    [{ password: 'é'.repeat(40) }, 'A password can be at most 72 bytes long.'],
    [{ displayName: 'a\u0007b' }, 'A name cannot contain control characters.'],
    [{ displayName: '<b>' }, 'A name cannot contain < or >.'],
    [{ role: 'admin' }, 'Choose rider, bike fitter or physiotherapist.'],
    [{ timeZone: 'Nowhere/Land' }, 'Choose a time zone from the list, like Europe/London.'],
    [{ extra: 1 }, 'Unexpected field: extra.'],
  ])('refuses %o with a clear message', (override, message) => {
    const result = registerSchema.safeParse({ ...valid, ...override });
    expect(result.success).toBe(false);
    expect(result.error!.issues.map((i) => i.message)).toContain(message);
  });

  it('checks sign-in and decisions', () => {
    expect(signInSchema.parse({ email: ' A@B.CO ', password: 'x' }).email).toBe('a@b.co');
    expect(signInSchema.safeParse({ email: 'a@b.co', password: 'x', more: 1 }).success).toBe(false);
    expect(accountDecisionSchema.safeParse({ decision: 'maybe' }).success).toBe(false);
  });
});

describe('time zones and roles', () => {
  it('knows IANA zones and refuses others', () => {
    expect(isIanaTimeZone('UTC')).toBe(true);
    expect(isIanaTimeZone('America/Argentina/Buenos_Aires')).toBe(true);
    expect(isIanaTimeZone('Mars/Base')).toBe(false);
    expect(isIanaTimeZone('../../etc')).toBe(false);
  });

  it('sends fitters and physios for approval, not riders', () => {
    expect(needsApproval('fitter')).toBe(true);
    expect(needsApproval('physio')).toBe(true);
    expect(needsApproval('rider')).toBe(false);
  });
});

describe('consultation states', () => {
  it('allows the journey and refuses jumps', () => {
    expect(canTransition('requested', 'booked')).toBe(true);
    expect(canTransition('booked', 'booked')).toBe(true); // a reschedule
    expect(canTransition('plan_active', 'on_hold')).toBe(true);
    expect(canTransition('cancelled', 'booked')).toBe(false);
    expect(canTransition('requested', 'plan_active')).toBe(false);
  });

  it('labels every state and lists transitions only to known states', () => {
    for (const state of CONSULTATION_STATES) {
      expect(STATE_LABELS[state]).toEqual(expect.any(String));
      for (const next of TRANSITIONS[state]) expect(CONSULTATION_STATES).toContain(next);
    }
  });
});
