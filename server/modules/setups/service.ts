import type { DataSource, EntityManager } from 'typeorm';
import { canonicalRecord, type SettingDefinition, type SetupRecord } from '../../../shared/schemas/setup-record';
import type { SettingDefinitionRow } from '../../../shared/schemas/setup';
import { compareSetups } from '../../../shared/setup/compare';
import { classRanges, classTypicalTexts } from '../../../shared/content-checks/class-ranges';
import { parseSetupText, validateSetupObject } from '../../../shared/setup/import';
import type { AppContext } from '../../context';
import { notFound } from '../../lib/errors';
import { newStorageKey } from '../../lib/storage';
import { DocumentEntity } from '../revisions/document.entity';
import { RevisionEntity } from '../revisions/revision.entity';
import { changeBaseline } from '../revisions/commands/baseline';
import type { Member } from '../revisions/transition';
import { UserEntity } from '../auth/user.entity';
import { SetupEntity } from './setup.entity';
import { checkFileContent, checkFileName, invalidSetup } from './upload';
import { canReadUpload } from './policy';
import { ownsMotor } from '../motors/service';

type Db = DataSource | EntityManager;

/** The live parameter library, as the setup validator and the setup form need it. */
export async function loadSettingLibrary(db: Db): Promise<SettingDefinitionRow[]> {
  const rows: { slug: string; content: Record<string, unknown> }[] = await db.query(
    `SELECT d.slug, r.content FROM documents d JOIN revisions r ON r.id = d.published_revision_id
      WHERE d.kind = 'parameter' AND d.hidden_at IS NULL ORDER BY d.slug`,
  );
  return rows.map(({ slug, content }) => ({
    slug,
    name: String(content.name ?? slug),
    unit: String(content.unit ?? ''),
    category: String(content.category ?? ''),
    summary: String(content.summary ?? ''),
    range: content.range as SettingDefinition['range'],
    typical: typicalByClass(slug, String(content.name ?? slug), String(content.body ?? '')),
  }));
}

/** An entry's typical settings per class: the table's text, with its numbers where it has them. */
function typicalByClass(slug: string, name: string, body: string): NonNullable<SettingDefinitionRow['typical']> {
  const ranges = classRanges({ slug, name, unit: '', body });
  const typical: NonNullable<SettingDefinitionRow['typical']> = {};
  for (const [cls, text] of classTypicalTexts(body)) {
    const range = ranges.get(cls);
    typical[cls] = range ? { text, min: range.min, max: range.max } : { text };
  }
  return typical;
}

/** Library names by slug, for labels in comparisons. */
export function namesOf(library: SettingDefinition[]): Record<string, string> {
  return Object.fromEntries(library.map((d) => [d.slug, d.name]));
}

type Baseline = { doc: DocumentEntity; revision: RevisionEntity; title: string; authorDisplayName: string };

/** The live revision of a visible guide, or 404. */
async function liveGuideRevision(db: Db, slug: string): Promise<Baseline> {
  const doc = await db.getRepository(DocumentEntity).findOneBy({ kind: 'guide', slug });
  if (!doc || doc.hiddenAt || !doc.publishedRevisionId) throw notFound('That guide');
  const revision = await db.getRepository(RevisionEntity).findOneByOrFail({ id: doc.publishedRevisionId });
  const author = await db.getRepository(UserEntity).findOneBy({ id: revision.authorId });
  return { doc, revision, title: String(revision.content.title ?? slug), authorDisplayName: author?.displayName ?? 'Unknown author' };
}

/** A stored baseline stamped with where it comes from and when it was exported. */
function withProvenance(b: Baseline, record: SetupRecord): SetupRecord {
  return canonicalRecord({
    ...record,
    provenance: {
      guideSlug: b.doc.slug,
      guideTitle: b.title.slice(0, 140),
      revisionNumber: b.revision.number,
      authorDisplayName: b.authorDisplayName.slice(0, 60),
      exportedAt: new Date(Math.floor(Date.now() / 1000) * 1000).toISOString().replace('.000Z', 'Z'),
    },
  });
}

/** The live baseline of a guide with its provenance filled in, or 404 when the guide or its baseline is missing. */
export async function guideBaseline(db: Db, slug: string): Promise<{ record: SetupRecord; baseline: Baseline }> {
  const b = await liveGuideRevision(db, slug);
  if (!b.revision.setup) throw notFound("That guide's baseline setup");
  return { record: withProvenance(b, b.revision.setup as SetupRecord), baseline: b };
}

/** Published baselines of every visible guide, newest first. */
export async function listBaselines(db: Db) {
  const rows: { slug: string; number: number; content: Record<string, unknown>; setup: SetupRecord; published_at: Date | null; display_name: string | null }[] =
    await db.query(
      `SELECT d.slug, r.number, r.content, r.setup, r.published_at, u.display_name
       FROM documents d JOIN revisions r ON r.id = d.published_revision_id LEFT JOIN users u ON u.id = r.author_id
      WHERE d.kind = 'guide' AND d.hidden_at IS NULL AND r.setup IS NOT NULL
      ORDER BY r.published_at DESC NULLS LAST, d.slug`,
    );
  return rows.map((r) => ({
    slug: r.slug,
    number: r.number,
    title: String(r.content.title ?? r.slug),
    record: r.setup,
    publishedAt: r.published_at,
    authorDisplayName: r.display_name ?? 'Unknown author',
  }));
}

/**
 * Validates an uploaded file and stores it: the object first, then the row in a transaction;
 * if the row cannot be written the object is removed again, so storage and table always agree.
 */
export async function createUpload(ctx: AppContext, ownerId: string, file: Express.Multer.File | undefined) {
  if (!file) throw invalidSetup(400, 'Attach a setup file.', [{ path: 'file', message: 'Send the setup file in the multipart field "file"' }]);
  const name = checkFileName(file.originalname ?? '');
  if ('issue' in name) throw invalidSetup(name.status, 'That file name is refused.', [name.issue]);
  const content = checkFileContent(file, name.kind);
  if ('issue' in content) throw invalidSetup(content.status, 'That file is not a setup record.', [content.issue]);
  const library = await loadSettingLibrary(ctx.dataSource);
  const result = parseSetupText(content.text, name.kind, library);
  if (!result.ok)
    throw invalidSetup(result.status, `The setup record has ${result.issues.length === 1 ? 'a problem' : `${result.issues.length} problems`}.`, result.issues);

  const record = canonicalRecord(result.record);
  const motorId = (record.motor as { registeredMotorId?: string }).registeredMotorId;
  // Someone else's motor and a motor that does not exist get the same answer: nothing about other members leaks.
  if (motorId && !(await ownsMotor(ctx.dataSource, ownerId, motorId))) {
    throw invalidSetup(400, 'The setup record has a problem.', [{ path: 'motor.registeredMotorId', message: 'That is not a motor in your motor register' }]);
  }
  const key = newStorageKey('setups', name.kind);
  await ctx.storage.put(key, file.buffer, name.kind === 'json' ? 'application/json' : 'text/csv; charset=utf-8');
  try {
    return await ctx.dataSource.transaction(async (m) => {
      const repo = m.getRepository(SetupEntity);
      return repo.save(repo.create({ ownerId, storageKey: key, originalName: name.displayName, fileFormat: name.kind, byteSize: file.buffer.length, record }));
    });
  } catch (err) {
    await ctx.storage.delete(key).catch((e) => ctx.logger.error({ err: e, key }, 'could not remove an orphaned upload'));
    throw err;
  }
}

export async function listUploads(db: Db, ownerId: string) {
  return db.getRepository(SetupEntity).find({ where: { ownerId }, order: { createdAt: 'DESC' } });
}

/** An upload its owner may read; anyone else gets 404, so ids reveal nothing. */
export async function getUpload(db: Db, user: { id: string } | null, id: string) {
  const row = await db.getRepository(SetupEntity).findOneBy({ id });
  if (!row || !canReadUpload(user, row)) throw notFound('That setup');
  return row;
}

/** Deletes an upload: the row first (so nothing points at a missing file), then the stored object. */
export async function deleteUpload(ctx: AppContext, user: { id: string }, id: string) {
  const row = await getUpload(ctx.dataSource, user, id);
  await ctx.dataSource.getRepository(SetupEntity).delete({ id: row.id });
  await ctx.storage.delete(row.storageKey).catch((err) => ctx.logger.error({ err, key: row.storageKey }, 'could not remove a deleted upload'));
}

export type ResolvedSide = { ref: string; label: string; kind: 'guide' | 'upload'; record: SetupRecord };

/** Resolves a compare ref: `guide:<slug>` (live baseline) or an upload id (owner only). */
export async function resolveRef(db: Db, user: { id: string } | null, ref: string): Promise<ResolvedSide> {
  if (ref.startsWith('guide:')) {
    const { record, baseline } = await guideBaseline(db, ref.slice('guide:'.length));
    return { ref, label: `${baseline.title} (v${baseline.revision.number})`, kind: 'guide', record };
  }
  const row = await getUpload(db, user, ref.toLowerCase());
  return { ref: row.id, label: row.originalName, kind: 'upload', record: row.record as SetupRecord };
}

export async function compareRefs(db: Db, user: { id: string } | null, a: string, b: string, atRpm?: number) {
  const [sa, sb] = [await resolveRef(db, user, a), await resolveRef(db, user, b)];
  const library = await loadSettingLibrary(db);
  const comparison = compareSetups(sa.record, sb.record, { atRpm, names: namesOf(library) });
  return { a: { ref: sa.ref, label: sa.label, kind: sa.kind }, b: { ref: sb.ref, label: sb.label, kind: sb.kind }, ...comparison };
}

/** Attaches (or replaces) the baseline of the author's own draft, after validating it against the library (a revision command). */
export async function attachToRevision(ctx: AppContext, user: Member, revisionId: string, body: unknown): Promise<SetupRecord> {
  const record = await changeBaseline(ctx, user, revisionId, async (m) => {
    const result = validateSetupObject(body, await loadSettingLibrary(m));
    if (!result.ok)
      throw invalidSetup(400, `The setup record has ${result.issues.length === 1 ? 'a problem' : `${result.issues.length} problems`}.`, result.issues);
    // Provenance is stamped on export from the revision itself; whatever came in is not kept.
    const { provenance: _ignored, ...record } = canonicalRecord(result.record);
    // A baseline is public once live; motors are private, so a guide's baseline never names one.
    if ((record.motor as { registeredMotorId?: string }).registeredMotorId !== undefined) {
      throw invalidSetup(400, 'The setup record has a problem.', [
        { path: 'motor.registeredMotorId', message: 'A guide’s baseline is public: remove the registered motor (it is private to you)' },
      ]);
    }
    return record as SetupRecord;
  });
  return record!;
}

export async function detachFromRevision(ctx: AppContext, user: Member, revisionId: string) {
  await changeBaseline(ctx, user, revisionId, async () => null);
}
