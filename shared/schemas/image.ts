import { z } from 'zod';

/** POST /api/revisions/:id/images → 201: the processed image, ready to be put into Markdown. */
export const uploadedImageSchema = z.object({
  id: z.uuid(),
  /** The width the Markdown points at (see shared/markdown/images.ts). */
  url: z.string(),
  /** The original's size after orientation. */
  width: z.number().int().positive(),
  height: z.number().int().positive(),
  srcset: z.string(),
});
export type UploadedImage = z.infer<typeof uploadedImageSchema>;

/** POST /api/images/:id/hide */
export const hideImageSchema = z.strictObject({
  reason: z.string({ message: 'Give a reason for hiding it' }).trim().min(3, 'Give a reason for hiding it').max(1000),
});

/** A moderator's view of an image's state. */
export const imageStateSchema = z.object({
  id: z.uuid(),
  hiddenAt: z.string().nullable(),
  hiddenReason: z.string().nullable(),
});
export type ImageState = z.infer<typeof imageStateSchema>;
