import { z } from 'zod';
import { defineRoute } from '../../lib/route';
import { CapturedMailEntity } from './captured-mail.entity';

const mailSchema = z.object({
  id: z.string(),
  to: z.string(),
  from: z.string(),
  subject: z.string(),
  text: z.string(),
  html: z.string().nullable(),
  headers: z.record(z.string(), z.string()),
  receivedAt: z.string(),
});

export const devMailRoutes = [
  defineRoute({
    method: 'get',
    path: '/api/dev/mail',
    summary: 'Mail captured by the local catcher, newest first (not in production)',
    tags: ['dev'],
    access: 'public',
    devOnly: true,
    query: z.object({ to: z.string().max(254).optional(), limit: z.coerce.number().int().min(1).max(200).default(50) }),
    response: z.array(mailSchema),
    handler: async ({ query, ctx }) => {
      const qb = ctx.dataSource.getRepository(CapturedMailEntity).createQueryBuilder('m').orderBy('m.receivedAt', 'DESC').take(query.limit);
      if (query.to) qb.where('lower(m.to) LIKE :to', { to: `%${query.to.toLowerCase()}%` });
      const rows = await qb.getMany();
      return {
        data: rows.map((m) => ({
          id: m.id,
          to: m.to,
          from: m.from,
          subject: m.subject,
          text: m.text,
          html: m.html,
          headers: m.headers ?? {},
          receivedAt: m.receivedAt.toISOString(),
        })),
      };
    },
  }),
];
