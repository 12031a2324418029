/** Polls `check` until it returns true or `ms` pass; returns the time it took, or throws. */
export async function within(ms: number, check: () => boolean | Promise<boolean>, what: string) {
  const t0 = performance.now();
  for (;;) {
    if (await check()) return performance.now() - t0;
    if (performance.now() - t0 > ms) throw new Error(`${what}: not true within ${ms} ms`);
    await new Promise((r) => setTimeout(r, 10));
  }
}
