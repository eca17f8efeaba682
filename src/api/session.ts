import { z } from 'zod';
import { publicUserSchema } from '@shared/auth';
import { http } from './http';

export const sessionApi = {
  /**
   * Is this tab's session still signed in? Used when the server closed the chat socket: a 401 here
   * goes through the shared 401 hook (the tab forgets the user and the router offers sign-in).
   */
  async stillSignedIn(): Promise<boolean> {
    await http.get('/api/auth/me', z.object({ user: publicUserSchema }));
    return true;
  },
};
