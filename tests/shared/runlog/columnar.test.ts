import { describe, expect, it } from 'vitest';
import { decodeColumnar, encodeColumnar } from '../../../shared/runlog/columnar';
import { bucketMinMax, firstSustainedFullThrottle } from '../../../shared/runlog/series';

describe('encodeColumnar / decodeColumnar', () => {
  const n = 60_000;
  const time = Float64Array.from({ length: n }, (_v, i) => 1000 + i * 0.01);
  const current = Float64Array.from(time, (t) => 30 + 20 * Math.sin(t));
  const pack = Float64Array.from(time, () => 7.6);

  it('keeps 4 bytes per sample value plus a small header', () => {
    const bytes = encodeColumnar(time, { current_a: current, pack_v: pack });
    const values = n * 3;
    expect(bytes.byteLength).toBeLessThanOrEqual(values * 4 + 64);
    expect(bytes.byteLength / values).toBeLessThanOrEqual(4.001);
  });

  it('round-trips within float32 precision, time relative to a 64-bit start', () => {
    const back = decodeColumnar(encodeColumnar(time, { current_a: current, pack_v: pack }));
    expect(back.time.length).toBe(n);
    expect(back.time[n - 1]).toBeCloseTo(time[n - 1], 4);
    // IEEE 754 binary32 keeps 24 significant bits: relative error under 2^-24 ≈ 6e-8.
    expect(Math.abs(back.channels.current_a![123] - current[123]) / Math.abs(current[123])).toBeLessThan(1e-7);
    expect(Object.keys(back.channels)).toEqual(['current_a', 'pack_v']);
  });

  it('refuses bytes that are not this layout', () => {
    expect(() => decodeColumnar(new Uint8Array([1, 2, 3]))).toThrow(/not a columnar run/i);
    const bytes = encodeColumnar(time.slice(0, 10), { pack_v: pack.slice(0, 10) });
    expect(() => decodeColumnar(bytes.slice(0, bytes.length - 4))).toThrow(/length/);
  });
});

describe('bucketMinMax', () => {
  it('keeps a one-sample spike that an average would lose', () => {
    const time = Float64Array.from({ length: 10_000 }, (_v, i) => i / 100);
    const rpm = Float64Array.from(time, () => 20_000);
    rpm[5_555] = 41_000;
    const series = bucketMinMax(time, { motor_rpm: rpm }, 100);
    expect(series.t.length).toBe(100);
    expect(Math.max(...(series.channels.motor_rpm!.max as number[]))).toBe(41_000);
    expect(Math.min(...(series.channels.motor_rpm!.min as number[]))).toBe(20_000);
  });

  it('never returns more buckets than samples', () => {
    const series = bucketMinMax(Float64Array.from([0, 1, 2]), { pack_v: Float64Array.from([8, 7.9, 7.8]) }, 500);
    expect(series.t).toEqual([0, 1, 2]);
  });
});

describe('firstSustainedFullThrottle', () => {
  it('skips a blip and finds the first hold of half a second', () => {
    const time = Float64Array.from({ length: 100 }, (_v, i) => i * 0.1);
    const throttle = Float64Array.from(time, (t) => ((t >= 1 && t < 1.2) || t >= 4 ? 100 : 0));
    expect(firstSustainedFullThrottle(time, throttle)).toBeCloseTo(4, 9);
    expect(
      firstSustainedFullThrottle(
        time,
        Float64Array.from(time, () => 50),
      ),
    ).toBeNull();
  });
});
