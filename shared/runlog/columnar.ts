import { VALUE_CHANNELS, type ValueChannel } from './vocabulary';

/**
 * Our compact store of a parsed run: a short header, then one little-endian 32-bit float column per channel
 * (time first, relative to a 64-bit start time so float precision is spent on the run, not on the clock).
 * Layout: "TWRC", version u8, channel count u8, 2 bytes zero, row count u32, start time f64, then per value
 * channel its name (length u8 + ASCII), zero-padded to 4 bytes, then the columns.
 */
export type ColumnarRun = { time: Float64Array; channels: Partial<Record<ValueChannel, Float32Array>> };

const MAGIC = [0x54, 0x57, 0x52, 0x43];

/** Encodes a run's columns; 4 bytes per sample value plus a header of a few dozen bytes. */
export function encodeColumnar(time: ArrayLike<number>, channels: Partial<Record<ValueChannel, ArrayLike<number>>>): Uint8Array {
  const names = VALUE_CHANNELS.filter((c) => channels[c]);
  const n = time.length;
  let headerBytes = 20 + names.reduce((s, c) => s + 1 + c.length, 0);
  headerBytes = Math.ceil(headerBytes / 4) * 4;
  const buf = new ArrayBuffer(headerBytes + 4 * n * (names.length + 1));
  const view = new DataView(buf);
  const bytes = new Uint8Array(buf);
  bytes.set(MAGIC, 0);
  view.setUint8(4, 1);
  view.setUint8(5, names.length);
  view.setUint32(8, n, true);
  const t0 = n ? time[0] : 0;
  view.setFloat64(12, t0, true);
  let p = 20;
  for (const name of names) {
    view.setUint8(p++, name.length);
    for (let i = 0; i < name.length; i++) view.setUint8(p++, name.charCodeAt(i));
  }
  p = headerBytes;
  for (let i = 0; i < n; i++, p += 4) view.setFloat32(p, time[i] - t0, true);
  for (const name of names) {
    const col = channels[name]!;
    for (let i = 0; i < n; i++, p += 4) view.setFloat32(p, col[i], true);
  }
  return bytes;
}

/** Decodes {@link encodeColumnar}'s bytes; throws on anything that is not that layout. */
export function decodeColumnar(bytes: Uint8Array): ColumnarRun {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  if (bytes.byteLength < 20 || MAGIC.some((b, i) => bytes[i] !== b) || view.getUint8(4) !== 1) throw new Error('Not a columnar run (bad header)');
  const count = view.getUint8(5);
  const n = view.getUint32(8, true);
  const t0 = view.getFloat64(12, true);
  let p = 20;
  const names: ValueChannel[] = [];
  for (let k = 0; k < count; k++) {
    const len = view.getUint8(p++);
    let name = '';
    for (let i = 0; i < len; i++) name += String.fromCharCode(view.getUint8(p++));
    if (!(VALUE_CHANNELS as readonly string[]).includes(name)) throw new Error(`Not a columnar run (unknown channel ${name})`);
    names.push(name as ValueChannel);
  }
  p = Math.ceil(p / 4) * 4;
  if (bytes.byteLength !== p + 4 * n * (count + 1)) throw new Error('Not a columnar run (length does not match)');
  const time = new Float64Array(n);
  for (let i = 0; i < n; i++, p += 4) time[i] = t0 + view.getFloat32(p, true);
  const channels: ColumnarRun['channels'] = {};
  for (const name of names) {
    const col = new Float32Array(n);
    for (let i = 0; i < n; i++, p += 4) col[i] = view.getFloat32(p, true);
    channels[name] = col;
  }
  return { time, channels };
}
