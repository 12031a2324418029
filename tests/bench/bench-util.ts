// Small helpers shared by the search bench files.
import { rng } from './search-corpus';

export const pct = (xs: number[], p: number) => {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.floor((p / 100) * s.length))];
};
export const mb = (bytes: number) => bytes / 1024 / 1024;
export const fmt = (n: number, d = 2) => n.toFixed(d);

export function shuffled<T>(xs: T[], seed: number) {
  const r = rng(seed);
  const a = [...xs];
  for (let i = a.length - 1; i > 0; i--) {
    const j = Math.floor(r() * (i + 1));
    [a[i], a[j]] = [a[j], a[i]];
  }
  return a;
}

/** One table row: the first cell left-aligned, the others right-aligned, to the given widths. */
export const line = (cells: string[], widths: number[]) => cells.map((c, i) => (i === 0 ? c.padEnd(widths[i]) : c.padStart(widths[i]))).join('  ');
