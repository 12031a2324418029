import { describe, expect, it } from 'vitest';
import { readGuideDirs, readParameterFiles, readSetupFile } from '../../../server/db/seed-content';
import { baselineInClassRange } from '../../../shared/content-checks/baseline-in-class-range';
import { cautionNearExample } from '../../../shared/content-checks/caution-near-example';
import { classRanges } from '../../../shared/content-checks/class-ranges';
import { exampleMatchesBaseline } from '../../../shared/content-checks/example-vs-baseline';
import { hasBlockingChecks, runContentChecks } from '../../../shared/content-checks/run';
import { statedValueMatchesBaseline } from '../../../shared/content-checks/stated-value';
import type { CheckLibraryEntry } from '../../../shared/content-checks/types';
import { buildSetupRecord } from '../../factories/setup-record';

const library: CheckLibraryEntry[] = readParameterFiles().map((p) => ({ slug: p.slug, name: p.content.name, unit: p.content.unit, body: p.content.body }));
const example = (lines: string[]) => ['```worked-example', ...lines, '```'].join('\n');
const baseline = buildSetupRecord({
  escSettings: {
    'drag-brake': { value: 8, unit: '%' },
    'throttle-curve': { value: 20, unit: '%' },
    'low-voltage-cutoff': { value: 3.2, unit: 'V' },
    'zero-timing-mode': { value: 1, unit: '' },
  },
});

describe('example-matches-baseline', () => {
  it('flags an expo sign opposite to the baseline as an error, at the example input', () => {
    const body = `Softer bottom end:\n\n${example(['calc: throttle', 'expoPct: -20', 'punchRatePctPerS: 400'])}\n`;
    expect(exampleMatchesBaseline({ body, setup: baseline })).toEqual([
      expect.objectContaining({ rule: 'example-matches-baseline', severity: 'error', path: 'examples[0].expoPct' }),
    ]);
    expect(exampleMatchesBaseline({ body: body.replace('-20', '20'), setup: baseline })).toEqual([]);
  });

  it('warns when a gearing input differs from the baseline, naming the baseline field', () => {
    const body = example(['calc: gearing', 'spur: 84', 'pinion: 34', 'internalRatio: 2.6', 'tyreDiameterMm: 62']);
    const found = exampleMatchesBaseline({ body, setup: baseline });
    expect(found).toEqual([expect.objectContaining({ severity: 'warning', path: 'examples[0].pinion' })]);
    expect(found[0].message).toMatch(/pinion 34 where the baseline has 32 \(gearing\.pinionTeeth\)/);
  });

  it('compares pack cells, chemistry and cutoff, and says nothing without a baseline', () => {
    const body = example(['calc: pack', 'chemistry: lipo', 'cells: 3', 'cutoffPerCellV: 3.0']);
    expect(exampleMatchesBaseline({ body, setup: baseline }).map((c) => c.path)).toEqual(['examples[0].cells', 'examples[0].cutoffPerCellV']);
    expect(exampleMatchesBaseline({ body, setup: null })).toEqual([]);
  });
});

describe('stated-value-matches-baseline', () => {
  it('catches a value the text states that the baseline does not hold, in prose and in a table', () => {
    const prose = statedValueMatchesBaseline({ body: 'Punch high, drag brake 4 %, brake strength 60 %.', setup: baseline }, library);
    expect(prose).toEqual([expect.objectContaining({ rule: 'stated-value-matches-baseline', severity: 'error', path: 'escSettings.drag-brake' })]);
    const table = statedValueMatchesBaseline({ body: '| Setting | Value |\n| --- | --- |\n| Drag brake | 12 % | more bite |', setup: baseline }, library);
    expect(table.map((c) => c.path)).toEqual(['escSettings.drag-brake']);
  });

  it('accepts the baseline value, a range that holds it, a change and a step size', () => {
    const body = [
      'Drag brake 8 % on this layout; the library gives drag brake 0–10 % for the class.',
      'Drag brake lowered from 10 % to 8 % last week.',
      'Add drag brake 2 % at a time.',
      'Low-voltage cutoff 3.2 V per cell.',
    ].join('\n\n');
    expect(statedValueMatchesBaseline({ body, setup: baseline }, library)).toEqual([]);
  });
});

describe('caution-near-example', () => {
  const hot = example(['calc: temperature', 'value: 90', 'unit: C', 'part: motor']);
  it('is an error when an example ends in a danger and no caution is near it', () => {
    const found = cautionNearExample({ body: `My motor after the final:\n\n${hot}\n\nNext time I will try the other tyres.` });
    expect(found).toEqual([expect.objectContaining({ rule: 'caution-near-example', severity: 'error', path: 'examples[0].value' })]);
  });

  it('is satisfied by a caution beside the example, and ignores examples with nothing to warn about', () => {
    expect(cautionNearExample({ body: `My motor after the final:\n\n${hot}\n\nThat is too hot: stop and let it cool, and gear down.` })).toEqual([]);
    expect(cautionNearExample({ body: example(['calc: temperature', 'value: 40', 'unit: C', 'part: motor']) })).toEqual([]);
  });

  it('is a warning for a caution-level result (a motor in the hot band)', () => {
    const warm = example(['calc: temperature', 'value: 75', 'unit: C', 'part: motor']);
    expect(cautionNearExample({ body: `After five minutes:\n\n${warm}\n` }).map((c) => c.severity)).toEqual(['warning']);
  });
});

describe('baseline-in-class-range', () => {
  it("reads the class table of an entry (drag brake, stock 2WD buggy: 0–10 %; throttle curve '0 to +30 %')", () => {
    expect(classRanges(library.find((e) => e.slug === 'drag-brake')!).get('buggy-2wd-stock')).toMatchObject({ min: 0, max: 10 });
    expect(classRanges(library.find((e) => e.slug === 'throttle-curve')!).get('stadium-truck')).toMatchObject({ min: 0, max: 30 });
  });

  it('flags a baseline value outside the class range with the range, and leaves values inside alone', () => {
    const heavy = buildSetupRecord({ escSettings: { 'drag-brake': { value: 25, unit: '%' } } });
    const found = baselineInClassRange({ body: '', class: 'buggy-2wd-stock', setup: heavy }, library);
    expect(found).toEqual([expect.objectContaining({ severity: 'warning', path: 'escSettings.drag-brake' })]);
    expect(found[0].message).toMatch(/0–10 %/);
    expect(baselineInClassRange({ body: '', class: 'buggy-2wd-stock', setup: baseline }, library)).toEqual([]);
  });

  it('checks the final drive ratio worked out from the gearing', () => {
    // 84/20 × 2.6 = 10.92, far shorter than a stock buggy's range in the final-drive-ratio entry
    const short = buildSetupRecord({ gearing: { spurTeeth: 84, pinionTeeth: 20, internalRatio: 2.6, tyreDiameterMm: 62 } });
    expect(
      baselineInClassRange({ body: '', class: 'buggy-2wd-stock', setup: short }, library)
        .map((c) => c.message)
        .join(' '),
    ).toMatch(/Final drive ratio 10\.92/);
  });
});

describe('runContentChecks', () => {
  it('lists errors first and blocks only on errors', () => {
    const body = `Drag brake 4 %.\n\n${example(['calc: gearing', 'spur: 84', 'pinion: 34', 'internalRatio: 2.6', 'tyreDiameterMm: 62'])}`;
    const found = runContentChecks({ body, class: 'buggy-2wd-stock', setup: baseline }, library);
    expect(found.map((c) => c.severity)).toEqual(['error', 'warning']);
    expect(hasBlockingChecks(found)).toBe(true);
    expect(hasBlockingChecks(found.filter((c) => c.severity === 'warning'))).toBe(false);
  });

  it('finds no errors in any seeded content that is live or waiting for review', () => {
    const errors: string[] = [];
    for (const g of readGuideDirs()) {
      const live = g.revisions.map((r) => r.state).lastIndexOf('published');
      for (const r of g.revisions.slice(Math.max(live, 0))) {
        const found = runContentChecks({ body: r.content.body, class: r.content.class, setup: readSetupFile(g.slug, r.number) }, library);
        errors.push(...found.filter((c) => c.severity === 'error').map((c) => `${g.slug} v${r.number}: ${c.message}`));
      }
    }
    for (const p of readParameterFiles()) {
      errors.push(
        ...runContentChecks({ body: p.content.body }, library)
          .filter((c) => c.severity === 'error')
          .map((c) => `${p.slug}: ${c.message}`),
      );
    }
    expect(errors).toEqual([]);
  });

  it('would have caught the corrected statements in the old versions', () => {
    const old = (slug: string, n: number) => {
      const r = readGuideDirs()
        .find((g) => g.slug === slug)!
        .revisions.find((x) => x.number === n)!;
      return runContentChecks({ body: r.content.body, class: r.content.class, setup: readSetupFile(slug, n) }, library).filter((c) => c.severity === 'error');
    };
    expect(old('stadium-truck-harbour-flats-clay', 1).map((c) => c.path)).toContain('examples[1].expoPct');
    expect(old('short-course-saltings-meadow-loose-dirt', 1).map((c) => c.path)).toContain('examples[2].expoPct');
  });
});
