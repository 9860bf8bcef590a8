import type { Request, RequestHandler } from 'express';
import { actingRole, rolesAllow, type Action } from '@shared/auth/permissions';
import type { Person } from '@shared/schemas/people';
import { AppError } from '../errors';
import type { Actor, RequestOrigin } from '../modules/ledger/ledger.repository';

/** Who may call a route. Every API route starts with exactly one access guard. */
export type RouteAccess = { kind: 'public' } | { kind: 'signed-in' } | { kind: 'action'; action: Action };

export type AccessGuard = RequestHandler & { access: RouteAccess };

function guard(access: RouteAccess, handler: RequestHandler): AccessGuard {
  return Object.assign(handler, { access });
}

export function currentPerson(req: Request): Person | null {
  return (req.user as Person | undefined) ?? null;
}

export const allowPublic = (): AccessGuard => guard({ kind: 'public' }, (_req, _res, next) => next());

export const requireSignedIn = (): AccessGuard =>
  guard({ kind: 'signed-in' }, (req, _res, next) => {
    next(currentPerson(req) ? undefined : new AppError('UNAUTHENTICATED', 'Sign in to continue'));
  });

export const requireAction = (action: Action): AccessGuard =>
  guard({ kind: 'action', action }, (req, res, next) => {
    const person = currentPerson(req);
    if (!person) return next(new AppError('UNAUTHENTICATED', 'Sign in to continue'));
    if (!rolesAllow(person.roles, action)) return next(new AppError('FORBIDDEN', `Your roles do not allow ${action}`));
    res.locals.action = action;
    next();
  });

/** The person acting, in the role that allows the route's action, for the ledger. */
export function actorOf(req: Request, action?: Action): Actor {
  const person = currentPerson(req);
  if (!person) return { id: null, name: null, role: null };
  return { id: person.id, name: person.name, role: action ? actingRole(person.roles, action) : null };
}

export function originOf(req: Request): RequestOrigin {
  return { requestId: req.id ? String(req.id) : null, clientAddress: req.ip ?? null };
}
