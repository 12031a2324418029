import { beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { createClient, type TestClient } from '../setup/test-app';
import { DEMO_ACCOUNTS } from '../../server/db/demo-accounts';
import { screenshot } from '../setup/browser';
import { createUser } from '../factories/user';
import { proposeEdit } from '../factories/guide';
import { buildSetupRecord } from '../factories/setup-record';
import { XSS_TEXT_CORPUS, collectDialogs, packCorpus, pageDomScan, readXssFlag } from '../setup/xss';
import { browserSuite } from '../setup/browser-suite';
import { firstName } from '../../src/lib/names';

// Every plain-text field a user writes, filled with the corpus (packed to each field's length limit),
// then every page that shows it loaded in Chromium twice: once under the product's CSP, once with CSP
// bypassed so that only the rendering stands between the text and the page.

type Account = { email: string; password: string };
/**
 * A page to check; `nextPage` clicks that button once (a paged table) and checks the page after it too;
 * `fullLoad` loads it afresh (the compare page keeps its own picks when only the URL changes).
 */
type Visit = {
  place: string;
  who: Account | null;
  path: string;
  expectText: string[];
  pieces: number;
  nextPage?: string;
  fullLoad?: boolean;
  /** The header's account link must carry this whole name as its accessible name. */ expectLabel?: string;
};

const suite = browserSuite();
const visits: Visit[] = [];
/** place → how many corpus pieces reached it (for the coverage count below). */
const coverage = new Map<string, number>();

const demo = (key: string): Account => {
  const a = DEMO_ACCOUNTS.find((d) => d.key === key)!;
  return { email: a.email, password: a.password };
};
const piecesIn = (packs: string[]) => XSS_TEXT_CORPUS.filter((p) => packs.some((x) => x.includes(p))).length;
const chunk = <T>(xs: T[], n: number) => Array.from({ length: Math.ceil(xs.length / n) }, (_, i) => xs.slice(i * n, i * n + n));
const pad = (i: number) => String(i).padStart(2, '0');

async function apiClient(account: Account) {
  const client = createClient(suite.server.t.app);
  const res = await client.post('/api/auth/sign-in', account);
  if (res.status !== 200) throw new Error(`sign-in ${account.email}: ${res.status}`);
  client.resetCsrf();
  return client;
}

async function ok(promise: Promise<{ status: number; body: unknown }>, status = 200) {
  const res = await promise;
  expect(res.status, JSON.stringify(res.body)).toBe(status);
  return res.body as { data: Record<string, unknown> & { revision?: { id: string }; guide?: { slug: string } } };
}

function addVisit(v: Visit) {
  visits.push(v);
  coverage.set(v.place, Math.max(coverage.get(v.place) ?? 0, v.pieces));
}

async function uploadSetup(client: TestClient, name: string, record: unknown) {
  const token = (await client.agent.get('/api/csrf')).body.data.token as string;
  const res = await client.agent
    .post('/api/setups')
    .set('x-csrf-token', token)
    .attach('file', Buffer.from(JSON.stringify(record)), { filename: name, contentType: 'application/json' });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.data as { id: string; originalName: string };
}

beforeAll(async () => {
  const rosa = await apiClient(demo('rosa'));
  const owen = await apiClient(demo('owen'));
  const T = XSS_TEXT_CORPUS;

  // Guides: title, summary, conditions and tags; the submit note; one guide per pack.
  const titles = packCorpus(T, 140, 'Corpus 00 '.length);
  const summaries = packCorpus(T, 500, 'Corpus summary 00: '.length);
  const conditions = packCorpus(T, 300);
  const tagSets = chunk(
    T.filter((p) => p.length <= 40),
    20,
  );
  const notes = packCorpus(T, 1000);
  const reasons = packCorpus(T, 2000);
  const guideCount = Math.max(titles.length, summaries.length, conditions.length, tagSets.length, notes.length + reasons.length);
  const guides: Array<{ slug: string; title: string; summary: string; conditions: string; tags: string[] }> = [];
  for (let i = 0; i < guideCount; i++) {
    const g = {
      title: `Corpus ${pad(i)} ${titles[i % titles.length]}`,
      summary: `Corpus summary ${pad(i)}: ${summaries[i % summaries.length]}`,
      conditions: conditions[i % conditions.length],
      tags: tagSets[i % tagSets.length],
    };
    const created = await ok(
      rosa.post('/api/guides', { ...g, class: 'touring-mod', surface: 'carpet', parameters: [], body: 'Plain body for the text corpus check.' }),
      201,
    );
    const id = created.data.revision!.id;
    await ok(rosa.post(`/api/revisions/${id}/submit`, { note: notes[i % notes.length] }));
    await ok(owen.post(`/api/reviews/${id}/publish`));
    guides.push({ slug: created.data.guide!.slug, ...g });
  }
  // Edit notes left in review, and edits the moderator returns with a reason.
  const openNoteIds: string[] = [];
  for (const [i, note] of notes.entries()) {
    const r = await proposeEdit(rosa, guides[i].slug, { conditions: 'Edited for the note check' });
    await ok(rosa.post(`/api/revisions/${r.id}/submit`, { note }));
    openNoteIds.push(r.id);
  }
  for (const [j, reason] of reasons.entries()) {
    const r = await proposeEdit(rosa, guides[notes.length + j].slug, { conditions: 'Edited for the return check' });
    await ok(rosa.post(`/api/revisions/${r.id}/submit`, { note: 'Edit the moderator sends back' }));
    await ok(owen.post(`/api/reviews/${r.id}/return`, { reason }));
  }

  // Display names: one account per pack; each publishes an edit of one shared guide (byline, history)
  // and leaves another in review (queue).
  const names = packCorpus(T, 60);
  const history = await ok(
    rosa.post('/api/guides', {
      title: 'Corpus history of many hands',
      summary: 'A guide edited by every hostile display name in turn.',
      class: 'touring-mod',
      surface: 'carpet',
      tags: [],
      parameters: [],
      body: 'History body.',
    }),
    201,
  );
  const historySlug = history.data.guide!.slug;
  await ok(rosa.post(`/api/revisions/${history.data.revision!.id}/submit`, { note: 'First version' }));
  await ok(owen.post(`/api/reviews/${history.data.revision!.id}/publish`));
  const people: Account[] = [];
  for (const [k, displayName] of names.entries()) {
    const { user, password } = await createUser(suite.server.t, { displayName });
    const account = { email: user.email, password };
    people.push(account);
    const client = await apiClient(account);
    const edit = await proposeEdit(client, historySlug, { summary: `A guide edited by every hostile display name in turn, pass ${pad(k)}.` });
    await ok(client.post(`/api/revisions/${edit.id}/submit`, { note: `Edit number ${pad(k)}` }));
    await ok(owen.post(`/api/reviews/${edit.id}/publish`));
  }
  for (const [k, account] of people.entries()) {
    const client = await apiClient(account);
    const edit = await proposeEdit(client, historySlug, { conditions: `Queued edit ${pad(k)}` });
    await ok(client.post(`/api/revisions/${edit.id}/submit`, { note: `Queued edit ${pad(k)}` }));
  }

  // Parameter proposals: name, aliases, summary, each on its own library entry.
  const paramNames = packCorpus(T, 80);
  const aliasSets = chunk(
    T.filter((p) => p.length <= 60),
    20,
  );
  const paramSummaries = packCorpus(T, 400);
  const library = (await ok(rosa.get('/api/parameters'))).data as unknown as Array<{ slug: string }>;
  const proposalCount = Math.max(paramNames.length, aliasSets.length, paramSummaries.length);
  expect(library.length).toBeGreaterThanOrEqual(proposalCount);
  const proposals: Array<{ id: string; name: string; aliases: string[]; summary: string }> = [];
  for (let p = 0; p < proposalCount; p++) {
    const fields = { name: paramNames[p % paramNames.length], aliases: aliasSets[p % aliasSets.length], summary: paramSummaries[p % paramSummaries.length] };
    const r = await proposeEdit(rosa, library[p].slug, fields, 'parameters');
    await ok(rosa.post(`/api/revisions/${r.id}/submit`, { note: `Parameter proposal ${pad(p)}` }));
    proposals.push({ id: r.id, ...fields });
  }

  // Uploaded setups: chassis, layout, notes and the file name.
  const chassis = packCorpus(T, 120);
  const layouts = packCorpus(T, 300);
  const setupNotes = packCorpus(T, 4000);
  const fileNames = ['<img src=x onerror=alert("file")>.json', '"><script>window.__xss="file"</script>.json'];
  const uploadCount = Math.max(chassis.length, layouts.length, setupNotes.length, fileNames.length);
  const uploads: Array<{ id: string; label: string; chassis: string; layout: string; notes: string }> = [];
  for (let u = 0; u < uploadCount; u++) {
    const base = buildSetupRecord();
    const fields = { chassis: chassis[u % chassis.length], layout: layouts[u % layouts.length], notes: setupNotes[u % setupNotes.length] };
    const record = buildSetupRecord({
      vehicle: { ...base.vehicle, chassis: fields.chassis },
      conditions: { ...base.conditions, layout: fields.layout },
      notes: fields.notes,
    });
    const saved = await uploadSetup(rosa, fileNames[u] ?? `corpus-${pad(u)}.json`, record);
    uploads.push({ id: saved.id, label: saved.originalName, ...fields });
  }

  // Registered motors: label, rotor notes and bench-check notes (private, so only their owner's pages show them).
  const motorLabels = packCorpus(T, 80).map((x) => x.trim());
  const rotorNotes = packCorpus(T, 500).map((x) => x.trim());
  const checkNotes = packCorpus(T, 2000);
  const motors: Array<{ id: string; label: string; rotorNotes: string; notes: string }> = [];
  // Every label shows on the register; only as many motor pages as the longer fields need are visited.
  for (let m = 0; m < motorLabels.length; m++) {
    const fields = { label: motorLabels[m], rotorNotes: rotorNotes[m % rotorNotes.length], notes: checkNotes[m % checkNotes.length] };
    const motor = await ok(rosa.post('/api/motors', { label: fields.label, poles: 2, sensored: true, rotorNotes: fields.rotorNotes }), 201);
    await ok(rosa.post(`/api/motors/${motor.data.id}/checks`, { testVoltageV: 7.4, noLoadRpm: 17_020, notes: fields.notes }), 201);
    motors.push({ id: String(motor.data.id), ...fields });
  }
  const motorPages = motors.slice(0, Math.max(rotorNotes.length, checkNotes.length));

  // The pages, with the text each must show as written (proof the corpus reached it).
  const anon = null;
  const allTitles = guides.map((g) => g.title);
  addVisit({
    place: 'guide title/summary/tags: guides list',
    who: anon,
    path: '/guides?pageSize=100',
    expectText: [...allTitles, ...guides.map((g) => g.summary)],
    pieces: piecesIn(titles),
  });
  for (const g of guides)
    addVisit({
      place: 'guide title/summary/conditions/tags: guide page',
      who: anon,
      path: `/guides/${g.slug}`,
      expectText: [g.title, g.summary, g.conditions, ...g.tags],
      pieces: piecesIn([...titles, ...summaries, ...conditions, ...tagSets.flat()]),
    });
  addVisit({
    place: 'guide title/summary: search results',
    who: anon,
    path: '/search?q=Corpus',
    expectText: allTitles.slice(0, 3),
    pieces: piecesIn(titles.slice(0, 3)),
  });
  for (const q of packCorpus(T, 200))
    addVisit({ place: 'search query echo', who: anon, path: `/search?q=${encodeURIComponent(q)}`, expectText: [q], pieces: piecesIn(packCorpus(T, 200)) });
  addVisit({
    place: 'edit note + return reason: workbench',
    who: demo('rosa'),
    path: '/me/revisions',
    expectText: [...notes, ...reasons],
    pieces: piecesIn(notes),
  });
  addVisit({ place: 'edit note + display name: review queue', who: demo('owen'), path: '/review', expectText: [...notes, ...names], pieces: piecesIn(notes) });
  for (const id of openNoteIds)
    addVisit({
      place: 'edit note: review page',
      who: demo('owen'),
      path: `/review/${id}`,
      expectText: [notes[openNoteIds.indexOf(id)]],
      pieces: piecesIn(notes),
    });
  for (const p of proposals)
    addVisit({
      place: 'parameter name/aliases/summary: review page',
      who: demo('owen'),
      path: `/review/${p.id}`,
      expectText: [p.name, p.summary, ...p.aliases],
      pieces: piecesIn([...paramNames, ...aliasSets.flat(), ...paramSummaries]),
    });
  addVisit({ place: 'display name: admin users table', who: demo('nell'), path: '/admin/users', expectText: names, pieces: piecesIn(names), nextPage: 'Next' });
  addVisit({ place: 'display name: guide byline/history', who: anon, path: `/guides/${historySlug}`, expectText: names, pieces: piecesIn(names) });
  // The header shows only the signed-in account's own name (its first word; the whole name is the link's
  // accessible name and tooltip), so each costs a full page load: a spread of six.
  const sample = [0, 1, 2, 3, 4, 5].map((i) => Math.round((i * (people.length - 1)) / 5));
  for (const k of sample)
    addVisit({
      place: 'display name: header',
      who: people[k],
      path: '/calculators',
      expectText: [firstName(names[k])],
      expectLabel: names[k],
      pieces: piecesIn(sample.map((i) => names[i])),
    });
  addVisit({ place: 'setup file name: setup library', who: demo('rosa'), path: '/setups', expectText: uploads.map((u) => u.label), pieces: fileNames.length });
  for (let u = 0; u < uploads.length; u += 2) {
    const a = uploads[u];
    const b = uploads[u + 1] ?? uploads[0];
    addVisit({
      place: 'setup chassis/layout/notes/file name: compare page',
      who: demo('rosa'),
      path: `/setups/compare?a=${a.id}&b=${b.id}`,
      expectText: [a.chassis, b.chassis, a.layout, b.layout, a.notes, b.notes, a.label, b.label],
      pieces: piecesIn([...chassis, ...layouts, ...setupNotes]),
      fullLoad: true,
    });
  }
  addVisit({ place: 'motor label: motor register', who: demo('rosa'), path: '/motors', expectText: motors.map((m) => m.label), pieces: piecesIn(motorLabels) });
  for (const m of motorPages)
    addVisit({
      place: 'motor label/rotor notes/check notes: motor page',
      who: demo('rosa'),
      path: `/motors/${m.id}`,
      expectText: [m.label, m.rotorNotes, m.notes],
      pieces: piecesIn([...motorLabels, ...rotorNotes, ...checkNotes]),
      fullLoad: true,
    });
  for (const m of motors.slice(0, checkNotes.length))
    addVisit({
      place: 'motor label/check notes: bench sheet',
      who: demo('rosa'),
      path: `/motors/${m.id}/print`,
      expectText: [m.label, m.notes],
      pieces: piecesIn([...motorLabels, ...checkNotes]),
      fullLoad: true,
    });
}, 120_000);

/** One browser context per account, signed in through the API (the context shares its cookies). */
async function contextFor(who: Account | null, bypassCSP: boolean): Promise<BrowserContext> {
  const context = await suite.browser.newContext({ bypassCSP, viewport: { width: 1280, height: 900 } });
  if (who) {
    const token = ((await (await context.request.get(`${suite.server.baseUrl}/api/csrf`)).json()) as { data: { token: string } }).data.token;
    const res = await context.request.post(`${suite.server.baseUrl}/api/auth/sign-in`, { data: who, headers: { 'x-csrf-token': token } });
    if (res.status() !== 200) throw new Error(`browser sign-in ${who.email}: ${res.status()}`);
  }
  return context;
}

type Finding = { place: string; path: string; problem: string };

/** Everything on one page that shows a script ran or markup got in, plus the expected text that is missing. */
async function inspect(page: Page, v: Visit, dialogs: string[], text: string): Promise<Finding[]> {
  const findings: Finding[] = [];
  const add = (problem: string) => findings.push({ place: v.place, path: v.path, problem });
  // Handlers bound to load, error and autofocus fire within a moment of rendering.
  await page.waitForTimeout(100);
  const flag = await readXssFlag(page);
  if (flag) add(`window.__xss = ${flag}`);
  for (const d of dialogs.splice(0)) add(`dialog: ${d}`);
  for (const bad of await page.locator('body').evaluate(pageDomScan)) add(`injected ${bad}`);
  if (new URL(page.url()).pathname !== v.path.split('?')[0]) add(`navigated to ${page.url()}`);
  for (const x of v.expectText.filter((e) => !text.includes(e))) add(`not shown as text: ${x.slice(0, 60)}`);
  if (v.expectLabel) {
    const label = await page
      .getByRole('banner')
      .locator('a[href="/account"]')
      .getAttribute('aria-label', { timeout: 2000 })
      .catch(() => null);
    if (label !== `${v.expectLabel}, your account`) add(`account link not named by the whole name: ${String(label).slice(0, 60)}`);
  }
  return findings;
}

/**
 * The page's text as a reader of the new version reads it: a word-by-word change shows the new words among
 * struck-out old ones (and screen-reader markers around both), so those are left out.
 */
function newText(): string {
  const copy = document.body.cloneNode(true) as HTMLElement;
  copy.querySelectorAll('del, ins > .sr-only').forEach((e) => e.remove());
  return copy.textContent ?? '';
}
const bodyText = (page: Page) => page.evaluate(newText);
/**
 * Waits until the page shows every expected string. After an in-app navigation the previous page stays up
 * until the next one is ready, so when it already held all of them, also wait for it to be replaced.
 */
const showsAll = (page: Page, xs: string[], previousText = '') =>
  page
    .waitForFunction(
      ({ want, needSwap }) => {
        // As newText (a function cannot be handed to the page, and the page's CSP forbids building one there).
        const copy = document.body.cloneNode(true) as HTMLElement;
        copy.querySelectorAll('del, ins > .sr-only').forEach((e) => e.remove());
        const text = copy.textContent ?? '';
        return want.every((x) => text.includes(x)) && !(needSwap && document.querySelector('[data-xss-previous]'));
      },
      { want: xs, needSwap: xs.every((x) => previousText.includes(x)) },
      { timeout: 8_000 },
    )
    .then(() => true)
    .catch(() => false);

/**
 * Loads every visit, one page per account: the first visit loads the app, the rest navigate inside it
 * (history.pushState + popstate, as a link would), which keeps two passes on a small machine quick.
 */
async function runPass(bypassCSP: boolean): Promise<Finding[]> {
  const findings: Finding[] = [];
  const groups = new Map<string, Visit[]>();
  for (const v of visits) groups.set(v.who?.email ?? 'anon', [...(groups.get(v.who?.email ?? 'anon') ?? []), v]);
  for (const group of groups.values()) {
    const context = await contextFor(group[0].who, bypassCSP);
    const page = await context.newPage();
    const dialogs = collectDialogs(page);
    for (const [i, v] of group.entries()) {
      let previousText = '';
      if (i === 0 || v.fullLoad) await page.goto(`${suite.server.baseUrl}${v.path}`);
      else {
        previousText = await page.evaluate((path) => {
          document.querySelector('#main > *')?.setAttribute('data-xss-previous', '');
          window.history.pushState({}, '', path);
          window.dispatchEvent(new PopStateEvent('popstate'));
          return document.querySelector('#main')?.textContent ?? '';
        }, v.path);
      }
      let shown = await showsAll(page, v.nextPage ? v.expectText.slice(0, 1) : v.expectText, previousText);
      let text = await bodyText(page);
      if (v.nextPage) {
        findings.push(...(await inspect(page, { ...v, expectText: [] }, dialogs, text)));
        await page.getByRole('button', { name: v.nextPage, exact: true }).click();
        shown = await showsAll(page, v.expectText.slice(-1));
        text += await bodyText(page);
      }
      if (!shown) await screenshot(page, `text-xss-missing-${v.place}`);
      findings.push(...(await inspect(page, v, dialogs, text)));
    }
    await context.close();
  }
  return findings;
}

describe('XSS corpus through every plain-text field, rendered in Chromium', () => {
  it('runs no script anywhere, under CSP and with CSP bypassed, and shows every piece as text', async () => {
    const [withCsp, bypassed] = await Promise.all([runPass(false), runPass(true)]);
    const total = [...coverage.values()].reduce((a, b) => a + b, 0);
    console.info(`text-xss: ${XSS_TEXT_CORPUS.length} pieces, ${coverage.size} places, ${total} piece×place pairs, ${visits.length} pages × 2 passes`);
    expect(withCsp).toEqual([]);
    expect(bypassed).toEqual([]);
  }, 300_000);

  it('the page scan notices an injected handler and a script URL (so a pass above means something)', async () => {
    const context = await suite.browser.newContext({ bypassCSP: true });
    const page = await context.newPage();
    await page.goto(`${suite.server.baseUrl}/guides`);
    await page.getByRole('heading', { level: 1 }).first().waitFor();
    expect(await page.locator('body').evaluate(pageDomScan)).toEqual([]);
    await page.evaluate(() => {
      const img = document.createElement('img');
      img.setAttribute('src', 'x');
      img.setAttribute('onerror', 'window.__xss = "planted"');
      const a = document.createElement('a');
      a.setAttribute('href', ' java\tscript:alert(1)');
      document.querySelector('main')!.append(img, a);
    });
    await page.waitForFunction(() => (window as unknown as { __xss?: string }).__xss === 'planted');
    expect(await readXssFlag(page)).toBe('planted');
    expect(await page.locator('body').evaluate(pageDomScan)).toEqual(['img[onerror]', 'a[href= java\tscript:alert(1)]']);
    await context.close();
  });
});
