import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { start, type E2EServer } from '../setup/e2e-server';
import { createClient } from '../setup/test-app';
import { DEMO_ACCOUNTS } from '../../server/db/demo-accounts';
import { launchBrowser, screenshot } from '../setup/browser';
import { signedInPage } from './guide-helpers';

// Each payload tries to set window.__xss or open a dialog. The page runs with CSP bypassed, so the
// sanitizer is the only thing standing between the body and the page.
const CORPUS = [
  '<script>window.__xss = "script"</script>',
  '<img src="x" onerror="window.__xss = \'img-onerror\'">',
  '<svg onload="window.__xss = \'svg-onload\'"><circle r="5"/></svg>',
  '<svg><script>window.__xss = "svg-script"</script></svg>',
  '<iframe src="javascript:window.top.__xss = \'iframe-js\'"></iframe>',
  '<iframe srcdoc="<script>parent.__xss = \'srcdoc\'</script>"></iframe>',
  '<style>@import "javascript:alert(1)"; body { background: url("javascript:window.__xss=1") }</style>',
  '<div style="background:url(javascript:alert(\'style\'))" onmouseover="alert(\'hover\')">hover me</div>',
  '<details open ontoggle="alert(\'details\')"><summary>x</summary></details>',
  '<input autofocus onfocus="alert(\'focus\')">',
  '<object data="javascript:alert(\'object\')"></object><embed src="javascript:alert(\'embed\')">',
  '<a href="javascript:alert(\'raw-a\')">raw link</a>',
  '<math><mi xlink:href="javascript:alert(\'math\')">m</mi></math>',
  '<meta http-equiv="refresh" content="0;url=javascript:alert(\'meta\')">',
  '<form action="javascript:alert(\'form\')"><button>go</button></form>',
  '[md javascript link](javascript:alert("md-js"))',
  '[md mixed case](JaVaScRiPt:alert("md-case"))',
  '[md entity](jav&#x09;ascript:alert("md-entity"))',
  '[md data link](data:text/html;base64,PHNjcmlwdD5hbGVydCgxKTwvc2NyaXB0Pg==)',
  '[md vbscript](vbscript:msgbox("x"))',
  '![md image js](javascript:alert("img-js"))',
  '![md image data](data:image/svg+xml;base64,PHN2ZyBvbmxvYWQ9YWxlcnQoMSk+PC9zdmc+)',
  '![broken](x" onerror="alert(\'attr-break\'))',
  '<javascript:alert("autolink")>',
  '[reference link][evil]\n\n[evil]: javascript:alert("ref")',
  '```worked-example\ncalc: <script>window.__xss = "example"</script>\nspur: <img src=x onerror=alert(1)>\n```',
  '<scr<script>ipt>window.__xss = "nested"</script>',
];

const BODY = `## Harmless heading\n\nOrdinary text before the corpus.\n\n${CORPUS.join('\n\n')}\n\nOrdinary text after the corpus.`;

let server: E2EServer;
let browser: Browser;
let slug: string;
let revisionId: string;

async function apiAs(key: string) {
  const a = DEMO_ACCOUNTS.find((d) => d.key === key)!;
  const client = createClient(server.t.app);
  const res = await client.post('/api/auth/sign-in', { email: a.email, password: a.password });
  if (res.status !== 200) throw new Error(`sign-in ${key}: ${res.status}`);
  client.resetCsrf();
  return client;
}

beforeAll(async () => {
  server = await start();
  browser = await launchBrowser();
  const rosa = await apiAs('rosa');
  const created = await rosa.post('/api/guides', { title: 'Corpus check on Harbour Flats carpet', summary: 'A guide body made of hostile markup, to check that none of it runs.', class: 'touring-mod', surface: 'carpet', tags: ['test'], parameters: [], body: BODY });
  expect(created.status).toBe(201);
  slug = created.body.data.guide.slug;
  revisionId = created.body.data.revision.id;
  expect((await rosa.post(`/api/revisions/${revisionId}/submit`, { note: 'Corpus for the sanitizer check.' })).status).toBe(200);
}, 60_000);
afterAll(async () => {
  await browser?.close();
  await server?.close();
});

/** Loads a page with CSP bypassed, trips every event the corpus listens for, and reports what ran. */
async function probe(page: Page, path: string, ready: string, prepare?: () => Promise<void>) {
  const dialogs: string[] = [];
  page.on('dialog', (d) => {
    dialogs.push(d.message());
    void d.dismiss();
  });
  await page.goto(`${server.baseUrl}${path}`);
  await page.getByText(ready).first().waitFor();
  if (prepare) await prepare();
  const body = page.locator('.prose-notebook').first();
  await body.getByText('Ordinary text before the corpus.').waitFor();
  await body.getByText('Ordinary text after the corpus.').waitFor();
  // Give handlers a chance: hover and focus everything, click every link and button inside the body.
  for (const el of await body.locator('a, button, div, summary, input').all()) {
    await el.hover({ timeout: 500 }).catch(() => {});
    await el.focus({ timeout: 500 }).catch(() => {});
  }
  for (const a of await body.locator('a').all()) {
    const href = await a.getAttribute('href');
    if (href && !/^https?:/i.test(href)) await a.click({ timeout: 1000, noWaitAfter: true }).catch(() => {});
  }
  await page.waitForTimeout(300);
  const flag = await page.evaluate(() => (window as unknown as { __xss?: string }).__xss ?? null);
  const dom = await body.evaluate((root) => {
    const bad: string[] = [];
    for (const el of Array.from(root.querySelectorAll('*'))) {
      const tag = el.tagName.toLowerCase();
      if (['script', 'iframe', 'object', 'embed', 'style', 'form', 'input', 'meta', 'link', 'base'].includes(tag)) bad.push(`<${tag}>`);
      for (const attr of Array.from(el.attributes)) {
        if (/^on/i.test(attr.name)) bad.push(`${tag}[${attr.name}]`);
        if (attr.name === 'style') bad.push(`${tag}[style]`);
        if (['href', 'src', 'xlink:href', 'action', 'data', 'srcdoc'].includes(attr.name) && !/^(https?:|\/|#|[a-z0-9._-]+(\/|$))/i.test(attr.value.trim())) bad.push(`${tag}[${attr.name}=${attr.value.slice(0, 40)}]`);
      }
    }
    return bad;
  });
  return { flag, dialogs, dom, url: page.url() };
}

describe('XSS corpus through guide bodies, rendered in Chromium', () => {
  it('runs no script on the review page, where a moderator meets the proposal first', async () => {
    const owen = await signedInPage(browser, server.baseUrl, 'owen');
    const ctx = owen.context();
    const page = await ctx.browser()!.newContext({ bypassCSP: true, storageState: await ctx.storageState() }).then((c) => c.newPage());
    const result = await probe(page, `/review/${revisionId}`, 'Corpus check on Harbour Flats carpet', () => page.getByText('Read the proposal as readers would see it').click());
    await screenshot(page, 'guides-xss-review');
    expect(result).toEqual({ flag: null, dialogs: [], dom: [], url: `${server.baseUrl}/review/${revisionId}` });
    // Publish it so readers can reach it.
    await owen.goto(`${server.baseUrl}/review/${revisionId}`);
    await owen.getByRole('button', { name: 'Publish' }).click();
    await owen.waitForURL(`${server.baseUrl}/review`);
  }, 90_000);

  it('runs no script on the public guide page, and the text around the corpus still reads', async () => {
    const context = await browser.newContext({ bypassCSP: true });
    const page = await context.newPage();
    const result = await probe(page, `/guides/${slug}`, 'Corpus check on Harbour Flats carpet');
    await screenshot(page, 'guides-xss-corpus');
    expect(result).toEqual({ flag: null, dialogs: [], dom: [], url: `${server.baseUrl}/guides/${slug}` });
    await page.getByRole('heading', { name: 'Harmless heading' }).waitFor();
    await context.close();
  }, 90_000);

  it('the probe itself notices a script that does run (so a pass above means something)', async () => {
    const context = await browser.newContext({ bypassCSP: true });
    const page = await context.newPage();
    await page.goto(`${server.baseUrl}/guides/${slug}`);
    await page.locator('.prose-notebook').getByText('Ordinary text after the corpus.').waitFor();
    await page.evaluate(() => {
      const img = document.createElement('img');
      img.setAttribute('src', 'x');
      img.setAttribute('onerror', 'window.__xss = "planted"');
      document.querySelector('.prose-notebook')!.appendChild(img);
    });
    await page.waitForFunction(() => (window as unknown as { __xss?: string }).__xss === 'planted');
    const dom = await page.locator('.prose-notebook img[onerror]').count();
    expect(dom).toBe(1);
    await context.close();
  });
});
