import { z } from 'zod';
import type { Request, Response } from 'express';
import {
  unsubscribeBodySchema,
  unsubscribeResultSchema,
  watchParamsSchema,
  watchSchema,
  watchSettingsPatchSchema,
  watchSettingsSchema,
  watchStateSchema,
} from '../../../shared/schemas/watch';
import type { AppContext } from '../../context';
import { defineRoute, type RouteDef } from '../../lib/route';
import { watchService } from './service';

const self = { resource: 'account', rule: 'self' } as const;

export const watchRoutes: RouteDef[] = [
  defineRoute({
    method: 'get',
    path: '/api/watches',
    summary: 'What the signed-in person watches (guides and parameter entries)',
    tags: ['watches'],
    access: 'member',
    owner: self,
    response: z.array(watchSchema),
    handler: async ({ user, ctx }) => {
      const rows = await watchService(ctx).list(user!);
      return { data: rows, meta: { total: rows.length } };
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/watches/settings',
    summary: 'How the signed-in person gets watch mails: immediate, daily digest or off',
    tags: ['watches'],
    access: 'member',
    owner: self,
    response: watchSettingsSchema,
    handler: async ({ user, ctx }) => ({ data: await watchService(ctx).settings(user!) }),
  }),
  defineRoute({
    method: 'put',
    path: '/api/watches/settings',
    summary: 'Choose how watch mails come: one per change, a daily digest, or none',
    tags: ['watches'],
    access: 'member',
    owner: self,
    body: watchSettingsPatchSchema,
    response: watchSettingsSchema,
    handler: async ({ body, user, ctx }) => ({ data: await watchService(ctx).setSettings(user!, body.delivery) }),
  }),
  defineRoute({
    method: 'get',
    path: '/api/watches/:kind/:slug',
    summary: 'Whether the signed-in person watches this guide or parameter entry',
    tags: ['watches'],
    access: 'member',
    params: watchParamsSchema,
    response: watchStateSchema,
    handler: async ({ params, user, ctx }) => ({ data: await watchService(ctx).state(user!, params.kind, params.slug) }),
  }),
  ...(['put', 'delete'] as const).map((method) =>
    defineRoute({
      method,
      path: '/api/watches/:kind/:slug',
      summary: method === 'put' ? 'Watch a guide or parameter entry (mail when it changes)' : 'Stop watching a guide or parameter entry',
      tags: ['watches'],
      access: 'member',
      params: watchParamsSchema,
      response: watchStateSchema,
      handler: async ({ params, user, ctx }) => ({ data: await watchService(ctx).set(user!, params.kind, params.slug, method === 'put') }),
    }),
  ),
  defineRoute({
    method: 'post',
    path: '/api/unsubscribe',
    summary: "Stop watch mails with a mail's signed link (no sign-in needed)",
    tags: ['watches'],
    access: 'public',
    body: unsubscribeBodySchema,
    response: unsubscribeResultSchema,
    handler: async ({ body, ctx }) => ({ data: await watchService(ctx).unsubscribe(body.token) }),
  }),
];

/**
 * RFC 8058 one-click unsubscribe: mail programs POST `List-Unsubscribe=One-Click` to the address in the
 * List-Unsubscribe header, with no cookie and no CSRF token, so it lives outside /api. The signed token
 * in the address is the whole proof.
 */
export function oneClickUnsubscribe(ctx: AppContext) {
  return async (req: Request, res: Response) => {
    const token = typeof req.query.token === 'string' ? req.query.token : '';
    const parsed = unsubscribeBodySchema.safeParse({ token });
    if (!parsed.success) {
      res.status(400).json({ error: { code: 'token_invalid', message: 'That unsubscribe link is not valid.' } });
      return;
    }
    await watchService(ctx).unsubscribe(parsed.data.token);
    res.status(200).type('text').send('You will get no more of these mails.');
  };
}
