import { deleteAccountSchema } from '../../../shared/schemas/account';
import { defineRoute, type RouteDef } from '../../lib/route';
import { logOut, sessionCookieName } from '../../middleware/auth';
import { deleteAccount } from './delete';
import { sendExport } from './export';

/** The member's own data: take it all away as one archive, or delete the account. */
export const accountRoutes: RouteDef[] = [
  defineRoute({
    method: 'get',
    path: '/api/account/export',
    summary:
      'Download everything that is yours as one zip archive (profile, revisions and drafts, setups, run logs with their files, motors and bench checks, watches) in JSON, CSV and Markdown, with a README',
    tags: ['account'],
    access: 'member',
    owner: { resource: 'account', rule: 'self' },
    download: true,
    handler: async ({ user, ctx, res }) => {
      await sendExport(ctx, user.id, res);
    },
  }),
  defineRoute({
    method: 'delete',
    path: '/api/account',
    summary:
      'Delete your account (with your current password): private data and credentials go, published versions stay credited to "Former member", every session ends; the last administrator is refused (409 last_admin)',
    tags: ['account'],
    access: 'member',
    owner: { resource: 'account', rule: 'self' },
    rateLimit: 'auth',
    body: deleteAccountSchema,
    status: 204,
    handler: async ({ body, user, req, res, ctx }) => {
      await deleteAccount(ctx, user.id, body.currentPassword);
      if (req.session) await logOut(req);
      res.clearCookie(sessionCookieName(ctx.config), { path: '/', httpOnly: true, sameSite: 'lax', secure: ctx.config.production });
      return { status: 204 };
    },
  }),
];
