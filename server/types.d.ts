import type { User as UserModel } from './models/user';

declare global {
  namespace Express {
    // passport puts the signed-in account on req.user.
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends UserModel {}
  }
}

declare module 'express-session' {
  interface SessionData {
    csrfToken?: string;
  }
}

export {};
