import { describe, expect, it } from 'vitest';
import { revealWorkedExamples, screenshotPath, VIEWPORTS } from '../setup/browser';
import { browserSuite } from '../setup/browser-suite';

const suite = browserSuite();

// 200 % browser zoom on a 1280 px window lays the page out at 640 CSS px.
const SIZES = { desktop: VIEWPORTS.desktop, phone: VIEWPORTS.phone, zoom200: { width: 640, height: 450 } } as const;

const PAGES = [
  { name: 'parameters', path: '/parameters', ready: 'table tbody tr' },
  { name: 'parameter-drag-brake', path: '/parameters/drag-brake', ready: '[data-worked-example] [data-result]' },
  { name: 'parameter-ramped-advance', path: '/parameters/ramped-advance', ready: '[data-chart] path.recharts-curve' },
  { name: 'calculators', path: '/calculators', ready: 'main li a' },
  { name: 'calculator-pack', path: '/calculators/pack', ready: '[data-result="fullV"]' },
  { name: 'calculator-gearing', path: '/calculators/gearing', ready: '[data-chart] .recharts-bar-rectangle' },
  {
    name: 'calculator-timing-full-throttle',
    path: '/calculators/timing-curve?baseDeg=5&rampDeg=20&rampStartRpm=10000&rampEndRpm=30000&atRpm=20000&stepDeg=10&stepDelayS=0.3',
    ready: '[data-chart] .recharts-line:nth-of-type(2) path.recharts-curve',
  },
  { name: 'calculator-throttle', path: '/calculators/throttle', ready: '[data-chart] path.recharts-curve' },
] as const;

describe('library and calculator pages at desktop, phone and 200 % zoom widths', () => {
  for (const p of PAGES) {
    it(`${p.path} fits every width without sideways scrolling and without errors`, async () => {
      for (const [size, viewport] of Object.entries(SIZES)) {
        const page = await suite.browser.newPage({ viewport });
        const errors: string[] = [];
        page.on('pageerror', (e) => errors.push(e.message));
        await page.goto(`${suite.server.baseUrl}${p.path}`);
        await revealWorkedExamples(page);
        await page.evaluate(() => window.scrollTo(0, 0));
        await page.locator(p.ready).first().waitFor();
        const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
        await page.screenshot({ path: screenshotPath(`${p.name}-${size}`), fullPage: true });
        await page.screenshot({ path: screenshotPath(`${p.name}-${size}-top`) });
        const example = page.locator('[data-worked-example], main .rounded-lg:has([data-result])').first();
        if (await example.count()) await example.screenshot({ path: screenshotPath(`${p.name}-${size}-example`) });
        expect(overflow, `${p.path} at ${size}`).toBeLessThanOrEqual(0);
        expect(errors).toEqual([]);
        await page.close();
      }
    });
  }
});
