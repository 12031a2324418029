import AxeBuilder from '@axe-core/playwright';
import type { Browser, Page } from 'playwright-core';
import type { DataSource } from 'typeorm';
import { expect } from 'vitest';
import { DEMO_ACCOUNTS } from '../../server/db/demo-accounts';

/** A page signed in as a demo account through the sign-in form, in its own browser context. */
export async function signedInPage(browser: Browser, baseUrl: string, key: string, viewport = { width: 1280, height: 900 }): Promise<Page> {
  const account = DEMO_ACCOUNTS.find((a) => a.key === key);
  if (!account) throw new Error(`no demo account ${key}`);
  // Signs in at desktop width (the phone layout folds "Sign out" into the menu), then takes the asked-for size.
  const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
  const page = await context.newPage();
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(account.email);
  await page.getByLabel('Password').fill(account.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('banner').getByRole('button', { name: 'Sign out' }).waitFor();
  if (viewport.width !== 1280 || viewport.height !== 900) await page.setViewportSize(viewport);
  return page;
}

/** Waits until the editor reports the draft saved on the server. */
export async function waitSaved(page: Page, timeout = 20_000) {
  try {
    await page.locator('[data-testid="autosave-status"][data-state="saved"]').waitFor({ timeout });
  } catch (err) {
    // Say where it stood instead (pending, saving, error with its message…), so a failure can be read.
    const status = page.getByTestId('autosave-status');
    const state = await status.getAttribute('data-state', { timeout: 1000 }).catch(() => 'absent');
    const text = await status.textContent({ timeout: 1000 }).catch(() => '');
    throw new Error(`the draft was not reported saved within ${timeout} ms; status ${state}: ${text} (${page.url()})`, { cause: err });
  }
}

/** One revision row as the database holds it, with its author's e-mail and its base's number. */
export type RevisionRow = {
  id: string;
  number: number;
  state: string;
  authorEmail: string;
  baseRevisionId: string | null;
  baseNumber: number | null;
  note: string;
  reason: string | null;
  restoredFromNumber: number | null;
  content: Record<string, unknown> & { body: string };
};

/** Every revision of a document, oldest first, read straight from PostgreSQL (what the UI claims, checked at the source). */
export async function revisionsOf(dataSource: DataSource, slug: string): Promise<RevisionRow[]> {
  const rows = await dataSource.query(
    `SELECT r.id, r.number, r.state, u.email AS "authorEmail", r.base_revision_id AS "baseRevisionId", b.number AS "baseNumber",
            r.note, r.reason, r.restored_from_number AS "restoredFromNumber", r.content
       FROM revisions r JOIN documents d ON d.id = r.document_id JOIN users u ON u.id = r.author_id
       LEFT JOIN revisions b ON b.id = r.base_revision_id
      WHERE d.slug = $1 ORDER BY r.number`,
    [slug],
  );
  return rows as RevisionRow[];
}

/** The document row of a slug: its live revision and hidden state. */
export async function documentOf(dataSource: DataSource, slug: string) {
  const [row] = await dataSource.query(
    `SELECT id, published_revision_id AS "publishedRevisionId", hidden_at AS "hiddenAt", hidden_reason AS "hiddenReason" FROM documents WHERE slug = $1`,
    [slug],
  );
  return row as { id: string; publishedRevisionId: string | null; hiddenAt: Date | null; hiddenReason: string | null };
}

/** Opens "Propose an edit" on a live guide and waits until the editor holds the live text. */
export async function openProposal(page: Page, baseUrl: string, slug: string, bodyContains: string) {
  await page.goto(`${baseUrl}/guides/${slug}`);
  await page.getByRole('link', { name: 'Propose an edit' }).click();
  await page.waitForURL(`**/guides/${slug}/edit`);
  await expect.poll(() => page.getByLabel('Body').inputValue(), { timeout: 15_000 }).toContain(bodyContains);
}

/** Replaces one passage of the body the way an author would: select all, then the whole new text. */
export async function editBody(page: Page, from: string, to: string) {
  const body = page.getByLabel('Body');
  const current = await body.inputValue();
  if (!current.includes(from)) throw new Error(`the body does not contain ${JSON.stringify(from)}`);
  await body.fill(current.replace(from, to));
}

/** Submits the open draft with an edit note through the dialog. */
export async function submitWithNote(page: Page, note: string) {
  await page.getByRole('button', { name: 'Submit for review' }).click();
  const dialog = page.getByRole('dialog', { name: 'Submit for review' });
  await dialog.getByLabel('Edit note').fill(note);
  await dialog.getByRole('button', { name: 'Submit' }).click();
}

/**
 * On the review screen: presses the publish (or approve) button, then confirms in the dialog that says
 * what will go live, and waits for the dialog to close. `button` is the decision button's exact name.
 */
export async function confirmPublish(page: Page, button = 'Publish') {
  await page.getByRole('button', { name: button, exact: true }).click();
  const dialog = page.getByRole('dialog', { name: /^(Publish this version|Approve and publish|Record your approval)\?$/ });
  await dialog.getByTestId('goes-live').waitFor({ timeout: 20_000 });
  await dialog.getByRole('button', { name: /^(Publish now|Approve and publish now|Record my approval)$/ }).click();
  await dialog.waitFor({ state: 'hidden', timeout: 20_000 });
}

/** The moderator publishes the proposal titled `title` from the review queue. */
export async function publishFromQueue(page: Page, baseUrl: string, title: string) {
  await page.goto(`${baseUrl}/review`);
  await page.getByRole('link', { name: title }).click();
  await page.getByRole('heading', { name: title, level: 1 }).waitFor();
  await confirmPublish(page);
  await page.waitForURL(`${baseUrl}/review`);
}

/** Serious and critical axe violations on the page as it stands, with the offending selectors. */
export async function seriousViolations(page: Page) {
  const result = await new AxeBuilder({ page: page as never }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
  return result.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`)
    .join('\n');
}
