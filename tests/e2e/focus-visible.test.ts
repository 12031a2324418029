import { describe, expect, it } from 'vitest';
import { browserSuite } from '../setup/browser-suite';
import { waitForApp } from '../setup/browser';

const suite = browserSuite();

type Stop = { what: string; style: string; width: number; color: string; inViewport: boolean };

/** Tabs through the page and reads, for each element that takes focus, the outline the browser draws around it. */
async function tabThrough(path: string, width: number, stops = 30): Promise<Stop[]> {
  const context = await suite.browser.newContext({ viewport: { width, height: 900 } });
  const page = await context.newPage();
  await page.goto(`${suite.server.baseUrl}${path}`);
  await waitForApp(page);
  // Tab only once the page's own content is there: under load a lazily loaded page can still be on its way when the
  // app has started, and Tab would then walk the header alone.
  await page.locator('main h1').first().waitFor({ timeout: 30_000 });
  if (path.startsWith('/calculators/')) await page.locator('main input').first().waitFor({ timeout: 30_000 });
  const seen: Stop[] = [];
  for (let i = 0; i < stops; i++) {
    await page.keyboard.press('Tab');
    const stop = await page.evaluate(() => {
      const el = document.activeElement as HTMLElement | null;
      if (!el || el === document.body) return null;
      const cs = getComputedStyle(el);
      const r = el.getBoundingClientRect();
      const name = (el.getAttribute('aria-label') ?? el.textContent ?? el.getAttribute('name') ?? '').trim().slice(0, 40);
      return {
        what: `${el.tagName.toLowerCase()} "${name}"`,
        style: cs.outlineStyle,
        width: parseFloat(cs.outlineWidth),
        color: cs.outlineColor,
        inViewport: r.bottom > 0 && r.top < window.innerHeight,
      };
    });
    if (stop) seen.push(stop);
  }
  await context.close();
  return seen;
}

describe('keyboard focus is visible (WCAG 2.2 2.4.7, 2.4.11)', () => {
  for (const width of [390, 1366]) {
    for (const path of ['/', '/parameters/drag-brake', '/calculators/gearing']) {
      it(`${path} at ${width} px: every element reached by Tab draws a solid outline at least 2 px wide, on screen`, async () => {
        const stops = await tabThrough(path, width);
        expect(stops.length).toBeGreaterThan(5);
        const faint = stops.filter((s) => s.style === 'none' || s.style === 'hidden' || !(s.width >= 2) || /rgba\(.*, 0\)$/.test(s.color));
        expect(faint, JSON.stringify(faint, null, 1)).toEqual([]);
        // Not hidden under a sticky header or off screen: the browser scrolls the focused element into view.
        expect(stops.filter((s) => !s.inViewport)).toEqual([]);
        // Inputs included (they used to turn their outline off and only recolour a 1 px border).
        if (path === '/calculators/gearing') expect(stops.some((s) => s.what.startsWith('input'))).toBe(true);
      });
    }
  }
});
