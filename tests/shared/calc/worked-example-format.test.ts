import { describe, expect, it } from 'vitest';
import { formatWorkedExample, parseWorkedExample } from '../../../shared/calc/worked-example';
import { exampleBlocks } from '../../../shared/content-checks/types';
import { calculatorNames, getCalculator } from '../../../shared/calc/registry';

describe('formatWorkedExample', () => {
  it('writes a block that reads back to the same calculator and inputs', () => {
    const block = formatWorkedExample('gearing', { spur: '84', pinion: '40', internalRatio: '1,9', tyreDiameterMm: '64' });
    expect(block).toBe('```worked-example\ncalc: gearing\nspur: 84\npinion: 40\ninternalRatio: 1.9\ntyreDiameterMm: 64\n```\n');
    const [found] = exampleBlocks(`Intro\n\n${block}\nMore`);
    const parsed = parseWorkedExample(found.source);
    expect(parsed).toMatchObject({ ok: true, calc: 'gearing', inputs: { spur: 84, pinion: 40, internalRatio: 1.9, tyreDiameterMm: 64 } });
  });

  it('leaves blank inputs out and keeps a typed line break inside its value', () => {
    const block = formatWorkedExample('gearing', { spur: '84', pinion: '', note: 'a\n```\ncalc: x' });
    expect(exampleBlocks(block)).toHaveLength(1);
    expect(block).not.toContain('pinion');
    expect(block.split('\n').filter((l) => l.startsWith('```'))).toHaveLength(2);
  });

  it("round-trips every calculator's own example", () => {
    for (const name of calculatorNames) {
      const calculator = getCalculator(name)!;
      const [found] = exampleBlocks(formatWorkedExample(name, calculator.defaults as Record<string, unknown>));
      expect(parseWorkedExample(found.source).ok, name).toBe(true);
    }
  });
});
