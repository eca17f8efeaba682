import type { AccountStatus, Role } from '@shared/auth';
import type { StatusKind } from '@/components/StatusBadge.vue';

/** Account statuses in plain words, with the badge each shows (icon plus word, never colour alone). */
export const STATUS_WORDS: Record<AccountStatus, string> = {
  active: 'Active',
  pending: 'Waiting for approval',
  disabled: 'Disabled',
  rejected: 'Rejected',
};

export const STATUS_BADGE: Record<AccountStatus, StatusKind> = {
  active: 'steady',
  pending: 'waiting',
  disabled: 'hold',
  rejected: 'hold',
};

/** Who to list on People: by role, by status, and by a name or e-mail fragment ('' = any). */
export interface PeopleFilter {
  role: Role | '';
  status: AccountStatus | '';
  q: string;
}
