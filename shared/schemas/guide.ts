import { z } from 'zod';
import { CLASS_SLUGS, SURFACE_SLUGS } from '../constants';
import { slugSchema } from './common';

/** What a guide revision holds (the fields an author can change). */
export const guideContentSchema = z.object({
  title: z.string().trim().min(5, 'Give the guide a title of at least 5 characters').max(140),
  summary: z.string().trim().min(10, 'Write a summary of at least 10 characters').max(500),
  class: z.enum(CLASS_SLUGS, { message: 'Choose a class' }),
  surface: z.enum(SURFACE_SLUGS, { message: 'Choose a surface' }),
  conditions: z.string().trim().max(300).default(''),
  tags: z.array(z.string().trim().min(1).max(40)).max(20).default([]),
  parameters: z.array(slugSchema).max(40).default([]),
  body: z.string().max(100_000, 'The body is too long (100,000 characters at most)'),
});
export type GuideContent = z.infer<typeof guideContentSchema>;
