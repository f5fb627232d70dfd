/**
 * Every API route is declared through `defineRoutes`, which records `{ method, path, action }`
 * in the app's route registry (the permission test walks it), asks the policy before the
 * handler runs, and validates `{ params, query, body }` once.
 *
 * Order inside a route: anonymous callers of a route that needs an account get 401 first, then
 * the input is validated (400 naming the fields), then the policy decides on the resource
 * (403), then the handler runs.
 */
import type { Request, RequestHandler, Response, Router } from 'express';
import { decide, type Action, type Actor, type Resource } from '../policy/policy.js';
import { assertCan } from '../policy/enforce.js';
import type { Parsed, Schemas } from './validate.js';
import { validate } from './validate.js';

export type Method = 'get' | 'post' | 'patch' | 'put' | 'delete';

export interface RouteEntry {
  method: Uppercase<Method>;
  /** Full path as Express sees it, e.g. `/api/studios/:studioId`. */
  path: string;
  action: Action;
}

export class RouteRegistry {
  readonly entries: RouteEntry[] = [];
  add(entry: RouteEntry): void {
    if (this.entries.some((e) => e.method === entry.method && e.path === entry.path)) {
      throw new Error(`Route ${entry.method} ${entry.path} is declared twice.`);
    }
    this.entries.push(entry);
  }
}

export interface RouteSpec<S extends Schemas> {
  action: Action;
  schemas?: S;
  /**
   * The resource the policy decides on, from the parsed input; may load it (a promise), and may
   * throw NotFoundError when the id names nothing.
   */
  resource?: (input: Parsed<S>) => Resource | Promise<Resource>;
  /** Middleware that runs before validation (e.g. rate limits). */
  before?: RequestHandler[];
}

export interface RouteCall<S extends Schemas> {
  req: Request;
  res: Response;
  input: Parsed<S>;
  actor: Actor | null;
}

type Handler<S extends Schemas> = (call: RouteCall<S>) => unknown | Promise<unknown>;

export function actorOf(req: Request): Actor | null {
  return req.user ?? null;
}

export function defineRoutes(router: Router, registry: RouteRegistry, base: string) {
  const add =
    (method: Method) =>
    <S extends Schemas>(path: string, spec: RouteSpec<S>, handler: Handler<S>): void => {
      const full = (base + (path === '/' ? '' : path)) || '/';
      registry.add({ method: method.toUpperCase() as Uppercase<Method>, path: full, action: spec.action });
      const check = validate(spec.schemas ?? {});
      router[method](path, ...(spec.before ?? []), async (req, res, next) => {
        const actor = actorOf(req);
        if (!actor) {
          const d = decide(null, spec.action);
          if (!d.allowed && d.status === 401) assertCan(null, spec.action);
        }
        check(req, res, () => undefined);
        const input = res.locals.input as Parsed<S>;
        assertCan(actor, spec.action, spec.resource ? await spec.resource(input) : undefined);
        await handler({ req, res, input, actor });
        if (!res.headersSent) next(new Error(`${method.toUpperCase()} ${full} sent no response`));
      });
    };
  return { get: add('get'), post: add('post'), patch: add('patch'), put: add('put'), delete: add('delete') };
}
