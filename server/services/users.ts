import { UniqueConstraintError } from 'sequelize';
import { needsApproval, type AccountDecision, type RegisterInput, type Role } from '@shared/auth';
import { conflict, notFound, badRequest } from '../errors';
import { User } from '../models';
import type { PasswordHasher } from './passwords';
import { recordAudit, type AuditActor } from './audit';

/** Create an account from the public form. Fitters and physios start `pending`. */
export async function registerUser(input: RegisterInput, hasher: PasswordHasher, actor: AuditActor): Promise<User> {
  const passwordHash = await hasher.hash(input.password);
  try {
    const user = await User.create({
      email: input.email,
      passwordHash,
      role: input.role,
      displayName: input.displayName,
      timeZone: input.timeZone,
      status: needsApproval(input.role) ? 'pending' : 'active',
    });
    await recordAudit({ ...actor, actorId: user.id, actorRole: user.role }, { action: 'user.register', subjectType: 'user', subjectId: user.id });
    return user;
  } catch (error) {
    if (error instanceof UniqueConstraintError) {
      throw conflict('An account with that e-mail already exists. Sign in instead, or use another address.');
    }
    throw error;
  }
}

/** Used by the seed and the CLI: create or update an account with a known password. */
export async function upsertUser(
  fields: { email: string; password: string; role: Role; displayName: string; timeZone: string; status?: User['status'] },
  hasher: PasswordHasher,
): Promise<{ user: User; created: boolean }> {
  const existing = await User.findOne({ where: { email: fields.email.toLowerCase() } });
  if (existing) return { user: existing, created: false };
  const user = await User.create({
    email: fields.email.toLowerCase(),
    passwordHash: await hasher.hash(fields.password),
    role: fields.role,
    displayName: fields.displayName,
    timeZone: fields.timeZone,
    status: fields.status ?? 'active',
    approvedAt: fields.status === 'pending' ? null : new Date(),
  });
  return { user, created: true };
}

export async function listPendingAccounts(): Promise<User[]> {
  return User.findAll({ where: { status: 'pending' }, order: [['createdAt', 'ASC']] });
}

/** An admin approves or rejects a pending fitter or physio. */
export async function decideAccount(userId: number, decision: AccountDecision['decision'], actor: AuditActor): Promise<User> {
  const user = await User.findByPk(userId);
  if (!user) throw notFound('That account');
  if (user.status !== 'pending') throw badRequest('Only accounts waiting for approval can be approved or rejected.');
  user.status = decision === 'approve' ? 'active' : 'rejected';
  user.approvedAt = decision === 'approve' ? new Date() : null;
  user.approvedById = actor.actorId;
  await user.save();
  await recordAudit(actor, { action: `user.${decision}`, subjectType: 'user', subjectId: user.id });
  return user;
}
