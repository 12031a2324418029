import { z } from 'zod';
import { uuidParam } from '../../../shared/schemas/common';
import { adminUserPatchSchema, adminUserQuerySchema, adminUserSchema } from '../../../shared/schemas/user';
import { defineRoute } from '../../lib/route';
import { presentAdminUser } from '../auth/presenter';
import { adminService } from './service';

export const adminRoutes = [
  defineRoute({
    method: 'get',
    path: '/api/admin/users',
    summary: 'List accounts (search by e-mail or name)',
    tags: ['admin'],
    access: 'admin',
    query: adminUserQuerySchema,
    response: z.array(adminUserSchema),
    handler: async ({ query, ctx }) => {
      const { rows, total } = await adminService(ctx).listUsers(query);
      return { data: rows.map(presentAdminUser), meta: { total, page: query.page, pageSize: query.pageSize } };
    },
  }),
  defineRoute({
    method: 'patch',
    path: '/api/admin/users/:id',
    summary: "Change an account's role or disable/enable it",
    tags: ['admin'],
    access: 'admin',
    owner: { resource: 'account', rule: 'not-owner' },
    params: uuidParam,
    body: adminUserPatchSchema,
    response: z.object({ user: adminUserSchema }),
    handler: async ({ params, body, user, ctx }) => ({ data: { user: presentAdminUser(await adminService(ctx).updateUser(user.id, params.id, body)) } }),
  }),
];
