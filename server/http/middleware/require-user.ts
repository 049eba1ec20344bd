import type { RequestHandler } from 'express';
import { UnauthenticatedError } from '../../errors.ts';

/** Refuses the request with 401 unless a person is signed in (a live session with a known user). */
export const requireUser: RequestHandler = (req, _res, next) => {
  if (!req.user) throw new UnauthenticatedError();
  next();
};
