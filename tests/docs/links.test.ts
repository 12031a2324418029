import fs from 'node:fs';
import path from 'node:path';
import remarkGfm from 'remark-gfm';
import remarkParse from 'remark-parse';
import { unified } from 'unified';
import { describe, expect, it } from 'vitest';

// The developer documents point at each other and at their own headings; a renamed heading or a moved
// file breaks such a link silently. Every relative link and every anchor in them must resolve.

const root = path.resolve(import.meta.dirname, '../..');
const documents = [
  'README.md',
  'DEVELOPERS.md',
  ...fs
    .readdirSync(path.join(root, 'docs'))
    .filter((f) => f.endsWith('.md'))
    .map((f) => `docs/${f}`),
];

/** The part of a Markdown syntax tree read here. */
type Node = { type: string; value?: string; url?: string; children?: Node[] };

const trees = new Map<string, Node>();
/** Each file parsed once (parsing is the slow part). */
function parse(file: string): Node {
  const known = trees.get(file);
  if (known) return known;
  const tree = unified()
    .use(remarkParse)
    .use(remarkGfm)
    .parse(fs.readFileSync(path.join(root, file), 'utf8')) as Node;
  trees.set(file, tree);
  return tree;
}

/** Every node of a type, in document order. */
function nodesOf(tree: Node, type: string, found: Node[] = []): Node[] {
  if (tree.type === type) found.push(tree);
  for (const child of tree.children ?? []) nodesOf(child, type, found);
  return found;
}

const textOf = (node: Node): string => (node.type === 'text' || node.type === 'inlineCode' ? (node.value ?? '') : (node.children ?? []).map(textOf).join(''));

/** The anchors a Markdown file's headings get on the usual forge: lower case, punctuation dropped, spaces to hyphens, repeats numbered. */
const anchorSets = new Map<string, Set<string>>();
function anchorsOf(file: string): Set<string> {
  const known = anchorSets.get(file);
  if (known) return known;
  const seen = new Map<string, number>();
  const anchors = new Set<string>();
  for (const h of nodesOf(parse(file), 'heading')) {
    const base = textOf(h)
      .trim()
      .toLowerCase()
      .replace(/[^\p{L}\p{M}\p{N}\p{Pc} -]/gu, '')
      .replace(/ /g, '-');
    const n = seen.get(base) ?? 0;
    seen.set(base, n + 1);
    anchors.add(n ? `${base}-${n}` : base);
  }
  anchorSets.set(file, anchors);
  return anchors;
}

/** Links that stay inside the repository: no scheme, no protocol-relative host. */
function relativeLinks(file: string): string[] {
  return nodesOf(parse(file), 'link')
    .map((l) => l.url ?? '')
    .filter((url) => !/^([a-z][a-z0-9+.-]*:|\/\/)/i.test(url));
}

describe('developer documents: every relative link and anchor resolves', () => {
  it('finds the documents and links worth checking', () => {
    expect(documents).toEqual(expect.arrayContaining(['README.md', 'DEVELOPERS.md', 'docs/decisions.md', 'docs/threat-model.md']));
    // DEVELOPERS.md's table of contents alone links every one of its sections.
    expect(relativeLinks('DEVELOPERS.md').length).toBeGreaterThan(20);
  });

  it.each(documents)('%s', (file) => {
    const broken = relativeLinks(file).filter((url) => {
      const [target, anchor] = url.split('#', 2);
      const resolved = target ? path.join(path.dirname(file), decodeURI(target)) : file;
      if (!fs.existsSync(path.join(root, resolved))) return true;
      return anchor !== undefined && (!resolved.endsWith('.md') || !anchorsOf(resolved).has(decodeURIComponent(anchor)));
    });
    expect(broken).toEqual([]);
  });

  it('the anchor rule matches headings with code, punctuation and repeats', () => {
    const anchors = anchorsOf('docs/decisions.md');
    expect(anchors).toContain('8-npm-ci-only-when-the-lockfile-content-changed');
    expect(anchors).toContain('1-module-resolution-bundler-everywhere');
    expect(anchorsOf('DEVELOPERS.md')).toContain('content-checks-and-the-second-moderator-13');
  });
});
