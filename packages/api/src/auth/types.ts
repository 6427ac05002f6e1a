/** What passport puts on `req.user`, and what the session keeps besides passport's own. */
import type { User as Account } from '../db/entities/user.js';

declare global {
  namespace Express {
    interface User extends Pick<Account, 'id' | 'login' | 'name' | 'email' | 'siteRole' | 'disabled'> {}
  }
}

declare module 'express-session' {
  interface SessionData {
    /** The expiry of the session's row when it was read (ms), never saved: see session-store.ts. */
    storedExpiry?: number;
  }
}

export {};
