import { z } from 'zod';
import { uuidParam } from '../../../shared/schemas/common';
import {
  checkCreateSchema,
  checkSchema,
  motorCompareSchema,
  motorCreateSchema,
  motorPatchSchema,
  motorSchema,
  type CheckCreate,
} from '../../../shared/schemas/motor';
import { checkValues } from '../../../shared/motors/check-values';
import { compareChecks, compareFindings, effectiveTolerances } from '../../../shared/motors/compare';
import { benchChecksToCsv } from '../../../shared/motors/csv';
import { defineRoute, type RouteDef } from '../../lib/route';
import { contentDisposition } from '../setups/routes';
import { presentCheck, presentMotor } from './presenter';
import {
  addCheck,
  comparePair,
  createMotor,
  deleteCheck,
  deleteMotor,
  getMotor,
  listChecks,
  listMotors,
  motorWithStats,
  referenceOf,
  updateMotor,
} from './service';

const owner = { resource: 'motor', rule: 'owner' } as const;
const compareQuery = z.strictObject({ from: z.uuid('from must be a check id').optional(), to: z.uuid('to must be a check id').optional() });
const checkParams = z.object({ id: z.uuid({ message: 'Must be an id' }), checkId: z.uuid({ message: 'Must be an id' }) });

export const motorRoutes: RouteDef[] = [
  defineRoute({
    method: 'get',
    path: '/api/motors',
    summary: 'Your motor register',
    tags: ['motors'],
    access: 'member',
    owner: { resource: 'motor', rule: 'self' },
    response: z.array(motorSchema),
    handler: async ({ user, ctx }) => {
      const motors = (await listMotors(ctx.dataSource, user.id)).map(presentMotor);
      return { data: motors, meta: { total: motors.length } };
    },
  }),
  defineRoute({
    method: 'post',
    path: '/api/motors',
    summary: 'Register a motor of yours',
    tags: ['motors'],
    access: 'member',
    status: 201,
    body: motorCreateSchema,
    response: motorSchema,
    handler: async ({ body, user, ctx }) => ({
      status: 201,
      data: presentMotor({ row: await createMotor(ctx.dataSource, user.id, body), stats: { checkCount: 0, lastTestedAt: null } }),
    }),
  }),
  defineRoute({
    method: 'get',
    path: '/api/motors/:id',
    summary: 'One of your motors',
    tags: ['motors'],
    access: 'member',
    owner,
    params: uuidParam,
    response: motorSchema,
    handler: async ({ params, user, ctx }) => ({ data: presentMotor(await motorWithStats(ctx.dataSource, await getMotor(ctx.dataSource, user, params.id))) }),
  }),
  defineRoute({
    method: 'patch',
    path: '/api/motors/:id',
    summary: 'Change one of your motors: details, tolerances per quantity, the reference check',
    tags: ['motors'],
    access: 'member',
    owner,
    params: uuidParam,
    body: motorPatchSchema,
    response: motorSchema,
    handler: async ({ params, body, user, ctx }) => ({
      data: presentMotor(await motorWithStats(ctx.dataSource, await updateMotor(ctx.dataSource, user, params.id, body))),
    }),
  }),
  defineRoute({
    method: 'delete',
    path: '/api/motors/:id',
    summary: 'Delete one of your motors and all its checks',
    tags: ['motors'],
    access: 'member',
    owner,
    params: uuidParam,
    status: 204,
    handler: async ({ params, user, ctx }) => {
      await deleteMotor(ctx.dataSource, user, params.id);
    },
  }),
  defineRoute({
    method: 'post',
    path: '/api/motors/:id/checks',
    summary: 'Add a bench check (one value per reading, or up to five repeats under readings.<field>)',
    tags: ['motors'],
    access: 'member',
    owner,
    params: uuidParam,
    status: 201,
    body: checkCreateSchema,
    response: checkSchema,
    handler: async ({ params, body, user, ctx }) => {
      const row = await addCheck(ctx.dataSource, user, params.id, body as CheckCreate);
      const motor = await getMotor(ctx.dataSource, user, params.id);
      return { status: 201, data: presentCheck(row, referenceOf(motor, await listChecks(ctx.dataSource, motor.id))?.id) };
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/motors/:id/checks',
    summary: "One of your motors' bench checks, oldest first",
    tags: ['motors'],
    access: 'member',
    owner,
    params: uuidParam,
    response: z.array(checkSchema),
    handler: async ({ params, user, ctx }) => {
      const motor = await getMotor(ctx.dataSource, user, params.id);
      const checks = await listChecks(ctx.dataSource, motor.id);
      const ref = referenceOf(motor, checks)?.id;
      return { data: checks.map((c) => presentCheck(c, ref)), meta: { total: checks.length, referenceCheckId: ref ?? null } };
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/motors/:id/checks.csv',
    summary: "Download one of your motors' bench checks in our CSV layout",
    tags: ['motors'],
    access: 'member',
    owner,
    params: uuidParam,
    download: true,
    handler: async ({ params, user, ctx, res }) => {
      const motor = await getMotor(ctx.dataSource, user, params.id);
      const checks = await listChecks(ctx.dataSource, motor.id);
      const ref = referenceOf(motor, checks)?.id;
      const name = `${motor.label.replace(/[^A-Za-z0-9._-]+/g, '-').replace(/^-+|-+$/g, '') || 'motor'}-bench-checks.csv`;
      res.setHeader('Content-Type', 'text/csv; charset=utf-8; header=present');
      res.setHeader('Content-Disposition', contentDisposition(name));
      res.status(200).send(
        benchChecksToCsv(
          motor,
          checks.map((c) => presentCheck(c, ref)),
        ),
      );
    },
  }),
  defineRoute({
    method: 'delete',
    path: '/api/motors/:id/checks/:checkId',
    summary: 'Delete one bench check of one of your motors',
    tags: ['motors'],
    access: 'member',
    owner,
    params: checkParams,
    status: 204,
    handler: async ({ params, user, ctx }) => {
      await deleteCheck(ctx.dataSource, user, params.id, params.checkId);
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/motors/:id/compare',
    summary: 'Compare two checks of one of your motors (from defaults to the reference, to to the latest): change, tolerance and verdict per quantity',
    tags: ['motors'],
    access: 'member',
    owner,
    params: uuidParam,
    query: compareQuery,
    response: motorCompareSchema,
    handler: async ({ params, query, user, ctx }) => {
      const { motor, checks, from, to } = await comparePair(ctx.dataSource, user, params.id, query.from, query.to);
      const ref = referenceOf(motor, checks)?.id;
      const rows = compareChecks(checkValues(from), checkValues(to), effectiveTolerances(motor.tolerances));
      return { data: { from: presentCheck(from, ref), to: presentCheck(to, ref), quantities: rows, findings: compareFindings(rows) } };
    },
  }),
];
