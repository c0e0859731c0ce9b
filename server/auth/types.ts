import type { User as UserModel } from '../models/User';

/**
 * Type augmentations: `req.user` is the User model (loaded fresh on every request by passport's
 * deserializer), and the session stores when its user signed in (for the absolute lifetime).
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
    /** Milliseconds since the epoch at sign-in. */
    signedInAt?: number;
  }
}

export {};
