import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { screenshot, watchPageErrors } from '../setup/browser';
import { publishFromQueue, signedInPage, submitWithNote, waitSaved } from './guide-helpers';
import { browserSuite } from '../setup/browser-suite';

const suite = browserSuite();

const TITLE = 'Reading the endbell timing mark on a 2WD stock buggy';
const ALT = 'Endbell with the timing mark one notch above the centre line';

/** An invented drawing of an endbell with marks (a PNG, as a phone screenshot or a drawing program gives). */
async function endbellPng() {
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="1400" height="1000"><rect width="100%" height="100%" fill="#f6f0e4"/>
    <circle cx="700" cy="500" r="380" fill="#c9ced6" stroke="#1d2a44" stroke-width="12"/>
    ${Array.from({ length: 9 }, (_, i) => `<line x1="${380 + i * 80}" y1="130" x2="${380 + i * 80}" y2="${i === 5 ? 60 : 95}" stroke="#1d2a44" stroke-width="10"/>`).join('')}
    <polygon points="780,30 810,0 750,0" fill="#a9572a"/></svg>`;
  return sharp(Buffer.from(svg)).png().toBuffer();
}

describe('images in a guide, in Chromium: paste, alt text, review, live page', () => {
  it('an author pastes an image, is asked for alt text, submits; the moderator sees it among the changes and publishes; the live page shows it with srcset and no layout shift', async () => {
    const rosa = await signedInPage(suite.browser, suite.server.baseUrl, 'rosa');
    const rosaErrors = watchPageErrors(rosa);
    await rosa.goto(`${suite.server.baseUrl}/guides/new`);
    await rosa.getByLabel('Title', { exact: true }).fill(TITLE);
    await rosa.getByLabel('Summary').fill('Where the timing mark sits for a calm start on the high-bite clay, with a drawing of the endbell.');
    await rosa.getByLabel('Class').selectOption('buggy-2wd-stock');
    await rosa.getByLabel('Surface').selectOption('clay');
    await rosa.getByLabel('Conditions').fill('Indoor clay, high bite, 18–21 °C air');
    await rosa.getByLabel('Tags').fill('stock, timing');
    await rosa.getByLabel('Body').fill('## The mark\n\nSet the endbell one mark above the middle.\n\n## Checking it\n\nRun five minutes and feel the can.');
    await waitSaved(rosa);

    // Paste an image into the editor (a paste event carrying a file, as the clipboard gives after a screenshot).
    const png = (await endbellPng()).toString('base64');
    await rosa.getByLabel('Body').click();
    await rosa.evaluate((b64) => {
      const bytes = Uint8Array.from(atob(b64), (c) => c.charCodeAt(0));
      const data = new DataTransfer();
      data.items.add(new File([bytes], 'endbell.png', { type: 'image/png' }));
      const target = document.activeElement ?? document.body;
      target.dispatchEvent(new ClipboardEvent('paste', { clipboardData: data, bubbles: true, cancelable: true }));
    }, png);

    // The editor inserts it as Markdown and asks for alt text; submitting without it is refused.
    const altField = rosa.getByLabel('Alt text needed: what does this image show?');
    await altField.waitFor({ timeout: 30_000 });
    await expect.poll(() => rosa.getByLabel('Body').inputValue()).toMatch(/!\[\]\(\/api\/images\/[0-9a-f-]{36}\/960#1400x1000\)/);
    await rosa.locator('.w-md-editor-preview img[srcset]').first().waitFor();
    await screenshot(rosa, 'images-editor-alt-prompt');
    await rosa.getByRole('button', { name: 'Submit for review' }).click();
    const dialog = rosa.getByRole('dialog', { name: 'Submit for review' });
    await dialog.getByLabel('Edit note').fill('First version, with a drawing of the endbell.');
    await dialog.getByRole('button', { name: 'Submit' }).click();
    await rosa
      .getByText(/Every image needs alt text/)
      .first()
      .waitFor();
    await altField.fill(ALT);
    await rosa.getByRole('button', { name: 'Save alt text' }).click();
    await expect.poll(() => rosa.getByLabel('Body').inputValue()).toContain(`![${ALT}](/api/images/`);
    await waitSaved(rosa);
    await submitWithNote(rosa, 'First version, with a drawing of the endbell.');
    await rosa.waitForURL('**/me/revisions');

    // The moderator sees the added image among the changes, then publishes.
    const owen = await signedInPage(suite.browser, suite.server.baseUrl, 'owen');
    const owenErrors = watchPageErrors(owen);
    await owen.goto(`${suite.server.baseUrl}/review`);
    await owen.getByRole('link', { name: TITLE }).click();
    const changes = owen.getByRole('region', { name: 'Changed images' });
    await changes.getByText('Added (1)').waitFor();
    const thumb = changes.getByRole('img', { name: ALT });
    await expect.poll(() => thumb.evaluate((el) => (el as HTMLImageElement).naturalWidth)).toBe(480);
    await screenshot(owen, 'images-review');
    await publishFromQueue(owen, suite.server.baseUrl, TITLE);

    const [{ slug }] = await suite.server.t.db.dataSource.query(
      `SELECT d.slug FROM documents d JOIN revisions r ON r.id = d.published_revision_id WHERE r.content->>'title' = $1`,
      [TITLE],
    );
    // A visitor reads the live page: the image is there with width, height and srcset, and nothing shifts.
    for (const viewport of [
      { width: 390, height: 844 },
      { width: 1280, height: 900 },
    ]) {
      const context = await suite.browser.newContext({ viewport });
      const visitor = await context.newPage();
      const visitorErrors = watchPageErrors(visitor);
      await visitor.addInitScript(() => {
        const w = window as unknown as { __cls: number };
        w.__cls = 0;
        new PerformanceObserver((list) => {
          for (const e of list.getEntries() as unknown as Array<{ value: number; hadRecentInput: boolean }>) if (!e.hadRecentInput) w.__cls += e.value;
        }).observe({ type: 'layout-shift', buffered: true });
      });
      await visitor.goto(`${suite.server.baseUrl}/guides/${slug}`);
      const img = visitor.getByRole('img', { name: ALT });
      await img.waitFor();
      const attrs = await img.evaluate((el) => ({ srcset: el.getAttribute('srcset'), width: el.getAttribute('width'), height: el.getAttribute('height') }));
      expect(attrs.width).toBe('960');
      expect(attrs.height).toBe('686');
      expect(attrs.srcset).toMatch(
        /^\/api\/images\/[0-9a-f-]{36}\/480 480w, \/api\/images\/[0-9a-f-]{36}\/960 960w, \/api\/images\/[0-9a-f-]{36}\/1400 1400w$/,
      );
      await img.scrollIntoViewIfNeeded();
      await expect
        .poll(() => img.evaluate((el) => (el as HTMLImageElement).complete && (el as HTMLImageElement).naturalWidth > 0), { timeout: 20_000 })
        .toBe(true);
      await visitor.locator('html[data-app="running"]').waitFor({ timeout: 30_000 });
      const cls = await visitor.evaluate(() => (window as unknown as { __cls: number }).__cls);
      console.log(`CLS on the guide page with an image at ${viewport.width} px: ${cls.toFixed(4)}`);
      expect(cls).toBeLessThanOrEqual(0.1);
      await screenshot(visitor, `images-live-${viewport.width}`);
      expect(visitorErrors).toEqual([]);
      await context.close();
    }
    expect(rosaErrors).toEqual([]);
    expect(owenErrors).toEqual([]);
  }, 240_000);

  it('an author drops an image file onto the editor: it uploads, goes into the body as Markdown, shows in the preview and asks for alt text', async () => {
    const rosa = await signedInPage(suite.browser, suite.server.baseUrl, 'rosa');
    const errors = watchPageErrors(rosa);
    await rosa.goto(`${suite.server.baseUrl}/guides/new`);
    await rosa.getByLabel('Title', { exact: true }).fill('Gear mesh checked with a strip of paper');
    await rosa.getByLabel('Summary').fill('How much play the spur and pinion need, shown on a drawing of the two gears.');
    await rosa.getByLabel('Class').selectOption('buggy-2wd-stock');
    await rosa.getByLabel('Surface').selectOption('clay');
    await rosa.getByLabel('Body').fill('## The mesh\n\nRoll a strip of paper through the gears, then take it out.');
    await waitSaved(rosa);

    // A drop carrying a file, as the browser fires it when a file is dragged from the desktop onto the text.
    const png = (await endbellPng()).toString('base64');
    const body = rosa.getByLabel('Body');
    const box = (await body.boundingBox())!;
    await body.evaluate(
      (el, { b64, x, y }) => {
        const bytes = Uint8Array.from(atob(b64), (c) => c.charCodeAt(0));
        const data = new DataTransfer();
        data.items.add(new File([bytes], 'gear-mesh.png', { type: 'image/png' }));
        for (const type of ['dragenter', 'dragover', 'drop'])
          el.dispatchEvent(new DragEvent(type, { dataTransfer: data, bubbles: true, cancelable: true, clientX: x, clientY: y }));
      },
      { b64: png, x: box.x + 20, y: box.y + 20 },
    );

    await rosa.getByLabel('Alt text needed: what does this image show?').waitFor({ timeout: 30_000 });
    await expect.poll(() => body.inputValue(), { timeout: 30_000 }).toMatch(/!\[\]\(\/api\/images\/[0-9a-f-]{36}\/960#1400x1000\)/);
    // The text written before is still there, and the image is one of ours, served to its author.
    expect(await body.inputValue()).toContain('Roll a strip of paper through the gears');
    const preview = rosa.locator('.w-md-editor-preview img[srcset]').first();
    await preview.waitFor({ timeout: 30_000 });
    await expect
      .poll(() => preview.evaluate((el) => (el as HTMLImageElement).complete && (el as HTMLImageElement).naturalWidth > 0), { timeout: 20_000 })
      .toBe(true);
    // Stored once, on the draft that uploaded it.
    const [{ n }] = await suite.server.t.db.dataSource.query(
      `SELECT count(*)::int AS n FROM images i JOIN revisions r ON r.id = i.revision_id WHERE r.content->>'title' = $1 AND r.state = 'draft'`,
      ['Gear mesh checked with a strip of paper'],
    );
    expect(n).toBe(1);
    await screenshot(rosa, 'images-editor-dropped');
    expect(errors).toEqual([]);
  }, 180_000);
});
