import type { PublicUser } from '@shared/auth';
import type { User } from '../models';

/** The only way a user leaves the server: no hash, no internal fields. */
export function presentUser(user: User): PublicUser {
  return {
    id: user.id,
    email: user.email,
    displayName: user.displayName,
    role: user.role,
    status: user.status,
    timeZone: user.timeZone,
    createdAt: user.createdAt.toISOString(),
  };
}
