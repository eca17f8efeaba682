import type { z } from 'zod';
import type { deleteAccountSchema } from '@shared/admin';
import { http } from './http';

export type DeleteAccountInput = z.input<typeof deleteAccountSchema>;

/** "Your data": the rider's export and the erasure of their account. */
export const privacyApi = {
  /**
   * Same-origin download link: the browser sends the session cookie, and the server names the
   * .zip. A plain link (not fetch) so a large export streams to disk instead of into memory.
   */
  exportUrl: '/api/rider/export',
  deleteAccount: (input: DeleteAccountInput) => http.del('/api/rider/account', input),
};
