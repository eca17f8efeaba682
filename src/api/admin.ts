import { z } from 'zod';
import { publicUserSchema, ROLES, type AccountDecision, type PublicUser } from '@shared/auth';
import { http } from './http';

const adminHomeSchema = z.object({
  greetingName: z.string(),
  pendingAccounts: z.array(publicUserSchema),
  // SQL counts can arrive as strings from some drivers; coerce rather than fail the page.
  accountsByRole: z.partialRecord(z.enum(ROLES), z.coerce.number()),
});
export type AdminHome = z.infer<typeof adminHomeSchema>;

const decisionResult = z.object({ account: publicUserSchema });

export const adminApi = {
  home: () => http.get('/api/admin/home', adminHomeSchema),
  async decideAccount(id: number, decision: AccountDecision['decision']): Promise<PublicUser> {
    const { account } = await http.post(`/api/admin/accounts/${id}/decision`, { decision }, decisionResult);
    return account;
  },
};
