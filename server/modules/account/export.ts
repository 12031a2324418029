import { ZipArchive } from 'archiver';
import type { Response } from 'express';
import { benchChecksToCsv } from '../../../shared/motors/csv';
import type { AppContext } from '../../context';
import { presentUser } from '../auth/presenter';
import { UserEntity } from '../auth/user.entity';
import { presentCheck, presentMotor } from '../motors/presenter';
import { listChecks, listMotors, referenceOf } from '../motors/service';
import { RunEntity } from '../runs/run.entity';
import { SetupEntity } from '../setups/setup.entity';
import { watchService } from '../watches/service';
import { contentDisposition } from '../setups/routes';

/** A stored file's name inside the archive: the row's id (unique) and the name it was uploaded under, made safe for any unzip tool. */
function archiveName(id: string, original: string) {
  const safe = original
    .normalize('NFKC')
    .replace(/[^A-Za-z0-9._ -]/g, '_')
    .replace(/^\.+/, '_')
    .slice(0, 100);
  return `${id}-${safe || 'file'}`;
}

const json = (value: unknown) => `${JSON.stringify(value, null, 2)}\n`;

type Entry = { name: string; body: string | Buffer };

/**
 * Everything that is the member's own, read before the first byte is sent (so a database failure is an
 * ordinary error answer, not a cut-off download): profile, every revision they wrote (drafts, proposals,
 * published versions), uploaded setups, run logs (metadata and the files as uploaded), motors with their
 * bench checks, and what they watch.
 */
export async function collectExport(ctx: AppContext, userId: string): Promise<{ entries: Entry[]; missing: string[] }> {
  const ds = ctx.dataSource;
  const user = await ds.getRepository(UserEntity).findOneByOrFail({ id: userId });
  const entries: Entry[] = [];
  const missing: string[] = [];
  const exportedAt = new Date().toISOString();

  const watches = watchService(ctx);
  const actor = presentUser(user);
  entries.push({
    name: 'profile.json',
    body: json({
      ...actor,
      createdAt: user.createdAt.toISOString(),
      emailVerifiedAt: user.emailVerifiedAt?.toISOString() ?? null,
      watchMail: (await watches.settings(actor)).delivery,
      exportedAt,
    }),
  });

  const revisions: Array<Record<string, unknown>> = await ds.query(
    `SELECT r.id, d.kind, d.slug, r.number, r.state, r.note, r.reason, r.content, r.setup, r.restored_from_number AS "restoredFromNumber",
            r.created_at AS "createdAt", r.updated_at AS "updatedAt", r.submitted_at AS "submittedAt", r.published_at AS "publishedAt"
       FROM revisions r JOIN documents d ON d.id = r.document_id
      WHERE r.author_id = $1
      ORDER BY d.kind, d.slug, r.number`,
    [userId],
  );
  entries.push({ name: 'revisions/revisions.json', body: json(revisions) });
  for (const r of revisions) {
    const body = String((r.content as { body?: unknown }).body ?? '');
    entries.push({ name: `revisions/${r.kind}-${r.slug}-v${r.number}.md`, body });
  }

  const setups = await ds.getRepository(SetupEntity).find({ where: { ownerId: userId }, order: { createdAt: 'ASC' } });
  entries.push({
    name: 'setups/setups.json',
    body: json(
      setups.map((s) => ({
        id: s.id,
        originalName: s.originalName,
        fileFormat: s.fileFormat,
        byteSize: s.byteSize,
        createdAt: s.createdAt.toISOString(),
        file: `setups/files/${archiveName(s.id, s.originalName)}`,
        record: s.record,
      })),
    ),
  });
  for (const s of setups) {
    const bytes = await ctx.storage.get(s.storageKey);
    if (bytes) entries.push({ name: `setups/files/${archiveName(s.id, s.originalName)}`, body: bytes });
    else missing.push(`setups/files/${archiveName(s.id, s.originalName)}`);
  }

  const runs = await ds.getRepository(RunEntity).find({ where: { ownerId: userId }, order: { createdAt: 'ASC' } });
  entries.push({
    name: 'runs/runs.json',
    body: json(
      runs.map((r) => ({
        id: r.id,
        title: r.title,
        originalName: r.originalName,
        byteSize: r.byteSize,
        setupId: r.setupId,
        motorId: r.motorId,
        channels: r.channels,
        mapping: r.mapping,
        importNotes: r.importNotes,
        gaps: r.gaps,
        summary: r.summary,
        createdAt: r.createdAt.toISOString(),
        file: `runs/files/${archiveName(r.id, r.originalName)}`,
      })),
    ),
  });
  for (const r of runs) {
    const bytes = await ctx.storage.get(r.rawKey);
    if (bytes) entries.push({ name: `runs/files/${archiveName(r.id, r.originalName)}`, body: bytes });
    else missing.push(`runs/files/${archiveName(r.id, r.originalName)}`);
  }

  const motors = await listMotors(ds, userId);
  const motorsOut = [];
  for (const m of motors) {
    const checks = await listChecks(ds, m.row.id);
    const ref = referenceOf(m.row, checks)?.id;
    const presented = checks.map((c) => presentCheck(c, ref));
    motorsOut.push({ ...presentMotor(m), checks: presented, checksCsv: `motors/${archiveName(m.row.id, m.row.label)}-bench-checks.csv` });
    entries.push({ name: `motors/${archiveName(m.row.id, m.row.label)}-bench-checks.csv`, body: benchChecksToCsv(m.row, presented) });
  }
  entries.push({ name: 'motors/motors.json', body: json(motorsOut) });

  entries.push({ name: 'watches.json', body: json(await watches.list(actor)) });

  entries.unshift({
    name: 'README.md',
    body: readme(exportedAt, { revisions: revisions.length, setups: setups.length, runs: runs.length, motors: motors.length }, missing),
  });
  return { entries, missing };
}

function readme(exportedAt: string, counts: Record<'revisions' | 'setups' | 'runs' | 'motors', number>, missing: string[]) {
  return [
    '# Your Tunewright data',
    '',
    `Exported ${exportedAt} (UTC). Everything here is yours: open formats (JSON, CSV, Markdown) that any text editor or spreadsheet reads.`,
    '',
    '- `profile.json`: your account (e-mail, display name, role, when it was made) and how you get mail about what you watch.',
    `- \`revisions/revisions.json\`: every version you wrote (${counts.revisions}), drafts, proposals and published ones, with their state, edit note, the moderator's reason when one was sent back, the fields and the baseline setup record. Each body is also in its own Markdown file, \`revisions/<kind>-<slug>-v<number>.md\`.`,
    `- \`setups/setups.json\`: your uploaded setup records (${counts.setups}) as checked on upload; \`setups/files/\` holds each file exactly as you uploaded it.`,
    `- \`runs/runs.json\`: your run logs (${counts.runs}): titles, column mapping, import notes and figures; \`runs/files/\` holds each log exactly as you uploaded it.`,
    `- \`motors/motors.json\`: your motors (${counts.motors}) with every bench check and its repeats; \`motors/*-bench-checks.csv\` is each motor's checks in our bench-check CSV layout (units in the headers).`,
    '- `watches.json`: the guides and parameter entries you watch.',
    '',
    'Dates are ISO 8601 in UTC. Setup records follow our `tunewright.setup` schema, published at /schemas/setup-record.v2.json on the site.',
    ...(missing.length ? ['', 'These stored files could not be read when the archive was made and are not in it:', '', ...missing.map((m) => `- ${m}`)] : []),
    '',
  ].join('\n');
}

/** Streams the archive. Everything is read first; once the headers are out, a failure can only cut the stream. */
export async function sendExport(ctx: AppContext, userId: string, res: Response) {
  const { entries } = await collectExport(ctx, userId);
  const zip = new ZipArchive({ zlib: { level: 6 } });
  const day = new Date().toISOString().slice(0, 10);
  res.setHeader('Content-Type', 'application/zip');
  res.setHeader('Content-Disposition', contentDisposition(`tunewright-data-${day}.zip`));
  res.setHeader('Cache-Control', 'private, no-store');
  res.status(200);
  const done = new Promise<void>((resolve, reject) => {
    res.once('finish', resolve);
    res.once('close', resolve);
    zip.once('error', reject);
  });
  zip.on('warning', (err) => ctx.logger.warn({ err }, 'account export: archive warning'));
  zip.pipe(res);
  for (const e of entries) zip.append(e.body, { name: `tunewright-data/${e.name}` });
  await zip.finalize();
  await done.catch((err: unknown) => {
    ctx.logger.error({ err }, 'account export: the archive stream failed');
    res.destroy();
  });
}
