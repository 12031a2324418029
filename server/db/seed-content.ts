import fs from 'node:fs';
import path from 'node:path';
import crypto from 'node:crypto';
import { isDeepStrictEqual } from 'node:util';
import matter from 'gray-matter';
import type { DataSource, EntityManager } from 'typeorm';
import { parameterContentSchema } from '../../shared/schemas/parameter';
import { guideContentSchema } from '../../shared/schemas/guide';
import { canonicalRecord, type SetupRecord } from '../../shared/schemas/setup-record';
import { validateSetupObject } from '../../shared/setup/import';
import { DocumentEntity } from '../modules/revisions/document.entity';
import { RevisionEntity } from '../modules/revisions/revision.entity';
import { UserEntity } from '../modules/auth/user.entity';
import { hashPassword } from '../lib/passwords';

export const CONTENT_DIR = path.resolve(process.cwd(), 'content');
export const LIBRARY_EMAIL = 'library@tunewright.invalid';
const DAY = 86_400_000;

/** The account that authors the seeded parameter library; it can never sign in. */
export async function libraryAccount(ds: DataSource | EntityManager) {
  const repo = ds.getRepository(UserEntity);
  const existing = await repo.findOneBy({ email: LIBRARY_EMAIL });
  if (existing) return existing;
  return repo.save(
    repo.create({
      email: LIBRARY_EMAIL,
      displayName: 'Tunewright library',
      role: 'member',
      passwordHash: await hashPassword(crypto.randomBytes(24).toString('hex'), 4),
      emailVerifiedAt: new Date(),
      disabledAt: new Date(),
    }),
  );
}

/** One seeded version of a parameter entry: v1 is `<slug>.md`, corrections are `<slug>/v<N>.md` with an edit note. */
export type ParameterFile = { slug: string; number: number; note: string; content: ReturnType<typeof parameterContentSchema.parse> };

function parseParameterFile(file: string, label: string, fallbackSlug: string) {
  const { data, content } = matter(fs.readFileSync(file, 'utf8'));
  const slug = String(data.slug ?? fallbackSlug);
  const fields = Object.fromEntries(Object.entries(data).filter(([key]) => key !== 'note'));
  const parsed = parameterContentSchema.safeParse({ ...fields, body: content.trim() + '\n' });
  if (!parsed.success) throw new Error(`${label}: ${parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ')}`);
  return { slug, note: data.note === undefined ? '' : String(data.note), content: parsed.data };
}

/**
 * Every seeded version of every parameter entry, oldest first per entry: `<slug>.md` is version 1 and
 * `<slug>/v2.md`, `v3.md`, … are later corrections (each naming its edit note), so the published
 * history shows what was corrected and why.
 */
export function readParameterHistory(dir = path.join(CONTENT_DIR, 'parameters')): ParameterFile[][] {
  return fs
    .readdirSync(dir)
    .filter((f) => f.endsWith('.md'))
    .sort()
    .map((file) => {
      const first = parseParameterFile(path.join(dir, file), file, path.basename(file, '.md'));
      const versions: ParameterFile[] = [{ ...first, number: 1, note: first.note || 'Library entry' }];
      const later = path.join(dir, path.basename(file, '.md'));
      if (fs.existsSync(later) && fs.statSync(later).isDirectory()) {
        const files = fs
          .readdirSync(later)
          .filter((f) => /^v\d+\.md$/.test(f))
          .sort((a, b) => Number(a.slice(1, -3)) - Number(b.slice(1, -3)));
        files.forEach((f, i) => {
          const label = `${path.basename(later)}/${f}`;
          if (Number(f.slice(1, -3)) !== i + 2) throw new Error(`${label}: corrections must be numbered v2, v3, … without gaps`);
          const next = parseParameterFile(path.join(later, f), label, first.slug);
          if (next.slug !== first.slug) throw new Error(`${label}: slug ${next.slug} is not ${first.slug}`);
          if (next.note.trim().length < 3) throw new Error(`${label}: a correction needs an edit note`);
          versions.push({ ...next, number: i + 2 });
        });
      }
      return versions;
    });
}

/** Reads and validates the parameter library as it is live: the latest version of each entry. */
export function readParameterFiles(dir = path.join(CONTENT_DIR, 'parameters')) {
  return readParameterHistory(dir).map((versions) => {
    const { slug, content } = versions[versions.length - 1];
    return { slug, content };
  });
}

export type GuideFile = {
  number: number;
  state: 'published' | 'in_review';
  author: string;
  note: string;
  content: ReturnType<typeof guideContentSchema.parse>;
};

/** Reads content/guides/<slug>/v<N>.md, in revision order. */
export function readGuideDirs(dir = path.join(CONTENT_DIR, 'guides')) {
  return fs
    .readdirSync(dir)
    .filter((d) => fs.statSync(path.join(dir, d)).isDirectory())
    .sort()
    .map((slug) => {
      const files = fs
        .readdirSync(path.join(dir, slug))
        .filter((f) => /^v\d+\.md$/.test(f))
        .sort((a, b) => Number(a.slice(1, -3)) - Number(b.slice(1, -3)));
      const revisions: GuideFile[] = files.map((file, i) => {
        const { data, content } = matter(fs.readFileSync(path.join(dir, slug, file), 'utf8'));
        const parsed = guideContentSchema.safeParse({ ...data, body: content.trim() + '\n' });
        if (!parsed.success) throw new Error(`${slug}/${file}: ${parsed.error.issues.map((x) => `${x.path.join('.')}: ${x.message}`).join('; ')}`);
        if (Number(file.slice(1, -3)) !== i + 1) throw new Error(`${slug}: revision files must be numbered v1, v2, … without gaps`);
        return {
          number: i + 1,
          state: data.state === 'in_review' ? 'in_review' : 'published',
          author: String(data.author),
          note: String(data.note ?? ''),
          content: parsed.data,
        };
      });
      return { slug, revisions };
    });
}

/**
 * Seeds the parameter library: every version file of an entry, the last one live and the older ones
 * archived. An entry that exists gets the versions it lacks appended (so a correction reaches a running
 * library), but only while its latest revision is still the seeded one, word for word: an entry that
 * moderators have edited since is left alone.
 */
export async function seedParameters(ds: DataSource) {
  const author = await libraryAccount(ds);
  let created = 0;
  for (const versions of readParameterHistory()) {
    const slug = versions[0].slug;
    await ds.transaction(async (m) => {
      const docs = m.getRepository(DocumentEntity);
      const revs = m.getRepository(RevisionEntity);
      let doc = await docs.findOne({ where: { kind: 'parameter', slug }, lock: { mode: 'pessimistic_write' } });
      let latest: RevisionEntity | null = null;
      if (doc) {
        latest = await revs.findOne({ where: { documentId: doc.id }, order: { number: 'DESC' } });
        const seeded = latest && versions.find((v) => v.number === latest!.number);
        if (!latest || !seeded || latest.state !== 'published' || !isDeepStrictEqual(latest.content, JSON.parse(JSON.stringify(seeded.content)))) return;
        if (latest.number >= versions.length) return;
      } else {
        doc = await docs.save(docs.create({ kind: 'parameter', slug, createdBy: author.id }));
        created++;
      }
      const now = new Date();
      for (const v of versions.filter((x) => x.number > (latest?.number ?? 0))) {
        if (latest) await revs.update({ id: latest.id }, { state: 'archived' });
        latest = await revs.save(
          revs.create({
            documentId: doc.id,
            number: v.number,
            baseRevisionId: latest?.id ?? null,
            authorId: author.id,
            state: 'published',
            note: v.note,
            content: v.content,
            submittedAt: now,
            publishedAt: now,
            reviewedAt: now,
          }),
        );
      }
      doc.publishedRevisionId = latest!.id;
      await docs.save(doc);
    });
  }
  return created;
}

/**
 * Seeds the demo guides with their history: older published files become archived, the last
 * published one is live, a trailing in_review file waits in the queue. Guides that exist are left alone.
 */
export async function seedGuides(ds: DataSource, users: Map<string, UserEntity>, reviewers: UserEntity[]) {
  let created = 0;
  for (const guide of readGuideDirs()) {
    await ds.transaction(async (m) => {
      if (await m.getRepository(DocumentEntity).exists({ where: { kind: 'guide', slug: guide.slug } })) return;
      const first = users.get(guide.revisions[0].author);
      if (!first) throw new Error(`${guide.slug}: unknown author ${guide.revisions[0].author}`);
      const doc = await m.getRepository(DocumentEntity).save(m.getRepository(DocumentEntity).create({ kind: 'guide', slug: guide.slug, createdBy: first.id }));
      const lastPublished = guide.revisions.map((r) => r.state).lastIndexOf('published');
      let base: RevisionEntity | null = null;
      let live: RevisionEntity | null = null;
      const n = guide.revisions.length;
      for (const [i, r] of guide.revisions.entries()) {
        const author = users.get(r.author);
        if (!author) throw new Error(`${guide.slug} v${r.number}: unknown author ${r.author}`);
        const reviewer = reviewers.find((u) => u.id !== author.id) ?? null;
        const when = new Date(Date.now() - (n - i) * 21 * DAY);
        const state = r.state === 'in_review' ? 'in_review' : i === lastPublished ? 'published' : 'archived';
        const rev: RevisionEntity = await m.getRepository(RevisionEntity).save(
          m.getRepository(RevisionEntity).create({
            documentId: doc.id,
            number: r.number,
            baseRevisionId: base?.id ?? null,
            authorId: author.id,
            state,
            note: r.note,
            content: r.content,
            submittedAt: when,
            reviewedBy: state === 'in_review' ? null : (reviewer?.id ?? null),
            reviewedAt: state === 'in_review' ? null : new Date(when.getTime() + DAY),
            publishedAt: state === 'in_review' ? null : new Date(when.getTime() + DAY),
            createdAt: when,
          }),
        );
        if (state === 'published') live = rev;
        base = rev;
      }
      doc.publishedRevisionId = live?.id ?? null;
      await m.getRepository(DocumentEntity).save(doc);
      created++;
    });
  }
  return created;
}

/** Reads and validates content/setups/<guide-slug>-v<N>.json against the parameter files; null when there is none. */
export function readSetupFile(guideSlug: string, number: number, dir = path.join(CONTENT_DIR, 'setups')): SetupRecord | null {
  const file = path.join(dir, `${guideSlug}-v${number}.json`);
  if (!fs.existsSync(file)) return null;
  const library = readParameterFiles().map(({ slug, content }) => ({ slug, name: content.name, unit: content.unit, range: content.range }));
  const result = validateSetupObject(JSON.parse(fs.readFileSync(file, 'utf8')), library);
  if (!result.ok) throw new Error(`setups/${path.basename(file)}: ${result.issues.map((i) => `${i.path}: ${i.message}`).join('; ')}`);
  return canonicalRecord(result.record);
}

/**
 * Attaches content/setups baselines to the seeded guide revisions they name. Only revisions
 * without a baseline are filled, so running it again (or after an author changed one) changes nothing.
 */
export async function seedGuideBaselines(ds: DataSource) {
  let attached = 0;
  for (const guide of readGuideDirs()) {
    for (const r of guide.revisions) {
      const record = readSetupFile(guide.slug, r.number);
      if (!record) continue;
      const result: unknown[] = await ds.query(
        `UPDATE revisions r SET setup = $1::jsonb FROM documents d
          WHERE r.document_id = d.id AND d.kind = 'guide' AND d.slug = $2 AND r.number = $3 AND r.setup IS NULL RETURNING r.id`,
        [JSON.stringify(record), guide.slug, r.number],
      );
      attached += Array.isArray(result[0]) ? (result[0] as unknown[]).length : result.length;
    }
  }
  return attached;
}
