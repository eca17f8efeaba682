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
 * Append one audit row. Later issues call this for every read and write of health data.
 * Pass the request's transaction when the audited write happens in one, so both commit together.
 */
export async function recordAudit(actor: AuditActor, facts: AuditFacts, options: { transaction?: import('sequelize').Transaction } = {}) {
  await AuditEntry.create(
    {
      ...actor,
      action: facts.action,
      subjectType: facts.subjectType ?? null,
      subjectId: facts.subjectId === undefined ? null : String(facts.subjectId),
      subjectUserId: facts.subjectUserId ?? null,
      detail: facts.detail ?? null,
    },
    { transaction: options.transaction },
  );
}
