import fs from 'node:fs';
import path from 'node:path';
import exifr from 'exifr';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedParameters } from '../../server/db/seed-content';
import { sweepImages } from '../../server/modules/images/sweep';
import { createClient, createTestApp, type TestApp, type TestClient } from '../setup/test-app';
import { signedInClient } from '../factories/user';
import { createDraftGuide } from '../factories/guide';
import { buildPhoto, buildPng, buildPngHeader, imageMarkdownFor, PLANTED_EXIF, sendImage, uploadImage } from '../factories/image';

let t: TestApp;
let rosa: TestClient;
let jonah: TestClient;
let mod: TestClient;

const imageCount = async () => Number((await t.db.dataSource.query('SELECT count(*)::int AS n FROM images'))[0].n);
function storedFiles(): string[] {
  const dir = path.join(t.ctx.config.uploadDir, 'images');
  if (!fs.existsSync(dir)) return [];
  return fs
    .readdirSync(dir, { recursive: true, withFileTypes: true })
    .filter((e) => e.isFile())
    .map((e) => path.join(e.parentPath, e.name))
    .sort();
}

beforeAll(async () => {
  t = await createTestApp({}, { catcher: false });
  await seedParameters(t.db.dataSource);
  rosa = (await signedInClient(t, 'member')).client;
  jonah = (await signedInClient(t, 'member')).client;
  mod = (await signedInClient(t, 'moderator')).client;
});
afterAll(async () => {
  await t?.close();
});

describe('POST /api/revisions/:id/images', () => {
  it('answers 201 with id, url, width, height and srcset, and serves re-encoded bytes without the planted EXIF', async () => {
    const { revision } = await createDraftGuide(rosa);
    const upload = await buildPhoto({ width: 2000, height: 1200 });
    // The planted tags are really in the upload (read by exifr, an independent EXIF reader).
    const planted = await exifr.parse(upload, { gps: true, tiff: true });
    expect(planted.Make).toBe(PLANTED_EXIF.IFD0.Make);
    expect(planted.latitude).toBeCloseTo(47.5, 3);

    const img = await uploadImage(rosa, revision.id, upload);
    expect(Object.keys(img).sort()).toEqual(['height', 'id', 'srcset', 'url', 'width']);
    expect(img).toMatchObject({ width: 2000, height: 1200, url: `/api/images/${img.id}/960` });
    expect(img.srcset).toBe(`/api/images/${img.id}/480 480w, /api/images/${img.id}/960 960w, /api/images/${img.id}/1600 1600w`);

    for (const width of [480, 960, 1600]) {
      const res = await rosa.agent.get(`/api/images/${img.id}/${width}`).buffer(true);
      expect(res.status).toBe(200);
      expect(res.headers['content-type']).toBe('image/jpeg');
      expect(res.headers['x-content-type-options']).toBe('nosniff');
      // A draft's image: the author's browser may show it, nothing in between may keep it.
      expect(res.headers['cache-control']).toBe('private, no-store');
      const served = res.body as Buffer;
      expect(Buffer.compare(served, upload)).not.toBe(0);
      expect((await sharp(served).metadata()).width).toBe(width);
      // exifr finds no EXIF at all in what is served: no GPS, no camera.
      expect(await exifr.parse(served, { gps: true, tiff: true, exif: true })).toBeUndefined();
      expect(await exifr.gps(served)).toBeUndefined();
      expect(served.includes(Buffer.from(PLANTED_EXIF.IFD0.Make))).toBe(false);
    }
  });

  it('applies the EXIF orientation to the pixels (a portrait photo stays portrait without the tag)', async () => {
    const { revision } = await createDraftGuide(rosa);
    // Stored 1200×800 with orientation 6 (rotate 90° clockwise to view): the reader sees 800×1200.
    const img = await uploadImage(rosa, revision.id, await buildPhoto({ width: 1200, height: 800, orientation: 6 }));
    expect({ width: img.width, height: img.height }).toEqual({ width: 800, height: 1200 });
    const served = (await rosa.agent.get(`/api/images/${img.id}/480`).buffer(true)).body as Buffer;
    const meta = await sharp(served).metadata();
    expect({ width: meta.width, height: meta.height, orientation: meta.orientation }).toEqual({ width: 480, height: 720, orientation: undefined });
  });

  it('never makes an image wider than its original', async () => {
    const { revision } = await createDraftGuide(rosa);
    const img = await uploadImage(rosa, revision.id, await buildPng(640, 360));
    expect(img.srcset).toBe(`/api/images/${img.id}/480 480w, /api/images/${img.id}/640 640w`);
    expect(img.url).toBe(`/api/images/${img.id}/640`);
    const res = await rosa.agent.get(`/api/images/${img.id}/640`).buffer(true);
    expect(res.headers['content-type']).toBe('image/png');
    expect((await rosa.get(`/api/images/${img.id}/960`)).status).toBe(404);
  });

  describe('hostile files: refused with the error shape, nothing stored', () => {
    const cases: Array<{ label: string; status: number; body: () => Promise<Buffer>; name?: string; type?: string }> = [
      { label: 'a text file', status: 415, body: async () => Buffer.from('endbell one mark above the middle\n'), name: 'notes.txt', type: 'text/plain' },
      { label: 'a PDF named .jpg', status: 415, body: async () => Buffer.from('%PDF-1.7\n1 0 obj << >> endobj\n%%EOF') },
      {
        label: 'an SVG (with script)',
        status: 415,
        body: async () => Buffer.from('<?xml version="1.0"?><svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>'),
        name: 'diagram.svg',
        type: 'image/svg+xml',
      },
      {
        label: 'an SVG sent as a PNG',
        status: 415,
        body: async () => Buffer.from('  <svg xmlns="http://www.w3.org/2000/svg" onload="alert(1)"/>'),
        name: 'x.png',
        type: 'image/png',
      },
      {
        label: 'a truncated JPEG',
        status: 400,
        body: async () => {
          const photo = await buildPhoto();
          return photo.subarray(0, Math.floor(photo.length * 0.6));
        },
      },
      { label: 'a 50,000 × 50,000 PNG header', status: 413, body: async () => buildPngHeader(50_000, 50_000), name: 'bomb.png', type: 'image/png' },
      {
        label: 'a PNG with an HTML page after it (polyglot)',
        status: 400,
        body: async () => Buffer.concat([await buildPng(), Buffer.from('<html><body><script>alert(document.cookie)</script></body></html>')]),
        name: 'poly.png',
        type: 'image/png',
      },
      {
        label: 'a JPEG with script in its comment (polyglot)',
        status: 400,
        body: async () => {
          const photo = await buildPhoto();
          // A COM segment right after SOI: still a decodable JPEG.
          const text = Buffer.from('*/<script>alert(1)</script>/*');
          const len = Buffer.alloc(2);
          len.writeUInt16BE(text.length + 2);
          return Buffer.concat([photo.subarray(0, 2), Buffer.from([0xff, 0xfe]), len, text, photo.subarray(2)]);
        },
      },
      { label: 'an empty file', status: 400, body: async () => Buffer.alloc(0) },
      {
        label: 'a GIF',
        status: 415,
        body: async () =>
          sharp({ create: { width: 40, height: 40, channels: 3, background: '#fff' } })
            .gif()
            .toBuffer(),
        name: 'a.gif',
        type: 'image/gif',
      },
      { label: 'a file over the size limit', status: 413, body: async () => Buffer.concat([Buffer.from([0xff, 0xd8, 0xff]), Buffer.alloc(13 * 1024 * 1024)]) },
    ];
    for (const c of cases) {
      it(`${c.label} → ${c.status}`, async () => {
        const { revision } = await createDraftGuide(rosa);
        const [rows, files] = [await imageCount(), storedFiles()];
        const res = await (await sendImage(rosa, revision.id, await c.body(), c.name ?? 'photo.jpg', c.type ?? 'image/jpeg')).req;
        expect(res.status, JSON.stringify(res.body)).toBe(c.status);
        expect(Object.keys(res.body)).toEqual(['error']);
        expect(res.body.error).toMatchObject({ code: 'invalid_image', message: expect.any(String) });
        expect(res.body.error.details).toEqual([{ path: 'file', message: expect.any(String) }]);
        expect(await imageCount()).toBe(rows);
        expect(storedFiles()).toEqual(files);
      });
    }
  });

  it("refuses someone else's draft (404, as for an unknown id) before reading the file, and visitors (401)", async () => {
    const { revision } = await createDraftGuide(rosa);
    const rows = await imageCount();
    const res = await (await sendImage(jonah, revision.id, await buildPhoto())).req;
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
    const visitor = createClient(t.app);
    const token = (await visitor.agent.get('/api/csrf')).body.data.token as string;
    const anon = await visitor.agent
      .post(`/api/revisions/${revision.id}/images`)
      .set('x-csrf-token', token)
      .attach('file', await buildPng(), 'a.png');
    expect(anon.status).toBe(401);
    expect(await imageCount()).toBe(rows);
  });
});

describe('GET /api/images/:id/:width', () => {
  it('a draft image: 404 to strangers and visitors (same as an unknown id), shown to its author and moderators; public and immutable once live', async () => {
    const { revision, slug } = await createDraftGuide(rosa);
    const img = await uploadImage(rosa, revision.id);
    const url = `/api/images/${img.id}/480`;
    const unknown = await jonah.get('/api/images/00000000-0000-4000-8000-000000000000/480');
    for (const who of [jonah, createClient(t.app)]) {
      const res = await who.get(url);
      expect({ status: res.status, body: res.body }).toEqual({ status: 404, body: unknown.body });
    }
    expect((await mod.agent.get(url)).status).toBe(200);

    // Submit without alt text: 422 with the error shape, the revision stays a draft.
    const body = `## Endbell\n\n${imageMarkdownFor(img, '')}\n\nOne mark above the middle.`;
    expect((await rosa.patch(`/api/revisions/${revision.id}`, { body })).status).toBe(200);
    const refused = await rosa.post(`/api/revisions/${revision.id}/submit`, { note: 'With a photo' });
    expect(refused.status).toBe(422);
    expect(refused.body.error.code).toBe('image_check_failed');
    expect(refused.body.error.details).toEqual([expect.objectContaining({ path: 'content.body', message: expect.stringContaining('needs alt text') })]);
    expect((await rosa.get(`/api/revisions/${revision.id}`)).body.data.revision.state).toBe('draft');

    const withAlt = body.replace('![]', '![Endbell with the timing mark one notch above the centre line]');
    expect((await rosa.patch(`/api/revisions/${revision.id}`, { body: withAlt })).status).toBe(200);
    expect((await rosa.post(`/api/revisions/${revision.id}/submit`, { note: 'With a photo' })).status).toBe(200);
    // In review: still private.
    expect((await jonah.get(url)).status).toBe(404);
    expect((await mod.post(`/api/reviews/${revision.id}/publish`)).status).toBe(200);
    const live = await createClient(t.app).agent.get(url).buffer(true);
    expect(live.status).toBe(200);
    expect(live.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(live.headers['content-type']).toBe('image/jpeg');

    // Hidden by a moderator: gone for readers, still there for moderators; the guide stays up.
    const hidden = await mod.post(`/api/images/${img.id}/hide`, { reason: 'Shows a person' });
    expect(hidden.status).toBe(200);
    expect(hidden.body.data).toMatchObject({ id: img.id, hiddenReason: 'Shows a person' });
    expect((await createClient(t.app).get(url)).status).toBe(404);
    expect((await mod.agent.get(url)).status).toBe(200);
    const reader = createClient(t.app);
    const hiddenGuide = await reader.get(`/api/guides/${slug}`);
    expect(hiddenGuide.status).toBe(200);
    // The drawn body shows the notice where the image was, and the revision lists the image as hidden.
    const notice = 'A moderator has hidden this image.'; // HIDDEN_IMAGE_NOTICE, written out: the test reads what readers see
    expect(hiddenGuide.body.data.revision.hiddenImages).toEqual([img.id]);
    expect(hiddenGuide.body.data.revision.bodyHtml).toContain(`<span class="image-hidden">${notice}</span>`);
    expect(hiddenGuide.body.data.revision.bodyHtml).not.toContain(`/api/images/${img.id}/`);
    expect(hiddenGuide.body.data.revision.bodyHtml).toContain('One mark above the middle.');
    const version = await reader.get(`/api/guides/${slug}/revisions/1`);
    expect(version.status).toBe(200);
    expect(version.body.data.revision.hiddenImages).toEqual([img.id]);
    expect(version.body.data.revision.bodyHtml).toContain(notice);
    expect((await mod.post(`/api/images/${img.id}/unhide`, {})).status).toBe(200);
    expect((await createClient(t.app).get(url)).status).toBe(200);
    const shownAgain = (await createClient(t.app).get(`/api/guides/${slug}`)).body.data.revision;
    expect(shownAgain.hiddenImages).toEqual([]);
    expect(shownAgain.bodyHtml).not.toContain(notice);
    expect(shownAgain.bodyHtml).toContain(`src="/api/images/${img.id}/960"`);
  });

  it('refuses an image of another page, or one not uploaded here, at submit', async () => {
    const other = await createDraftGuide(rosa);
    const foreign = await uploadImage(rosa, other.revision.id);
    const { revision } = await createDraftGuide(rosa);
    const body = `${imageMarkdownFor(foreign, 'Gear mesh checked with a strip of paper')}\n\n![Motor](https://example.org/motor.jpg)`;
    expect((await rosa.patch(`/api/revisions/${revision.id}`, { body })).status).toBe(200);
    const res = await rosa.post(`/api/revisions/${revision.id}/submit`, { note: 'Borrowed images' });
    expect(res.status).toBe(422);
    expect(res.body.error.details.map((d: { message: string }) => d.message)).toEqual([
      expect.stringContaining('not uploaded to this page'),
      expect.stringContaining('not an image uploaded here'),
    ]);
  });
});

describe('the image sweep', () => {
  it('removes old images no revision uses whose draft is gone, and keeps used, young and in-draft ones', async () => {
    const a = await createDraftGuide(rosa);
    const used = await uploadImage(rosa, a.revision.id);
    const unusedInDraft = await uploadImage(rosa, a.revision.id);
    const orphan = await uploadImage(rosa, a.revision.id);
    const young = await uploadImage(rosa, a.revision.id);
    expect(
      (await rosa.patch(`/api/revisions/${a.revision.id}`, { body: `${imageMarkdownFor(used, 'Sensor cable routed away from the motor wires')}` })).status,
    ).toBe(200);
    // The orphan's draft is gone (as if deleted); the young one too, but it is inside the grace.
    await t.db.dataSource.query(`UPDATE images SET revision_id = NULL WHERE id = ANY($1)`, [[orphan.id, young.id]]);
    await t.db.dataSource.query(`UPDATE images SET created_at = now() - interval '2 days' WHERE id = ANY($1)`, [[used.id, unusedInDraft.id, orphan.id]]);
    const before = storedFiles().length;
    const removed = await sweepImages(t.ctx, new Date(Date.now() - 24 * 60 * 60 * 1000));
    expect(removed).toEqual([orphan.id]);
    const left = (await t.db.dataSource.query('SELECT id FROM images WHERE id = ANY($1)', [[used.id, unusedInDraft.id, orphan.id, young.id]])).map(
      (r: { id: string }) => r.id,
    );
    expect(left.sort()).toEqual([used.id, unusedInDraft.id, young.id].sort());
    // Its stored widths went with it (a 1200-pixel photo: 480, 960 and 1200).
    expect(storedFiles().length).toBe(before - 3);
    expect((await rosa.get(`/api/images/${used.id}/480`)).status).toBe(200);
  });
});
