import type { User as UserModel } from '../models/User';

/**
 * Type augmentations: `req.user` is the User model (loaded fresh on every request by passport's
 * deserializer), and the session stores the CSRF token.
 */
declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
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
