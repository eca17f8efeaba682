import { createHash } from 'node:crypto';
import type { Transaction } from 'sequelize';
import { consentTextFor, currentConsent, type ConsentKind } from '@shared/rider';
import { AppError, conflict, notFound } from '../errors';
import { Consent } from '../models';
import { recordAudit, type AuditActor } from './audit';

export interface ConsentScope {
  type: string;
  id: number;
}

/** SHA-256 of the exact text shown, so what was agreed can be proven even after the wording changes. */
export function consentTextHash(text: string): string {
  return createHash('sha256').update(text, 'utf8').digest('hex');
}

/**
 * Record that `userId` agreed to the current text of `kind`. A stale version (the text changed
 * while the form was open) is refused, so nobody is held to words they did not see.
 */
export async function giveConsent(
  userId: number,
  kind: ConsentKind,
  version: string,
  actor: AuditActor,
  options: { scope?: ConsentScope; transaction?: Transaction } = {},
): Promise<Consent> {
  const current = currentConsent(kind);
  if (!current) throw new AppError(400, 'validation_failed', 'This kind of consent cannot be given yet.');
  if (current.version !== version) {
    throw new AppError(409, 'consent_outdated', 'The consent text has changed since you opened the form. Please read it again and tick the box.');
  }
  const consent = await Consent.create(
    {
      userId,
      kind,
      version: current.version,
      textHash: consentTextHash(current.text),
      scopeType: options.scope?.type ?? null,
      scopeId: options.scope?.id ?? null,
      givenAt: new Date(),
    },
    { transaction: options.transaction },
  );
  await recordAudit(actor, { action: 'consent.give', subjectType: 'consent', subjectId: consent.id, subjectUserId: userId, detail: { kind, version } }, { transaction: options.transaction });
  return consent;
}

/** The newest consent of this kind (and scope) that has not been withdrawn, or null. */
export function activeConsent(userId: number, kind: ConsentKind, options: { scope?: ConsentScope; transaction?: Transaction } = {}): Promise<Consent | null> {
  return Consent.findOne({
    where: { userId, kind, withdrawnAt: null, scopeType: options.scope?.type ?? null, scopeId: options.scope?.id ?? null },
    order: [['id', 'DESC']],
    transaction: options.transaction,
  });
}

export function listConsents(userId: number): Promise<Consent[]> {
  return Consent.findAll({ where: { userId }, order: [['id', 'DESC']] });
}

/** Withdrawing keeps the row (the record that consent existed) and stamps when it ended. */
export async function withdrawConsent(userId: number, consentId: number, actor: AuditActor): Promise<Consent> {
  const consent = await Consent.findOne({ where: { id: consentId, userId } });
  if (!consent) throw notFound('That consent');
  if (consent.withdrawnAt) throw conflict('You have already withdrawn this consent.');
  await consent.update({ withdrawnAt: new Date() });
  await recordAudit(actor, { action: 'consent.withdraw', subjectType: 'consent', subjectId: consent.id, subjectUserId: userId, detail: { kind: consent.kind } });
  return consent;
}

/** The text a stored consent refers to (for showing the rider what they agreed to). */
export function textOf(consent: Consent) {
  return consentTextFor(consent.kind, consent.version);
}
