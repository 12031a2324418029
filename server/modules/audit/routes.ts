import { z } from 'zod';
import { AUDIT_CSV_MAX_ROWS, auditEntrySchema, auditFilterSchema, auditQuerySchema } from '../../../shared/schemas/audit';
import { defineRoute, type RouteDef } from '../../lib/route';
import { contentDisposition } from '../setups/routes';
import { auditService } from './service';

export const auditRoutes: RouteDef[] = [
  defineRoute({
    method: 'get',
    path: '/api/audit',
    summary: 'The audit log, newest first: who did what, when and why (moderators and administrators); filter by actor, action, target and date',
    tags: ['audit'],
    access: 'moderator',
    query: auditQuerySchema,
    response: z.array(auditEntrySchema),
    handler: async ({ query, ctx }) => {
      const { rows, total } = await auditService(ctx).list(query);
      return { data: rows, meta: { total, limit: query.limit, offset: query.offset } };
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/audit.csv',
    summary: `The audit log as CSV with the same filters, newest first, at most ${AUDIT_CSV_MAX_ROWS.toLocaleString('en-GB')} rows (X-Total-Count says how many matched)`,
    tags: ['audit'],
    access: 'moderator',
    query: auditFilterSchema,
    download: true,
    handler: async ({ query, ctx, res }) => {
      const { text, total, rows } = await auditService(ctx).csv(query);
      res.setHeader('Content-Type', 'text/csv; charset=utf-8');
      res.setHeader('Content-Disposition', contentDisposition(`tunewright-audit-${new Date().toISOString().slice(0, 10)}.csv`));
      res.setHeader('X-Total-Count', String(total));
      res.setHeader('X-Row-Count', String(rows));
      res.setHeader('Cache-Control', 'no-store');
      // A byte-order mark, so spreadsheet programs read the file as UTF-8.
      res.status(200).send(`\uFEFF${text}`);
    },
  }),
];
