import type { Request } from 'express';
import { AuditEntry } from '../models';

export interface AuditFacts {
  action: string;
  subjectType?: string;
  subjectId?: string | number;
  subjectUserId?: number | null;
  detail?: Record<string, unknown>;
}

export interface AuditActor {
  actorId: number | null;
  actorRole: string | null;
  ip: string | null;
  userAgent: string | null;
}

/** Who and where, read from a request (or a socket handshake shaped like one). */
export function actorFromRequest(req: Pick<Request, 'user' | 'ip' | 'headers'>): AuditActor {
  return {
    actorId: req.user?.id ?? null,
    actorRole: req.user?.role ?? null,
    ip: req.ip ?? null,
    userAgent: (req.headers['user-agent'] ?? '').slice(0, 255) || null,
  };
}

/**
 * The only keys an audit row's `detail` may hold: ids, counts, dates and the names of actions and
 * kinds, never health content. The audit table is append-only (an erased account's rows stay), so
 * anything health-related written here could never be erased: a triage level, a check-in decision
 * or a physio's decision is dropped here whatever a caller passes. Add a key only if it is not
 * about the rider's body.
 */
const DETAIL_KEYS = new Set(['draftId', 'snapshotId', 'stepIndex', 'appliedOn', 'count', 'kind', 'view', 'variant', 'fields', 'source', 'version', 'amountMinor', 'cancelledBy', 'role', 'status', 'refundId']);

/** `detail` reduced to the allowed keys with plain values; null when nothing is left. */
export function auditDetail(detail: Record<string, unknown> | undefined): Record<string, unknown> | null {
  if (!detail) return null;
  const plain = (v: unknown) => v === null || ['string', 'number', 'boolean'].includes(typeof v);
  const kept = Object.entries(detail).filter(([key, value]) => DETAIL_KEYS.has(key) && (plain(value) || (Array.isArray(value) && value.every(plain))));
  return kept.length ? Object.fromEntries(kept) : null;
}

/**
 * Append one audit row: who, role, what, subject, ip and user agent. `detail` keeps only the keys
 * in DETAIL_KEYS. Pass the request's transaction when the audited write happens in one, so both
 * commit together.
 */
export async function recordAudit(actor: AuditActor, facts: AuditFacts, options: { transaction?: import('sequelize').Transaction } = {}) {
  await AuditEntry.create(
    {
      ...actor,
      action: facts.action,
      subjectType: facts.subjectType ?? null,
      subjectId: facts.subjectId === undefined ? null : String(facts.subjectId),
      subjectUserId: facts.subjectUserId ?? null,
      detail: auditDetail(facts.detail),
    },
    { transaction: options.transaction },
  );
}
