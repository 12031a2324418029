import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseWorkedExample } from '../../../shared/calc/worked-example';
import { readGuideDirs, readParameterFiles, CONTENT_DIR } from '../../../server/db/seed-content';

/** Every ```worked-example block body in a Markdown text, with the line it starts on. */
function workedExampleBlocks(markdown: string) {
  const blocks: { line: number; body: string }[] = [];
  const re = /^```worked-example[ \t]*\n([\s\S]*?)^```[ \t]*$/gm;
  for (let m = re.exec(markdown); m; m = re.exec(markdown)) {
    blocks.push({ line: markdown.slice(0, m.index).split('\n').length, body: m[1] });
  }
  return blocks;
}

function markdownFiles(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const full = path.join(dir, e.name);
    return e.isDirectory() ? markdownFiles(full) : e.name.endsWith('.md') ? [full] : [];
  });
}

const files = [...markdownFiles(path.join(CONTENT_DIR, 'parameters')), ...markdownFiles(path.join(CONTENT_DIR, 'guides'))];

describe('content: worked-example blocks', () => {
  it('finds the blocks (so the check below is not vacuous)', () => {
    const count = files.reduce((n, f) => n + workedExampleBlocks(fs.readFileSync(f, 'utf8')).length, 0);
    expect(count).toBeGreaterThan(40);
  });

  it('every block in content/parameters and content/guides parses and validates', () => {
    const failures: string[] = [];
    for (const file of files) {
      for (const block of workedExampleBlocks(fs.readFileSync(file, 'utf8'))) {
        const result = parseWorkedExample(block.body);
        if (!result.ok) {
          failures.push(
            `${path.relative(CONTENT_DIR, file)}:${block.line}: ${result.issues.map((i) => `${i.path || '(block)'}: ${i.message}`).join('; ')}`,
          );
        }
      }
    }
    expect(failures).toEqual([]);
  });

  it('an entry with a calculator has a worked example for that calculator', () => {
    const missing = readParameterFiles()
      .filter((p) => p.content.calculator)
      .filter(
        (p) =>
          !workedExampleBlocks(p.content.body).some((b) => {
            const r = parseWorkedExample(b.body);
            return r.ok && r.calc === p.content.calculator;
          }),
      )
      .map((p) => p.slug);
    expect(missing).toEqual([]);
  });
});

describe('content: links between entries', () => {
  const slugs = new Set(readParameterFiles().map((p) => p.slug));

  it('every related: slug is an entry', () => {
    const broken = readParameterFiles().flatMap((p) => p.content.related.filter((r) => !slugs.has(r)).map((r) => `${p.slug} → ${r}`));
    expect(broken).toEqual([]);
  });

  it('every guide parameters: slug is an entry', () => {
    const broken = readGuideDirs().flatMap((g) =>
      g.revisions.flatMap((r) => r.content.parameters.filter((s) => !slugs.has(s)).map((s) => `${g.slug} v${r.number} → ${s}`)),
    );
    expect(broken).toEqual([]);
  });

  it('every relative Markdown link in an entry points at an entry', () => {
    const broken = readParameterFiles().flatMap((p) =>
      [...p.content.body.matchAll(/\]\(([^)\s]+)\)/g)]
        .map((m) => m[1])
        .filter((href) => !/^https?:/.test(href) && !href.startsWith('#'))
        .filter((href) => !slugs.has(href))
        .map((href) => `${p.slug} → ${href}`),
    );
    expect(broken).toEqual([]);
  });

  it('every entry has a Cautions section', () => {
    expect(
      readParameterFiles()
        .filter((p) => !/^## Cautions\s*$/m.test(p.content.body))
        .map((p) => p.slug),
    ).toEqual([]);
  });
});
