import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { calculatorNames, getCalculator } from '../../../shared/calc/registry';

// The calculators whose card draws a chart (src/features/calculators/components/calc-chart.tsx).
const WITH_CHART = new Set(['timing-curve', 'throttle', 'gearing']);
const inputKeys = new Set(calculatorNames.flatMap((n) => getCalculator(n)!.fields.map((f) => f.key)));

function parameterFiles(dir = path.resolve('content/parameters')): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => (e.isDirectory() ? parameterFiles(path.join(dir, e.name)) : e.name.endsWith('.md') ? [path.join(dir, e.name)] : []));
}

/** The prose of an entry: its text outside fenced blocks (a worked-example block does use the keys). */
const prose = (text: string) => text.replace(/^```[\s\S]*?^```/gm, '');

describe('parameter entries’ prose', () => {
  const files = parameterFiles();
  it('never shows a calculator’s internal input key (readers see labels)', () => {
    expect(files.length).toBeGreaterThan(40);
    const found = files.flatMap((f) =>
      [...prose(fs.readFileSync(f, 'utf8')).matchAll(/`([A-Za-z]+)(?::[^`]*)?`/g)].filter((m) => inputKeys.has(m[1])).map((m) => `${path.basename(f)}: ${m[0]}`),
    );
    expect(found).toEqual([]);
  });

  it('never mentions a chart or a plotted line when its calculator’s card has none', () => {
    const found = files.filter((f) => {
      const text = fs.readFileSync(f, 'utf8');
      const calc = /^calculator:\s*(\S+)/m.exec(text)?.[1];
      if (!calc || calc === 'null' || WITH_CHART.has(calc)) return false;
      const example = prose(text).split(/^## Worked example\s*$/m)[1]?.split(/^## /m)[0] ?? '';
      return /\b(chart|plots?|graph|brake line)\b/i.test(example);
    });
    expect(found).toEqual([]);
  });
});
