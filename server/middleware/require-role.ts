import type { RequestHandler } from 'express';
import type { Role } from '@shared/auth';
import { forbidden, notSignedIn } from '../errors';

/** 401 when nobody is signed in, 403 when the account is of another role or switched off. */
export function requireRole(...roles: Role[]): RequestHandler {
  return (req, _res, next) => {
    if (!req.isAuthenticated() || !req.user) throw notSignedIn();
    if (req.user.status !== 'active') throw forbidden('Your account is not active.');
    if (!roles.includes(req.user.role)) throw forbidden('This page is for another kind of account.');
    next();
  };
}

export const requireSignedIn: RequestHandler = (req, _res, next) => {
  if (!req.isAuthenticated() || !req.user) throw notSignedIn();
  next();
};
