import { describe, expect, it } from 'vitest';
import { adminRefundSchema, auditQuerySchema, deleteAccountSchema, updateUserSchema, userQuerySchema } from '@shared/admin';
import { signInSchema } from '@shared/auth';
import { DEFAULT_CANCELLATION_POLICY } from '@shared/booking';
import { clinicSettingsSchema, DEFAULT_CLINIC_SETTINGS } from '@shared/clinic';
import { DEFAULT_STEP_CAPS, DEFAULT_WINDOW_CAPS } from '@shared/fit/planner';
import { ERROR_CODES, type Ack, type ApiErrorBody } from '@shared/http';
import { problems } from './problems';

describe('clinicSettingsSchema', () => {
  it('fills every setting with the demo defaults', () => {
    expect(clinicSettingsSchema.parse({})).toEqual({
      defaultFeeMinor: 9000,
      currency: 'EUR',
      cancellation: { windowHours: 24, earlyRefundShare: 1, lateRefundShare: 0.5 },
      holdMinutes: 10,
      planner: { stepCaps: DEFAULT_STEP_CAPS, windowCaps: DEFAULT_WINDOW_CAPS, windowDays: 28, adaptationDays: 14, adaptationRides: 4, revertRecencyDays: 90 },
    });
    expect(DEFAULT_CLINIC_SETTINGS).toEqual(clinicSettingsSchema.parse({}));
    expect(DEFAULT_CLINIC_SETTINGS.cancellation).toEqual(DEFAULT_CANCELLATION_POLICY);
  });

  it('fills the rest of a partly given cancellation policy and planner', () => {
    const parsed = clinicSettingsSchema.parse({ currency: 'JPY', defaultFeeMinor: 12_000, cancellation: { windowHours: 48 }, planner: { windowDays: 14 } });
    expect(parsed.cancellation).toEqual({ windowHours: 48, earlyRefundShare: 1, lateRefundShare: 0.5 });
    expect(parsed.planner).toMatchObject({ windowDays: 14, adaptationDays: 14, stepCaps: DEFAULT_STEP_CAPS });
    expect(parsed).toMatchObject({ currency: 'JPY', defaultFeeMinor: 12_000, holdMinutes: 10 });
  });

  it('gives each parse its own top-level defaults', () => {
    const a = clinicSettingsSchema.parse({});
    const b = clinicSettingsSchema.parse({});
    expect(a.cancellation).not.toBe(b.cancellation);
    expect(a.planner).not.toBe(b.planner);
  });

  it('keeps the payment hold between 2 and 30 whole minutes', () => {
    expect(clinicSettingsSchema.parse({ holdMinutes: 2 }).holdMinutes).toBe(2);
    expect(clinicSettingsSchema.parse({ holdMinutes: 30 }).holdMinutes).toBe(30);
    for (const holdMinutes of [1, 31, 5.5]) expect(clinicSettingsSchema.safeParse({ holdMinutes }).success).toBe(false);
  });

  it('refuses unknown currencies, negative fees, bad shares and unknown settings', () => {
    expect(clinicSettingsSchema.safeParse({ currency: 'XBT' }).success).toBe(false);
    expect(clinicSettingsSchema.safeParse({ defaultFeeMinor: -1 }).success).toBe(false);
    expect(clinicSettingsSchema.safeParse({ defaultFeeMinor: 10_000_001 }).success).toBe(false);
    expect(clinicSettingsSchema.safeParse({ cancellation: { lateRefundShare: 1.5 } }).success).toBe(false);
    expect(clinicSettingsSchema.safeParse({ planner: { windowDays: 0 } }).success).toBe(false);
    expect(clinicSettingsSchema.safeParse({ theme: 'dark' }).success).toBe(false);
  });
});

describe('updateUserSchema', () => {
  it('changes a role, a status or both', () => {
    expect(updateUserSchema.parse({ role: 'physio' })).toEqual({ role: 'physio' });
    expect(updateUserSchema.parse({ status: 'disabled' })).toEqual({ status: 'disabled' });
    expect(updateUserSchema.parse({ role: 'admin', status: 'active' })).toEqual({ role: 'admin', status: 'active' });
  });

  it('asks for a change when neither is given', () => {
    expect(problems(updateUserSchema, {})).toEqual({ '': 'Change the role or the status.' });
  });

  it('only switches accounts on or off, never back to pending or rejected', () => {
    expect(problems(updateUserSchema, { status: 'pending' })).toEqual({ status: 'Choose active or disabled.' });
    expect(problems(updateUserSchema, { status: 'rejected' })).toEqual({ status: 'Choose active or disabled.' });
    expect(problems(updateUserSchema, { role: 'owner' })).toEqual({ role: 'Choose a role from the list.' });
  });
});

describe('userQuerySchema', () => {
  it('reads query strings, trimming the search and starting at page 1', () => {
    expect(userQuerySchema.parse({})).toEqual({ page: 1 });
    expect(userQuerySchema.parse({ role: 'fitter', status: 'pending', q: '  hanna ', page: '3' })).toEqual({ role: 'fitter', status: 'pending', q: 'hanna', page: 3 });
  });

  it('refuses bad pages, long searches and unknown filters', () => {
    for (const page of ['0', '10001', '1.5', 'next']) expect(userQuerySchema.safeParse({ page }).success).toBe(false);
    expect(userQuerySchema.safeParse({ q: 'x'.repeat(101) }).success).toBe(false);
    expect(userQuerySchema.safeParse({ status: 'banned' }).success).toBe(false);
    expect(userQuerySchema.safeParse({ sort: 'email' }).success).toBe(false);
  });
});

describe('adminRefundSchema', () => {
  it('accepts a positive amount and a trimmed reason', () => {
    expect(adminRefundSchema.parse({ amountMinor: 4500, reason: '  Fitter ill.  ' })).toEqual({ amountMinor: 4500, reason: 'Fitter ill.' });
  });

  it('refuses nothing to refund, a missing amount and a missing or long reason', () => {
    expect(problems(adminRefundSchema, { amountMinor: 0, reason: '  ' })).toEqual({ amountMinor: 'Refund more than zero.', reason: 'Say why.' });
    expect(problems(adminRefundSchema, { reason: 'x'.repeat(301) })).toEqual({ amountMinor: 'Enter the amount to refund.', reason: 'Keep the reason under 300 characters.' });
    expect(adminRefundSchema.safeParse({ amountMinor: 12.5, reason: 'r' }).success).toBe(false);
  });
});

describe('auditQuerySchema', () => {
  it('reads filters from the query string with 50 rows by default', () => {
    expect(auditQuerySchema.parse({})).toEqual({ limit: 50 });
    expect(auditQuerySchema.parse({ actorId: '4', subjectUserId: '9', action: ' intake.read ', beforeId: '120', limit: '200' })).toEqual({
      actorId: 4, subjectUserId: 9, action: 'intake.read', beforeId: 120, limit: 200,
    });
  });

  it('explains what an action looks like', () => {
    expect(problems(auditQuerySchema, { action: 'Intake.Read' })).toEqual({ action: 'Actions look like intake.read.' });
    expect(problems(auditQuerySchema, { action: 'intake;drop' })).toEqual({ action: 'Actions look like intake.read.' });
  });

  it('refuses limits outside 1 to 200 and ids that are not positive', () => {
    for (const limit of ['0', '201']) expect(auditQuerySchema.safeParse({ limit }).success).toBe(false);
    expect(auditQuerySchema.safeParse({ actorId: '-1' }).success).toBe(false);
    expect(auditQuerySchema.safeParse({ beforeId: 'abc' }).success).toBe(false);
  });
});

describe('deleteAccountSchema', () => {
  it('accepts the password and the word DELETE', () => {
    expect(deleteAccountSchema.parse({ password: 'hunter2hunter2', confirm: 'DELETE' })).toEqual({ password: 'hunter2hunter2', confirm: 'DELETE' });
  });

  it('asks for the password again', () => {
    expect(problems(deleteAccountSchema, { confirm: 'DELETE' })).toEqual({ password: 'Enter your password to confirm.' });
    expect(problems(deleteAccountSchema, { password: '', confirm: 'DELETE' })).toEqual({ password: 'Enter your password to confirm.' });
    expect(deleteAccountSchema.safeParse({ password: 'x'.repeat(129), confirm: 'DELETE' }).success).toBe(false);
  });

  it.each(['delete', 'DELETE ', 'yes', undefined])('refuses %j as the confirmation', (confirm) => {
    expect(problems(deleteAccountSchema, { password: 'pw', confirm })).toEqual({ confirm: 'Type DELETE to confirm.' });
  });
});

describe('signInSchema', () => {
  it('names an unexpected field', () => {
    expect(problems(signInSchema, { email: 'a@b.co', password: 'x', remember: true })).toEqual({ '': 'Unexpected field: remember.' });
  });

  it('asks for the e-mail and password in plain words', () => {
    expect(problems(signInSchema, { email: '  ', password: '' })).toEqual({ email: 'Enter your e-mail address.', password: 'Enter your password.' });
    expect(problems(signInSchema, { email: `${'a'.repeat(250)}@b.co`, password: 'x'.repeat(129) })).toEqual({
      email: 'That e-mail address is too long.', password: 'That password is too long.',
    });
  });
});

describe('API error shapes', () => {
  it('list each stable error code once', () => {
    expect(ERROR_CODES).toContain('validation_failed');
    expect(ERROR_CODES).toContain('csrf_failed');
    expect(new Set(ERROR_CODES).size).toBe(ERROR_CODES.length);
    for (const code of ERROR_CODES) expect(code).toMatch(/^[a-z_]+$/);
  });

  it('type socket acknowledgements as OK with data or ERROR with the API error body', () => {
    const body: ApiErrorBody = { error: { code: 'validation_failed', message: 'Check the form.', fields: { body: 'Write a message or attach a file.' } } };
    const acks: Ack<number>[] = [{ status: 'OK', data: 3 }, { status: 'ERROR', errors: body.error }];
    expect(acks.map((a) => (a.status === 'OK' ? a.data : a.errors.fields?.body))).toEqual([3, 'Write a message or attach a file.']);
  });
});
