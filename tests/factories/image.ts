import sharp from 'sharp';
import zlib from 'node:zlib';
import { expect } from 'vitest';
import type { TestClient } from '../setup/test-app';

/** A made-up GPS position (a point in open sea) and camera, written into the test photo's EXIF. */
export const PLANTED_EXIF = {
  IFD0: { Make: 'Invented Camera Co', Model: 'Bench Test 1', Software: 'tunewright-tests' },
  IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '47/1 30/1 0/1', GPSLongitudeRef: 'W', GPSLongitude: '30/1 15/1 0/1' },
};

/** A photo-like JPEG (a gradient, so it compresses like a photo) carrying EXIF with GPS and an orientation tag. */
export async function buildPhoto(opts: { width?: number; height?: number; orientation?: number } = {}) {
  const width = opts.width ?? 1200;
  const height = opts.height ?? 800;
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}"><defs><linearGradient id="g"><stop offset="0" stop-color="#2a6f97"/><stop offset="1" stop-color="#f4a259"/></linearGradient></defs><rect width="100%" height="100%" fill="url(#g)"/><circle cx="${width / 3}" cy="${height / 2}" r="${height / 4}" fill="#333"/></svg>`;
  return sharp(Buffer.from(svg))
    .jpeg({ quality: 90 })
    .withExif(PLANTED_EXIF as never)
    .withMetadata({ orientation: opts.orientation ?? 1 })
    .toBuffer();
}

export async function buildPng(width = 640, height = 360) {
  return sharp({ create: { width, height, channels: 3, background: '#e8eef2' } })
    .png()
    .toBuffer();
}

/** A PNG whose header claims width × height pixels, with a small body: a decompression bomb's shape. */
export function buildPngHeader(width: number, height: number): Buffer {
  const chunk = (type: string, data: Buffer) => {
    const len = Buffer.alloc(4);
    len.writeUInt32BE(data.length);
    const typed = Buffer.concat([Buffer.from(type, 'latin1'), data]);
    const crc = Buffer.alloc(4);
    crc.writeUInt32BE(zlib.crc32(typed) >>> 0);
    return Buffer.concat([len, typed, crc]);
  };
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 2; // truecolour
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', ihdr),
    chunk('IDAT', zlib.deflateSync(Buffer.alloc(256 * 1024))),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}

/** A multipart image upload into a revision on the client's session (wrapped: a supertest request is thenable). */
export async function sendImage(client: TestClient, revisionId: string, body: Buffer, name = 'photo.jpg', contentType = 'image/jpeg') {
  const token = (await client.agent.get('/api/csrf')).body.data.token as string;
  return { req: client.agent.post(`/api/revisions/${revisionId}/images`).set('x-csrf-token', token).attach('file', body, { filename: name, contentType }) };
}

export type Uploaded = { id: string; url: string; width: number; height: number; srcset: string };

/** Uploads an image into a draft and returns the answer's data (fails the test unless it was stored). */
export async function uploadImage(client: TestClient, revisionId: string, body?: Buffer): Promise<Uploaded> {
  const res = await (await sendImage(client, revisionId, body ?? (await buildPhoto()))).req;
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.data as Uploaded;
}

/** The Markdown the editor inserts for an upload. */
export const imageMarkdownFor = (img: Uploaded, alt: string) => `![${alt}](${img.url}#${img.width}x${img.height})`;
