// Every API route is declared with the access it needs; mountRoutes enforces it and records the
// route, so tests can check that each registered route appears in the route × role table.
import type { NextFunction, Request, RequestHandler, Response, Router } from 'express';
import type { Role } from '../../shared/roles';
import { Forbidden, NotFound, Unauthenticated } from './errors';
import { findMembership } from '../services/membership-service';

export type Access =
  | { kind: 'public' }
  | { kind: 'signed-in' }
  | { kind: 'studio'; roles: readonly Role[] };

export const PUBLIC: Access = { kind: 'public' };
export const SIGNED_IN: Access = { kind: 'signed-in' };
export const studioRoles = (...roles: Role[]): Access => ({ kind: 'studio', roles });

type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

export interface RouteDef {
  method: Method;
  path: string;
  access: Access;
  handler: (req: Request, res: Response, next: NextFunction) => unknown;
  before?: RequestHandler[];
}

export interface RegisteredRoute {
  method: Method;
  path: string;
  access: Access;
}

export const registeredRoutes: RegisteredRoute[] = [];

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

function guard(access: Access): RequestHandler {
  return async (req, _res, next) => {
    if (access.kind === 'public') return next();
    if (!req.user) throw new Unauthenticated();
    if (access.kind === 'signed-in') return next();
    const studioId = String(req.params.studioId ?? '');
    if (!UUID.test(studioId)) throw new NotFound('No such studio.');
    const membership = await findMembership(studioId, req.user.id);
    if (!membership) throw new Forbidden('You are not a member of this studio.');
    if (!access.roles.includes(membership.role)) throw new Forbidden();
    req.member = { studioId, role: membership.role, membershipId: membership.id };
    next();
  };
}

export function mountRoutes(router: Router, base: string, defs: RouteDef[]) {
  for (const def of defs) {
    const fullPath = `${base}${def.path}`;
    if (def.access.kind === 'studio' && !fullPath.includes(':studioId')) {
      throw new Error(`Studio route ${fullPath} has no :studioId`);
    }
    router[def.method](fullPath, guard(def.access), ...(def.before ?? []), def.handler);
    registeredRoutes.push({ method: def.method, path: fullPath, access: def.access });
  }
}
