import { z } from 'zod';
import { calcRunResultSchema, calculatorInfoSchema } from '../../../shared/schemas/calc';
import { defineRoute } from '../../lib/route';
import { presentCalculator } from './presenter';
import { calcService } from './service';

const nameParam = z.object({ name: z.string().min(1).max(40) });

export const calcRoutes = [
  defineRoute({
    method: 'get',
    path: '/api/calc',
    summary: 'List the calculators, with their form fields and the JSON Schema of each input',
    tags: ['calc'],
    access: 'public',
    response: z.array(calculatorInfoSchema),
    handler: () => ({ data: calcService.list().map(presentCalculator) }),
  }),
  defineRoute({
    method: 'post',
    path: '/api/calc/:name',
    summary: 'Run a calculator: results and the cautions that go with them',
    tags: ['calc'],
    access: 'public',
    params: nameParam,
    // Each calculator validates its own inputs (see GET /api/calc for their schemas).
    body: z.record(z.string(), z.unknown(), { error: 'Send the inputs as a JSON object' }).optional(),
    response: calcRunResultSchema,
    handler: ({ params, body }) => ({ data: calcService.run(params.name, body ?? {}) }),
  }),
];
