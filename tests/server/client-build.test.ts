import { describe, expect, it } from 'vitest';
import fs from 'node:fs';
import path from 'node:path';

// npm test builds dist/ before vitest runs; the shipped client must not reach any other host (fonts are bundled).
const dist = path.resolve('dist');

describe('the built client', () => {
  it('references no external host from its HTML or CSS', () => {
    expect(fs.existsSync(path.join(dist, 'index.html'))).toBe(true);
    const files = [
      path.join(dist, 'index.html'),
      ...fs
        .readdirSync(path.join(dist, 'assets'))
        .filter((f) => f.endsWith('.css'))
        .map((f) => path.join(dist, 'assets', f)),
    ];
    for (const file of files) {
      const text = fs.readFileSync(file, 'utf8');
      expect(text, file).not.toMatch(/(?:src|href)=["']https?:\/\//i);
      expect(text, file).not.toMatch(/url\(\s*["']?(?:https?:)?\/\//i);
      expect(text, file).not.toMatch(/@import\s+(url\()?["']?https?:/i);
    }
    const css = files
      .filter((f) => f.endsWith('.css'))
      .map((f) => fs.readFileSync(f, 'utf8'))
      .join('');
    expect(css).toMatch(/font-family:\s*["']?Inter/);
    expect(css).toMatch(/font-family:\s*["']?Merriweather/);
    // Web fonts never hold up the first paint: every face is optional (vite.config.ts, optionalFonts).
    expect(css).toMatch(/@font-face/);
    expect(css).not.toMatch(/font-display:\s*(swap|block|auto|fallback)/);
    expect(css.match(/@font-face/g)!.length).toBe(css.match(/font-display:\s*optional/g)!.length);
    expect(fs.readdirSync(path.join(dist, 'assets')).some((f) => /inter.*\.woff2$/i.test(f))).toBe(true);
  });
});
