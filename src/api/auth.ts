import { z } from 'zod';
import { publicUserSchema, type AccountSettings, type PublicUser, type RegisterInput, type SignInInput } from '@shared/auth';
import { http } from './http';

const userEnvelope = z.object({ user: publicUserSchema });
const signInResult = z.object({ user: publicUserSchema, csrfToken: z.string().min(1) });

/** Riders are signed in at once; fitters and physios wait for the clinic's approval. */
const registerResult = z.discriminatedUnion('signedIn', [
  z.object({ user: publicUserSchema, signedIn: z.literal(true), csrfToken: z.string().min(1) }),
  z.object({ user: publicUserSchema, signedIn: z.literal(false), message: z.string() }),
]);
export type RegisterResult = z.infer<typeof registerResult>;

export const authApi = {
  async me(): Promise<PublicUser> {
    const { user } = await http.get('/api/auth/me', userEnvelope, { expectUnauthorized: true });
    return user;
  },
  signIn(input: SignInInput) {
    return http.post('/api/auth/sign-in', input, signInResult);
  },
  register(input: RegisterInput): Promise<RegisterResult> {
    return http.post('/api/auth/register', input, registerResult);
  },
  async updateAccount(input: AccountSettings): Promise<PublicUser> {
    const { user } = await http.patch('/api/auth/me', input, userEnvelope);
    return user;
  },
  signOut(): Promise<void> {
    return http.postEmpty('/api/auth/sign-out', undefined, { expectUnauthorized: true });
  },
};
