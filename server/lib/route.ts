import type { NextFunction, Request, Response, Router } from 'express';
import { z } from 'zod';
import type { Role } from '../../shared/constants';
import { ROLE_RANK } from '../../shared/constants';
import type { User } from '../../shared/schemas/user';
import { AppError, unauthenticated, validationFailed } from './errors';
import type { AppContext } from '../context';
import { findUnstorableInput } from './input-text';

/** Who may call a route: anyone, or a signed-in account of at least this role. */
export type Access = 'public' | Role;
export type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

/** Things a member owns: a revision they wrote, a setup they uploaded, their own account. */
export type OwnedResource = 'revision' | 'setup-upload' | 'account' | 'motor' | 'run' | 'image';

/**
 * How a route treats the owner of what it acts on (checked in the module's policy or service, which
 * has the row; declared here so the docs and the authorization matrix can enumerate every such route):
 * - `owner`: only the owner may; others get the module's refusal (revisions: 404 to those who cannot
 *   see it, 403 `not_own_revision` to those who can; uploads: 404 to everyone, moderators included).
 * - `owner-or-moderator`: the owner and moderators see it; anyone else is told it does not exist (404).
 * - `not-owner`: anyone at the access level except the owner (no one reviews their own revision or
 *   changes their own role).
 * - `any`: the access level alone decides; the answer says whether it is the caller's own.
 * - `self`: there is no id to point elsewhere; the route only ever reads or changes the caller's own.
 */
export type OwnershipRule = 'owner' | 'owner-or-moderator' | 'not-owner' | 'any' | 'self';

export type Ownership = { resource: OwnedResource; rule: OwnershipRule };

export type HandlerResult = { status?: number; data?: unknown; meta?: unknown } | void;

/** The caller: always a signed-in account on a route whose access is a role, possibly nobody on a public one. */
export type CallerFor<A extends Access> = A extends 'public' ? User | null : User;

export type HandlerInput<B, Q, P, A extends Access = Access> = {
  body: B;
  query: Q;
  params: P;
  user: CallerFor<A>;
  req: Request;
  res: Response;
  ctx: AppContext;
};

export type RouteDef<B = unknown, Q = unknown, P = unknown, A extends Access = Access> = {
  method: Method;
  path: string;
  summary: string;
  tags: string[];
  access: A;
  /** Required on every route that takes an owned resource's id (the authorization matrix fails without it). */
  owner?: Ownership;
  body?: z.ZodType<B>;
  query?: z.ZodType<Q>;
  params?: z.ZodType<P>;
  /** Schema of `data` in the success envelope (documentation and contract tests). */
  response?: z.ZodType;
  /** Success status when the handler does not set one. */
  status?: number;
  /** Rate-limit bucket applied before the handler. */
  rateLimit?: 'auth' | 'upload';
  /** Only mounted when the development helpers are on (DEV_TOOLS=true: the local demo and the tests). */
  devOnly?: boolean;
  /** Request body is multipart (file upload) rather than JSON. */
  multipart?: boolean;
  /** Response is a file or text download rather than the JSON envelope. */
  download?: boolean;
  /** Extra Express middleware run after access checks and before validation (e.g. multer). */
  before?: Array<(req: Request, res: Response, next: NextFunction) => void>;
  handler: (input: HandlerInput<B, Q, P, A>) => Promise<HandlerResult> | HandlerResult;
};

/** Declares one API route; the route table, validation, OpenAPI and generated tests all read this. */
export function defineRoute<B = undefined, Q = undefined, P = undefined, A extends Access = Access>(def: RouteDef<B, Q, P, A>): RouteDef {
  return def as unknown as RouteDef;
}

export function isMutating(method: Method) {
  return method !== 'get';
}

/** Converts zod issues to `{ path, message }` rows; `where` prefixes the path (body, query, params). */
export function toFieldIssues(error: z.ZodError, where?: string) {
  return error.issues.map((i) => {
    const keys = (i.code === 'unrecognized_keys' ? [...i.path, ...i.keys] : i.path).map(String);
    const path = [where, ...keys].filter(Boolean).join('.');
    const message = i.code === 'unrecognized_keys' ? `Unknown field${i.keys.length > 1 ? 's' : ''}: ${i.keys.join(', ')}` : i.message;
    return { path: path || where || '', message };
  });
}

function parsePart<T>(schema: z.ZodType<T> | undefined, value: unknown, where: string, issues: ReturnType<typeof toFieldIssues>): T {
  if (!schema) return undefined as T;
  const result = schema.safeParse(value ?? (where === 'body' ? undefined : {}));
  if (result.success) return result.data;
  issues.push(...toFieldIssues(result.error, where));
  return undefined as T;
}

export function checkAccess(access: Access, user: User | null) {
  if (access === 'public') return;
  if (!user) throw unauthenticated();
  if (ROLE_RANK[user.role] < ROLE_RANK[access]) {
    throw new AppError(
      403,
      'role_required',
      access === 'admin' ? 'Only administrators can do that' : access === 'moderator' ? 'Only moderators can do that' : 'You are not allowed to do that',
    );
  }
}

/** Mounts route definitions on an Express router: access → validation → handler → envelope. */
export function mountRoutes(
  router: Router,
  routes: RouteDef[],
  ctx: AppContext,
  limiters: Record<'auth' | 'upload', (req: Request, res: Response, next: NextFunction) => void>,
) {
  for (const route of routes) {
    if (route.devOnly && !ctx.config.devTools) continue;
    const chain: Array<(req: Request, res: Response, next: NextFunction) => void> = [];
    if (route.rateLimit) chain.push(limiters[route.rateLimit]);
    chain.push((req, _res, next) => {
      checkAccess(route.access, (req.user as User | undefined) ?? null);
      next();
    });
    if (isMutating(route.method)) {
      chain.push((req, _res, next) => {
        const hasBody = Number(req.headers['content-length'] ?? 0) > 0 || req.headers['transfer-encoding'] !== undefined;
        const wanted = route.multipart ? 'multipart/form-data' : 'application/json';
        if (hasBody && !req.is(wanted)) throw new AppError(415, 'unsupported_media_type', `Send the request body as ${wanted}.`);
        next();
      });
    }
    if (route.before) chain.push(...route.before);
    router[route.method](route.path, ...chain, async (req: Request, res: Response) => {
      const issues: ReturnType<typeof toFieldIssues> = [];
      for (const where of ['params', 'query', 'body'] as const) findUnstorableInput(req[where], where, issues);
      if (issues.length) throw validationFailed(issues);
      const params = parsePart(route.params, req.params, 'params', issues);
      const query = parsePart(route.query, req.query, 'query', issues);
      const body = parsePart(route.body, req.body, 'body', issues);
      if (issues.length) throw validationFailed(issues);
      const result = await route.handler({ body, query, params, user: (req.user as User | undefined) ?? null, req, res, ctx });
      if (res.headersSent) return;
      const status = (result && result.status) ?? route.status ?? 200;
      if (status === 204 || !result || result.data === undefined) {
        res.status(status === 200 && (!result || result.data === undefined) ? 204 : status).end();
        return;
      }
      res.status(status).json(result.meta === undefined ? { data: result.data } : { data: result.data, meta: result.meta });
    });
  }
}

export { AppError };
