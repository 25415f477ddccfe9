// Every API route is registered with an access policy; the table drives the role-matrix test.
import type { RequestHandler, Router } from 'express';
import type { Policy } from '../middleware/access';

export interface RouteEntry {
  method: 'get' | 'post' | 'patch' | 'put' | 'delete';
  path: string;
  policy: Policy;
}

export type SecureRouter = Record<
  RouteEntry['method'],
  (path: string, policy: Policy, ...handlers: RequestHandler[]) => void
>;

/**
 * Wraps an Express router so a route cannot be added without a policy. The policy check runs
 * before any handler (and before body parsing errors can leak anything).
 */
export function secureRouter(router: Router, table: RouteEntry[], mountPath: string): SecureRouter {
  const add =
    (method: RouteEntry['method']) =>
    (path: string, policy: Policy, ...handlers: RequestHandler[]) => {
      table.push({ method, path: `${mountPath}${path}`, policy });
      router[method](path, policy.middleware, ...handlers);
    };
  return {
    get: add('get'),
    post: add('post'),
    patch: add('patch'),
    put: add('put'),
    delete: add('delete'),
  };
}
