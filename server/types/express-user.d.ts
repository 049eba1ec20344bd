import type { User as LagbookUser } from '../db/users.repo.ts';

declare global {
  namespace Express {
    /** The signed-in person on `req.user`, re-read from the database on every request. */
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends LagbookUser {}
  }
}

export {};
