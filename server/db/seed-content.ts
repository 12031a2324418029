import fs from 'node:fs';
import path from 'node:path';
import crypto from 'node:crypto';
import matter from 'gray-matter';
import type { DataSource, EntityManager } from 'typeorm';
import { parameterContentSchema } from '../../shared/schemas/parameter';
import { guideContentSchema } from '../../shared/schemas/guide';
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

/** Reads and validates content/parameters/*.md; throws naming the file and field on bad content. */
export function readParameterFiles(dir = path.join(CONTENT_DIR, 'parameters')) {
  return fs
    .readdirSync(dir)
    .filter((f) => f.endsWith('.md'))
    .sort()
    .map((file) => {
      const { data, content } = matter(fs.readFileSync(path.join(dir, file), 'utf8'));
      const slug = String(data.slug ?? path.basename(file, '.md'));
      const parsed = parameterContentSchema.safeParse({ ...data, body: content.trim() + '\n' });
      if (!parsed.success) throw new Error(`${file}: ${parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ')}`);
      return { slug, content: parsed.data };
    });
}

export type GuideFile = { number: number; state: 'published' | 'in_review'; author: string; note: string; content: ReturnType<typeof guideContentSchema.parse> };

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
        return { number: i + 1, state: data.state === 'in_review' ? 'in_review' : 'published', author: String(data.author), note: String(data.note ?? ''), content: parsed.data };
      });
      return { slug, revisions };
    });
}

/** Seeds the parameter library as published revision 1 of each entry; entries that exist are left alone. */
export async function seedParameters(ds: DataSource) {
  const author = await libraryAccount(ds);
  let created = 0;
  for (const { slug, content } of readParameterFiles()) {
    await ds.transaction(async (m) => {
      if (await m.getRepository(DocumentEntity).exists({ where: { kind: 'parameter', slug } })) return;
      const doc = await m.getRepository(DocumentEntity).save(m.getRepository(DocumentEntity).create({ kind: 'parameter', slug, createdBy: author.id }));
      const rev = await m.getRepository(RevisionEntity).save(
        m.getRepository(RevisionEntity).create({
          documentId: doc.id,
          number: 1,
          authorId: author.id,
          state: 'published',
          note: 'Library entry',
          content,
          submittedAt: new Date(),
          publishedAt: new Date(),
          reviewedAt: new Date(),
        }),
      );
      doc.publishedRevisionId = rev.id;
      await m.getRepository(DocumentEntity).save(doc);
      created++;
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
            reviewedBy: state === 'in_review' ? null : reviewer?.id ?? null,
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
