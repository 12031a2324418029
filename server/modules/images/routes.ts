import { z } from 'zod';
import { IMAGE_LIMITS } from '../../../shared/markdown/images';
import { hideImageSchema, imageStateSchema, uploadedImageSchema } from '../../../shared/schemas/image';
import { defineRoute, type RouteDef } from '../../lib/route';
import { presentUploadedImage, readImage, setImageHidden, uploadImage } from './service';
import { parseImageUpload } from './upload';

const revisionIdParam = z.object({ id: z.uuid({ message: 'Must be a revision id' }) });
const imageIdParam = z.object({ id: z.uuid({ message: 'Must be an image id' }) });
const imageWidthParams = z.object({
  id: z.uuid({ message: 'Must be an image id' }),
  width: z.coerce.number({ message: 'Must be a width in pixels' }).int('Must be a width in pixels').min(1).max(100_000),
});
const unhideBody = z.strictObject({ reason: z.string().trim().max(1000).optional() });

/** A year, and never revalidated: an image id's bytes never change (a new upload is a new id). */
const PUBLIC_CACHE = 'public, max-age=31536000, immutable';

export const imageRoutes: RouteDef[] = [
  defineRoute({
    method: 'post',
    path: '/api/revisions/:id/images',
    summary: `Upload an image into your own draft (multipart: file; JPEG, PNG or WebP, ${IMAGE_LIMITS.fileBytes / 1024 / 1024} MB and ${IMAGE_LIMITS.maxPixels / 1_000_000} megapixels at most). Decoded and re-encoded: orientation applied, metadata removed, stored at a few widths`,
    tags: ['images', 'revisions'],
    access: 'member',
    owner: { resource: 'revision', rule: 'owner' },
    multipart: true,
    rateLimit: 'upload',
    status: 201,
    params: revisionIdParam,
    before: [parseImageUpload],
    response: uploadedImageSchema,
    handler: async ({ req, params, user, ctx }) => ({ status: 201, data: presentUploadedImage(await uploadImage(ctx, user!, params.id, req.file)) }),
  }),
  defineRoute({
    method: 'get',
    path: '/api/images/:id/:width',
    summary: 'One stored width of an image (widths as in its srcset). Public once a live revision uses it; before that only its uploader and moderators see it',
    tags: ['images'],
    access: 'public',
    owner: { resource: 'image', rule: 'owner-or-moderator' },
    params: imageWidthParams,
    download: true,
    handler: async ({ params, user, res, ctx }) => {
      const image = await readImage(ctx, user, params.id, params.width);
      res.setHeader('Content-Type', image.contentType);
      res.setHeader('X-Content-Type-Options', 'nosniff');
      res.setHeader('Content-Disposition', 'inline');
      res.setHeader('Cache-Control', image.shared ? PUBLIC_CACHE : 'private, no-store');
      res.status(200).end(image.body);
    },
  }),
  defineRoute({
    method: 'post',
    path: '/api/images/:id/hide',
    summary: 'Hide an image (moderators): pages show a notice in its place; the guide itself stays up',
    tags: ['images', 'moderation'],
    access: 'moderator',
    owner: { resource: 'image', rule: 'any' },
    params: imageIdParam,
    body: hideImageSchema,
    response: imageStateSchema,
    handler: async ({ params, body, user, ctx }) => ({ data: await setImageHidden(ctx, user!, params.id, true, body.reason) }),
  }),
  defineRoute({
    method: 'post',
    path: '/api/images/:id/unhide',
    summary: 'Show a hidden image again (moderators)',
    tags: ['images', 'moderation'],
    access: 'moderator',
    owner: { resource: 'image', rule: 'any' },
    params: imageIdParam,
    body: unhideBody,
    response: imageStateSchema,
    handler: async ({ params, body, user, ctx }) => ({ data: await setImageHidden(ctx, user!, params.id, false, body.reason ?? null) }),
  }),
];
