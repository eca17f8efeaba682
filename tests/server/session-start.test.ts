import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SaddlestepApp } from '@server/app';
import { Consultation } from '@server/models';
import { earliestStart, mayStartSession, START_EARLY_MINUTES } from '@shared/consultation';
import { startTestApp } from '../support/app';
import { bookedPair, startingSoon } from '../support/chat-factories';

/*
 * A fitter starts a booked session only shortly before its time (START_EARLY_MINUTES, our
 * decision): started days early, the rider would lose Move and Cancel, and with them any refund.
 */
let saddlestep: SaddlestepApp;
beforeAll(async () => {
  saddlestep = await startTestApp();
});
afterAll(async () => {
  await saddlestep.close();
});

describe('starting a session', () => {
  it('opens 15 minutes before the booked time and stays open after it', () => {
    const startsAt = new Date('2027-03-09T10:00:00Z');
    expect(START_EARLY_MINUTES).toBe(15);
    expect(earliestStart(startsAt).toISOString()).toBe('2027-03-09T09:45:00.000Z');
    expect(mayStartSession(startsAt, new Date('2027-03-09T09:44:59Z'))).toBe(false);
    expect(mayStartSession(startsAt, new Date('2027-03-09T09:45:00Z'))).toBe(true);
    expect(mayStartSession(startsAt, new Date('2027-03-10T10:00:00Z'))).toBe(true);
  });

  it('refuses a start days ahead with the reason, leaving the rider free to cancel', async () => {
    const { rider, fitter, consultation } = await bookedPair(saddlestep.app);
    const res = await fitter.post(`/api/consultations/${consultation.id}/start`);
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/from 15 minutes before its booked time/);
    expect((await Consultation.findByPk(consultation.id))!.status).toBe('booked');
    const cancelled = await rider.post(`/api/consultations/${consultation.id}/cancel`, {}).expect(200);
    expect(cancelled.body.consultation.status).toBe('cancelled');
  });

  it('starts a session booked to begin in a few minutes, and one whose time has passed', async () => {
    for (const minutes of [10, -30]) {
      const { fitter, consultation } = await bookedPair(saddlestep.app);
      await startingSoon(consultation, minutes);
      const res = await fitter.post(`/api/consultations/${consultation.id}/start`).expect(200);
      expect(res.body.consultation.status).toBe('in_session');
    }
  });
});
