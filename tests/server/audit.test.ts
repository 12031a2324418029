import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import crypto from 'node:crypto';
import Papa from 'papaparse';
import { AUDIT_CSV_MAX_ROWS } from '../../shared/schemas/audit';
import { createClient, createTestApp, type TestApp, type TestClient } from '../setup/test-app';
import { signedInClient } from '../factories/user';
import { createPublishedGuide, proposeEdit } from '../factories/guide';
import type { UserEntity } from '../../server/modules/auth/user.entity';

let t: TestApp;
let author: TestClient;
let authorUser: UserEntity;
let mod: TestClient;
let modUser: UserEntity;
let admin: TestClient;
let member: TestClient;
let memberUser: UserEntity;
let formulaSlug: string;
const FORMULA_TITLE = '=HYPERLINK("http://evil.test/x","Click me") on clay';
const HIDE_REASON = '@SUM(1+1) copied from a printed manual';

type Entry = {
  id: string;
  at: string;
  actor: { id: string; displayName: string } | null;
  action: string;
  targetType: string;
  targetId: string;
  target: string;
  reason: string | null;
};

beforeAll(async () => {
  t = await createTestApp({}, { catcher: false });
  ({ client: author, user: authorUser } = await signedInClient(t, 'member'));
  ({ client: member, user: memberUser } = await signedInClient(t, 'member'));
  ({ client: mod, user: modUser } = await signedInClient(t, 'moderator'));
  ({ client: admin } = await signedInClient(t, 'admin'));
  // A guide whose title a spreadsheet would take for a formula, published, edited, restored and hidden.
  ({ slug: formulaSlug } = await createPublishedGuide(author, mod, { title: FORMULA_TITLE }));
  const edit = await proposeEdit(author, formulaSlug, { summary: 'A second summary for the same layout, a little firmer on the brake.' });
  expect((await author.post(`/api/revisions/${edit.id}/submit`, { note: 'Firmer brake' })).status).toBe(200);
  expect((await mod.post(`/api/reviews/${edit.id}/publish`)).status).toBe(200);
  expect((await mod.post(`/api/guides/${formulaSlug}/restore`, { number: 1, reason: 'The firmer brake note was wrong' })).status).toBe(201);
  expect((await mod.post(`/api/guides/${formulaSlug}/hide`, { reason: HIDE_REASON })).status).toBe(200);
  expect((await admin.patch(`/api/admin/users/${memberUser.id}`, { role: 'moderator', reason: 'Helps with the spring series' })).status).toBe(200);
});
afterAll(async () => {
  await t.close();
});

const list = async (client: TestClient, query: string) => {
  const res = await client.get(`/api/audit?${query}`);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body as { data: Entry[]; meta: { total: number; limit: number; offset: number } };
};

describe('GET /api/audit', () => {
  it('is for moderators and administrators: visitors 401, members 403', async () => {
    expect((await createClient(t.app).get('/api/audit')).status).toBe(401);
    const { client: plain } = await signedInClient(t, 'member');
    const refused = await plain.get('/api/audit');
    expect(refused.status).toBe(403);
    expect(refused.body.error.code).toBe('role_required');
    expect((await plain.get('/api/audit.csv')).status).toBe(403);
    expect((await createClient(t.app).get('/api/audit.csv')).status).toBe(401);
    expect((await mod.get('/api/audit')).status).toBe(200);
    expect((await admin.get('/api/audit')).status).toBe(200);
  });

  it('lists every transition newest first, with who, what, about what and why', async () => {
    const { data } = await list(mod, `actor=${modUser.id}`);
    // Rows of one transaction share their time; they still read in the order they were written (newest first).
    expect(data.map((e) => e.action)).toEqual([
      'document.hide',
      'revision.restore',
      'revision.archive',
      'revision.publish',
      'revision.archive',
      'revision.publish',
    ]);
    expect(data.map((e) => e.target)).toEqual([
      FORMULA_TITLE,
      `${FORMULA_TITLE} (version 3)`,
      `${FORMULA_TITLE} (version 2)`,
      `${FORMULA_TITLE} (version 2)`,
      `${FORMULA_TITLE} (version 1)`,
      `${FORMULA_TITLE} (version 1)`,
    ]);
    const times = data.map((e) => e.at);
    expect([...times].sort().reverse()).toEqual(times);
    const hide = data[0];
    expect(hide).toMatchObject({
      actor: { id: modUser.id, displayName: modUser.displayName },
      targetType: 'document',
      target: FORMULA_TITLE,
      reason: HIDE_REASON,
    });
    expect(data[1]).toMatchObject({
      target: `${FORMULA_TITLE} (version 3)`,
      reason: 'The firmer brake note was wrong',
      actionLabel: 'Restored an older version',
    });
    // No e-mail addresses: moderators read this list too.
    expect(JSON.stringify(data)).not.toContain('@tidewater.test');
  });

  it('filters by action, target type and target id, and pages with limit/offset and meta.total', async () => {
    const roles = await list(admin, 'action=user.role');
    expect(roles.meta.total).toBeGreaterThanOrEqual(1);
    expect(roles.data.every((e) => e.action === 'user.role')).toBe(true);
    const mine = roles.data.find((e) => e.targetId === memberUser.id)!;
    expect(mine).toMatchObject({ targetType: 'user', target: memberUser.displayName, reason: 'Helps with the spring series', from: 'member', to: 'moderator' });

    const users = await list(admin, 'targetType=user');
    expect(users.data.every((e) => e.targetType === 'user')).toBe(true);
    const byTarget = await list(mod, `targetId=${memberUser.id}`);
    expect(byTarget.data.map((e) => e.action)).toEqual(['user.role']);

    // Paging: the author's rows (create + submit + create + submit) one at a time, then past the end.
    const all = await list(mod, `actor=${authorUser.id}`);
    expect(all.meta.total).toBe(all.data.length);
    expect(all.meta.total).toBeGreaterThanOrEqual(4);
    const pages: string[] = [];
    for (let offset = 0; offset < all.meta.total; offset += 2) {
      const page = await list(mod, `actor=${authorUser.id}&limit=2&offset=${offset}`);
      expect(page.meta).toEqual({ total: all.meta.total, limit: 2, offset });
      pages.push(...page.data.map((e) => e.id));
    }
    expect(pages).toEqual(all.data.map((e) => e.id));
    const past = await list(mod, `actor=${authorUser.id}&limit=2&offset=${all.meta.total}`);
    expect(past.data).toEqual([]);
    expect(past.meta.total).toBe(all.meta.total);
  });

  it('filters by a date range in whole UTC days, both ends included', async () => {
    const subject = crypto.randomUUID();
    for (const at of ['2026-03-01T23:59:59Z', '2026-03-02T00:00:00Z', '2026-03-03T12:00:00Z', '2026-03-04T00:00:00Z']) {
      await t.db.dataSource.query(
        `INSERT INTO audit_log (actor_id, action, subject_kind, subject_id, from_value, to_value, created_at) VALUES (NULL, 'user.role', 'user', $1, 'member', 'moderator', $2)`,
        [subject, at],
      );
    }
    const within = await list(mod, `targetId=${subject}&since=2026-03-02&until=2026-03-03`);
    expect(within.data.map((e) => e.at)).toEqual(['2026-03-03T12:00:00.000Z', '2026-03-02T00:00:00.000Z']);
    expect(within.data[0].actor).toBeNull();
    expect((await list(mod, `targetId=${subject}&since=2026-03-03`)).meta.total).toBe(2);
    expect((await list(mod, `targetId=${subject}&until=2026-03-01`)).meta.total).toBe(1);
  });

  it('refuses bad filters with the one error shape', async () => {
    for (const [query, path] of [
      ['since=2026-02-30', 'query.since'],
      ['until=yesterday', 'query.until'],
      ['action=revision.explode', 'query.action'],
      ['actor=not-an-id', 'query.actor'],
      ['targetType=planet', 'query.targetType'],
      ['limit=0', 'query.limit'],
      ['limit=201', 'query.limit'],
      ['offset=-1', 'query.offset'],
      ['colour=red', 'query.colour'],
    ]) {
      const res = await mod.get(`/api/audit?${query}`);
      expect(res.status, query).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(
        res.body.error.details.map((d: { path: string }) => d.path),
        query,
      ).toContain(path);
    }
  });
});

describe('GET /api/audit.csv', () => {
  it('exports the filtered rows as CSV, with formula-looking cells escaped so a spreadsheet reads them as text', async () => {
    const res = await mod.get(`/api/audit.csv?actor=${modUser.id}`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="tunewright-audit-\d{4}-\d{2}-\d{2}\.csv"/);
    expect(res.headers['x-total-count']).toBe('6');
    expect(res.headers['x-row-count']).toBe('6');
    const text = res.text;
    expect(text.startsWith('\uFEFF')).toBe(true);
    const parsed = Papa.parse<string[]>(text.slice(1), { skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    const [header, ...rows] = parsed.data;
    expect(header).toEqual(['Time (UTC)', 'Who', 'Who (id)', 'Action', 'Action code', 'About', 'About (type)', 'About (id)', 'From', 'To', 'Reason']);
    expect(rows).toHaveLength(6);
    const hide = rows.find((r) => r[4] === 'document.hide')!;
    // The title starts with "=": the cell starts with a quote mark instead, so it is never evaluated.
    expect(hide[5]).toBe(`'${FORMULA_TITLE}`);
    expect(hide[10]).toBe(`'${HIDE_REASON}`);
    expect(rows.every((r) => !/^[=+\-@\t\r]/.test(r.join('')) && r.every((cell) => !/^[=+\-@\t\r]/.test(cell)))).toBe(true);
    expect(hide[1]).toBe(modUser.displayName);
    // Ordinary cells are left as they are.
    expect(rows.find((r) => r[4] === 'revision.restore')![10]).toBe('The firmer brake note was wrong');
  });

  it(`uses the same filters and refuses bad ones; it holds at most ${AUDIT_CSV_MAX_ROWS} rows`, async () => {
    const res = await admin.get(`/api/audit.csv?action=user.role&targetId=${memberUser.id}`);
    const rows = Papa.parse<string[]>(res.text.slice(1), { skipEmptyLines: true }).data;
    expect(rows).toHaveLength(2);
    expect(rows[1][8]).toBe('member');
    expect(rows[1][9]).toBe('moderator');
    const bad = await mod.get('/api/audit.csv?since=31-12-2026');
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].path).toBe('query.since');
    // Paging belongs to the list, not the export.
    expect((await mod.get('/api/audit.csv?limit=5')).status).toBe(400);
  });
});

describe('GET /api/hidden', () => {
  it('lists hidden guides for moderators, with who hid them and why; showing one again removes it', async () => {
    expect((await member.get('/api/hidden')).status).toBe(200); // promoted to moderator above
    const { client: plain } = await signedInClient(t, 'member');
    expect((await plain.get('/api/hidden')).status).toBe(403);
    expect((await createClient(t.app).get('/api/hidden')).status).toBe(401);
    const res = await mod.get('/api/hidden');
    expect(res.status).toBe(200);
    const row = (res.body.data as Array<{ slug: string }>).find((r) => r.slug === formulaSlug);
    expect(row).toEqual({
      kind: 'guide',
      slug: formulaSlug,
      title: FORMULA_TITLE,
      hiddenAt: expect.any(String),
      hiddenBy: { id: modUser.id, displayName: modUser.displayName },
      reason: HIDE_REASON,
    });
    expect(res.body.meta.total).toBe(res.body.data.length);
    expect((await mod.post(`/api/guides/${formulaSlug}/unhide`, {})).status).toBe(200);
    const after = await mod.get('/api/hidden');
    expect((after.body.data as Array<{ slug: string }>).some((r) => r.slug === formulaSlug)).toBe(false);
    // …and the audit log has both.
    const { data } = await list(mod, `action=document.unhide&actor=${modUser.id}`);
    expect(data).toHaveLength(1);
  });
});
